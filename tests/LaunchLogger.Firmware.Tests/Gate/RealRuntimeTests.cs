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
        Assert.Equal(expected, Lines(onDevice));
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

    /// <summary>The compared lines: everything but the step markers (#…), which an instrumented
    /// interpreter extends with its counters.</summary>
    private static string[] Lines(string output) =>
        output.Replace("\r", "", StringComparison.Ordinal).Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => !l.StartsWith('#')).ToArray();

    private static string Run(string file, string arguments)
    {
        var info = new ProcessStartInfo(file, arguments)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
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
