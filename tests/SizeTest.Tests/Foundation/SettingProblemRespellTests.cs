using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Foundation;

/// <summary><see cref="SettingProblem.Respell"/>: a front end writes in the settings it owns and leaves the rest as placeholders.</summary>
public sealed class SettingProblemRespellTests
{
    [Fact]
    public void OwnedSettingsAreWrittenInAndTheOthersStayPlaceholders()
    {
        var p = new SettingProblem("fix {kcorr} or choose another {out}; the column '{{x}' is a user's value");
        var r = p.Respell(s => s == "kcorr" ? "corrections.{kcorr}" : null);
        Assert.Equal(["out"], r.Settings);                              // only out is left for the next front end
        Assert.Equal("fix corrections.{kcorr} or choose another --out; the column '{x}' is a user's value", r.Render(s => "--" + s));
    }

    [Fact]
    public void AnInputExceptionKeepsItsPlaceAndBecomesTheInnerError()
    {
        var e = SettingProblem.Input("drop {hdu} '3'", "cat.csv", 4, "z");
        var r = e.Respelled(s => s == "hdu" ? "catalogue.table" : null);
        Assert.Equal("cat.csv, line 4, column 'z': drop catalogue.table '3'", r.Message);
        Assert.Same(e, r.InnerException);
        var plain = new InputException("no settings here");
        Assert.Same(plain, plain.Respelled(_ => "x"));
    }
}
