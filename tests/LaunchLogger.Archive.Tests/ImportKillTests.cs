using System.Diagnostics;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Verbs;
using Microsoft.Data.Sqlite;
using Xunit.Abstractions;

namespace LaunchLogger.Archive.Tests;

public class ImportKillTests(ITestOutputHelper log)
{
    private const int Kills = 50;
    private const int Logs = 3;

    // Three different runs: copies of one run in two logs would be filed as one run.
    private static readonly byte[][] Distinct = [TestLogs.Hatch, TestLogs.Roadster, TestLogs.SecondHatch];

    [Fact]
    public void An_import_killed_at_random_points_leaves_the_archive_consistent_and_a_reimport_completes_it()
    {
        using var temp = new TempFolder();
        string card = Directory.CreateDirectory(temp.File("card")).FullName;
        for (int i = 0; i < Logs; i++)
        {
            File.WriteAllBytes(Path.Combine(card, $"run{i:000}.log"), TestLogs.Variant(Distinct[i], i + 1));
        }

        // Each kill falls at a random point of the filing: when the archive's write-ahead log has
        // grown past a random size (every log adds at least its own bytes to it), plus a random
        // few milliseconds, so kills land both between logs and inside a transaction's writes.
        long logBytes = Directory.GetFiles(card).Sum(f => new FileInfo(f).Length);
        var random = new Random(13);
        int killedMidway = 0;
        for (int kill = 0; kill < Kills; kill++)
        {
            string archive = temp.File($"kill{kill}.db");
            long threshold = 4096 + (long)(random.NextDouble() * (logBytes - 4096));
            int? code = ImportUntil(card, archive, threshold, random.Next(0, 20));
            killedMidway += code is null ? 1 : 0;
            AssertConsistent(archive, complete: false);

            // The re-import files what the killed one did not, and nothing twice.
            Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [card], RunAssignment.None, false, new StringWriter(), new StringWriter()));
            AssertConsistent(archive, complete: true);
        }

        // The kills must have landed inside imports, not after them.
        log.WriteLine($"{killedMidway} of {Kills} kills hit a running import");
        Assert.True(killedMidway >= Kills * 3 / 4, $"only {killedMidway} of {Kills} kills hit a running import");
    }

    /// <summary>Runs `launchlogger import` as a child process and kills it once the archive's
    /// write-ahead log holds <paramref name="walBytes"/> bytes and <paramref name="extraMs"/> more
    /// milliseconds have passed.</summary>
    /// <returns>Its exit code, or null when it was killed before it ended.</returns>
    private static int? ImportUntil(string card, string archive, long walBytes, int extraMs)
    {
        string cli = typeof(ImportCommand).Assembly.Location;
        var start = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string arg in new[] { cli, "import", card, "--archive", archive })
        {
            start.ArgumentList.Add(arg);
        }

        using Process child = Process.Start(start)!;
        child.OutputDataReceived += (_, _) => { };
        child.ErrorDataReceived += (_, _) => { };
        child.BeginOutputReadLine();
        child.BeginErrorReadLine();
        var wal = new FileInfo(archive + "-wal");
        var patience = Stopwatch.StartNew();
        while (!child.HasExited && patience.Elapsed < TimeSpan.FromMinutes(2))
        {
            wal.Refresh();
            if (wal.Exists && wal.Length >= walBytes)
            {
                Thread.Sleep(extraMs);
                break;
            }

            Thread.Sleep(1);
        }

        if (!child.HasExited)
        {
            child.Kill(entireProcessTree: true);
            child.WaitForExit();
            return null;
        }

        child.WaitForExit();
        return child.ExitCode;
    }

    private static void AssertConsistent(string archive, bool complete)
    {
        if (!File.Exists(archive))
        {
            Assert.False(complete);
            return;
        }

        using var connection = new SqliteConnection($"Data Source={archive};Pooling=False");
        connection.Open();
        long Count(string sql)
        {
            using SqliteCommand command = connection.CreateCommand();
            command.CommandText = sql;
            return Convert.ToInt64(command.ExecuteScalar());
        }

        using (SqliteCommand check = connection.CreateCommand())
        {
            check.CommandText = "PRAGMA integrity_check";
            Assert.Equal("ok", check.ExecuteScalar());
        }

        Assert.Equal(0, Count("SELECT count(*) FROM pragma_foreign_key_check"));
        if (Count("SELECT count(*) FROM sqlite_master WHERE name = 'logs'") == 0)
        {
            Assert.False(complete);
            return;
        }

        // A log is filed whole or not at all: its one run, with a current result.
        Assert.Equal(0, Count("SELECT count(*) FROM logs l WHERE (SELECT count(*) FROM runs r WHERE r.log_id = l.id) <> 1"));
        Assert.Equal(0, Count("SELECT count(*) FROM runs WHERE result_id IS NULL OR result_id NOT IN (SELECT id FROM results)"));
        long logs = Count("SELECT count(*) FROM logs");
        Assert.True(complete ? logs == Logs : logs <= Logs, $"{logs} logs filed");
    }
}
