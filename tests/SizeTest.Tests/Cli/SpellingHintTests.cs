using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// A mistyped option, option value, world model, column or parameter is exit 2 with a message naming what was given and,
/// when a known name is within the Damerau–Levenshtein limit (NameSuggestionsTests), "did you mean 'X'?"; a far-off word
/// gets no guess. The distances are counted by hand in the comments.
/// </summary>
public sealed class SpellingHintTests
{
    // Runs the command (CAT: a three-row catalogue; fit gets an --out), asserts exit 2 and returns stderr.
    private static string Run(string command)
    {
        using var t = new TempFiles();
        var cat = t.Write("c.csv", "id,z,theta,theta_err\na,0.5,1,0.1\nb,1.0,0.8,0.1\nc,1.5,0.7,0.1\n");
        var args = command.Split(' ').Select(a => a == "CAT" ? cat : a).ToList();
        if (args[0] == "fit") args.AddRange(["--out", t.PathOf("out")]);
        var (exit, _, err) = CliRunner.Run([.. args]);
        Assert.Equal(2, exit);
        return err;
    }

    [Theory]
    [InlineData("fit CAT --modle lcdm", "'--modle'", "--models")]                 // swap le, insert s: 2
    [InlineData("predict --z 1 -modle lcdm", "'-modle'", "--model")]              // dashes aside, swap: 1
    [InlineData("predict --z 1 --h1 70", "'--h1'", "--h0")]                       // h1 → h0: 1 (a 2-character name)
    [InlineData("fit CAT --models lcdm,lcmd", "'lcmd'", "lcdm")]                  // swap: 1
    [InlineData("predict --z 1 --model tired_light", "'tired_light'", "tired-light")] // 1
    [InlineData("fit CAT --size-errors gausian", "'gausian'", "gaussian")]        // insert s: 1
    [InlineData("fit CAT --size-errors Gaussian", "'Gaussian'", "gaussian")]      // case only
    [InlineData("fit CAT --z-prior-shape flt", "'flt'", "flat")]                  // 1 from a 4-character name
    [InlineData("fit CAT --z-marginal linaer", "'linaer'", "linear")]             // swap: 1
    [InlineData("fit CAT --evolution powr", "'powr'", "power")]                   // 1
    [InlineData("fit CAT --evolution binnd:4", "'binnd:4'", "binned:4")]          // 1, the bins kept
    [InlineData("fit CAT --observable siz", "'siz'", "size")]                     // 1
    [InlineData("fit CAT --sampler mcm", "'mcm'", "mcmc")]                        // 1
    [InlineData("fit CAT --format jsn", "'jsn'", "json")]                         // 1
    [InlineData("fit CAT --size-def isophotl:25", "'isophotl:25'", "isophotal:25")] // 1
    [InlineData("fit CAT --header yse", "'yse'", "yes")]                          // swap: 1
    [InlineData("fit CAT --catalog-format cvs", "'cvs'", "csv")]                  // swap: 1
    [InlineData("fit CAT --col theta=thta", "'thta'", "theta")]                   // 1: a column of the file
    [InlineData("fit CAT --col thta=theta", "'thta'", "theta")]                   // 1: a role
    [InlineData("fit CAT --keep theta_er", "'theta_er'", "theta_err")]            // 1
    [InlineData("inspect CAT --col z_err=theta_er", "'theta_er'", "theta_err")]
    [InlineData("predict --z 1 --model static-linear --flux-convention energy_loss", "'energy_loss'", "energy-loss")] // 1
    [InlineData("fit CAT --models lcdm --free omega_n", "'omega_n'", "omega_m")]   // 1: a parameter
    [InlineData("fitt CAT", "Unrecognized command or argument 'fitt'", "fit")]   // a verb: 1 (said as unrecognised, not "required command not provided")
    public void AMistypedNameGetsADidYouMean(string command, string given, string suggestion)
    {
        var err = Run(command);
        Assert.Contains(given, err);
        Assert.Contains($"(did you mean '{suggestion}'?)", err);
        Assert.Single(err.Trim().Split('\n'));
    }

    [Theory]
    [InlineData("fit CAT --models steady-state", "'steady-state'")]
    [InlineData("fit CAT --size-errors poisson", "'poisson'")]
    [InlineData("fit CAT --evolution cubic", "'cubic'")]
    [InlineData("fit CAT --col theta=radius", "'radius'")]
    [InlineData("fit CAT --col theta=th", "'th'")] // 2 from 'z' and 'id' (names of at most 4 characters: limit 1), 3 from 'theta'
    [InlineData("predict --z 1 --zzzz 2", "'--zzzz'")]
    public void AFarOffWordGetsNoGuess(string command, string given)
    {
        var err = Run(command);
        Assert.Contains(given, err);
        Assert.DoesNotContain("did you mean", err);
    }
}
