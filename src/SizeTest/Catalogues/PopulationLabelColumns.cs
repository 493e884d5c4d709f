using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues;

/// <summary>
/// Finds the columns of a catalogue that look like a population label, for a note that they could be fitted as separate
/// populations (<see cref="PopulationLabelColumn"/>). A candidate is a text, boolean or integer column (or a real one whose
/// values are all whole numbers, as CSV integers are read) whose name has a class or type word (<c>type</c>, <c>class</c>,
/// <c>morph</c>, <c>population</c>, <c>pop</c>, <c>sample</c>, <c>sf</c>, <c>quiescent</c>, …; <c>galaxy_type</c>,
/// <c>morph_type</c>, <c>sf_flag</c>) or whose UCD is <c>src.class…</c> or <c>src.morph.type</c>; never an id-like column
/// (an id word in its name, UCD <c>meta.id</c>), a column mapped to a role other than group, or a kept column. It is
/// suggested when the accepted rows hold between <see cref="MinLabels"/> and <see cref="MaxLabels"/> distinct labels and
/// each has at least <see cref="MinRowsPerLabel"/> rows. Nothing is suggested when the group column was given.
/// </summary>
internal static class PopulationLabelColumns
{
    /// <summary>Fewest distinct labels: one label is one population.</summary>
    public const int MinLabels = 2;

    /// <summary>Most distinct labels: more look like a measured quantity or an index, not a handful of populations.</summary>
    public const int MaxLabels = 8;

    /// <summary>
    /// Fewest accepted rows of every label. Each population gets its own R0, a, β and scatter; about five objects per free
    /// parameter is the common-practice floor for a stable fit, so 20 for four parameters.
    /// </summary>
    public const int MinRowsPerLabel = 20;

    // Words (ColumnNameWords) that say a class or a type; whole normalised names for the run-together spellings.
    private static readonly string[] ClassWords =
        ["type", "class", "morph", "morphology", "population", "pop", "sample", "subsample", "group", "category", "kind",
         "sf", "sfg", "quiescent", "passive", "starforming", "classification"];
    private static readonly string[] ClassNames =
        ["galtype", "galaxytype", "morphtype", "objtype", "sftype", "sfflag", "qflag", "popflag", "hubbletype"];

    // Words of an identifier's name, and whole names of one (as MappingResolver detects the id).
    private static readonly string[] IdWords = ["id", "objid", "objectid", "sourceid", "srcid", "galid", "designation"];
    private static readonly string[] IdNames = ["name", "source", "obj", "seq", "number", "galaxy"];

    /// <summary>The candidate columns (indices into <paramref name="columns"/>) and why each looks like a label.</summary>
    /// <param name="columns">The reader's columns.</param>
    /// <param name="mapping">The resolved mapping (mapped and kept columns are passed over, except the group column).</param>
    /// <param name="groupGiven">Whether the user named the group column (then nothing is suggested).</param>
    public static IReadOnlyList<(int Index, string Reason)> Candidates(IReadOnlyList<CatalogueColumn> columns, ResolvedMapping mapping, bool groupGiven)
    {
        ArgumentNullException.ThrowIfNull(columns);
        ArgumentNullException.ThrowIfNull(mapping);
        if (groupGiven) return [];
        var taken = mapping.Roles.Values.Where(b => b.Role != ColumnRole.Group).Select(b => b.ColumnIndex)
            .Concat(mapping.Kept.Select(k => k.ColumnIndex)).ToHashSet();
        var list = new List<(int, string)>();
        for (int i = 0; i < columns.Count; i++)
        {
            var c = columns[i];
            if (taken.Contains(i) || c.Kind is ColumnKind.Unsupported) continue;
            if (Reason(c) is { } why) list.Add((i, why));
        }
        return list;
    }

    /// <summary>Why <paramref name="column"/> looks like a population label, or null (including for an id-like column).</summary>
    public static string? Reason(CatalogueColumn column)
    {
        ArgumentNullException.ThrowIfNull(column);
        var ucd = string.IsNullOrWhiteSpace(column.Ucd) ? [] : column.Ucd.ToLowerInvariant().Split(';', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries);
        var words = ColumnNameWords.Split(column.Name);
        string name = string.Concat(words);
        if (ucd.Contains("meta.id") || words.Any(IdWords.Contains) || IdNames.Contains(name)) return null;
        if (ucd.Length > 0 && (ucd[0].StartsWith("src.class", StringComparison.Ordinal) || ucd[0].StartsWith("src.morph.type", StringComparison.Ordinal)))
            return SettingProblem.Text($"UCD {column.Ucd!.Trim()}");
        if (words.Any(ClassWords.Contains) || ClassNames.Contains(name)) return "named like a population label";
        return null;
    }

    /// <summary>Counts the labels of one candidate over the accepted rows, giving up beyond <see cref="MaxLabels"/>.</summary>
    /// <param name="column">The column.</param>
    /// <param name="reason">Why it is a candidate.</param>
    /// <param name="wholeNumbersOnly">Take only whole-number labels (a real column: its labels must be integers).</param>
    internal sealed class Tally(CatalogueColumn column, string reason, bool wholeNumbersOnly)
    {
        private readonly Dictionary<string, long> _counts = new(StringComparer.Ordinal);
        private long _unlabelled;
        private bool _dropped;

        /// <summary>Counts one accepted row's cell: its text, or null when the cell is empty or unreadable.</summary>
        public void Add(string? label)
        {
            if (_dropped) return;
            if (label is null || label.Length == 0) { _unlabelled++; return; }
            if (_counts.TryGetValue(label, out var n)) { _counts[label] = n + 1; return; }
            if (_counts.Count == MaxLabels || (wholeNumbersOnly && !IsWholeNumber(label))) { _dropped = true; _counts.Clear(); return; }
            _counts[label] = 1;
        }

        /// <summary>The suggestion, or null when the labels are too few, too many or too thinly filled.</summary>
        public PopulationLabelColumn? Result()
        {
            if (_dropped || _counts.Count < MinLabels || _counts.Values.Any(n => n < MinRowsPerLabel)) return null;
            var labels = _counts.OrderBy(kv => kv.Key, StringComparer.Ordinal).Select(kv => (kv.Key, kv.Value)).ToArray();
            return new PopulationLabelColumn(column.Name, reason, labels, _unlabelled);
        }

        private static bool IsWholeNumber(string text) =>
            double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && Math.Abs(v) < 1e6 && v == Math.Floor(v);
    }
}
