using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Angles;

namespace SizeTest.Simulation;

/// <summary>
/// Draws mock catalogues (<see cref="MockCatalogue"/>) from a <see cref="MockSurveySpec"/>. Physics only, no I/O.
/// </summary>
/// <remarks>
/// <para>Objects are drawn in chunks of <see cref="ChunkSize"/>; chunk c uses its own
/// <see cref="SimulationRandom.ForStream"/>(seed, c), so its objects depend only on the seed and c. Chunks run in
/// parallel and are merged in chunk order, keeping the first <see cref="SurveyDesign.Count"/> objects that pass the
/// selection: the catalogue is the same bit for bit whatever the number of threads.</para>
/// <para>Per object, in this order: z_true from N(z); for radio sources log10 L ~ N(mean, sd); ε₁ (intrinsic size),
/// ε₂ (intrinsic SB), ε₃ (size error), ε₄ (SB error) ~ N(0,1), always all four so that changing one error level
/// leaves the other draws unchanged; then, with photometric redshifts, ε_z until z_obs &gt; 0.
/// Galaxy: log10 R = log10 R0 + a log10(1+z) + σ_R ε₁; θ = R / D_A(z) (10⁻³ R[kpc]/D_A[Mpc] rad);
/// μ = μ0 + 2.5 (n − b) log10(1+z) + κ (log10 R − log10 R_pivot) + σ_μ ε₂ (Tolman 1930; n from the world model).
/// Radio: log10 ℓ = log10 ℓ_m + β (log10 L − log10 L_pivot) + n log10(1+z) + σ ε₁; θ = ℓ / D_A
/// (Gurvits, Kellermann &amp; Frey 1999). Errors and selection: see <see cref="MeasurementErrors"/> and
/// <see cref="MockSelection"/>.</para>
/// </remarks>
public static class MockSurveyGenerator
{
    /// <summary>Objects drawn per chunk (and per random stream).</summary>
    public const int ChunkSize = 16384;

    private const double Ln10 = 2.302585092994046;

    /// <summary>Draws the catalogue of <paramref name="spec"/>.</summary>
    /// <param name="spec">World model, population, design, seed.</param>
    /// <param name="parallel">Whether chunks may run on several threads (the result is identical either way).</param>
    /// <param name="cancel">Cancellation.</param>
    /// <exception cref="InputException">A setting of the spec is invalid (named as in <see cref="SettingProblem"/>).</exception>
    /// <exception cref="ArgumentException">Another value of the spec is invalid.</exception>
    /// <exception cref="AnalysisException">The selection passes too few objects (more than the draw cap needed).</exception>
    public static MockCatalogue Generate(MockSurveySpec spec, bool parallel = true, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(spec);
        spec.Validate();
        var design = spec.Design;
        int n = design.Count;
        // Warm the model's distance tables over the whole redshift range once, so that parallel chunks only read them.
        Span<double> warm = stackalloc double[2];
        spec.Model.AngularDiameterDistances([design.Redshifts.ZMin, design.Redshifts.ZMax], warm);

        var result = new MockColumns(n);
        long drawn = 0, failSb = 0, failMag = 0, failSize = 0;
        long maxDraws = (long)design.MaxDrawsPerObject * n;
        long nextChunk = 0;
        double passEstimate = 1.0;
        while (result.Count < n)
        {
            cancel.ThrowIfCancellationRequested();
            int needed = n - result.Count;
            long batch = (long)Math.Ceiling(needed / Math.Max(passEstimate, 1e-3) * 1.1 / ChunkSize);
            batch = Math.Clamp(batch, 1, Math.Max(1, 4 * Environment.ProcessorCount));
            var chunks = new ChunkResult[batch];
            long first = nextChunk;
            if (parallel && batch > 1)
                Parallel.For(0, (int)batch, new ParallelOptions { CancellationToken = cancel }, c => chunks[c] = DrawChunk(spec, first + c));
            else
                for (int c = 0; c < batch; c++) chunks[c] = DrawChunk(spec, first + c);
            nextChunk += batch;
            long passedThisRound = 0, drawnThisRound = 0;
            foreach (var chunk in chunks)
            {
                int take = Math.Min(chunk.Columns.Count, n - result.Count);
                if (take > 0 && result.Count + take == n)
                {
                    // The catalogue completes in this chunk: count draws and failures only up to the last object taken.
                    int lastDraw = chunk.DrawIndex[take - 1];
                    for (int i = 0; i <= lastDraw; i++) Tally(chunk.Fail[i], ref failSb, ref failMag, ref failSize);
                    drawn += lastDraw + 1;
                }
                else
                {
                    for (int i = 0; i < ChunkSize; i++) Tally(chunk.Fail[i], ref failSb, ref failMag, ref failSize);
                    drawn += ChunkSize;
                }
                result.Append(chunk.Columns, 0, take);
                passedThisRound += chunk.Columns.Count;
                drawnThisRound += ChunkSize;
                if (result.Count >= n) break;
            }
            passEstimate = Math.Max((double)passedThisRound / drawnThisRound, 1e-6);
            if (result.Count < n && drawn >= maxDraws)
                throw SettingProblem.Analysis(FormattableString.Invariant(
                    $"the selection passes too few objects: only {result.Count} of {drawn} drawn objects passed (pass fraction {(double)result.Count / drawn:G3}); loosen {{sb_limit}}/{{mag_limit}}/{{min_size}} or lower {{object_count}}"));
        }
        return new MockCatalogue(spec, result, drawn, failSb, failMag, failSize);
    }

    private static void Tally(byte code, ref long sb, ref long mag, ref long size)
    {
        if (code == 1) sb++;
        else if (code == 2) mag++;
        else if (code == 3) size++;
    }

    private sealed class ChunkResult(MockColumns columns, int[] drawIndex, byte[] fail)
    {
        public MockColumns Columns { get; } = columns;
        public int[] DrawIndex { get; } = drawIndex;
        public byte[] Fail { get; } = fail;
    }

    private static ChunkResult DrawChunk(MockSurveySpec spec, long chunkIndex)
    {
        var rng = SimulationRandom.ForStream(spec.Seed, chunkIndex);
        var design = spec.Design;
        var errors = design.MeasurementErrors;
        var cuts = design.Cuts;
        var zDist = design.Redshifts;
        bool galaxy = design.Kind == MockObjectKind.Galaxy;
        const int m = ChunkSize;
        var zTrue = new double[m];
        var da = new double[m];
        for (int i = 0; i < m; i++) zTrue[i] = zDist.Sample(ref rng);
        spec.Model.AngularDiameterDistances(zTrue, da);
        var log10Da = new double[m];
        if (galaxy)
            for (int i = 0; i < m; i++) log10Da[i] = Math.Log10(da[i]);

        var g = spec.GalaxyTruth;
        var r = spec.RadioTruth;
        double log10Size0 = galaxy ? Math.Log10(g.R0Kpc) : Math.Log10(r.LinearSizePc / 1000.0);
        double sizeEvolution = galaxy ? g.SizeEvolution : r.SizeEvolution;
        double sizeScatter = galaxy ? g.ScatterDex : r.ScatterDex;
        double sbSlope = 2.5 * (spec.Model.BolometricDimmingExponent - g.SbEvolution);
        double log10Pivot = Math.Log10(g.PivotSizeKpc);
        double radPerKpcMpc = 1e-3 * AngleUnits.ArcsecPerRadian; // θ[arcsec] = 1e-3 R[kpc] / D_A[Mpc] rad
        double log10RadPerKpcMpc = Math.Log10(radPerKpcMpc);
        double f2 = errors.SizeErrorFraction * errors.SizeErrorFraction, floor = errors.SizeErrorFloorArcsec, sigmaFrac = errors.SizeErrorFraction;
        double muErr = errors.MuErrorMag, sz = errors.PhotoZError;
        bool hasSb = cuts.SbLimit is not null, hasMag = cuts.MagLimit is not null, hasSize = cuts.MinThetaArcsec is not null;
        double sbLimit = cuts.SbLimit ?? 0, magLimit = cuts.MagLimit ?? 0, minTheta = cuts.MinThetaArcsec ?? 0;
        double magOffset = 2.5 * Math.Log10(2 * Math.PI);
        var survey = spec.SurveyTruth;
        var lf = galaxy ? survey.LuminosityFunction : null;
        var groups = galaxy ? survey.Groups : [];
        double[] cumulative = new double[groups.Count];
        double total = groups.Sum(q => q.Fraction), run = 0;
        for (int q = 0; q < groups.Count; q++) { run += groups[q].Fraction / total; cumulative[q] = run; }
        double dlExponent = Photometry.ModelLuminosity.DistanceExponent(spec.Model);
        double zLo = zDist.ZMin, zHi = zDist.ZMax;
        bool gaussianErrors = errors.SizeErrors is SizeErrorModel.Gaussian or SizeErrorModel.GaussianOwnSize;
        bool ownSizeErrors = errors.SizeErrors == SizeErrorModel.GaussianOwnSize;
        double lnFourPiMpc2 = Math.Log(4 * Math.PI) + 2 * Math.Log(Cosmology.PhysicalConstants.MegaparsecM);

        var cols = new MockColumns(m);
        var drawIndex = new int[m];
        var fail = new byte[m];
        int k = 0;
        for (int i = 0; i < m; i++)
        {
            double z = zTrue[i];
            double log10OnePlusZ = Math.Log10(1.0 + z);
            double logL = galaxy ? 0.0 : r.LogLuminosityMean + r.LogLuminositySd * rng.NextGaussian();
            double e1 = rng.NextGaussian(), e2 = rng.NextGaussian(), e3 = rng.NextGaussian(), e4 = rng.NextGaussian();
            // Survey ingredients draw after the four deviates, and only when used, so that older catalogues are unchanged.
            int group = 0;
            double s0 = log10Size0, sEvo = sizeEvolution, sSc = sizeScatter, beta = survey.SizeLuminositySlope;
            if (groups.Count > 0)
            {
                double u = rng.NextDouble();
                while (group < groups.Count - 1 && u > cumulative[group]) group++;
                var gp = groups[group];
                s0 = Math.Log10(gp.R0Kpc); sEvo = gp.SizeEvolution; sSc = gp.ScatterDex; beta = gp.SizeLuminositySlope;
            }
            double absMag = lf is null ? double.NaN : lf.Sample(ref rng);
            double log10Size = s0 + sEvo * log10OnePlusZ + sSc * e1;
            if (!galaxy) log10Size += r.LuminosityExponent * (logL - r.LogLuminosityPivot);
            if (lf is not null) log10Size += -0.4 * beta * (absMag - survey.PivotAbsMag);
            double sizeKpc = Math.Exp(Ln10 * log10Size);
            double thetaTrue = sizeKpc / da[i] * radPerKpcMpc;
            double frac = errors.SizeErrorFractionAtZMax is { } f1 ? sigmaFrac + (f1 - sigmaFrac) * (z - zLo) / (zHi - zLo) : sigmaFrac;
            // The population's median angular size at this z (at the pivot luminosity): the scale of the errors that must carry no
            // information about the object's own θ_true (the floor, and Gaussian errors).
            double thetaMedian = Math.Exp(Ln10 * (s0 + sEvo * log10OnePlusZ)) / da[i] * radPerKpcMpc;
            // The floor is set by the measurement (PSF, depth) at this z, not by the object: σ_ln = √(f² + (floor/θ_med(z))²). A floor
            // from θ_true would make the quoted error tell the fit the true size, which the likelihood assumes it does not.
            double sigmaLn = floor > 0 ? Math.Sqrt(frac * frac + floor * floor / (thetaMedian * thetaMedian)) : frac;
            double thetaObs, growth, thetaErr;
            if (gaussianErrors)
            {
                // The quoted error is a fraction of the population's median size at this z (not of the object's own size), so it
                // carries no information about θ_true: θ_obs ~ N(θ_true, σ_θ²) with σ_θ known, as a catalogue quotes it.
                // GaussianOwnSize: the error is a fraction of the object's own true θ instead.
                double thetaRef = ownSizeErrors ? thetaTrue : thetaMedian;
                thetaErr = frac * thetaRef;
                thetaObs = thetaTrue + thetaErr * e3;
                growth = thetaObs > 0 ? Math.Log(thetaObs / thetaTrue) : double.NaN;
            }
            else
            {
                growth = sigmaLn * e3;            // ln θ_obs − ln θ_true
                thetaObs = thetaTrue * Math.Exp(growth);
                thetaErr = sigmaLn * thetaObs;
            }
            double muTrue = 0, muObs = 0, mag = 0;
            if (galaxy && lf is not null)
            {
                // m = M + 5 log10(D_L / 10 pc); μ from m and θ: μ = m + 2.5 log10(2π θ²) (θ in arcsec).
                mag = absMag + 5.0 * (log10Da[i] + dlExponent * log10OnePlusZ) + 25.0;
                muTrue = mag + 5.0 * Math.Log10(thetaTrue) + magOffset;
                muObs = thetaObs > 0 ? mag + 5.0 * Math.Log10(thetaObs) + magOffset + muErr * e4 : double.NaN;
            }
            else if (galaxy)
            {
                muTrue = g.Mu0 + sbSlope * log10OnePlusZ + g.KormendySlope * (log10Size - log10Pivot) + g.ScatterMag * e2;
                muObs = muTrue + muErr * e4;
                // m = μ − 5 log10 θ_obs − 2.5 log10(2π), with log10 θ_obs = log10 θ_true + growth/ln10
                mag = muObs - 5.0 * (log10Size - log10Da[i] + log10RadPerKpcMpc + growth / Ln10) - magOffset;
            }
            double fluxJy = galaxy ? double.NaN
                : Math.Exp(Ln10 * logL + (1 + survey.RadioSpectralIndex) * Math.Log(1 + z) - lnFourPiMpc2 - 2 * (Math.Log(da[i]) + dlExponent * Math.Log(1 + z))) / 1e-26;
            double zObs = z;
            if (sz > 0)
            {
                do zObs = z + sz * (1.0 + z) * rng.NextGaussian();
                while (!(zObs > 0));
            }
            byte code = 0;
            if (!(thetaObs > 0)) code = 3;
            else if (hasSb && !(muObs < sbLimit)) code = 1;
            else if (hasMag && !(mag < magLimit)) code = 2;
            else if (hasSize && !(thetaObs > minTheta)) code = 3;
            fail[i] = code;
            if (code != 0) continue;
            cols.ZObs[k] = zObs;
            cols.ZErr[k] = sz * (1.0 + zObs);
            cols.ZTrue[k] = z;
            cols.ThetaObs[k] = thetaObs;
            cols.ThetaErr[k] = thetaErr;
            cols.AbsMag[k] = absMag;
            cols.FluxJy[k] = fluxJy;
            cols.Group[k] = group;
            cols.ThetaTrue[k] = thetaTrue;
            cols.MuObs[k] = muObs;
            cols.MuErr[k] = muErr;
            cols.MuTrue[k] = muTrue;
            cols.Mag[k] = mag;
            cols.LogL[k] = logL;
            cols.SizeKpc[k] = sizeKpc;
            drawIndex[k] = i;
            k++;
        }
        cols.Count = k;
        return new ChunkResult(cols, drawIndex, fail);
    }
}
