using SizeTest.Foundation.Text;
using Xunit;

namespace SizeTest.Tests.Foundation;

/// <summary>
/// The did-you-mean helper. Distances are closed forms counted by hand from the definition of the (unrestricted)
/// Damerau–Levenshtein distance (Damerau 1964; Lowrance &amp; Wagner 1975): insertions, deletions, substitutions and
/// transpositions of adjacent characters cost 1 each.
/// </summary>
public sealed class NameSuggestionsTests
{
    [Theory]
    [InlineData("", "", 0)]
    [InlineData("", "abc", 3)]          // three insertions
    [InlineData("abc", "", 3)]          // three deletions
    [InlineData("abc", "abc", 0)]
    [InlineData("a", "b", 1)]           // one substitution
    [InlineData("ab", "ba", 1)]         // one transposition (Levenshtein: 2)
    [InlineData("lcmd", "lcdm", 1)]     // one transposition
    [InlineData("ca", "abc", 2)]        // swap to ac, insert b (the optimal-string-alignment variant gives 3)
    [InlineData("kitten", "sitting", 3)] // k→s, e→i, insert g; no transposition helps
    [InlineData("abcdef", "badcfe", 3)] // three disjoint adjacent swaps
    [InlineData("gausian", "gaussian", 1)] // one insertion
    [InlineData("binnd", "binned", 1)]
    [InlineData("modle", "models", 2)]  // swap le, insert s
    public void DistanceIsTheClosedForm(string a, string b, int expected)
    {
        Assert.Equal(expected, NameSuggestions.Distance(a, b));
        Assert.Equal(expected, NameSuggestions.Distance(b, a)); // a metric: symmetric
    }

    [Theory]
    [InlineData("lcdm", 1)]   // a name of 4 characters: 1
    [InlineData("sb", 1)]
    [InlineData("power", 2)]  // 5 or more: 2
    [InlineData("static-linear", 2)]
    public void MaxDistanceIsOneForShortNamesElseTwo(string name, int expected) =>
        Assert.Equal(expected, NameSuggestions.MaxDistance(name));

    private static readonly string[] Models = ["lcdm", "wcdm", "w0wacdm", "eds", "milne", "static-linear", "tired-light"];

    [Theory]
    [InlineData("lcmd", "lcdm")]               // 1 from a 4-character name
    [InlineData("LCMD", "lcdm")]               // case is ignored
    [InlineData("LCDM", "lcdm")]               // a name differing only in case is offered
    [InlineData("tired_light", "tired-light")] // 1
    [InlineData("statc-linaer", "static-linear")] // 2: one insertion, one transposition
    [InlineData("milen", "milne")]             // 1
    [InlineData("ed", "eds")]                  // 1 from a 3-character name
    [InlineData("lcxy", null)]                 // 2 from lcdm, a 4-character name: too far
    [InlineData("stati-lnear", "static-linear")]  // 2
    [InlineData("stat-lnear", null)]           // 3 from static-linear
    [InlineData("steady-state", null)]
    [InlineData("lcdm", null)]                 // the word is itself known
    public void ClosestIsWithinTheLimit(string word, string? expected) =>
        Assert.Equal(expected, NameSuggestions.Closest(word, Models));

    [Fact]
    public void TiesGoToTheNearestLengthThenTheOrdinallyFirstAndTheHintIsAPhrase()
    {
        Assert.Equal("aa", NameSuggestions.Closest("ab", ["ac", "aa"])); // both 1 away, both of length 2
        Assert.Equal("h0", NameSuggestions.Closest("h1", ["h", "h0"]));  // both 1 away; h0 has the word's length
        Assert.Equal(" (did you mean 'gaussian'?)", NameSuggestions.Hint("gausian", ["lognormal", "gaussian"]));
        Assert.Equal("", NameSuggestions.Hint("xyz", ["lognormal", "gaussian"]));
    }
}
