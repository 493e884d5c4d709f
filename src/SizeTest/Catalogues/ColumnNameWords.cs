using System.Text;

namespace SizeTest.Catalogues;

/// <summary>The words of a column name, as detection reads them.</summary>
internal static class ColumnNameWords
{
    /// <summary>The name's words, lower case: split at non-alphanumerics and lower-to-upper case changes
    /// (<c>MAG_AUTO</c> → mag, auto; <c>petroMag_r</c> → petro, mag, r; <c>n_ser</c> → n, ser).</summary>
    public static List<string> Split(string name)
    {
        var words = new List<string>();
        var word = new StringBuilder();
        char previous = ' ';
        foreach (char ch in name)
        {
            bool boundary = !char.IsLetterOrDigit(ch) || (char.IsUpper(ch) && char.IsLower(previous));
            if (boundary && word.Length > 0) { words.Add(word.ToString()); word.Clear(); }
            if (char.IsLetterOrDigit(ch)) word.Append(char.ToLowerInvariant(ch));
            previous = ch;
        }
        if (word.Length > 0) words.Add(word.ToString());
        return words;
    }
}
