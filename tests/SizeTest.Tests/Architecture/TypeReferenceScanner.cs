using System.Reflection.Emit;
using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;

namespace SizeTest.Tests.Architecture;

/// <summary>One type using another: both as namespace + type name, as the compiler resolved them.</summary>
internal readonly record struct TypeUse(string FromNamespace, string FromType, string ToNamespace, string ToType);

/// <summary>
/// Lists every type a compiled assembly's types refer to, read from its metadata with
/// System.Reflection.Metadata: base types, interfaces, generic constraints, field, method,
/// property and local-variable signatures, custom attributes and every type, method and field
/// token in the method bodies' IL. Because this is what the compiler resolved, the spelling in
/// the source (fully qualified, namespace-relative such as <c>Catalogues.SizeKind</c> inside
/// <c>SizeTest.Inference</c>, or a <c>using</c> alias) does not matter. Nested and
/// compiler-generated types (lambdas, iterators, async state machines) count as their
/// outermost declaring type.
/// </summary>
internal static class TypeReferenceScanner
{
    private static readonly Dictionary<short, OperandType> OperandTypes = typeof(OpCodes)
        .GetFields(System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.Static)
        .Select(f => (OpCode)f.GetValue(null)!)
        .ToDictionary(o => o.Value, o => o.OperandType);

    /// <summary>Every use by a type whose namespace satisfies <paramref name="includeSource"/>.</summary>
    public static List<TypeUse> Scan(string assemblyPath, Func<string, bool> includeSource)
    {
        using var stream = File.OpenRead(assemblyPath);
        using var pe = new PEReader(stream);
        var md = pe.GetMetadataReader();
        var uses = new HashSet<TypeUse>();
        foreach (var th in md.TypeDefinitions)
        {
            var (ns, name) = OuterName(md, th);
            if (!includeSource(ns)) continue;
            var sink = new Sink(md, pe, uses, ns, name);
            sink.Type(th);
        }
        return [.. uses];
    }

    /// <summary>Namespace and name of a type definition's outermost declaring type.</summary>
    private static (string Namespace, string Name) OuterName(MetadataReader md, TypeDefinitionHandle h)
    {
        var td = md.GetTypeDefinition(h);
        while (td.IsNested) td = md.GetTypeDefinition(td.GetDeclaringType());
        return (md.GetString(td.Namespace), md.GetString(td.Name));
    }

    private static (string Namespace, string Name) OuterName(MetadataReader md, TypeReferenceHandle h)
    {
        var tr = md.GetTypeReference(h);
        while (tr.ResolutionScope.Kind == HandleKind.TypeReference) tr = md.GetTypeReference((TypeReferenceHandle)tr.ResolutionScope);
        return (md.GetString(tr.Namespace), md.GetString(tr.Name));
    }

    private sealed class Sink(MetadataReader md, PEReader pe, HashSet<TypeUse> uses, string ns, string name)
        : ISignatureTypeProvider<int, object?>
    {
        public void Type(TypeDefinitionHandle th)
        {
            var td = md.GetTypeDefinition(th);
            Entity(td.BaseType);
            foreach (var ih in td.GetInterfaceImplementations()) Entity(md.GetInterfaceImplementation(ih).Interface);
            GenericParameters(td.GetGenericParameters());
            Attributes(td.GetCustomAttributes());
            foreach (var fh in td.GetFields())
            {
                var f = md.GetFieldDefinition(fh);
                f.DecodeSignature(this, null);
                Attributes(f.GetCustomAttributes());
            }
            foreach (var ph in td.GetProperties())
            {
                var p = md.GetPropertyDefinition(ph);
                p.DecodeSignature(this, null);
                Attributes(p.GetCustomAttributes());
            }
            foreach (var eh in td.GetEvents()) Entity(md.GetEventDefinition(eh).Type);
            foreach (var mh in td.GetMethods()) Method(md.GetMethodDefinition(mh));
        }

        private void Method(MethodDefinition m)
        {
            m.DecodeSignature(this, null);
            Attributes(m.GetCustomAttributes());
            GenericParameters(m.GetGenericParameters());
            foreach (var ph in m.GetParameters()) Attributes(md.GetParameter(ph).GetCustomAttributes());
            if (m.RelativeVirtualAddress == 0) return;
            var body = pe.GetMethodBody(m.RelativeVirtualAddress);
            if (!body.LocalSignature.IsNil) md.GetStandaloneSignature(body.LocalSignature).DecodeLocalSignature(this, null);
            var il = body.GetILReader();
            while (il.RemainingBytes > 0)
            {
                short code = il.ReadByte();
                if (code == 0xFE) code = unchecked((short)(0xFE00 | il.ReadByte()));
                switch (OperandTypes[code])
                {
                    case OperandType.InlineNone: break;
                    case OperandType.ShortInlineBrTarget or OperandType.ShortInlineI or OperandType.ShortInlineVar: il.Offset += 1; break;
                    case OperandType.InlineVar: il.Offset += 2; break;
                    case OperandType.InlineI8 or OperandType.InlineR: il.Offset += 8; break;
                    case OperandType.InlineSwitch: int targets = il.ReadInt32(); il.Offset += 4 * targets; break;
                    case OperandType.InlineType or OperandType.InlineTok or OperandType.InlineMethod or OperandType.InlineField:
                        Entity(MetadataTokens.EntityHandle(il.ReadInt32()));
                        break;
                    default: il.Offset += 4; break; // InlineBrTarget, InlineI, InlineSig, InlineString, ShortInlineR
                }
            }
        }

        private void GenericParameters(GenericParameterHandleCollection parameters)
        {
            foreach (var gh in parameters)
                foreach (var ch in md.GetGenericParameter(gh).GetConstraints())
                    Entity(md.GetGenericParameterConstraint(ch).Type);
        }

        private void Attributes(CustomAttributeHandleCollection attributes)
        {
            foreach (var ah in attributes) Entity(md.GetCustomAttribute(ah).Constructor);
        }

        private void Entity(EntityHandle h)
        {
            if (h.IsNil) return;
            switch (h.Kind)
            {
                case HandleKind.TypeDefinition:
                    Record(OuterName(md, (TypeDefinitionHandle)h));
                    break;
                case HandleKind.TypeReference:
                    Record(OuterName(md, (TypeReferenceHandle)h));
                    break;
                case HandleKind.TypeSpecification:
                    md.GetTypeSpecification((TypeSpecificationHandle)h).DecodeSignature(this, null);
                    break;
                case HandleKind.MemberReference:
                    var mr = md.GetMemberReference((MemberReferenceHandle)h);
                    Entity(mr.Parent);
                    if (mr.GetKind() == MemberReferenceKind.Method) mr.DecodeMethodSignature(this, null);
                    else mr.DecodeFieldSignature(this, null);
                    break;
                case HandleKind.MethodDefinition:
                    var md2 = md.GetMethodDefinition((MethodDefinitionHandle)h);
                    Record(OuterName(md, md2.GetDeclaringType()));
                    md2.DecodeSignature(this, null);
                    break;
                case HandleKind.FieldDefinition:
                    Record(OuterName(md, md.GetFieldDefinition((FieldDefinitionHandle)h).GetDeclaringType()));
                    break;
                case HandleKind.MethodSpecification:
                    var ms = md.GetMethodSpecification((MethodSpecificationHandle)h);
                    Entity(ms.Method);
                    ms.DecodeSignature(this, null);
                    break;
            }
        }

        private void Record((string Namespace, string Name) target)
        {
            if (target.Namespace.Length > 0) uses.Add(new TypeUse(ns, name, target.Namespace, target.Name));
        }

        public int GetTypeFromDefinition(MetadataReader reader, TypeDefinitionHandle handle, byte rawTypeKind) { Record(OuterName(md, handle)); return 0; }
        public int GetTypeFromReference(MetadataReader reader, TypeReferenceHandle handle, byte rawTypeKind) { Record(OuterName(md, handle)); return 0; }
        public int GetTypeFromSpecification(MetadataReader reader, object? genericContext, TypeSpecificationHandle handle, byte rawTypeKind)
            => md.GetTypeSpecification(handle).DecodeSignature(this, genericContext);
        public int GetPrimitiveType(PrimitiveTypeCode typeCode) => 0;
        public int GetSZArrayType(int elementType) => 0;
        public int GetArrayType(int elementType, ArrayShape shape) => 0;
        public int GetByReferenceType(int elementType) => 0;
        public int GetPointerType(int elementType) => 0;
        public int GetPinnedType(int elementType) => 0;
        public int GetGenericInstantiation(int genericType, System.Collections.Immutable.ImmutableArray<int> typeArguments) => 0;
        public int GetGenericTypeParameter(object? genericContext, int index) => 0;
        public int GetGenericMethodParameter(object? genericContext, int index) => 0;
        public int GetFunctionPointerType(MethodSignature<int> signature) => 0;
        public int GetModifiedType(int modifier, int unmodifiedType, bool isRequired) => 0;
    }
}
