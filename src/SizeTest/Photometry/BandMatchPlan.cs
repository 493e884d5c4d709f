using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;

namespace SizeTest.Photometry;

/// <summary>
/// The per-object outcome of band matching: for object i the bands A_i, B_i (indices into the
/// bands sorted by wavelength) and weight w_i of A (1 − w_i of B), chosen in ln λ against
/// λ_needed = λ_target (1+z_i). Nearest mode has A = B, w = 1.
/// </summary>
internal sealed class BandMatchPlan
{
    private readonly ObservedBand[] _bands;   // sorted by effective wavelength
    private readonly BandMatchOption _option;
    private readonly int[] _a, _b;
    private readonly double[] _w;
    private readonly int _outside;

    private BandMatchPlan(BandMatchOption option, ObservedBand[] bands, int[] a, int[] b, double[] w, int outside)
    {
        _option = option;
        _bands = bands;
        _a = a;
        _b = b;
        _w = w;
        _outside = outside;
    }

    /// <summary>Band A of object i.</summary>
    public ObservedBand BandA(int i) => _bands[_a[i]];

    /// <summary>Band B of object i (equal to A in nearest mode).</summary>
    public ObservedBand BandB(int i) => _bands[_b[i]];

    /// <summary>Weight of band A for object i.</summary>
    public double WeightA(int i) => _w[i];

    public static BandMatchPlan Create(CatalogueRows sample, BandMatchOption option)
    {
        if (option.Bands.Count == 0) throw new InputException("Band matching needs at least one observed band.");
        if (!(option.TargetLambdaAngstrom > 0)) throw new InputException($"Band matching target wavelength must be > 0 Å, got {option.TargetLambdaAngstrom}.");
        var names = new HashSet<string>(StringComparer.Ordinal);
        foreach (var band in option.Bands)
        {
            if (!names.Add(band.Name)) throw new InputException($"Band matching lists band '{band.Name}' twice.");
            if (!(band.EffectiveLambdaAngstrom > 0)) throw new InputException($"Band '{band.Name}' needs an effective wavelength > 0 Å.");
            // Existence only: a band's values may be missing for objects that do not use it;
            // the values actually used are checked in SurfaceBrightness.
            ObservablesBuilder.RequireColumn(sample, band.MuColumn, $"band-{band.Name} surface-brightness", checkValues: false);
            if (band.MuErrColumn is { } ec) ObservablesBuilder.RequireColumn(sample, ec, $"band-{band.Name} surface-brightness error", checkValues: false);
        }
        var bands = option.Bands.OrderBy(b => b.EffectiveLambdaAngstrom).ToArray();
        var ln = bands.Select(b => Math.Log(b.EffectiveLambdaAngstrom)).ToArray();
        int n = sample.Count, outside = 0;
        var a = new int[n];
        var bb = new int[n];
        var w = new double[n];
        double lnTarget = Math.Log(option.TargetLambdaAngstrom);
        for (int i = 0; i < n; i++)
        {
            double x = lnTarget + Math.Log(1.0 + sample.Z[i]);
            int j = 0;
            while (j + 1 < ln.Length && ln[j + 1] <= x) j++;   // ln[j] ≤ x < ln[j+1], or an end
            int lo, hi;
            double wa;
            if (x <= ln[0]) { lo = hi = 0; wa = 1; outside += x < ln[0] && ln.Length > 1 ? 1 : 0; }
            else if (j == ln.Length - 1) { lo = hi = j; wa = 1; outside += x > ln[j] && ln.Length > 1 ? 1 : 0; }
            else if (option.Mode == BandMatchMode.Interpolate)
            {
                lo = j; hi = j + 1;
                wa = (ln[hi] - x) / (ln[hi] - ln[lo]);
            }
            else
            {
                lo = hi = (x - ln[j] <= ln[j + 1] - x) ? j : j + 1;
                wa = 1;
            }
            a[i] = lo; bb[i] = hi; w[i] = wa;
        }
        return new BandMatchPlan(option, bands, a, bb, w, outside);
    }

    /// <summary>μ per object (zero-pointed to AB) and its error (null if no band has an error column).</summary>
    public (double[] Mu, double[]? MuErr) SurfaceBrightness(CatalogueRows sample, BandTable? zeroPoints)
    {
        int n = sample.Count;
        bool anyErr = _bands.Any(b => b.MuErrColumn is not null);
        if (anyErr && _bands.Any(b => b.MuErrColumn is null))
            throw new InputException("Band matching: give an error column for every band or for none.");
        var mu = new double[n];
        var err = anyErr ? new double[n] : null;
        for (int i = 0; i < n; i++)
        {
            var (ba, bb, wa) = (_bands[_a[i]], _bands[_b[i]], _w[i]);
            double wb = 1.0 - wa;
            mu[i] = wa * (Value(sample, ba.MuColumn, i) + ZeroPoint(sample, zeroPoints, ba, i));
            if (wb > 0) mu[i] += wb * (Value(sample, bb.MuColumn, i) + ZeroPoint(sample, zeroPoints, bb, i));
            if (err is not null)
            {
                double ea = Value(sample, ba.MuErrColumn!, i);
                double eb = wb > 0 ? Value(sample, bb.MuErrColumn!, i) : 0.0;
                err[i] = Math.Sqrt(wa * wa * ea * ea + wb * wb * eb * eb);   // independent band errors
            }
        }
        return (mu, err);
    }

    private static double Value(CatalogueRows sample, string column, int i)
    {
        double v = sample.ExtraColumns[column][i];
        return double.IsFinite(v) ? v
            : throw new InputException("the matched band's value is missing or not a number; this object needs it.",
                sample.SourceName, sample.SourceRows[i], column);
    }

    private static double ZeroPoint(CatalogueRows sample, BandTable? zp, ObservedBand band, int i)
    {
        if (zp is null) return 0.0;
        if (!zp.TryGet(band.Name, out double off))
            throw new InputException($"band '{band.Name}' is not in the zero-point table {zp.Source}; add it (offset 0 for AB bands).",
                sample.SourceName, sample.SourceRows[i], band.MuColumn);
        return off;
    }

    /// <summary>A_i = (w R_A + (1−w) R_B) E(B−V)_i.</summary>
    public void Extinction(CatalogueRows sample, double[] ebv, BandTable coefficients, double[] a)
    {
        for (int i = 0; i < sample.Count; i++)
        {
            double r = _w[i] * Coefficient(sample, coefficients, _bands[_a[i]], i);
            if (_w[i] < 1) r += (1 - _w[i]) * Coefficient(sample, coefficients, _bands[_b[i]], i);
            a[i] = r * ebv[i];
        }
    }

    private static double Coefficient(CatalogueRows sample, BandTable t, ObservedBand band, int i) =>
        t.TryGet(band.Name, out double r) ? r
        : throw new InputException($"band '{band.Name}' is not in the {t.Quantity} table {t.Source}; add it.",
            sample.SourceName, sample.SourceRows[i], band.MuColumn);

    /// <summary>
    /// k[i] = w K(A→target, z_i) + (1−w) K(B→target, z_i) for the template's spectrum: through the
    /// filter curves when both the band and the target have one, otherwise for narrow bands at
    /// the effective wavelengths: K = −2.5 log10[(1+z) L_ν(λ_R/(1+z)) g^Q(λ_Q) / (g^R(λ_R) L_ν(λ_Q))]
    /// (Hogg et al. 2002 eq. 8 with delta-function filters).
    /// </summary>
    public void ResidualK(CatalogueRows sample, KCorrectionOption.Template t, double step, double[] k)
    {
        int n = sample.Count;
        Array.Clear(k);
        var weight = new double[n];
        for (int bi = 0; bi < _bands.Length; bi++)
        {
            var rows = new List<int>();
            for (int i = 0; i < n; i++)
            {
                double w = (_a[i] == bi ? _w[i] : 0.0) + (_b[i] == bi && _b[i] != _a[i] ? 1.0 - _w[i] : 0.0);
                weight[i] = w;
                if (w > 0) rows.Add(i);
            }
            if (rows.Count == 0) continue;
            var band = _bands[bi];
            if (band.Response is { } resp && _option.TargetBand is { } target)
            {
                ObservablesBuilder.TemplateK(sample, t, resp, target, step, k, rows, weight);
                continue;
            }
            double lR = band.EffectiveLambdaAngstrom, lQ = _option.TargetLambdaAngstrom;
            var gR = t.ObservedReference ?? SpectralTable.AbReference;
            var gQ = t.RestReference ?? SpectralTable.AbReference;
            double lnConst = Math.Log(gQ.FNuAt(lQ)) - Math.Log(gR.FNuAt(lR)) - Math.Log(t.Spectrum.FNuAt(lQ));
            foreach (int i in rows)
            {
                double opz = 1.0 + sample.Z[i];
                double l = t.Spectrum.FNuAt(lR / opz);
                double val = -2.5 / Math.Log(10.0) * (Math.Log(opz) + Math.Log(l) + lnConst);
                if (!double.IsFinite(val))
                    throw new InputException(
                        $"template {t.Spectrum.Source} has no flux at rest wavelength {ObservablesBuilder.F(lR / opz)} Å or {ObservablesBuilder.F(lQ)} Å needed for band {band.Name} at z = {ObservablesBuilder.F(sample.Z[i])}; extend the template.",
                        sample.SourceName, sample.SourceRows[i], "z");
                k[i] += weight[i] * val;
            }
        }
    }

    /// <summary>Lines for the corrections list.</summary>
    public IEnumerable<string> Describe()
    {
        var counts = new int[_bands.Length];
        for (int i = 0; i < _a.Length; i++) { counts[_a[i]]++; if (_b[i] != _a[i]) counts[_b[i]]++; }
        string list = string.Join(", ", _bands.Select((b, j) => $"{b.Name} ({ObservablesBuilder.F(b.EffectiveLambdaAngstrom)} A, {counts[j]} objects)"));
        string mode = _option.Mode == BandMatchMode.Interpolate ? "interpolated in ln lambda between the two bracketing bands" : "nearest band in ln lambda";
        yield return $"band matching: rest-frame target {ObservablesBuilder.F(_option.TargetLambdaAngstrom)} A observed at lambda (1+z); {mode}; bands {list}.";
        if (_outside > 0)
            yield return $"band matching: {_outside} objects need a wavelength outside the observed bands; the nearest end band is used and the residual K-correction covers the gap.";
    }
}
