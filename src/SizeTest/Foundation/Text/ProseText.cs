using System.Text.RegularExpressions;

namespace SizeTest.Foundation.Text;

/// <summary>Text meant as prose in a report: console column padding ("theta     ← theta") collapsed to one space.</summary>
public static partial class ProseText
{
    /// <summary><paramref name="text"/> with every run of two or more spaces or tabs replaced by one space; line breaks stay.</summary>
    public static string Collapse(string text) => Padding().Replace(text, " ");

    [GeneratedRegex("[ \\t]{2,}")]
    private static partial Regex Padding();
}
