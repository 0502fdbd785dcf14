using System.Diagnostics;
using System.Runtime.InteropServices;
using LaunchLogger.Cli.Verbs;
using Xunit.Abstractions;

namespace LaunchLogger.Cli.Tests;

/// <summary>Ctrl+C on the real process: `launchlogger simulate` writing a set of three files is
/// sent SIGINT at points spread over its run. Whenever the signal lands, the folder holds the
/// whole set (byte for byte what an uninterrupted run writes) or none of it, never a part or a
/// temporary file, and the exit code is 130 (ExitCode.Cancelled, README) unless the set was
/// complete before the signal.</summary>
public class InterruptTests(ITestOutputHelper log)
{
    private const int Sigint = 2; // POSIX.1 signal number of SIGINT

    [PosixFact]
    public void CtrlCLeavesTheWholeOutputSetOrNothing()
    {
        using var temp = new TempFolder();
        string scenario = temp.Write("long.json", """{ "name": "ctrl-c", "plan": { "stage_s": 3, "target_speed_mps": null, "target_distance_m": 2000, "max_duration_s": 120 } }""");
        string reference = Directory.CreateDirectory(temp.File("reference")).FullName;
        string home = Directory.CreateDirectory(temp.File("home")).FullName;
        var clock = Stopwatch.StartNew();
        Assert.Equal(0, RunChild(Args(scenario, reference), home, interruptAfter: null).Code);
        TimeSpan whole = clock.Elapsed;

        // Signals spread over the reference run's time; if the machine got faster since (a busy
        // machine made the reference slow) and every run completed first, the delay is halved
        // until the tool handles one, so the test always sees an interrupted run as well as whole sets.
        var delays = new List<TimeSpan>(new[] { 0.15, 0.35, 0.55, 0.75, 0.9 }.Select(f => whole * f));
        int interrupted = 0;
        for (int i = 0; i < delays.Count; i++)
        {
            string folder = Directory.CreateDirectory(temp.File($"at{i}")).FullName;
            (int code, string said) = RunChild(Args(scenario, folder), home, delays[i]);
            bool handled = said.Contains("cancelled; nothing written", StringComparison.Ordinal);
            log.WriteLine($"signal after {delays[i].TotalMilliseconds:F0} ms of a {whole.TotalMilliseconds:F0} ms reference run: exit {code}{(handled ? ", cancelled by the tool" : "")}");

            string[] left = [.. Directory.GetFiles(folder).Select(Path.GetFileName).OfType<string>().Order(StringComparer.Ordinal)];
            if (left.Length == 0)
            {
                // A signal before the runtime has started the tool's handler ends the process
                // as SIGINT does by default (also 130, and nothing written); only the tool's own
                // cancellation counts as an interruption it handled.
                Assert.Equal((int)ExitCode.Cancelled, code);
                interrupted += handled ? 1 : 0;
            }
            else
            {
                // The whole set, as an uninterrupted run writes it; nothing else.
                Assert.Equal(["receiver.nmea", "run.log", "truth.json"], left);
                foreach (string name in left)
                {
                    Assert.Equal(File.ReadAllBytes(Path.Combine(reference, name)), File.ReadAllBytes(Path.Combine(folder, name)));
                }

                Assert.Contains(code, new[] { (int)ExitCode.Ok, (int)ExitCode.Cancelled });
            }

            if (i == delays.Count - 1 && interrupted == 0 && delays.Min() > TimeSpan.FromMilliseconds(20))
            {
                delays.Add(delays.Min() / 2);
            }
        }

        Assert.True(interrupted > 0, "no signal was handled by the tool before the set was written: the run is too short to test, or the tool does not stop on SIGINT");
    }

    private static string[] Args(string scenario, string folder) =>
        ["simulate", "--scenario", scenario, "--seed", "3", "--out", Path.Combine(folder, "run.log"), "--truth", Path.Combine(folder, "truth.json"), "--receiver-nmea", Path.Combine(folder, "receiver.nmea")];

    /// <summary>Runs the CLI as a child process; sends it SIGINT after <paramref name="interruptAfter"/>.
    /// Returns its exit code and what it wrote to its standard error.</summary>
    private static (int Code, string Error) RunChild(string[] args, string home, TimeSpan? interruptAfter)
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

        // The safety notice's first-run marker goes to the test's folder, not the runner's home.
        start.Environment["LAUNCHLOGGER_HOME"] = home;

        using Process child = StartWithSigintAtDefault(start);
        child.OutputDataReceived += (_, _) => { };
        var said = new System.Text.StringBuilder();
        child.ErrorDataReceived += (_, e) =>
        {
            lock (said)
            {
                said.AppendLine(e.Data);
            }
        };
        child.BeginOutputReadLine();
        child.BeginErrorReadLine();
        if (interruptAfter is { } wait && !child.WaitForExit(wait))
        {
            Assert.Equal(0, Kill(child.Id, Sigint));
        }

        Assert.True(child.WaitForExit(TimeSpan.FromMinutes(3)), "the child did not end");
        child.WaitForExit(); // and for its output streams to end
        lock (said)
        {
            return (child.ExitCode, said.ToString());
        }
    }

    /// <summary>Starts the child with SIGINT at its default, as a command typed at a terminal
    /// has it. A child inherits an ignored SIGINT and then keeps ignoring it (the runtime leaves
    /// an ignored SIGINT so, as a shell's background job expects), so a test runner started in the
    /// background by a script (`cmd &`: SIGINT ignored) would see every child run to its end.</summary>
    private static Process StartWithSigintAtDefault(ProcessStartInfo start)
    {
        lock (SignalGate)
        {
            bool ignored = SigintIgnored();
            if (ignored)
            {
                Signal(Sigint, SigDefault);
            }

            try
            {
                return Process.Start(start)!;
            }
            finally
            {
                if (ignored)
                {
                    Signal(Sigint, SigIgnore);
                }
            }
        }
    }

    /// <summary>True when this process ignores SIGINT (its handler is SIG_IGN), as a command
    /// started in the background by a non-interactive shell does.</summary>
    private static bool SigintIgnored()
    {
        // struct sigaction begins with its handler on Linux and macOS; 256 bytes hold the whole.
        byte[] old = new byte[256];
        Assert.Equal(0, SigAction(Sigint, IntPtr.Zero, old));
        return MemoryMarshal.Read<nint>(old) == SigIgnore;
    }

    private static readonly object SignalGate = new();
    private const nint SigDefault = 0; // POSIX.1 SIG_DFL
    private const nint SigIgnore = 1; // SIG_IGN on Linux and macOS

    [DllImport("libc", EntryPoint = "kill", SetLastError = true)]
    private static extern int Kill(int pid, int signal);

    [DllImport("libc", EntryPoint = "sigaction", SetLastError = true)]
    private static extern int SigAction(int signal, IntPtr action, [Out] byte[] oldAction);

    [DllImport("libc", EntryPoint = "signal", SetLastError = true)]
    private static extern nint Signal(int signal, nint handler);
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
