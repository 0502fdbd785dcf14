using System.Collections.Immutable;
using System.Reflection;
using System.Reflection.Emit;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;

namespace LaunchLogger.Firmware.Tests.Gate;

/// <summary>Reads a compiled assembly's metadata and IL the way nanoFramework's metadata processor
/// and interpreter will meet it, and lists what the device cannot run or runs badly.</summary>
/// <remarks>
/// Facts from shared/HARDWARE-FACTS.md (seen on the interpreter's POSIX build): every by-value load
/// of a struct copies it into a new heap object, struct locals are allocated on method entry;
/// localloc, calli, cpblk, initblk, jmp, arglist, mkrefany, refanyval, refanytype and ckfinite are
/// refused; checked (.ovf) arithmetic does not trap; generic types and methods and
/// multi-dimensional arrays pass the metadata processor but fail at load. Opcode values and table
/// layouts: ECMA-335 6th edition, Partition III (instructions) and Partition II §23.2 (signatures).
/// Every finding starts with its category so tests can tell them apart.
/// </remarks>
internal sealed class IlGate
{
    public const string RefusedInstruction = "refused instruction";
    public const string CheckedArithmetic = "checked arithmetic";
    public const string PointerSignature = "pointer type";
    public const string FunctionPointerSignature = "function pointer type";
    public const string MultiDimensionalArray = "multi-dimensional array";
    public const string InterfaceMethodWithBody = "interface method with a body";
    public const string GenericParameter = "generic parameter";
    public const string GenericMethodInstantiation = "generic method instantiation";
    public const string GenericTypeInstantiation = "generic type instantiation";
    public const string StructParameter = "struct passed by value";
    public const string StructReturn = "struct returned by value";
    public const string StructLocal = "struct local";
    public const string StructLoad = "by-value struct load";
    public const string Allocation = "allocation reachable";

    private static readonly HashSet<string> Refused = new(StringComparer.Ordinal)
    {
        "localloc", "calli", "cpblk", "initblk", "jmp", "arglist", "mkrefany", "refanyval", "refanytype", "ckfinite",
    };

    private static readonly Dictionary<ushort, OpCode> OpCodesByValue = typeof(OpCodes)
        .GetFields(BindingFlags.Public | BindingFlags.Static)
        .Select(f => (OpCode)f.GetValue(null)!)
        .ToDictionary(o => (ushort)o.Value, o => o);

    private readonly PEReader pe;
    private readonly MetadataReader reader;
    private readonly Shapes shapes;

    /// <param name="pe">The assembly to check.</param>
    /// <param name="externalEnums">Full names of enums in referenced assemblies (value types that
    /// are not structs); any other referenced value type counts as a struct.</param>
    public IlGate(PEReader pe, ISet<string> externalEnums)
    {
        this.pe = pe;
        reader = pe.GetMetadataReader();
        shapes = new Shapes(externalEnums);
    }

    /// <summary>The full names of the enums an assembly (a referenced mscorlib) defines.</summary>
    public static HashSet<string> EnumsOf(string assemblyPath)
    {
        using var pe = new PEReader(File.OpenRead(assemblyPath));
        MetadataReader r = pe.GetMetadataReader();
        var enums = new HashSet<string>(StringComparer.Ordinal);
        foreach (TypeDefinitionHandle h in r.TypeDefinitions)
        {
            TypeDefinition t = r.GetTypeDefinition(h);
            if (BaseTypeName(r, t) == "System.Enum")
            {
                enums.Add(Join(r.GetString(t.Namespace), r.GetString(t.Name)));
            }
        }

        return enums;
    }

    /// <summary>Every finding over the whole assembly (all but reachability).</summary>
    public List<string> Check()
    {
        var problems = new List<string>();
        CheckGenerics(problems);
        foreach (TypeDefinitionHandle th in reader.TypeDefinitions)
        {
            TypeDefinition type = reader.GetTypeDefinition(th);
            string typeName = shapes.GetTypeFromDefinition(reader, th, 0).Name;
            bool isInterface = (type.Attributes & TypeAttributes.Interface) != 0;
            foreach (FieldDefinitionHandle fh in type.GetFields())
            {
                FieldDefinition field = reader.GetFieldDefinition(fh);
                Shape f = field.DecodeSignature(shapes, null);
                ReportSignature(problems, f, $"field {typeName}.{reader.GetString(field.Name)}");
            }

            foreach (MethodDefinitionHandle mh in type.GetMethods())
            {
                MethodDefinition method = reader.GetMethodDefinition(mh);
                string name = $"{typeName}.{reader.GetString(method.Name)}";
                if (isInterface && method.RelativeVirtualAddress != 0)
                {
                    problems.Add($"{InterfaceMethodWithBody}: {name}");
                }

                MethodSignature<Shape> sig = method.DecodeSignature(shapes, null);
                ReportSignature(problems, sig.ReturnType, "return of " + name);
                if (sig.ReturnType.IsStruct)
                {
                    problems.Add($"{StructReturn}: {name} returns {sig.ReturnType.Name}");
                }

                for (int i = 0; i < sig.ParameterTypes.Length; i++)
                {
                    Shape p = sig.ParameterTypes[i];
                    ReportSignature(problems, p, $"parameter {i} of {name}");
                    if (p.IsStruct)
                    {
                        problems.Add($"{StructParameter}: {name} takes {p.Name} (pass it by ref)");
                    }
                }

                if (method.RelativeVirtualAddress != 0)
                {
                    CheckBody(problems, method, name);
                }
            }
        }

        foreach (MemberReferenceHandle rh in reader.MemberReferences)
        {
            MemberReference member = reader.GetMemberReference(rh);
            string name = "reference " + reader.GetString(member.Name);
            if (member.GetKind() == MemberReferenceKind.Method)
            {
                MethodSignature<Shape> sig = member.DecodeMethodSignature(shapes, null);
                ReportSignature(problems, sig.ReturnType, name);
                foreach (Shape p in sig.ParameterTypes)
                {
                    ReportSignature(problems, p, name);
                }
            }
            else
            {
                ReportSignature(problems, member.DecodeFieldSignature(shapes, null), name);
            }
        }

        return problems.Distinct().ToList();
    }

    /// <summary><c>newobj</c>, <c>newarr</c> and <c>box</c> in every method reachable by calls
    /// from <paramref name="typeName"/>.<paramref name="methodName"/> within this assembly. A call
    /// through an interface or a virtual method reaches every method of that name in the types
    /// that implement or derive from its declaring type. An object built only to be thrown
    /// (newobj directly followed by throw) is not counted: that path ends the loop anyway.</summary>
    public List<string> AllocationsReachableFrom(string typeName, string methodName)
    {
        var start = AllMethods().Where(m => m.TypeName == typeName && m.MethodName == methodName).Select(m => m.Handle).ToList();
        if (start.Count == 0)
        {
            throw new InvalidOperationException($"no method {typeName}.{methodName}");
        }

        var seen = new HashSet<MethodDefinitionHandle>(start);
        var queue = new Queue<MethodDefinitionHandle>(start);
        var problems = new List<string>();
        while (queue.Count > 0)
        {
            MethodDefinitionHandle mh = queue.Dequeue();
            MethodDefinition method = reader.GetMethodDefinition(mh);
            if (method.RelativeVirtualAddress == 0)
            {
                continue;
            }

            string name = NameOf(mh);
            List<Instruction> code = Decode(method);
            for (int i = 0; i < code.Count; i++)
            {
                Instruction ins = code[i];
                string op = ins.OpCode.Name!;
                bool thrownAway = op == "newobj" && i + 1 < code.Count && code[i + 1].OpCode.Name == "throw";
                if ((op == "newobj" && !thrownAway) || op == "newarr" || op == "box")
                {
                    problems.Add($"{Allocation}: {op} {TokenName(ins.Token)} in {name} (IL_{ins.Offset:X4})");
                }

                if (op is "call" or "callvirt" or "newobj" or "ldftn" or "ldvirtftn")
                {
                    foreach (MethodDefinitionHandle target in Targets(ins.Token, op == "callvirt"))
                    {
                        if (seen.Add(target))
                        {
                            queue.Enqueue(target);
                        }
                    }
                }
            }
        }

        return problems;
    }

    private void CheckGenerics(List<string> problems)
    {
        foreach (GenericParameterHandle gp in Enumerable.Range(1, reader.GetTableRowCount(TableIndex.GenericParam)).Select(MetadataTokens.GenericParameterHandle))
        {
            GenericParameter p = reader.GetGenericParameter(gp);
            string owner = p.Parent.Kind == HandleKind.TypeDefinition
                ? shapes.GetTypeFromDefinition(reader, (TypeDefinitionHandle)p.Parent, 0).Name
                : NameOf((MethodDefinitionHandle)p.Parent);
            problems.Add($"{GenericParameter}: {reader.GetString(p.Name)} on {owner}");
        }

        for (int row = 1; row <= reader.GetTableRowCount(TableIndex.MethodSpec); row++)
        {
            MethodSpecification spec = reader.GetMethodSpecification(MetadataTokens.MethodSpecificationHandle(row));
            string arguments = string.Join(",", spec.DecodeSignature(shapes, null).Select(s => s.Name));
            problems.Add($"{GenericMethodInstantiation}: {TokenName(MetadataTokens.GetToken(spec.Method))}<{arguments}>");
        }

        // A TypeSpec is also how an array of arrays or an array type as a call target is written:
        // only a generic instantiation (or a generic parameter) is a problem.
        for (int row = 1; row <= reader.GetTableRowCount(TableIndex.TypeSpec); row++)
        {
            Shape spec = reader.GetTypeSpecification(MetadataTokens.TypeSpecificationHandle(row)).DecodeSignature(shapes, null);
            if (spec.IsGeneric)
            {
                problems.Add($"{GenericTypeInstantiation}: {spec.Name}");
            }

            ReportSignature(problems, spec, "type " + spec.Name);
        }
    }

    private static void ReportSignature(List<string> problems, Shape shape, string where)
    {
        if (shape.HasPointer)
        {
            problems.Add($"{PointerSignature}: {shape.Name} in {where}");
        }

        if (shape.HasFunctionPointer)
        {
            problems.Add($"{FunctionPointerSignature}: {shape.Name} in {where}");
        }

        if (shape.HasMultiDimensionalArray)
        {
            problems.Add($"{MultiDimensionalArray}: {shape.Name} in {where}");
        }
    }

    private void CheckBody(List<string> problems, MethodDefinition method, string name)
    {
        MethodBodyBlock body = pe.GetMethodBody(method.RelativeVirtualAddress);
        ImmutableArray<Shape> locals = ImmutableArray<Shape>.Empty;
        if (!body.LocalSignature.IsNil)
        {
            locals = reader.GetStandaloneSignature(body.LocalSignature).DecodeLocalSignature(shapes, null);
            for (int i = 0; i < locals.Length; i++)
            {
                ReportSignature(problems, locals[i], $"local {i} of {name}");
                if (locals[i].IsStruct)
                {
                    problems.Add($"{StructLocal}: {locals[i].Name} in {name} (allocated on every entry on the device; keep it in a field)");
                }
            }
        }

        MethodSignature<Shape> sig = method.DecodeSignature(shapes, null);
        int argOffset = sig.Header.IsInstance ? 1 : 0;
        foreach (Instruction ins in Decode(method))
        {
            string op = ins.OpCode.Name!;
            string at = $"{name} (IL_{ins.Offset:X4})";
            if (Refused.Contains(op))
            {
                problems.Add($"{RefusedInstruction}: {op} in {at}");
            }

            if (op.Contains(".ovf", StringComparison.Ordinal))
            {
                problems.Add($"{CheckedArithmetic}: {op} in {at} (the interpreter does not trap overflow)");
            }

            Shape? loaded = op switch
            {
                "ldelem" or "ldobj" => TypeShape(ins.Token),
                "ldfld" or "ldsfld" => FieldShape(ins.Token),
                "call" or "callvirt" => ReturnShape(ins.Token),
                _ when op.StartsWith("ldloc", StringComparison.Ordinal) && !op.StartsWith("ldloca", StringComparison.Ordinal) => Pick(locals, ins.Index),
                _ when op.StartsWith("ldarg", StringComparison.Ordinal) && !op.StartsWith("ldarga", StringComparison.Ordinal) =>
                    ins.Index - argOffset >= 0 ? Pick(sig.ParameterTypes, ins.Index - argOffset) : null,
                _ => null,
            };
            if (loaded is { IsStruct: true })
            {
                problems.Add($"{StructLoad}: {op} of {loaded.Name} in {at}");
            }
        }
    }

    private static Shape? Pick(ImmutableArray<Shape> shapes, int index) => index >= 0 && index < shapes.Length ? shapes[index] : null;

    private Shape? TypeShape(int token)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        return h.Kind switch
        {
            HandleKind.TypeDefinition => shapes.GetTypeFromDefinition(reader, (TypeDefinitionHandle)h, IsValueTypeDef((TypeDefinitionHandle)h) ? (byte)0x11 : (byte)0x12),
            HandleKind.TypeReference => shapes.GetTypeFromReference(reader, (TypeReferenceHandle)h, 0x11),
            HandleKind.TypeSpecification => reader.GetTypeSpecification((TypeSpecificationHandle)h).DecodeSignature(shapes, null),
            _ => null,
        };
    }

    private bool IsValueTypeDef(TypeDefinitionHandle h) => BaseTypeName(reader, reader.GetTypeDefinition(h)) is "System.ValueType" or "System.Enum";

    private Shape? FieldShape(int token)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        return h.Kind switch
        {
            HandleKind.FieldDefinition => reader.GetFieldDefinition((FieldDefinitionHandle)h).DecodeSignature(shapes, null),
            HandleKind.MemberReference => reader.GetMemberReference((MemberReferenceHandle)h).DecodeFieldSignature(shapes, null),
            _ => null,
        };
    }

    private Shape? ReturnShape(int token)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        return h.Kind switch
        {
            HandleKind.MethodDefinition => reader.GetMethodDefinition((MethodDefinitionHandle)h).DecodeSignature(shapes, null).ReturnType,
            HandleKind.MemberReference => reader.GetMemberReference((MemberReferenceHandle)h).DecodeMethodSignature(shapes, null).ReturnType,
            HandleKind.MethodSpecification => ReturnShape(MetadataTokens.GetToken(reader.GetMethodSpecification((MethodSpecificationHandle)h).Method)),
            _ => null,
        };
    }

    private IEnumerable<MethodDefinitionHandle> Targets(int token, bool isVirtualCall)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        if (h.Kind == HandleKind.MethodSpecification)
        {
            h = reader.GetMethodSpecification((MethodSpecificationHandle)h).Method;
        }

        if (h.Kind != HandleKind.MethodDefinition)
        {
            yield break; // outside this assembly (mscorlib): not followed
        }

        var target = (MethodDefinitionHandle)h;
        yield return target;
        MethodDefinition method = reader.GetMethodDefinition(target);
        if (!isVirtualCall && (method.Attributes & MethodAttributes.Virtual) == 0)
        {
            yield break;
        }

        TypeDefinitionHandle declaring = method.GetDeclaringType();
        string name = reader.GetString(method.Name);
        foreach (var m in AllMethods())
        {
            if (m.MethodName == name && !m.Handle.Equals(target) && DerivesOrImplements(m.Declaring, declaring))
            {
                yield return m.Handle;
            }
        }
    }

    private bool DerivesOrImplements(TypeDefinitionHandle type, TypeDefinitionHandle ancestor)
    {
        for (int depth = 0; depth < 32 && !type.IsNil; depth++)
        {
            TypeDefinition t = reader.GetTypeDefinition(type);
            foreach (InterfaceImplementationHandle ih in t.GetInterfaceImplementations())
            {
                EntityHandle i = reader.GetInterfaceImplementation(ih).Interface;
                if (i.Kind == HandleKind.TypeDefinition && ((TypeDefinitionHandle)i).Equals(ancestor))
                {
                    return true;
                }
            }

            if (t.BaseType.Kind != HandleKind.TypeDefinition)
            {
                return false;
            }

            type = (TypeDefinitionHandle)t.BaseType;
            if (type.Equals(ancestor))
            {
                return true;
            }
        }

        return false;
    }

    private IEnumerable<(MethodDefinitionHandle Handle, TypeDefinitionHandle Declaring, string TypeName, string MethodName)> AllMethods()
    {
        foreach (TypeDefinitionHandle th in reader.TypeDefinitions)
        {
            string typeName = shapes.GetTypeFromDefinition(reader, th, 0).Name;
            foreach (MethodDefinitionHandle mh in reader.GetTypeDefinition(th).GetMethods())
            {
                yield return (mh, th, typeName, reader.GetString(reader.GetMethodDefinition(mh).Name));
            }
        }
    }

    private string NameOf(MethodDefinitionHandle mh)
    {
        MethodDefinition m = reader.GetMethodDefinition(mh);
        return shapes.GetTypeFromDefinition(reader, m.GetDeclaringType(), 0).Name + "." + reader.GetString(m.Name);
    }

    private string TokenName(int token)
    {
        EntityHandle h = MetadataTokens.EntityHandle(token);
        switch (h.Kind)
        {
            case HandleKind.MethodDefinition:
                return NameOf((MethodDefinitionHandle)h);
            case HandleKind.MemberReference:
                MemberReference r = reader.GetMemberReference((MemberReferenceHandle)h);
                string parent = r.Parent.Kind switch
                {
                    HandleKind.TypeReference or HandleKind.TypeDefinition or HandleKind.TypeSpecification => TypeShape(MetadataTokens.GetToken(r.Parent))?.Name ?? "?",
                    _ => "?",
                };
                return parent + "." + reader.GetString(r.Name);
            default:
                return TypeShape(token)?.Name ?? $"token 0x{token:X8}";
        }
    }

    private List<Instruction> Decode(MethodDefinition method)
    {
        BlobReader il = pe.GetMethodBody(method.RelativeVirtualAddress).GetILReader();
        var list = new List<Instruction>();
        while (il.RemainingBytes > 0)
        {
            int offset = il.Offset;
            ushort value = il.ReadByte();
            if (value == 0xFE)
            {
                value = (ushort)(0xFE00 | il.ReadByte());
            }

            if (!OpCodesByValue.TryGetValue(value, out OpCode opCode))
            {
                throw new InvalidDataException($"unknown opcode 0x{value:X} at IL_{offset:X4}");
            }

            int token = 0;
            int index = -1;
            switch (opCode.OperandType)
            {
                case OperandType.InlineNone:
                    index = ImpliedIndex(opCode.Name!);
                    break;
                case OperandType.ShortInlineVar:
                    index = il.ReadByte();
                    break;
                case OperandType.InlineVar:
                    index = il.ReadUInt16();
                    break;
                case OperandType.ShortInlineI:
                case OperandType.ShortInlineBrTarget:
                    il.ReadByte();
                    break;
                case OperandType.InlineI:
                case OperandType.InlineBrTarget:
                case OperandType.ShortInlineR:
                    il.ReadInt32();
                    break;
                case OperandType.InlineI8:
                case OperandType.InlineR:
                    il.ReadInt64();
                    break;
                case OperandType.InlineSwitch:
                    int n = il.ReadInt32();
                    il.Offset += n * 4;
                    break;
                default:
                    // InlineField, InlineMethod, InlineType, InlineTok, InlineString, InlineSig
                    token = il.ReadInt32();
                    break;
            }

            list.Add(new Instruction(offset, opCode, token, index));
        }

        return list;
    }

    /// <summary>The local or argument number of ldloc.0 … ldarg.3.</summary>
    private static int ImpliedIndex(string name)
    {
        int dot = name.LastIndexOf('.');
        return (name.StartsWith("ldloc.", StringComparison.Ordinal) || name.StartsWith("ldarg.", StringComparison.Ordinal))
            && dot > 0 && int.TryParse(name.AsSpan(dot + 1), out int k) ? k : -1;
    }

    private static string BaseTypeName(MetadataReader r, TypeDefinition t)
    {
        if (t.BaseType.Kind != HandleKind.TypeReference)
        {
            return "";
        }

        TypeReference b = r.GetTypeReference((TypeReferenceHandle)t.BaseType);
        return Join(r.GetString(b.Namespace), r.GetString(b.Name));
    }

    private static string Join(string ns, string name) => ns.Length == 0 ? name : ns + "." + name;

    private readonly record struct Instruction(int Offset, OpCode OpCode, int Token, int Index);

    /// <summary>What a signature says about a type, as far as the device cares.</summary>
    internal sealed record Shape(string Name, bool IsStruct = false, bool HasPointer = false, bool HasFunctionPointer = false, bool HasMultiDimensionalArray = false, bool IsGeneric = false)
    {
        public Shape Wrap(string name) => this with { Name = name, IsStruct = false };
    }

    private sealed class Shapes : ISignatureTypeProvider<Shape, object?>
    {
        private readonly ISet<string> externalEnums;

        public Shapes(ISet<string> externalEnums) => this.externalEnums = externalEnums;

        public Shape GetArrayType(Shape elementType, ArrayShape shape) =>
            elementType.Wrap(elementType.Name + "[" + new string(',', shape.Rank - 1) + "]") with { HasMultiDimensionalArray = true };

        public Shape GetByReferenceType(Shape elementType) => elementType.Wrap(elementType.Name + "&");

        public Shape GetFunctionPointerType(MethodSignature<Shape> signature) =>
            new("method pointer", HasFunctionPointer: true);

        public Shape GetGenericInstantiation(Shape genericType, ImmutableArray<Shape> typeArguments) =>
            genericType with { Name = genericType.Name + "<" + string.Join(",", typeArguments.Select(a => a.Name)) + ">", IsGeneric = true };

        public Shape GetGenericMethodParameter(object? genericContext, int index) => new("!!" + index, IsGeneric: true);

        public Shape GetGenericTypeParameter(object? genericContext, int index) => new("!" + index, IsGeneric: true);

        public Shape GetModifiedType(Shape modifier, Shape unmodifiedType, bool isRequired) => unmodifiedType;

        public Shape GetPinnedType(Shape elementType) => elementType;

        public Shape GetPointerType(Shape elementType) => elementType.Wrap(elementType.Name + "*") with { HasPointer = true };

        public Shape GetPrimitiveType(PrimitiveTypeCode typeCode) =>
            new("System." + typeCode, IsStruct: typeCode == PrimitiveTypeCode.TypedReference);

        public Shape GetSZArrayType(Shape elementType) => elementType.Wrap(elementType.Name + "[]");

        public Shape GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind)
        {
            TypeDefinition t = reader.GetTypeDefinition(handle);
            string name = Join(reader.GetString(t.Namespace), reader.GetString(t.Name));
            TypeDefinitionHandle outer = t.GetDeclaringType();
            if (!outer.IsNil)
            {
                name = GetTypeFromDefinition(reader, outer, 0).Name + "+" + name;
            }

            return new Shape(name, IsStruct: BaseTypeName(reader, t) == "System.ValueType");
        }

        public Shape GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind)
        {
            TypeReference t = reader.GetTypeReference(handle);
            string name = Join(reader.GetString(t.Namespace), reader.GetString(t.Name));
            return new Shape(name, IsStruct: rawTypeKind == 0x11 && !externalEnums.Contains(name));
        }

        public Shape GetTypeFromSpecification(MetadataReader reader, object? genericContext, TypeSpecificationHandle handle, byte rawTypeKind) =>
            reader.GetTypeSpecification(handle).DecodeSignature(this, genericContext);
    }
}
