using System.Globalization;
using System.Text;

namespace SizeTest.Foundation.Text;

/// <summary>
/// Makes text taken from a user's file (column names, units, cells) safe to print on a terminal:
/// control characters (C0, DEL, C1 — among them ESC, which starts terminal escape sequences) and the
/// bidirectional-override characters are shown as <c>\uXXXX</c> instead of being written raw. A
/// backslash is kept as it is, so ordinary Windows paths stay readable.
/// </summary>
public static class TerminalText
{
    /// <summary>Returns <paramref name="text"/> with every unsafe character replaced by <c>\uXXXX</c>.</summary>
    public static string Escape(string? text)
    {
        if (string.IsNullOrEmpty(text)) return text ?? "";
        int i = 0;
        while (i < text.Length && !IsUnsafe(text[i])) i++;
        if (i == text.Length) return text;
        var sb = new StringBuilder(text.Length + 16);
        sb.Append(text, 0, i);
        for (; i < text.Length; i++)
        {
            char c = text[i];
            if (IsUnsafe(c)) sb.Append("\\u").Append(((int)c).ToString("x4", CultureInfo.InvariantCulture));
            else sb.Append(c);
        }
        return sb.ToString();
    }

    /// <summary>True for characters that must not reach a terminal raw: C0/C1 controls, DEL and bidi overrides/isolates.</summary>
    public static bool IsUnsafe(char c) =>
        char.IsControl(c) || c is >= '\u202A' and <= '\u202E' || c is >= '\u2066' and <= '\u2069';
}
