using System.Collections.Immutable;
using System.Reflection;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;
using System.Text.RegularExpressions;

namespace LaunchLogger.Firmware.Tests;

/// <summary>The firmware core must run on nanoFramework 1.x. The NanoCheck project compiles its
/// sources against nanoFramework's own mscorlib, but generics compile there and then fail on the
/// device (shared/HARDWARE-FACTS.md), so these tests read the built assembly's metadata
/// (ECMA-335 tables GenericParam 0x2A, TypeSpec 0x1B, MethodSpec 0x2B) and fail on any of them.</summary>
public class NanoFrameworkGateTests
{
    private const string GateAssemblyName = "LaunchLogger.Firmware.Nano.dll";

    [Fact]
    public void TheGateAssemblyHasNoGenericDefinitionsOrInstantiations()
    {
        using var pe = new PEReader(File.OpenRead(GateAssemblyPath()));
        MetadataReader reader = pe.GetMetadataReader();
        List<string> problems = GenericUses(reader);
        Assert.True(problems.Count == 0, "The firmware core uses generics, which nanoFramework 1.x cannot run:\n  " + string.Join("\n  ", problems));
    }

    [Fact]
    public void TheGateAssemblyReferencesOnlyNanoFrameworksMscorlib()
    {
        // Compiled against nanoFramework.CoreLibrary's lib/mscorlib.dll, not the .NET reference
        // assemblies: no System.Runtime, no netstandard.
        using var pe = new PEReader(File.OpenRead(GateAssemblyPath()));
        MetadataReader reader = pe.GetMetadataReader();
        var references = reader.AssemblyReferences.Select(h => reader.GetString(reader.GetAssemblyReference(h).Name)).ToList();
        Assert.Equal(new[] { "mscorlib" }, references);
    }

    [Fact]
    public void TheCheckerFindsGenericsWhereThereAreSome()
    {
        // Guard against a vacuous gate: this test assembly is full of generics.
        using var pe = new PEReader(File.OpenRead(typeof(NanoFrameworkGateTests).Assembly.Location));
        List<string> problems = GenericUses(pe.GetMetadataReader());
        Assert.Contains(problems, p => p.StartsWith("generic instantiation", StringComparison.Ordinal) && p.Contains("System.Collections.Generic.List`1<"));
        Assert.Contains(problems, p => p.StartsWith("generic parameter", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.StartsWith("generic method instantiation", StringComparison.Ordinal));
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
        string core = Path.Combine(RepositoryRoot(), "firmware", "LaunchLogger.Firmware");
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

    /// <summary>Every generic definition or instantiation in an assembly, named.</summary>
    private static List<string> GenericUses(MetadataReader reader)
    {
        var names = new TypeNameProvider();
        var problems = new List<string>();
        foreach (TypeDefinitionHandle th in reader.TypeDefinitions)
        {
            TypeDefinition type = reader.GetTypeDefinition(th);
            string typeName = names.GetTypeFromDefinition(reader, th, 0);
            foreach (GenericParameterHandle gp in type.GetGenericParameters())
            {
                problems.Add($"generic parameter {reader.GetString(reader.GetGenericParameter(gp).Name)} on type {typeName}");
            }

            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = reader.GetMethodDefinition(mh);
                foreach (GenericParameterHandle gp in method.GetGenericParameters())
                {
                    problems.Add($"generic parameter {reader.GetString(reader.GetGenericParameter(gp).Name)} on method {typeName}.{reader.GetString(method.Name)}");
                }
            }
        }

        int typeSpecs = reader.GetTableRowCount(TableIndex.TypeSpec);
        for (int row = 1; row <= typeSpecs; row++)
        {
            TypeSpecification spec = reader.GetTypeSpecification(MetadataTokens.TypeSpecificationHandle(row));
            problems.Add("generic instantiation " + spec.DecodeSignature(names, null));
        }

        int methodSpecs = reader.GetTableRowCount(TableIndex.MethodSpec);
        for (int row = 1; row <= methodSpecs; row++)
        {
            MethodSpecification spec = reader.GetMethodSpecification(MetadataTokens.MethodSpecificationHandle(row));
            string arguments = string.Join(",", spec.DecodeSignature(names, null));
            problems.Add($"generic method instantiation {MethodName(reader, names, spec.Method)}<{arguments}>");
        }

        int genericParams = reader.GetTableRowCount(TableIndex.GenericParam);
        if (genericParams > 0 && !problems.Any(p => p.StartsWith("generic parameter", StringComparison.Ordinal)))
        {
            problems.Add($"{genericParams} generic parameter rows");
        }

        return problems;
    }

    private static string MethodName(MetadataReader reader, TypeNameProvider names, EntityHandle method)
    {
        if (method.Kind == HandleKind.MethodDefinition)
        {
            MethodDefinition m = reader.GetMethodDefinition((MethodDefinitionHandle)method);
            return names.GetTypeFromDefinition(reader, m.GetDeclaringType(), 0) + "." + reader.GetString(m.Name);
        }

        MemberReference r = reader.GetMemberReference((MemberReferenceHandle)method);
        string parent = r.Parent.Kind switch
        {
            HandleKind.TypeReference => names.GetTypeFromReference(reader, (TypeReferenceHandle)r.Parent, 0),
            HandleKind.TypeDefinition => names.GetTypeFromDefinition(reader, (TypeDefinitionHandle)r.Parent, 0),
            HandleKind.TypeSpecification => names.GetTypeFromSpecification(reader, null, (TypeSpecificationHandle)r.Parent, 0),
            _ => "?",
        };
        return parent + "." + reader.GetString(r.Name);
    }

    private static string GateAssemblyPath()
    {
        // Built by the test project's ProjectReference (ReferenceOutputAssembly=false) in the same configuration.
        string configuration = typeof(NanoFrameworkGateTests).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration ?? "Debug";
        string path = Path.Combine(RepositoryRoot(), "firmware", "LaunchLogger.Firmware.NanoCheck", "bin", configuration, "netstandard2.0", GateAssemblyName);
        Assert.True(File.Exists(path), $"The nanoFramework gate assembly was not built: {path}");
        return path;
    }

    private static string RepositoryRoot()
    {
        for (DirectoryInfo? dir = new(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "LaunchLogger.sln")))
            {
                return dir.FullName;
            }
        }

        throw new InvalidOperationException("LaunchLogger.sln not found above " + AppContext.BaseDirectory);
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

    /// <summary>Names types from signatures for the failure message.</summary>
    private sealed class TypeNameProvider : ISignatureTypeProvider<string, object?>
    {
        public string GetArrayType(string elementType, ArrayShape shape) => elementType + "[" + new string(',', shape.Rank - 1) + "]";

        public string GetByReferenceType(string elementType) => elementType + "&";

        public string GetFunctionPointerType(MethodSignature<string> signature) => "method pointer";

        public string GetGenericInstantiation(string genericType, ImmutableArray<string> typeArguments) => genericType + "<" + string.Join(",", typeArguments) + ">";

        public string GetGenericMethodParameter(object? genericContext, int index) => "!!" + index;

        public string GetGenericTypeParameter(object? genericContext, int index) => "!" + index;

        public string GetModifiedType(string modifier, string unmodifiedType, bool isRequired) => unmodifiedType;

        public string GetPinnedType(string elementType) => elementType;

        public string GetPointerType(string elementType) => elementType + "*";

        public string GetPrimitiveType(PrimitiveTypeCode typeCode) => "System." + typeCode;

        public string GetSZArrayType(string elementType) => elementType + "[]";

        public string GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind)
        {
            TypeDefinition t = reader.GetTypeDefinition(handle);
            string name = Join(reader.GetString(t.Namespace), reader.GetString(t.Name));
            TypeDefinitionHandle outer = t.GetDeclaringType();
            return outer.IsNil ? name : GetTypeFromDefinition(reader, outer, rawTypeKind) + "+" + name;
        }

        public string GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind)
        {
            TypeReference t = reader.GetTypeReference(handle);
            return Join(reader.GetString(t.Namespace), reader.GetString(t.Name));
        }

        public string GetTypeFromSpecification(MetadataReader reader, object? genericContext, TypeSpecificationHandle handle, byte rawTypeKind) =>
            reader.GetTypeSpecification(handle).DecodeSignature(this, genericContext);

        private static string Join(string ns, string name) => ns.Length == 0 ? name : ns + "." + name;
    }
}
