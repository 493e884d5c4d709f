using System.CommandLine;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Cli;

/// <summary>
/// The photometry options shared by verbs that turn a catalogue into observables (<c>fit</c>, <c>inspect</c>):
/// <c>--kcorr</c>, <c>--extinction</c>, <c>--zero-points</c>, <c>--band</c>, <c>--band-match</c>, <c>--sersic-n</c>,
/// <c>--sb</c>. The grammar is that of <see cref="PhotometryOptionText"/>; <see cref="ToOptions(ParseResult)"/> parses them with
/// <see cref="PhotometryOptionParser"/> (files read through <see cref="PhotometryFiles.ReadText"/>).
/// </summary>
internal sealed class PhotometryCliOptions
{
    public Option<string?> KCorrection { get; } = CliOptions.Text("--kcorr", "K-correction: none (default), column:NAME, powerlaw:ALPHA (f_nu ~ nu^ALPHA, K = -2.5(1+ALPHA)log10(1+z)) or template:FILE[,filter-obs:FILE,filter-rest:FILE,reference:ab|FILE,flux:flambda|fnu,wavelength-unit:angstrom|nm|um].");

    public Option<string?> Extinction { get; } = CliOptions.Text("--extinction", "Galactic extinction added to the SB model: none (default), column:NAME (A_band, mag) or ebv:COLUMN,coeffs:FILE (A = R_band x E(B-V)).");

    public Option<string?> ZeroPoints { get; } = CliOptions.Text("--zero-points", "FILE of rows 'band offset' converting to AB (m_AB = m + offset), applied to mu, mag and the isophote.");

    public Option<string?> Band { get; } = CliOptions.Text("--band", "Band of every object when the catalogue has no band column (for zero points and extinction coefficients).");

    public Option<string?> BandMatch { get; } = CliOptions.Text("--band-match", "Match observed bands to a rest-frame target: target:LAMBDA|FILE,band:NAME=MU_COL[/ERR_COL]@LAMBDA|FILE,...[,mode:nearest|interpolate][,wavelength-unit:...].");

    public Option<string?> SersicIndex { get; } = CliOptions.Text("--sersic-n", "Sérsic index n of the profiles (needed for isophotal sizes and SB conversions), e.g. 1 or 4.");

    public Option<string?> SurfaceBrightness { get; } = CliOptions.Text("--sb", "Surface brightness: column[:mean|effective|central][,to:KIND] (default: the mu column as given) or from-mag[,to:KIND] (<mu>_e from mag and size).");

    public void AddTo(Command command)
    {
        command.Options.Add(KCorrection);
        command.Options.Add(Extinction);
        command.Options.Add(ZeroPoints);
        command.Options.Add(Band);
        command.Options.Add(BandMatch);
        command.Options.Add(SersicIndex);
        command.Options.Add(SurfaceBrightness);
    }

    /// <summary>The option strings as given (null where absent).</summary>
    public PhotometryOptionText ToText(ParseResult parse) => new()
    {
        KCorrection = parse.GetValue(KCorrection),
        Extinction = parse.GetValue(Extinction),
        ZeroPoints = parse.GetValue(ZeroPoints),
        DefaultBand = parse.GetValue(Band),
        BandMatch = parse.GetValue(BandMatch),
        SersicIndex = parse.GetValue(SersicIndex),
        SurfaceBrightness = parse.GetValue(SurfaceBrightness),
    };

    /// <summary>Parses the options; throws <see cref="InputException"/> (one line, naming the option) on a bad value.</summary>
    public PhotometryOptions ToOptions(ParseResult parse) => PhotometryOptionParser.Parse(ToText(parse), PhotometryFiles.ReadText);

    /// <summary>Same as <see cref="ToOptions(ParseResult)"/>, adding every file read to <paramref name="filesRead"/> (inputs of the run).</summary>
    public PhotometryOptions ToOptions(ParseResult parse, ICollection<string> filesRead) =>
        PhotometryOptionParser.Parse(ToText(parse), path => { filesRead.Add(path); return PhotometryFiles.ReadText(path); });
}
