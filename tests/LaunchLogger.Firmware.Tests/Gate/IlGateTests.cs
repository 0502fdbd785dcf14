using System.Reflection;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;
using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;

namespace LaunchLogger.Firmware.Tests.Gate;

/// <summary>The IL gate on the compiled core (the NanoCheck assembly, built against the device's
/// mscorlib), and proof that each of its checks fires: small bad samples are compiled here, with
/// Roslyn in memory where C# can say the thing, and emitted instruction by instruction where it
/// cannot (cpblk, jmp, ckfinite, …).</summary>
public class IlGateTests
{
    private const string CoreLoop = "LaunchLogger.Firmware.CaptureLoop";

    [Fact]
    public void TheCoreHasNothingTheDeviceRefusesOrRunsBadly()
    {
        using var pe = new PEReader(File.OpenRead(GatePaths.GateAssembly()));
        List<string> problems = new IlGate(pe, DeviceEnums.Value).Check();
        Assert.True(problems.Count == 0, "The firmware core, as the device would load it:\n  " + string.Join("\n  ", problems));
    }

    [Theory]
    [InlineData(CoreLoop, "Step")]
    [InlineData("LaunchLogger.Firmware.Capture.PolledPulseSource", "Poll")]
    [InlineData("LaunchLogger.Firmware.Capture.EdgeObservationQueue", "TryWriteEdge")]
    [InlineData("LaunchLogger.Firmware.Run.RunRecorder", "Shutdown")]
    public void NothingReachableFromTheCapturePathAllocates(string type, string method)
    {
        using var pe = new PEReader(File.OpenRead(GatePaths.GateAssembly()));
        List<string> problems = new IlGate(pe, DeviceEnums.Value).AllocationsReachableFrom(type, method);
        Assert.True(problems.Count == 0, $"Allocations reachable from {type}.{method}:\n  " + string.Join("\n  ", problems));
    }

    [Fact]
    public void TheCallGraphReachesTheRecorderThroughTheCaptureStep()
    {
        // Guard against a vacuous reachability check: a recorder method that allocated would be
        // found through the loop's step, the source interface and the recorder.
        var found = new IlGate(Sample.Compile(SampleSources.Allocating), DeviceEnums.Value).AllocationsReachableFrom("Bad.Loop", "Step");
        Assert.Contains(found, p => p.StartsWith(IlGate.Allocation + ": newarr", StringComparison.Ordinal) && p.Contains("Bad.Loop.Helper"));
        Assert.Contains(found, p => p.StartsWith(IlGate.Allocation + ": box", StringComparison.Ordinal));
        Assert.Contains(found, p => p.StartsWith(IlGate.Allocation + ": newobj", StringComparison.Ordinal) && p.Contains("Bad.Other"));
        Assert.Contains(found, p => p.Contains("Bad.Source.TryRead", StringComparison.Ordinal)); // through the interface
        Assert.Contains(found, p => p.Contains("Bad.Base.Hook", StringComparison.Ordinal) || p.Contains("Bad.Derived.Hook", StringComparison.Ordinal));
        Assert.DoesNotContain(found, p => p.Contains("InvalidOperationException", StringComparison.Ordinal)); // built to be thrown
        Assert.DoesNotContain(found, p => p.Contains("Bad.Loop.NotCalled", StringComparison.Ordinal));
    }

    public static TheoryData<string, string> BadSamples => new()
    {
        { IlGate.StructParameter, "Bad.ByValue.Take takes Bad.Pair" },
        { IlGate.StructReturn, "Bad.ByValue.Make returns Bad.Pair" },
        { IlGate.StructLocal, "Bad.Pair in Bad.ByValue.Local" },
        { IlGate.StructLoad, "ldelem of Bad.Pair in Bad.ByValue.Local" },
        { IlGate.StructLoad, "ldfld of Bad.Pair in Bad.ByValue.Make" },
        { IlGate.StructLoad, "of Bad.Pair in Bad.ByValue.Pass" },
        { IlGate.CheckedArithmetic, "add.ovf in Bad.Checked.Add" },
        { IlGate.CheckedArithmetic, "conv.ovf" },
        { IlGate.PointerSignature, "System.Int32* in parameter 0 of Bad.Pointers.Read" },
        { IlGate.FunctionPointerSignature, "Bad.Pointers.Call" },
        { IlGate.RefusedInstruction, "calli in Bad.Pointers.Call" },
        { IlGate.RefusedInstruction, "localloc in Bad.Pointers.Stack" },
        { IlGate.MultiDimensionalArray, "System.Int32[,] in parameter 0 of Bad.Grid.Cell" },
        { IlGate.GenericParameter, "T on Bad.Holder`1" },
        { IlGate.GenericParameter, "U on Bad.Uses.Same" },
        { IlGate.GenericTypeInstantiation, "Bad.Holder`1<System.Int32>" },
        { IlGate.GenericMethodInstantiation, "Bad.Uses.Same<System.Int32>" },
    };

    [Theory]
    [MemberData(nameof(BadSamples))]
    public void EachCheckFailsOnABadSample(string category, string detail)
    {
        List<string> problems = new IlGate(Sample.Compile(SampleSources.Bad), DeviceEnums.Value).Check();
        Assert.Contains(problems, p => p.StartsWith(category + ":", StringComparison.Ordinal) && p.Contains(detail, StringComparison.Ordinal));
    }

    [Fact]
    public void ATypeSpecThatIsNotGenericPassesAndRightUsesOfStructsPass()
    {
        // new int[3][] is written through a TypeSpec (an array of arrays); a struct reached only by
        // reference, field by field, is what the core does.
        List<string> problems = new IlGate(Sample.Compile(SampleSources.Fine), DeviceEnums.Value).Check();
        Assert.True(problems.Count == 0, string.Join("\n", problems));
        using PEReader pe = Sample.Compile(SampleSources.Fine);
        Assert.True(pe.GetMetadataReader().GetTableRowCount(TableIndex.TypeSpec) > 0, "the sample should contain a TypeSpec");
    }

    [Fact]
    public void AnInterfaceMethodWithABodyFails()
    {
        // The device's mscorlib has no runtime-feature flag for it, so this sample is compiled
        // against the host's reference assemblies.
        List<string> problems = new IlGate(Sample.Compile(SampleSources.DefaultInterfaceMethod, againstDevice: false), new HashSet<string>()).Check();
        Assert.Contains(problems, p => p.StartsWith(IlGate.InterfaceMethodWithBody + ": Bad.IShape.Area", StringComparison.Ordinal));
        Assert.DoesNotContain(problems, p => p.Contains("Bad.IShape.Sides", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("localloc")]
    [InlineData("calli")]
    [InlineData("cpblk")]
    [InlineData("initblk")]
    [InlineData("jmp")]
    [InlineData("arglist")]
    [InlineData("mkrefany")]
    [InlineData("refanyval")]
    [InlineData("refanytype")]
    [InlineData("ckfinite")]
    public void EachRefusedInstructionFails(string opcode)
    {
        using var pe = new PEReader(ImmutableArrayOf(RefusedInstructionsAssembly.Emit()));
        List<string> problems = new IlGate(pe, new HashSet<string>()).Check();
        Assert.Contains(IlGate.RefusedInstruction + ": " + opcode + " in Bad.Refused.Uses_" + opcode.Replace('.', '_') + " (IL_0000)", problems);
        Assert.DoesNotContain(problems, p => p.Contains("Bad.Refused.Plain", StringComparison.Ordinal));
    }

    private static System.Collections.Immutable.ImmutableArray<byte> ImmutableArrayOf(byte[] bytes) => System.Collections.Immutable.ImmutableArray.Create(bytes);

    private static readonly Lazy<HashSet<string>> DeviceEnums = new(() => IlGate.EnumsOf(GatePaths.DeviceMscorlib()));

    /// <summary>Bad samples: each line breaks one rule the gate must catch.</summary>
    private static class SampleSources
    {
        public const string Bad = """
            namespace Bad
            {
                public struct Pair { public int A; public long B; }

                public sealed class ByValue
                {
                    private readonly Pair[] items = new Pair[2];
                    private Pair field;
                    public long Take(Pair p) { return p.B; }
                    public Pair Make() { return field; }
                    public long Local() { Pair copy = items[0]; return copy.B; }
                    public long Pass() { return Take(items[1]); }
                }

                public static class Checked
                {
                    public static int Add(int a, int b) { return checked(a + b); }
                    public static byte Narrow(int a) { return checked((byte)a); }
                }

                public static unsafe class Pointers
                {
                    public static int Read(int* p) { return *p; }
                    public static int Call(delegate*<int, int> f) { return f(1); }
                    public static int Stack() { int* p = stackalloc int[4]; p[0] = 1; return p[0]; }
                }

                public static class Grid
                {
                    public static int Cell(int[,] g) { return g[0, 0]; }
                }

                public sealed class Holder<T> { public T Value; }

                public static class Uses
                {
                    public static int Get() { return new Holder<int>().Value; }
                    public static U Same<U>(U x) { return x; }
                    public static int Call() { return Same(3); }
                }
            }
            """;

        public const string Fine = """
            namespace Bad
            {
                public struct Pair { public int A; public long B; }

                public sealed class Fine
                {
                    private readonly Pair[] items = new Pair[2];
                    private Pair current;
                    public int[][] Jagged() { return new int[3][]; }
                    public static void Copy(Pair[] from, int i, out Pair to) { to.A = from[i].A; to.B = from[i].B; }
                    public long Use(ref Pair p) { return p.B + p.A; }
                    public long Step() { Copy(items, 1, out current); return Use(ref current) + unchecked(current.A * 3); }
                }
            }
            """;

        public const string Allocating = """
            namespace Bad
            {
                public interface ISource { bool TryRead(int[] into); }
                public sealed class Source : ISource { public bool TryRead(int[] into) { into = new int[1]; return true; } }
                public class Base { public virtual void Hook() { } }
                public sealed class Derived : Base { public override void Hook() { object o = new Other(); } }
                public sealed class Other { }

                public sealed class Loop
                {
                    private readonly ISource source = new Source();
                    private readonly Base hook = new Derived();
                    private readonly int[] buffer = new int[1];
                    private int[] last;
                    public void Step() { Helper(); source.TryRead(buffer); hook.Hook(); }
                    private void Helper()
                    {
                        last = new int[4];
                        object boxed = 5;
                        if (boxed == null) { throw new System.InvalidOperationException("never"); }
                    }
                    public void NotCalled() { last = new int[9]; }
                }
            }
            """;

        public const string DefaultInterfaceMethod = """
            namespace Bad
            {
                public interface IShape
                {
                    int Sides();
                    int Area() { return Sides() * 2; }
                }
            }
            """;
    }

    private static class Sample
    {
        public static PEReader Compile(string source, bool againstDevice = true)
        {
            IEnumerable<MetadataReference> references = againstDevice
                ? new[] { MetadataReference.CreateFromFile(GatePaths.DeviceMscorlib()) }
                : ((string)AppContext.GetData("TRUSTED_PLATFORM_ASSEMBLIES")!).Split(Path.PathSeparator).Select(p => MetadataReference.CreateFromFile(p));
            var compilation = CSharpCompilation.Create(
                "BadSample",
                new[] { CSharpSyntaxTree.ParseText(source, new CSharpParseOptions(againstDevice ? LanguageVersion.CSharp9 : LanguageVersion.Latest)) },
                references,
                new CSharpCompilationOptions(OutputKind.DynamicallyLinkedLibrary, allowUnsafe: true));
            using var stream = new MemoryStream();
            var result = compilation.Emit(stream);
            Assert.True(result.Success, "bad sample did not compile:\n" + string.Join("\n", result.Diagnostics.Where(d => d.Severity == DiagnosticSeverity.Error)));
            return new PEReader(System.Collections.Immutable.ImmutableArray.Create(stream.ToArray()));
        }
    }

    /// <summary>An assembly whose methods each hold one instruction C# never emits (or only emits
    /// in unsafe code), then <c>ret</c>; and one plain method.</summary>
    private static class RefusedInstructionsAssembly
    {
        public static byte[] Emit()
        {
            var mb = new MetadataBuilder();
            mb.AddModule(0, mb.GetOrAddString("Refused.dll"), mb.GetOrAddGuid(new Guid("6c1a4a52-0d62-4c62-9d2e-2d9a8f0a1b11")), default, default);
            mb.AddAssembly(mb.GetOrAddString("Refused"), new Version(1, 0, 0, 0), default, default, 0, AssemblyHashAlgorithm.None);
            AssemblyReferenceHandle corlib = mb.AddAssemblyReference(mb.GetOrAddString("mscorlib"), new Version(1, 0, 0, 0), default, default, 0, default);
            TypeReferenceHandle objectRef = mb.AddTypeReference(corlib, mb.GetOrAddString("System"), mb.GetOrAddString("Object"));
            TypeReferenceHandle int32Ref = mb.AddTypeReference(corlib, mb.GetOrAddString("System"), mb.GetOrAddString("Int32"));
            var sigBlob = new BlobBuilder();
            new BlobEncoder(sigBlob).MethodSignature().Parameters(0, r => r.Void(), _ => { });
            BlobHandle voidSig = mb.GetOrAddBlob(sigBlob);
            StandaloneSignatureHandle calliSig = mb.AddStandaloneSignature(voidSig);

            var il = new BlobBuilder();
            var bodies = new MethodBodyStreamEncoder(il);
            (string Name, ILOpCode Op, Action<InstructionEncoder>? Operand)[] methods =
            {
                ("Plain", ILOpCode.Nop, null),
                ("Uses_localloc", ILOpCode.Localloc, null),
                ("Uses_calli", ILOpCode.Calli, e => e.Token(calliSig)),
                ("Uses_cpblk", ILOpCode.Cpblk, null),
                ("Uses_initblk", ILOpCode.Initblk, null),
                ("Uses_jmp", ILOpCode.Jmp, e => e.Token(MetadataTokens.MethodDefinitionHandle(1))),
                ("Uses_arglist", ILOpCode.Arglist, null),
                ("Uses_mkrefany", ILOpCode.Mkrefany, e => e.Token(int32Ref)),
                ("Uses_refanyval", ILOpCode.Refanyval, e => e.Token(int32Ref)),
                ("Uses_refanytype", ILOpCode.Refanytype, null),
                ("Uses_ckfinite", ILOpCode.Ckfinite, null),
            };
            mb.AddTypeDefinition(default, default, mb.GetOrAddString("<Module>"), default, MetadataTokens.FieldDefinitionHandle(1), MetadataTokens.MethodDefinitionHandle(1));
            foreach (var (name, op, operand) in methods)
            {
                var encoder = new InstructionEncoder(new BlobBuilder());
                encoder.OpCode(op);
                operand?.Invoke(encoder);
                encoder.OpCode(ILOpCode.Ret);
                int offset = bodies.AddMethodBody(encoder);
                mb.AddMethodDefinition(MethodAttributes.Public | MethodAttributes.Static | MethodAttributes.HideBySig, MethodImplAttributes.IL, mb.GetOrAddString(name), voidSig, offset, default);
            }

            mb.AddTypeDefinition(
                TypeAttributes.Public | TypeAttributes.Abstract | TypeAttributes.Sealed | TypeAttributes.Class,
                mb.GetOrAddString("Bad"),
                mb.GetOrAddString("Refused"),
                objectRef,
                MetadataTokens.FieldDefinitionHandle(1),
                MetadataTokens.MethodDefinitionHandle(1));
            var builder = new ManagedPEBuilder(new PEHeaderBuilder(imageCharacteristics: Characteristics.Dll), new MetadataRootBuilder(mb), il);
            var blob = new BlobBuilder();
            builder.Serialize(blob);
            return blob.ToArray();
        }
    }
}

/// <summary>Where the gate assembly and the device's mscorlib are.</summary>
internal static class GatePaths
{
    public const string GateAssemblyName = "LaunchLogger.Firmware.Nano.dll";

    public static string GateFolder()
    {
        // Built by the test project's ProjectReference (ReferenceOutputAssembly=false) in the same configuration.
        string configuration = typeof(GatePaths).Assembly.GetCustomAttribute<AssemblyConfigurationAttribute>()?.Configuration ?? "Debug";
        return Path.Combine(RepositoryRoot(), "firmware", "LaunchLogger.Firmware.NanoCheck", "bin", configuration, "netstandard2.0");
    }

    public static string GateAssembly()
    {
        string path = Path.Combine(GateFolder(), GateAssemblyName);
        Assert.True(File.Exists(path), $"The nanoFramework gate assembly was not built: {path}");
        return path;
    }

    /// <summary>nanoFramework.CoreLibrary's lib/mscorlib.dll, copied beside the gate assembly.</summary>
    public static string DeviceMscorlib()
    {
        string path = Path.Combine(GateFolder(), "mscorlib.dll");
        Assert.True(File.Exists(path), $"The device's mscorlib was not copied beside the gate assembly: {path}");
        return path;
    }

    public static string RepositoryRoot()
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
}
