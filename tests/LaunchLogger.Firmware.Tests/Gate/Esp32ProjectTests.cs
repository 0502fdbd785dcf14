using System.Diagnostics;
using System.Reflection;
using System.Reflection.PortableExecutable;
using System.Xml.Linq;

namespace LaunchLogger.Firmware.Tests.Gate;

/// <summary>The ESP32 application is built by the nanoFramework project system
/// (firmware/esp32/LaunchLogger.Esp32.nfproj) and compile-checked by an SDK-style project
/// (firmware/esp32/Check), which needs class libraries CI cannot restore. These tests keep the two
/// describing the same build: the same source files and the same pinned assemblies.</summary>
public class Esp32ProjectTests
{
    private static readonly XNamespace MsBuild = "http://schemas.microsoft.com/developer/msbuild/2003";

    [Fact]
    public void TheNanoFrameworkProjectListsEveryApplicationSourceAndNoOther()
    {
        // The check compiles every .cs in the folder (Check/ aside); the device build, only those
        // the .nfproj lists. A file left out of either would pass one build and not the other.
        string esp32 = Esp32Folder();
        string[] onDisk = Directory.EnumerateFiles(esp32, "*.cs", SearchOption.AllDirectories)
            .Select(f => Path.GetRelativePath(esp32, f).Replace('\\', '/'))
            .Where(f => !f.StartsWith("Check/", StringComparison.Ordinal) && !f.Contains("/obj/", StringComparison.Ordinal) && !f.Contains("/bin/", StringComparison.Ordinal))
            .Order(StringComparer.Ordinal)
            .ToArray();
        string[] listed = NfProject().Descendants(MsBuild + "Compile")
            .Select(c => ((string)c.Attribute("Include")!).Replace('\\', '/'))
            .Where(f => !f.StartsWith("../", StringComparison.Ordinal))
            .Order(StringComparer.Ordinal)
            .ToArray();

        Assert.NotEmpty(onDisk);
        Assert.Equal(onDisk, listed);
        Assert.Contains("Glue/PolledInput.cs", listed);
    }

    [Fact]
    public void TheCheckReferencesTheAssembliesOfThePinnedPackages()
    {
        // packages.config pins the versions; the .nfproj names each package's assembly by a hint
        // path packages/<id>.<version>/lib/<assembly>.dll; the check must reference the same ones.
        XDocument config = XDocument.Load(Path.Combine(Esp32Folder(), "packages.config"));
        string[] pinned = config.Descendants("package")
            .Select(p => (string)p.Attribute("id")! + "." + (string)p.Attribute("version")!)
            .Order(StringComparer.Ordinal)
            .ToArray();
        var hints = NfProject().Descendants(MsBuild + "HintPath")
            .Select(h => h.Value.Replace('\\', '/').Split('/'))
            .ToArray();
        Assert.Equal(pinned, hints.Select(parts => parts[1]).Order(StringComparer.Ordinal));

        string[] nfAssemblies = hints
            .Select(parts => Path.GetFileNameWithoutExtension(parts[^1]))
            .Where(a => a != "mscorlib")
            .Order(StringComparer.Ordinal)
            .ToArray();
        XDocument check = XDocument.Load(Path.Combine(Esp32Folder(), "Check", "LaunchLogger.Esp32.Check.csproj"));
        string[] checkAssemblies = check.Descendants("NanoLibrary")
            .SelectMany(n => ((string)n.Attribute("Include")!).Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            .Order(StringComparer.Ordinal)
            .ToArray();
        Assert.Equal(nfAssemblies, checkAssemblies);

        // The core's mscorlib: the check restores the same CoreLibrary as the nanoFramework gate.
        string coreLibrary = check.Descendants("PackageReference")
            .Single(p => (string?)p.Attribute("Include") == "nanoFramework.CoreLibrary")
            .Attribute("Version")!.Value;
        Assert.Contains("nanoFramework.CoreLibrary." + coreLibrary, pinned);
    }

    [Esp32LibrariesFact]
    public void TheApplicationCompilesAndPassesTheIlGate()
    {
        string configuration = typeof(Esp32ProjectTests).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration ?? "Debug";
        string project = Path.Combine(Esp32Folder(), "Check");
        string libraries = Environment.GetEnvironmentVariable("NANO_LIBRARIES")!;
        var info = new ProcessStartInfo("dotnet", $"build \"{project}\" -c {configuration} -nologo -p:NanoLibraries=\"{libraries}\"")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        using (Process build = Process.Start(info)!)
        {
            Task<string> error = build.StandardError.ReadToEndAsync();
            string output = build.StandardOutput.ReadToEnd();
            build.WaitForExit();
            Assert.True(build.ExitCode == 0, "the ESP32 application does not compile:\n" + output + error.Result);
        }

        string bin = Path.Combine(project, "bin", configuration, "netstandard2.0");
        var enums = IlGate.EnumsOf(Path.Combine(bin, "mscorlib.dll"));
        foreach (string library in Directory.EnumerateFiles(libraries, "*.dll"))
        {
            enums.UnionWith(IlGate.EnumsOf(library));
        }

        using var pe = new PEReader(File.OpenRead(Path.Combine(bin, "LaunchLogger.Esp32.dll")));
        var gate = new IlGate(pe, enums);
        List<string> problems = gate.Check();
        problems.AddRange(gate.AllocationsReachableFrom("LaunchLogger.Firmware.CaptureLoop", "Step"));
        string[] ours = problems.Where(p => !PlatformStructReturns.Any(p.StartsWith)).ToArray();
        Assert.True(ours.Length == 0, "The ESP32 application, as the device would load it:\n  " + string.Join("\n  ", ours));
    }

    /// <summary>The gate's findings that the nanoFramework class libraries impose: their methods
    /// return these structs (a pin's level, a pulse count, an I2C transfer's result, the span an
    /// I2C transfer takes), so the call that returns one cannot be avoided. The glue keeps them
    /// in fields and passes none on; every other finding fails.</summary>
    private static readonly string[] PlatformStructReturns = new[] { "System.Device.Gpio.PinValue", "System.Device.Gpio.GpioPulseCount", "System.Device.I2c.I2cTransferResult", "System.SpanByte" }
        .SelectMany(t => new[] { $"{IlGate.StructLoad}: call of {t} in ", $"{IlGate.StructLoad}: callvirt of {t} in " })
        .ToArray();

    private static string Esp32Folder() => Path.Combine(GatePaths.RepositoryRoot(), "firmware", "esp32");

    private static XDocument NfProject() => XDocument.Load(Path.Combine(Esp32Folder(), "LaunchLogger.Esp32.nfproj"));
}

/// <summary>A test that needs the pinned nanoFramework class libraries' assemblies (the registry
/// does not serve them): skipped unless NANO_LIBRARIES names their folder (DEVELOPERS.md, "The
/// ESP32 application's compile check").</summary>
public sealed class Esp32LibrariesFactAttribute : FactAttribute
{
    public Esp32LibrariesFactAttribute()
    {
        string? folder = Environment.GetEnvironmentVariable("NANO_LIBRARIES");
        if (string.IsNullOrEmpty(folder))
        {
            Skip = "the nanoFramework class libraries are not set up: set NANO_LIBRARIES (DEVELOPERS.md, 'The ESP32 application's compile check')";
        }
        else if (!Directory.Exists(folder))
        {
            Skip = "NANO_LIBRARIES names no folder: " + folder;
        }
    }
}
