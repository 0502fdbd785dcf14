using System.Reflection.Metadata;
using System.Reflection.PortableExecutable;
using System.Text.RegularExpressions;

using LaunchLogger.Firmware.Tests.Gate;

namespace LaunchLogger.Firmware.Tests;

/// <summary>The firmware core must run on nanoFramework 1.x. The NanoCheck project compiles its
/// sources against nanoFramework's own mscorlib; these tests check what it references and scan
/// the sources. What compiles but does not run (generics, by-value structs, refused IL) is the
/// IL gate's job (Gate/IlGateTests).</summary>
public class NanoFrameworkGateTests
{
    [Fact]
    public void TheGateAssemblyReferencesOnlyNanoFrameworksMscorlib()
    {
        // Compiled against nanoFramework.CoreLibrary's lib/mscorlib.dll, not the .NET reference
        // assemblies: no System.Runtime, no netstandard.
        using var pe = new PEReader(File.OpenRead(GatePaths.GateAssembly()));
        MetadataReader reader = pe.GetMetadataReader();
        var references = reader.AssemblyReferences.Select(h => reader.GetString(reader.GetAssemblyReference(h).Name)).ToList();
        Assert.Equal(new[] { "mscorlib" }, references);
    }

    // shared/HARDWARE-FACTS.md and the helper rules: no LINQ, System.Math, async, Span,
    // stackalloc, string interpolation, generic collections, StringBuilder; delegates typed
    // Func/Action compile but do not run on the 1.x runtime.
    private static readonly (string Name, Regex Pattern)[] Forbidden =
        {
            ("System.Linq", new Regex(@"\bSystem\.Linq\b")),
            ("Math.", new Regex(@"\bMath\.")),
            ("async", new Regex(@"\basync\s")),
            ("await", new Regex(@"\bawait\s")),
            ("Span<", new Regex(@"\bSpan<")),
            ("stackalloc", new Regex(@"\bstackalloc\b")),
            ("string interpolation $\"", new Regex("(\\$@?\"|@\\$\")")),
            ("List<", new Regex(@"\bList<")),
            ("Dictionary<", new Regex(@"\bDictionary<")),
            ("StringBuilder", new Regex(@"\bStringBuilder\b")),
            ("Func<", new Regex(@"\bFunc<")),
            ("Action<", new Regex(@"\bAction<")),
        };

    [Fact]
    public void TheCoreSourcesAvoidConstructsNanoFrameworkLacks()
    {
        string core = Path.Combine(GatePaths.RepositoryRoot(), "firmware", "LaunchLogger.Firmware");
        var files = Directory.EnumerateFiles(core, "*.cs", SearchOption.AllDirectories)
            .Where(f => !IsBuildOutput(core, f))
            .ToList();
        Assert.NotEmpty(files);

        var problems = files.SelectMany(f => ScanSource(Path.GetRelativePath(core, f), File.ReadAllLines(f))).ToList();
        Assert.True(problems.Count == 0, "Forbidden constructs in the firmware core:\n  " + string.Join("\n  ", problems));
    }

    [Fact]
    public void TheSourceScanFindsEachForbiddenConstructButIgnoresComments()
    {
        string[] lines =
        {
            "using System.Linq;",
            "int a = Math.Abs(b);",
            "async Task Go() { await x; }",
            "Span<byte> s = stackalloc byte[4];",
            "string t = $\"{a}\"; string u = @$\"{a}\";",
            "var l = new List<int>(); var d = new Dictionary<int, int>();",
            "var sb = new StringBuilder(); Func<int> f = null; Action<int> g = null;",
            "int ok = 1; // Math.Abs, List<int> and $\"x\" in a comment are fine",
            "/// <summary>System.Linq in a doc comment</summary>",
            "string url = \"http://host/Math.x\";",
        };
        var found = ScanSource("Sample.cs", lines);
        foreach (var (name, _) in Forbidden)
        {
            Assert.Contains(found, p => p.Contains(": " + name + " is not available", StringComparison.Ordinal));
        }

        Assert.DoesNotContain(found, p => p.StartsWith("Sample.cs:8:", StringComparison.Ordinal) || p.StartsWith("Sample.cs:9:", StringComparison.Ordinal));
        Assert.Contains(found, p => p.StartsWith("Sample.cs:10:", StringComparison.Ordinal));
    }

    private static IEnumerable<string> ScanSource(string name, string[] lines)
    {
        for (int i = 0; i < lines.Length; i++)
        {
            string code = WithoutLineComment(lines[i]);
            foreach (var (construct, pattern) in Forbidden.Where(f => f.Pattern.IsMatch(code)))
            {
                yield return $"{name}:{i + 1}: {construct} is not available on nanoFramework: {lines[i].Trim()}";
            }
        }
    }

    private static bool IsBuildOutput(string root, string file)
    {
        string relative = Path.GetRelativePath(root, file).Replace('\\', '/');
        return relative.StartsWith("bin/", StringComparison.Ordinal) || relative.StartsWith("obj/", StringComparison.Ordinal);
    }

    /// <summary>Drops a // comment (doc comments included) unless the slashes sit inside a string.</summary>
    private static string WithoutLineComment(string line)
    {
        bool inString = false;
        for (int i = 0; i < line.Length - 1; i++)
        {
            if (line[i] == '"' && (i == 0 || line[i - 1] != '\\'))
            {
                inString = !inString;
            }
            else if (!inString && line[i] == '/' && line[i + 1] == '/')
            {
                return line[..i];
            }
        }

        return line;
    }
}
