namespace SizeTest.Photometry;

/// <summary>
/// The photometry options as compact strings, one per CLI flag or study-file key (null =
/// not given). Grammar: see <see cref="PhotometryOptionParser"/>.
/// </summary>
public sealed record PhotometryOptionText
{
    /// <summary><c>--kcorr</c>: <c>none | column:NAME | powerlaw:ALPHA | template:FILE[,flux:flambda|fnu][,filter-obs:FILE][,filter-rest:FILE][,reference:ab|FILE][,reference-obs:ab|FILE][,reference-rest:ab|FILE][,reference-flux:flambda|fnu][,wavelength-unit:angstrom|nm|um]</c>.</summary>
    public string? KCorrection { get; init; }

    /// <summary><c>--extinction</c>: <c>none | column:NAME | ebv:COLUMN,coeffs:FILE</c>.</summary>
    public string? Extinction { get; init; }

    /// <summary><c>--zero-points</c>: path of a two-column table "band offset" (m_AB = m + offset).</summary>
    public string? ZeroPoints { get; init; }

    /// <summary><c>--band</c>: the band of every object when the catalogue has no band column.</summary>
    public string? DefaultBand { get; init; }

    /// <summary><c>--band-match</c>: <c>target:LAMBDA|FILE,band:NAME=MU_COL[/ERR_COL]@LAMBDA|FILE,…[,mode:nearest|interpolate][,wavelength-unit:…]</c>.</summary>
    public string? BandMatch { get; init; }

    /// <summary><c>--sersic-n</c>: Sérsic index, e.g. <c>4</c>.</summary>
    public string? SersicIndex { get; init; }

    /// <summary><c>--sb</c>: <c>column[:mean|effective|central][,to:mean|effective|central] | from-mag[,to:…]</c>.</summary>
    public string? SurfaceBrightness { get; init; }
}
