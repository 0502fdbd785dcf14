using System.Diagnostics;
using System.Runtime.InteropServices;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary>Ctrl+C on the real process: `launchlogger simulate` writing a set of three files is
/// sent SIGINT at points spread over its run. Whenever the signal lands, the folder holds the
/// whole set (byte for byte what an uninterrupted run writes) or none of it, never a part or a
/// temporary file, and the exit code is 130 (ExitCode.Cancelled, README) unless the set was
/// complete before the signal.</summary>
public class InterruptTests
{
    private const int Sigint = 2; // POSIX.1 signal number of SIGINT

    [PosixFact]
    public void CtrlCLeavesTheWholeOutputSetOrNothing()
    {
        using var temp = new TempFolder();
        string scenario = temp.Write("long.json", """{ "name": "ctrl-c", "plan": { "stage_s": 3, "target_speed_mps": null, "target_distance_m": 2000, "max_duration_s": 120 } }""");
        string reference = Directory.CreateDirectory(temp.File("reference")).FullName;
        var clock = Stopwatch.StartNew();
        Assert.Equal(0, RunChild(Args(scenario, reference), interruptAfter: null));
        TimeSpan whole = clock.Elapsed;

        // Signals spread over the reference run's time; if the machine got faster since (a busy
        // machine made the reference slow) and every run completed first, the delay is halved
        // until one lands, so the test always sees an interrupted run as well as whole sets.
        var delays = new List<TimeSpan>(new[] { 0.15, 0.35, 0.55, 0.75, 0.9 }.Select(f => whole * f));
        int interrupted = 0;
        for (int i = 0; i < delays.Count; i++)
        {
            string folder = Directory.CreateDirectory(temp.File($"at{i}")).FullName;
            int code = RunChild(Args(scenario, folder), delays[i]);

            string[] left = [.. Directory.GetFiles(folder).Select(Path.GetFileName).OfType<string>().Order(StringComparer.Ordinal)];
            if (left.Length == 0)
            {
                Assert.Equal((int)ExitCode.Cancelled, code);
                interrupted++;
                continue;
            }

            // The whole set, as an uninterrupted run writes it; nothing else.
            Assert.Equal(["receiver.nmea", "run.log", "truth.json"], left);
            foreach (string name in left)
            {
                Assert.Equal(File.ReadAllBytes(Path.Combine(reference, name)), File.ReadAllBytes(Path.Combine(folder, name)));
            }

            Assert.Contains(code, new[] { (int)ExitCode.Ok, (int)ExitCode.Cancelled });
            if (i == delays.Count - 1 && interrupted == 0 && delays.Min() > TimeSpan.FromMilliseconds(20))
            {
                delays.Add(delays.Min() / 2);
            }
        }

        Assert.True(interrupted > 0, "no signal landed before the set was written: the run is too short to test");
    }

    private static string[] Args(string scenario, string folder) =>
        ["simulate", "--scenario", scenario, "--seed", "3", "--out", Path.Combine(folder, "run.log"), "--truth", Path.Combine(folder, "truth.json"), "--receiver-nmea", Path.Combine(folder, "receiver.nmea")];

    /// <summary>Runs the CLI as a child process; sends it SIGINT after <paramref name="interruptAfter"/>.</summary>
    private static int RunChild(string[] args, TimeSpan? interruptAfter)
    {
        var start = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") ?? "dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(typeof(SimulateCommand).Assembly.Location);
        foreach (string arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        using Process child = Process.Start(start)!;
        child.OutputDataReceived += (_, _) => { };
        child.ErrorDataReceived += (_, _) => { };
        child.BeginOutputReadLine();
        child.BeginErrorReadLine();
        if (interruptAfter is { } wait && !child.WaitForExit(wait))
        {
            Assert.Equal(0, Kill(child.Id, Sigint));
        }

        Assert.True(child.WaitForExit(TimeSpan.FromMinutes(3)), "the child did not end");
        child.WaitForExit();
        return child.ExitCode;
    }

    [DllImport("libc", EntryPoint = "kill", SetLastError = true)]
    private static extern int Kill(int pid, int signal);
}

/// <summary>A test that sends POSIX signals: skipped, saying so, on other systems.</summary>
public sealed class PosixFactAttribute : FactAttribute
{
    public PosixFactAttribute()
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS())
        {
            Skip = "sends SIGINT to a child process: Linux or macOS only";
        }
    }
}
