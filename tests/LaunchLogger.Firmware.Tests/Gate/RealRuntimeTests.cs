using System.Diagnostics;
using System.Reflection;

namespace LaunchLogger.Firmware.Tests.Gate;

/// <summary>The harness (firmware/LaunchLogger.Firmware.NanoHarness) run on CoreCLR and on
/// nanoFramework's own interpreter must print the same lines. Needs the interpreter's POSIX build
/// and the metadata processor, named by NANOCLR_POSIX and NANO_METADATA_PROCESSOR (how to build
/// them: DEVELOPERS.md); skipped with a message when they are not set.</summary>
public class RealRuntimeTests
{
    [RealRuntimeFact]
    public void TheHarnessPrintsTheSameOnTheInterpreterAsOnCoreClr()
    {
        string onCoreClr = Run("dotnet", Quote(HarnessOnCoreClr()));
        string onDevice = Run("bash", Quote(Script()) + " " + Configuration() + " " + Quote(Directory.CreateTempSubdirectory("nano-harness-").FullName));

        string[] expected = Lines(onCoreClr);
        Assert.Equal("harness 1", expected[0]);
        Assert.Equal("done", expected[^1]);
        Assert.Contains(expected, l => l.StartsWith("log ", StringComparison.Ordinal));
        Assert.Contains("event brake-on at 6499000 gap 1000", expected);
        Assert.Contains("frames with a bad crc 0", expected);
        Assert.Equal(expected, Lines(onDevice));
    }

    /// <summary>The per-pass budget of Run/StepBudget.cs, in IL instructions executed by the
    /// interpreter (hardware-notes/esp32-and-linux-boards.md): no pass of the capture loop over
    /// it, and no allocation in any pass. Needs an interpreter built with the counters described
    /// in DEVELOPERS.md, named by NANOCLR_POSIX_COUNTING.</summary>
    [CountingRuntimeFact]
    public void OnTheInterpreterNoPassExceedsTheBudgetOrAllocates()
    {
        string work = Directory.CreateTempSubdirectory("nano-counts-").FullName;
        string clr = Environment.GetEnvironmentVariable("NANOCLR_POSIX_COUNTING")!;
        Run("bash", Quote(Script()) + " " + Configuration() + " " + Quote(work), clr);

        string summary = Run("bash", Quote(Script()) + " --counts " + Quote(Path.Combine(work, "raw-output.txt")));
        var largest = System.Text.RegularExpressions.Regex.Match(summary, @"largest single step (\d+) IL");
        var allocations = System.Text.RegularExpressions.Regex.Match(summary, @"allocations: (\d+) in all steps");
        Assert.True(largest.Success && allocations.Success, "the run gave no counts (is NANOCLR_POSIX_COUNTING an instrumented build?):\n" + summary);
        Assert.True(int.Parse(largest.Groups[1].Value) > 0, summary);
        Assert.True(int.Parse(largest.Groups[1].Value) <= LaunchLogger.Firmware.Run.StepBudget.MaxInstructionsPerStep, summary);
        Assert.Equal("0", allocations.Groups[1].Value);
    }

    [Fact]
    public void TheHarnessRunsOnCoreClr()
    {
        // Always runs: the CoreCLR side of the comparison works and says something.
        string[] lines = Lines(Run("dotnet", Quote(HarnessOnCoreClr())));
        Assert.Equal("crc32 123456789 3421780262", lines[1]); // CRC-32/ISO-HDLC check value 0xCBF43926 (CRC catalogue)
        Assert.Contains(lines, l => l.StartsWith("run 1 motion ", StringComparison.Ordinal));
        Assert.Contains("phase rolled-out at 2905000", lines);
        Assert.Equal("done", lines[^1]);
    }

    [Fact]
    public void TheHarnessDrivesTheSwitchesThroughTheLoopsDebouncing()
    {
        // The harness's switch script (Harness.cs, MarkChanges and BrakeChanges) against the
        // event definitions of LOG-FORMAT.md (events 5-7): a level counts once it has held 20 ms
        // and is dated to the pass that first read it, with the gap from the pass before. So a
        // bouncing closing is dated to its last contact, a 5 ms spike and a 10 ms touch give no
        // event, a press before the run opens is not logged, and an opening made during a slow
        // pass (9 299 000 -> 9 306 000) carries that pass's 7 ms gap.
        string[] events = Lines(Run("dotnet", Quote(HarnessOnCoreClr()))).Where(l => l.StartsWith("event ", StringComparison.Ordinal)).ToArray();
        Assert.Equal(new[] { "event mark at 4304000" }, events.Where(l => l.StartsWith("event mark", StringComparison.Ordinal)));
        Assert.Equal(new[] { "event brake-on at 6499000 gap 1000" }, events.Where(l => l.StartsWith("event brake-on", StringComparison.Ordinal)));
        Assert.Equal(new[] { "event brake-off at 9306000 gap 7000" }, events.Where(l => l.StartsWith("event brake-off", StringComparison.Ordinal)));
    }

    [Fact]
    public void TheHarnessRecordsBenchRestsThroughTheLoopsDebouncing()
    {
        // The harness's bench script (Harness.cs, BenchMarkChanges) against LOG-FORMAT.md 0x09 and
        // 0x0A: the press, held 3 s once staged, arms a rest (dated from the last bouncing contact,
        // 2 002 000); the release read at 5 203 000 opens it for its 5 s; a 1 s press arms nothing;
        // a second rest is ended by a pulse (outcome 1), and no run opens.
        string[] lines = Lines(Run("dotnet", Quote(HarnessOnCoreClr())));
        Assert.Contains("bench phase bench-rest at 5002000", lines);
        Assert.Contains("bench rests 2 runs 0", lines);
        Assert.Equal(
            new[] { "bench-rest 1 5203000 5000000 400000 8000 0 0", "bench-rest 2 16600000 5000000 400000 8000 0 0" },
            lines.Where(l => l.StartsWith("bench-rest ", StringComparison.Ordinal)));
        string[] ends = lines.Where(l => l.StartsWith("bench-rest-end ", StringComparison.Ordinal)).Select(l => l.Split(' ')).Select(f => string.Join(' ', f[1..4])).ToArray();
        Assert.Equal(new[] { "1 10203000 0", "2 18000000 1" }, ends);
    }

    /// <summary>The compared lines: everything but the step markers (#…), which an instrumented
    /// interpreter extends with its counters.</summary>
    private static string[] Lines(string output) =>
        output.Replace("\r", "", StringComparison.Ordinal).Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => !l.StartsWith('#')).ToArray();

    private static string Run(string file, string arguments, string? interpreter = null)
    {
        var info = new ProcessStartInfo(file, arguments)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        if (interpreter != null)
        {
            info.Environment["NANOCLR_POSIX"] = interpreter;
        }

        using Process process = Process.Start(info) ?? throw new InvalidOperationException(file + " did not start");
        process.StandardInput.Close();
        Task<string> error = process.StandardError.ReadToEndAsync();
        string output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"{file} {arguments} exited {process.ExitCode}: {error.Result}");
        return output;
    }

    private static string Quote(string path) => "\"" + path + "\"";

    private static string Configuration() =>
        typeof(RealRuntimeTests).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration ?? "Debug";

    private static string HarnessFolder() => Path.Combine(GatePaths.RepositoryRoot(), "firmware", "LaunchLogger.Firmware.NanoHarness");

    private static string Script() => Path.Combine(HarnessFolder(), "run-on-nanoclr.sh");

    private static string HarnessOnCoreClr()
    {
        string path = Path.Combine(HarnessFolder(), "bin", Configuration(), "net10.0", "LaunchLogger.Firmware.NanoHarness.dll");
        Assert.True(File.Exists(path), "the harness was not built: " + path);
        return path;
    }
}

/// <summary>A test that needs nanoFramework's interpreter and metadata processor: skipped, saying
/// so, unless both environment variables name them.</summary>
public sealed class RealRuntimeFactAttribute : FactAttribute
{
    public RealRuntimeFactAttribute()
    {
        string? clr = Environment.GetEnvironmentVariable("NANOCLR_POSIX");
        string? mdp = Environment.GetEnvironmentVariable("NANO_METADATA_PROCESSOR");
        if (string.IsNullOrEmpty(clr) || string.IsNullOrEmpty(mdp))
        {
            Skip = "nanoFramework's interpreter and metadata processor are not set up: set NANOCLR_POSIX and NANO_METADATA_PROCESSOR (DEVELOPERS.md, 'The firmware on nanoFramework's interpreter')";
        }
        else if (!File.Exists(clr))
        {
            Skip = "NANOCLR_POSIX names no file: " + clr;
        }
    }
}

/// <summary>A test that needs an interpreter built with instruction and allocation counters
/// (DEVELOPERS.md): skipped unless NANOCLR_POSIX_COUNTING and NANO_METADATA_PROCESSOR name the tools.</summary>
public sealed class CountingRuntimeFactAttribute : FactAttribute
{
    public CountingRuntimeFactAttribute()
    {
        string? clr = Environment.GetEnvironmentVariable("NANOCLR_POSIX_COUNTING");
        if (string.IsNullOrEmpty(clr) || string.IsNullOrEmpty(Environment.GetEnvironmentVariable("NANO_METADATA_PROCESSOR")))
        {
            Skip = "no counting build of nanoFramework's interpreter: set NANOCLR_POSIX_COUNTING and NANO_METADATA_PROCESSOR (DEVELOPERS.md, 'Counting instructions and allocations')";
        }
        else if (!File.Exists(clr))
        {
            Skip = "NANOCLR_POSIX_COUNTING names no file: " + clr;
        }
        else if (typeof(CountingRuntimeFactAttribute).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration != "Release")
        {
            // The budget is for the core as deployed; a Debug build carries about a third more IL.
            Skip = "the step budget is measured on the Release build: dotnet test -c Release";
        }
    }
}
