using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;
using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace SizeTest.Studies;

/// <summary>
/// A TOML value with the 1-based line and column of its key, built from Tomlyn's syntax tree so every
/// error can point at the place in the study file. Tables remember which keys were read, so the keys
/// nobody asked for can be reported as unknown.
/// </summary>
internal sealed class TomlNode
{
    private readonly Dictionary<string, TomlNode> _children = new(StringComparer.Ordinal);
    private readonly List<string> _order = [];
    private readonly HashSet<string> _used = new(StringComparer.Ordinal);

    private TomlNode(string path, object? scalar, List<TomlNode>? items, bool isTable, int line, int column, string file)
    {
        Path = path;
        Scalar = scalar;
        Items = items;
        IsTable = isTable;
        Line = line;
        Column = column;
        File = file;
    }

    /// <summary>Dotted key path (e.g. <c>models.lcdm.omega_m</c>).</summary>
    public string Path { get; }
    /// <summary>String, long, double or bool for scalars; null for tables and arrays.</summary>
    public object? Scalar { get; }
    /// <summary>Array items, or null.</summary>
    public List<TomlNode>? Items { get; }
    /// <summary>True for tables (standard or inline).</summary>
    public bool IsTable { get; }
    /// <summary>1-based line of the key (or of the value for array items).</summary>
    public int Line { get; }
    /// <summary>1-based column.</summary>
    public int Column { get; }
    /// <summary>File name for errors.</summary>
    public string File { get; }
    /// <summary>Keys of a table in file order.</summary>
    public IReadOnlyList<string> Keys => _order;

    /// <summary>An <see cref="InputException"/> pointing at this node.</summary>
    public InputException Error(string message) => new(message, File, Line, Column.ToString(CultureInfo.InvariantCulture));

    /// <summary>Parses TOML text; a syntax error becomes an <see cref="InputException"/> with its line and column.</summary>
    public static TomlNode Parse(string text, string file)
    {
        CheckNestingDepth(text, file);
        DocumentSyntax doc;
        try { doc = SyntaxParser.Parse(text, file, false); }
        catch (InvalidOperationException e)
        {
            // The parser's own limits (e.g. its nesting depth) are input problems, not internal errors.
            throw new InputException($"not valid TOML: {e.Message.Split(". ")[0]}", file, 1, "1");
        }
        foreach (var d in doc.Diagnostics)
            if (d.Kind == DiagnosticMessageKind.Error)
                throw new InputException($"not valid TOML: {d.Message}", file, d.Span.Start.Line + 1, (d.Span.Start.Column + 1).ToString(CultureInfo.InvariantCulture));
        var root = new TomlNode("", null, null, true, 1, 1, file);
        foreach (var kv in doc.KeyValues) root.AddKeyValue(kv);
        foreach (var table in doc.Tables)
        {
            if (table is TableArraySyntax)
                throw new InputException("arrays of tables ([[...]]) are not used in study files; write a table [name] instead",
                    file, table.Span.Start.Line + 1, (table.Span.Start.Column + 1).ToString(CultureInfo.InvariantCulture));
            var target = root.Descend(KeyParts(table.Name!), table.Name!.Span, defineLast: true);
            foreach (var kv in table.Items) target.AddKeyValue(kv);
        }
        return root;
    }

    /// <summary>Deepest nesting of arrays and inline tables a study file may use; study files need 3.</summary>
    public const int MaxNestingDepth = 32;

    /// <summary>
    /// Refuses arrays or inline tables nested deeper than <see cref="MaxNestingDepth"/>, naming the line and column
    /// of the first bracket past the limit, before the parser recurses into them. Quoted strings (basic, literal and
    /// their multi-line forms) and comments are skipped; table headers count like arrays but never nest.
    /// </summary>
    private static void CheckNestingDepth(string text, string file)
    {
        int depth = 0, line = 1, column = 0;
        for (int i = 0; i < text.Length; i++)
        {
            char c = text[i];
            column++;
            if (c == '\n') { line++; column = 0; continue; }
            if (c == '#') { while (i + 1 < text.Length && text[i + 1] != '\n') i++; continue; }
            if (c == '"' || c == '\'')
            {
                bool multi = i + 2 < text.Length && text[i + 1] == c && text[i + 2] == c;
                string close = multi ? new string(c, 3) : c.ToString();
                i += multi ? 3 : 1;
                while (i < text.Length)
                {
                    if (c == '"' && text[i] == '\\') { i += 2; continue; }
                    if (text[i] == '\n') { if (!multi) break; line++; column = 0; }
                    if (string.CompareOrdinal(text, i, close, 0, close.Length) == 0) { i += close.Length - 1; break; }
                    i++; column++;
                }
                continue;
            }
            if (c is '[' or '{')
            {
                if (++depth > MaxNestingDepth)
                    throw new InputException($"arrays or inline tables are nested more than {MaxNestingDepth} deep; a study file needs at most a few levels",
                        file, line, column.ToString(CultureInfo.InvariantCulture));
            }
            else if (c is ']' or '}') depth = Math.Max(0, depth - 1);
        }
    }

    private static List<string> KeyParts(KeySyntax key)
    {
        var parts = new List<string> { KeyText(key.Key!) };
        foreach (var dot in key.DotKeys) parts.Add(KeyText(dot.Key!));
        return parts;
    }

    private static string KeyText(BareKeyOrStringValueSyntax k) => k switch
    {
        BareKeySyntax b => b.Key!.Text!,
        StringValueSyntax s => s.Value!,
        _ => k.ToString() ?? "",
    };

    private TomlNode Descend(List<string> parts, SourceSpan span, bool defineLast)
    {
        var node = this;
        for (int i = 0; i < parts.Count; i++)
        {
            var name = parts[i];
            if (node._children.TryGetValue(name, out var child))
            {
                if (!child.IsTable) throw new InputException($"'{child.Path}' is already a value, not a table", File, span.Start.Line + 1, (span.Start.Column + 1).ToString(CultureInfo.InvariantCulture));
                node = child;
                continue;
            }
            var created = new TomlNode(Join(node.Path, name), null, null, true, span.Start.Line + 1, span.Start.Column + 1, File);
            node.Add(name, created);
            node = created;
        }
        _ = defineLast;
        return node;
    }

    private void Add(string name, TomlNode child)
    {
        _children[name] = child;
        _order.Add(name);
    }

    private static string Join(string a, string b) => a.Length == 0 ? b : a + "." + b;

    private void AddKeyValue(KeyValueSyntax kv)
    {
        var parts = KeyParts(kv.Key!);
        var parent = parts.Count > 1 ? Descend(parts.GetRange(0, parts.Count - 1), kv.Key!.Span, false) : this;
        var name = parts[^1];
        var span = kv.Key!.Span;
        if (parent._children.ContainsKey(name))
            throw new InputException($"key '{Join(parent.Path, name)}' is given twice", File, span.Start.Line + 1, (span.Start.Column + 1).ToString(CultureInfo.InvariantCulture));
        parent.Add(name, FromValue(kv.Value!, Join(parent.Path, name), span.Start.Line + 1, span.Start.Column + 1));
    }

    private TomlNode FromValue(ValueSyntax value, string path, int line, int column)
    {
        switch (value)
        {
            case StringValueSyntax s: return new TomlNode(path, s.Value ?? "", null, false, line, column, File);
            case IntegerValueSyntax i: return new TomlNode(path, i.Value, null, false, line, column, File);
            case FloatValueSyntax f: return new TomlNode(path, f.Value, null, false, line, column, File);
            case BooleanValueSyntax b: return new TomlNode(path, b.Value, null, false, line, column, File);
            case ArraySyntax a:
                var items = new List<TomlNode>();
                int k = 0;
                foreach (var item in a.Items)
                {
                    var sp = item.Value!.Span;
                    items.Add(FromValue(item.Value, $"{path}[{k++}]", sp.Start.Line + 1, sp.Start.Column + 1));
                }
                return new TomlNode(path, null, items, false, line, column, File);
            case InlineTableSyntax t:
                var table = new TomlNode(path, null, null, true, line, column, File);
                foreach (var item in t.Items) table.AddKeyValue(item.KeyValue!);
                return table;
            default:
                throw new InputException($"'{path}' has a value of a kind study files do not use (dates and times); write a string or a number", File, line, column.ToString(CultureInfo.InvariantCulture));
        }
    }

    /// <summary>The child <paramref name="key"/> (marked as read), or null when absent.</summary>
    public TomlNode? Get(string key)
    {
        if (!_children.TryGetValue(key, out var c)) return null;
        _used.Add(key);
        return c;
    }

    /// <summary>A sub-table (marked as read), or null; a non-table value is an error.</summary>
    public TomlNode? Table(string key)
    {
        var c = Get(key);
        if (c is not null && !c.IsTable) throw c.Error($"'{c.Path}' must be a table (e.g. [{c.Path}] or {{ … }})");
        return c;
    }

    /// <summary>A string value, or null when absent.</summary>
    public string? String(string key)
    {
        var c = Get(key);
        if (c is null) return null;
        return c.Scalar as string ?? throw c.Error($"'{c.Path}' must be a string in quotes");
    }

    /// <summary>A number (integer or float), or null when absent.</summary>
    public double? Number(string key) => Get(key) is { } c ? c.AsNumber() : null;

    /// <summary>This node as a finite number.</summary>
    public double AsNumber() => Scalar switch
    {
        long l => l,
        double d when double.IsFinite(d) => d,
        _ => throw Error($"'{Path}' must be a finite number"),
    };

    /// <summary>An integer, or null when absent.</summary>
    public int? Integer(string key)
    {
        var c = Get(key);
        if (c is null) return null;
        return c.Scalar is long l && l is >= int.MinValue and <= int.MaxValue ? (int)l : throw c.Error($"'{c.Path}' must be a whole number");
    }

    /// <summary>A boolean, or null when absent.</summary>
    public bool? Boolean(string key)
    {
        var c = Get(key);
        if (c is null) return null;
        return c.Scalar is bool b ? b : throw c.Error($"'{c.Path}' must be true or false");
    }

    /// <summary>An array of strings, or null when absent (a single string is taken as a one-item list).</summary>
    public IReadOnlyList<string>? Strings(string key)
    {
        var c = Get(key);
        if (c is null) return null;
        if (c.Scalar is string s) return [s];
        if (c.Items is null) throw c.Error($"'{c.Path}' must be a list of strings, e.g. [\"a\", \"b\"]");
        return c.Items.Select(i => i.Scalar as string ?? throw i.Error($"'{c.Path}' must hold only strings")).ToArray();
    }

    /// <summary>This node as a list of exactly <paramref name="count"/> numbers.</summary>
    public double[] AsNumbers(int count, string example)
    {
        if (Items is null || Items.Count != count) throw Error($"'{Path}' must be a list of {count} numbers, e.g. {example}");
        return Items.Select(i => i.AsNumber()).ToArray();
    }

    /// <summary>Throws for the first key of this table (recursively into read sub-tables) that nobody read.</summary>
    public void RejectUnknown(Func<string, string> hint)
    {
        foreach (var key in _order)
        {
            var c = _children[key];
            if (!_used.Contains(key))
            {
                // Candidates: the keys this table's hint lists, and the keys of it the file did use.
                string words = hint(Path);
                var known = System.Text.RegularExpressions.Regex.Matches(words, "[a-z][a-z0-9_]*").Select(m => m.Value).Concat(_used);
                throw c.Error($"unknown key '{c.Path}' in the study file{NameSuggestions.Hint(key, known)}; {words}");
            }
            if (c.IsTable) c.RejectUnknown(hint);
        }
    }
}
