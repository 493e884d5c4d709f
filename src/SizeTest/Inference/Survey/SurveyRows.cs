using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The per-object terms of a <see cref="SurveyModel"/> that do not depend on the observable: each object's population (group),
/// evolution bin, weight (times the per-model luminosity window), luminosity base term and photometric-redshift quadrature
/// nodes. Built once per bound hypothesis and shared by the survey kernels (<see cref="SurveySizeLikelihood"/>).
/// </summary>
/// <remarks>
/// <para>Luminosity: ln(L_i/L_pivot) = C_i + 2 ln D_L(z) with C_i from <see cref="ModelLuminosity.BaseTerms"/>; for flux densities
/// C shifts with z by −(1 + α) Δln(1+z) at a photo-z node (K-correction of a power-law spectrum S ∝ ν^α; flux held fixed).</para>
/// <para>Luminosity window: M_i = M_pivot − (C_i + 2 ln D_L(z_i)) / (0.4 ln 10), evaluated once with the world model's start (or fixed)
/// parameters; an object outside gets weight 0.</para>
/// <para>Photometric redshifts: p_i = ∫ p_i(· | z) N(z; z_obs, σ_z²) π(z) dz with π flat on [z_lo, z_hi], by Gauss–Hermite with J nodes
/// z_ij = z_obs + √2 σ_z x_j (Abramowitz &amp; Stegun 1964, 25.4.46) when all J nodes lie inside the prior. An object whose normal the
/// prior cuts (a node outside it, or none inside) is integrated under its truncated normal on the prior by J-point Gauss–Legendre
/// (<see cref="TruncatedRedshiftNodes"/>): dropping the outside Hermite nodes and renormalising was biased (400 objects, prior
/// [1, 2.5] on z_obs in 0.5–3, σ_z = 0.08(1+z): a = −1.539 with 40 nodes against −1.528 exact). Node i·J + j belongs to object i.</para>
/// </remarks>
internal sealed class SurveyRows
{
    private const double Ln10 = 2.302585092994046;

    // Up to this many nodes an object cut by the redshift prior takes the quantile rule (TruncatedRedshiftNodes.FillQuantile), beyond it the window rule.
    private const int QuantileRuleMaxNodes = 5;

    /// <summary>Objects.</summary>
    public int Count { get; }

    /// <summary>ln(1+z) and ln z at each object's observed redshift.</summary>
    public double[] Ln1pZ { get; }

    /// <inheritdoc cref="Ln1pZ"/>
    public double[] LnZ { get; }

    /// <summary>Number of groups (1 without populations) and each object's group index.</summary>
    public int GroupCount { get; }

    /// <summary>Each object's group index in <see cref="SurveyModel.GroupLabels"/>.</summary>
    public int[] Group { get; }

    /// <summary>Number of evolution bins (1 for the power law) and each object's bin (by observed redshift).</summary>
    public int BinCount { get; }

    /// <summary>Each object's evolution bin.</summary>
    public int[] Bin { get; }

    /// <summary>Each object's weight (null: all 1); 0 outside the luminosity window.</summary>
    public double[]? Weight { get; }

    /// <summary>Whether luminosity terms are present (a size relation or a window).</summary>
    public bool HasLuminosity => LuminosityBase is not null;

    /// <summary>C_i (null without luminosity terms).</summary>
    public double[]? LuminosityBase { get; }

    /// <summary>∂C/∂ln(1+z) with flux held fixed: 1 + α for flux densities, else 0.</summary>
    public double LuminosityZSlope { get; }

    /// <summary>Whether each object is integrated over its redshift.</summary>
    public bool MarginalisesRedshift { get; }

    /// <summary>Redshift nodes per object (0 without photo-z).</summary>
    public int NodesPerObject { get; }

    /// <summary>ln(1+z), ln z, log weight (−∞: dropped) and C at each node.</summary>
    public double[] NodeLn1pZ { get; } = [];

    /// <inheritdoc cref="NodeLn1pZ"/>
    public double[] NodeLnZ { get; } = [];

    /// <inheritdoc cref="NodeLn1pZ"/>
    public double[] NodeLogWeight { get; } = [];

    /// <inheritdoc cref="NodeLn1pZ"/>
    public double[] NodeLuminosityBase { get; } = [];

    /// <summary>ln D_A at each node under a fixed cosmology (null when the cosmology is free).</summary>
    public double[]? NodeLnDaFixed { get; }

    /// <summary>The nodes' stencils on the redshift grid (free cosmology; null otherwise).</summary>
    public RedshiftGrid? NodeGrid { get; }

    /// <summary>How objects are integrated over redshift (<see cref="RedshiftMarginal.Linear"/>: no nodes; the slope terms below instead).</summary>
    public RedshiftMarginal Marginal { get; }

    /// <summary>Linearised marginal: the variance s² of each object's redshift posterior (empty otherwise). Its one node
    /// (<see cref="NodesPerObject"/> = 1, log weight 0) sits at the posterior mean z̄.</summary>
    public double[] RedshiftVariance { get; } = [];

    /// <summary>Linearised marginal, fixed cosmology: d ln D_A/d z at z̄ (central difference of the model's D_A, step 10⁻⁴ z).</summary>
    public double[]? LnDaSlopeFixed { get; }

    /// <summary>Linearised marginal, free cosmology: 4 weights per object on its node's stencil in <see cref="NodeGrid"/> giving
    /// d(ln D_A − ln z)/d z at z̄ (<see cref="RedshiftGridSlope"/>).</summary>
    public double[]? SlopeWeights { get; }

    /// <summary>Notes for the results.</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <param name="h">The hypothesis (its survey terms and world model).</param>
    /// <param name="o">The objects.</param>
    /// <param name="groupNuisance">What each group has of its own, for the note (e.g. "R0, a, scatter").</param>
    /// <param name="fixedCosmology">Whether ln D_A is fixed (then node distances are computed once with <paramref name="startModel"/>).</param>
    /// <param name="grid">The redshift grid of a free cosmology (its node count is reused for the photo-z nodes' grid).</param>
    /// <param name="gridMinZ">Lower end of the grid.</param>
    /// <param name="gridMaxZ">Upper end of the grid.</param>
    /// <param name="priorMinZ">Lower end of the photo-z prior.</param>
    /// <param name="priorMaxZ">Upper end of the photo-z prior.</param>
    /// <param name="startModel">The world model at its start (or fixed) parameters.</param>
    /// <param name="wholeSample">These objects are the whole sample; false for a part of it (a rank's share, a one-object column check),
    /// which cannot judge a luminosity window that keeps none of them.</param>
    public SurveyRows(Hypothesis h, Observables o, string groupNuisance, bool fixedCosmology, RedshiftGrid? grid, double gridMinZ, double gridMaxZ,
        double priorMinZ, double priorMaxZ, IWorldModel startModel, bool wholeSample = true)
    {
        var sv = h.Nuisance.SurveyTerms;
        var notes = new List<string>();
        int n = Count = o.Count;
        Ln1pZ = new double[n];
        LnZ = new double[n];
        for (int i = 0; i < n; i++)
        {
            Ln1pZ[i] = Math.Log(1 + o.Z[i]);
            LnZ[i] = Math.Log(o.Z[i]);
        }

        // --- groups
        var labels = sv.GroupLabels;
        GroupCount = labels.Count;
        Group = new int[n];
        if (sv.Groups is { Count: > 0 })
        {
            var g = o.Survey.Group ?? throw SettingProblem.Exception([new("{group} needs a group column; map it with {group} COLUMN or {col} group=NAME")]);
            var index = labels.Select((l, k) => (l, k)).ToDictionary(t => t.l, t => t.k, StringComparer.Ordinal);
            for (int i = 0; i < n; i++)
                Group[i] = index.TryGetValue(g[i], out var k) ? k : throw new InputException($"object {i + 1} has group '{g[i]}', which is not among the fitted groups {string.Join(", ", labels)}");
            notes.Add(SettingProblem.Text($"populations: {GroupCount} groups ({string.Join(", ", labels)}), each with its own {groupNuisance}; the world model is shared."));
        }

        // --- evolution bins (by observed redshift)
        BinCount = sv.BinCount;
        Bin = new int[n];
        if (sv.EvolutionBinEdges is { } edges)
        {
            for (int i = 0; i < n; i++)
            {
                int k = 0;
                while (k < BinCount - 1 && o.Z[i] >= edges[k + 1]) k++;
                Bin[i] = k;
            }
            notes.Add($"evolution: binned, R0 free in {BinCount} equal-count redshift bins (edges {string.Join(", ", edges.Select(x => x.ToString("G4", System.Globalization.CultureInfo.InvariantCulture)))}) instead of (1+z)^a.");
        }

        // --- luminosities
        var lum = o.Survey.Luminosity;
        bool hasLum = sv.Relation != SizeRelationKind.None;
        if (hasLum || sv.HasWindow)
        {
            if (lum is null) throw SettingProblem.Exception([new(sv.Relation == SizeRelationKind.Mass
                ? "{size_mass} needs a 'log_mass' column; map it with {col} log_mass=NAME"
                : "{size_luminosity} and {abs_mag_range} need 'mag', 'abs_mag' or 'flux_density'; map one with {col} ROLE=NAME")]);
            if (sv.Relation == SizeRelationKind.Mass && !lum.IsMass) throw SettingProblem.Exception([new("{size_mass} needs stellar masses (log_mass), but the luminosity data are not masses")]);
            if (sv.Relation == SizeRelationKind.Luminosity && lum.IsMass) throw SettingProblem.Exception([new("the luminosity data are stellar masses; use {size_mass}")]);
            LuminosityBase = ModelLuminosity.BaseTerms(lum, o.Z, sv.PivotOrDefault);
            LuminosityZSlope = lum.Kind == LuminosityKind.FluxDensity ? 1 + lum.SpectralIndex : 0;
        }

        // --- weights and window
        double[]? w = o.Survey.Weight is { } ow ? (double[])ow.Clone() : null;
        if (sv.HasWindow)
        {
            if (lum!.Kind is LuminosityKind.FluxDensity or LuminosityKind.StellarMass) throw SettingProblem.Exception([new("{abs_mag_range} needs magnitudes (mag or abs_mag), not flux densities or masses")]);
            w ??= Enumerable.Repeat(1.0, n).ToArray();
            var lnDl = ModelLuminosity.LnLuminosityDistances(startModel, o.Z);
            double piv = sv.PivotOrDefault.AbsMag;
            int kept = 0;
            for (int i = 0; i < n; i++)
            {
                double absMag = piv - (LuminosityBase![i] + 2 * lnDl[i]) / (0.4 * Ln10);
                bool inside = (sv.AbsMagMin is not { } lo || absMag >= lo) && (sv.AbsMagMax is not { } hi || absMag <= hi);
                if (!inside) w[i] = 0; else kept++;
            }
            if (kept == 0 && wholeSample) throw LuminosityWindowNote.NoneInside(h.Family.Name);
            // The note (with counts over the whole sample) is written by SurveyBinding: under mpirun these are one rank's objects.
        }
        Weight = w;

        // --- photometric redshifts
        MarginalisesRedshift = sv.MarginaliseRedshift;
        Marginal = sv.ZMarginal;
        bool linear = Marginal == RedshiftMarginal.Linear;
        if (MarginalisesRedshift)
        {
            var zErr = o.Survey.ZErr ?? throw new InputException("photometric-redshift marginalisation needs a 'z_err' column");
            var gh = new GaussHermite(sv.RedshiftNodes);
            int J = linear ? 1 : sv.RedshiftNodes;
            NodesPerObject = J;
            NodeLn1pZ = new double[n * J];
            NodeLnZ = new double[n * J];
            NodeLogWeight = new double[n * J];
            NodeLuminosityBase = new double[n * J];
            var nodeZ = new double[n * J];
            GaussLegendre? gl = null;
            int truncated = 0;
            if (linear)
            {
                RedshiftVariance = LinearisedCentres(o.Z, zErr, priorMinZ, priorMaxZ, nodeZ, out truncated);
                if (sv.RedshiftPopulation is { } pop) PopulationMoments(o.Z, zErr, priorMinZ, priorMaxZ, pop, nodeZ, RedshiftVariance);
            }
            for (int i = 0; i < n && linear; i++)
            {
                NodeLn1pZ[i] = Math.Log(1 + nodeZ[i]);
                NodeLnZ[i] = Math.Log(nodeZ[i]);
                if (LuminosityBase is not null) NodeLuminosityBase[i] = LuminosityBase[i] - LuminosityZSlope * (NodeLn1pZ[i] - Ln1pZ[i]);
            }
            for (int i = 0; i < n && !linear; i++)
            {
                // Every Gauss–Hermite node inside the prior: the normal is whole there (to the nodes' reach, ±√2·x_max σ) and
                // Gauss–Hermite integrates it. Otherwise the prior cuts the normal within the nodes' reach, and dropping the
                // outside nodes and renormalising is a poor rule for a truncated normal (a few coarse nodes carry the cut
                // side): the object goes to the Gauss–Legendre path on the prior below, under its truncated normal.
                bool whole = zErr[i] > 0;
                for (int j = 0; j < J && whole; j++)
                {
                    double z = o.Z[i] + Math.Sqrt(2) * zErr[i] * gh.Nodes[j];
                    whole = z >= priorMinZ && z <= priorMaxZ && z > 0;
                }
                double sum = 0;
                for (int j = 0; j < J; j++)
                {
                    double z = o.Z[i] + Math.Sqrt(2) * zErr[i] * gh.Nodes[j];
                    bool inside = whole || (!(zErr[i] > 0) && z >= priorMinZ && z <= priorMaxZ && z > 0);
                    int q = i * J + j;
                    nodeZ[q] = inside ? z : o.Z[i];
                    NodeLogWeight[q] = inside ? gh.Weights[j] : 0;
                    sum += NodeLogWeight[q];
                    NodeLn1pZ[q] = Math.Log(1 + nodeZ[q]);
                    NodeLnZ[q] = Math.Log(nodeZ[q]);
                    if (LuminosityBase is not null) NodeLuminosityBase[q] = LuminosityBase[i] - LuminosityZSlope * (NodeLn1pZ[q] - Ln1pZ[i]);
                }
                if (sum > 0)
                    for (int j = 0; j < J; j++)
                    {
                        int q = i * J + j;
                        NodeLogWeight[q] = NodeLogWeight[q] > 0 ? Math.Log(NodeLogWeight[q] / sum) : double.NegativeInfinity;
                    }
                else
                {
                    // The prior cuts the object's normal (or no node lies inside it): the truncated normal on the prior by
                    // Gauss–Legendre (TruncatedRedshiftNodes).
                    if (!(zErr[i] > 0))
                        throw SettingProblem.Exception([new($"object {i + 1} of the fitted sample has z = {o.Z[i]:G6} outside the redshift prior [{priorMinZ:G4}, {priorMaxZ:G4}] and z_err = 0, so it has no density under the prior; widen {{z_prior}} or drop the object")]);
                    truncated++;
                    gl ??= new GaussLegendre(J);
                    // Cut but not excluded (a Hermite node inside): Gauss–Legendre in the normal's probability; excluded (no node
                    // inside: z_obs far outside the prior): Gauss–Legendre in z on the Gaussian's window at the prior's end.
                    bool cut = false;
                    for (int j = 0; j < J && !cut; j++)
                    {
                        double zj = o.Z[i] + Math.Sqrt(2) * zErr[i] * gh.Nodes[j];
                        cut = zj >= priorMinZ && zj <= priorMaxZ && zj > 0;
                    }
                    // Measured on 400 objects cut by a prior (TruncatedPriorQuadratureCliTests): the window rule is exact to 10⁻⁴ in a
                    // from 7 nodes on (the quantile rule, whose integrand has a log singularity at the uncut end, to 2·10⁻³), the quantile
                    // rule the better one with 3–5 nodes (TruncatedRedshiftNodesTests).
                    if (!cut || J > QuantileRuleMaxNodes || !TruncatedRedshiftNodes.FillQuantile(o.Z[i], zErr[i], Math.Max(priorMinZ, 0), priorMaxZ, gl, nodeZ.AsSpan(i * J, J), NodeLogWeight.AsSpan(i * J, J)))
                        TruncatedRedshiftNodes.Fill(o.Z[i], zErr[i], Math.Max(priorMinZ, 0), priorMaxZ, gl, nodeZ.AsSpan(i * J, J), NodeLogWeight.AsSpan(i * J, J));
                    for (int j = 0; j < J; j++)
                    {
                        int q = i * J + j;
                        NodeLn1pZ[q] = Math.Log(1 + nodeZ[q]);
                        NodeLnZ[q] = Math.Log(nodeZ[q]);
                        if (LuminosityBase is not null) NodeLuminosityBase[q] = LuminosityBase[i] - LuminosityZSlope * (NodeLn1pZ[q] - Ln1pZ[i]);
                    }
                }
            }
            if (sv.RedshiftPopulation is { } population && !linear)
                for (int i = 0; i < n; i++)
                {
                    // ln w_ij + ln π(z_ij), renormalised over the object's nodes (the prior's shape; its range was applied above).
                    double max = double.NegativeInfinity;
                    for (int q = i * J; q < (i + 1) * J; q++)
                    {
                        if (double.IsNegativeInfinity(NodeLogWeight[q])) continue;
                        NodeLogWeight[q] += population.LogDensity(nodeZ[q]);
                        if (NodeLogWeight[q] > max) max = NodeLogWeight[q];
                    }
                    if (double.IsNegativeInfinity(max)) throw new InvalidOperationException($"object {i + 1}: the population redshift prior vanishes at every node");
                    double sum = 0;
                    for (int q = i * J; q < (i + 1) * J; q++) sum += Math.Exp(NodeLogWeight[q] - max);
                    double norm = max + Math.Log(sum);
                    for (int q = i * J; q < (i + 1) * J; q++) NodeLogWeight[q] -= norm;
                }
            if (fixedCosmology)
            {
                NodeLnDaFixed = ModelLuminosity.LnLuminosityDistances(startModel, nodeZ);
                double e = ModelLuminosity.DistanceExponent(startModel);
                for (int q = 0; q < nodeZ.Length; q++) NodeLnDaFixed[q] -= e * NodeLn1pZ[q];
            }
            else
                NodeGrid = new RedshiftGrid(nodeZ, grid!.Nodes.Length, gridMinZ, gridMaxZ);
            if (linear)
            {
                if (fixedCosmology) LnDaSlopeFixed = LnDaSlope(startModel, nodeZ);
                else SlopeWeights = RedshiftGridSlope.Weights(NodeGrid!, nodeZ);
                string law = h.Nuisance.Observable switch
                {
                    ObservableKind.SurfaceBrightness => "μ ~ N(m_μ(z̄), σ_μ,i² + s_μ² + (∂m_μ/∂z)² s²)",
                    ObservableKind.Joint => "(ln θ, μ) ~ N(m(z̄), C + s² g gᵀ), C the bivariate covariance and g = (∂m_t/∂z, ∂m_μ/∂z)",
                    _ => "ln θ ~ N(m(z̄), σ_i² + σ² + (∂m/∂z)² s²)",
                };
                notes.Add(FormattableString.Invariant($"photometric redshifts: linearised marginal ({{z_marginal}} linear; effective variance, Clutton-Brock 1967, Orear 1982): {law} with z̄, s² the mean and variance of the object's redshift posterior N(z; z_obs, z_err²) π(z) on [{priorMinZ:G4}, {priorMaxZ:G4}], π ") +
                    (sv.RedshiftPopulation is { } popL ? popL.Describe() + " ({z_prior_shape} flat for a flat prior; moments integrated numerically)" : "flat in z (z_obs and z_err² where the prior keeps all but 10⁻¹² of the Gaussian)") + FormattableString.Invariant($", and ∂m/∂z at z̄ from each world model's own distances; {{z_marginal}} quadrature integrates exactly."));
            }
            else
            {
                notes.Add($"photometric redshifts: each object integrated over z with a prior on [{priorMinZ:G4}, {priorMaxZ:G4}]{(sv.RedshiftPriorMin is null && sv.RedshiftPriorMax is null ? " (the sample's redshift range; set it with {z_prior})" : "")}, " +
                    (sv.RedshiftPopulation is { } pop ? pop.Describe() + " ({z_prior_shape} flat for a flat prior)" : "flat in z") + $", times N(z_obs; z, z_err²), by {J}-point Gauss–Hermite quadrature in z (nodes through the redshift grid); {{ignore_z_err}} turns this off.");
            if (truncated > 0)
                notes.Add($"photometric redshifts: the prior cuts the redshift error distribution of {truncated} object(s) (a Gauss–Hermite node outside it); each is integrated over the prior by {J}-point Gauss–Legendre under its truncated normal N(z; z_obs, z_err²).");
            }
        }
        Notes = notes;
    }

    // Linearised marginal under the population prior: each object's posterior N(z; z_obs, σ²) π(z) on [lo, hi] summarised by its mean
    // (written to centre) and variance, by 64-point Gauss–Legendre on the Gaussian's 20-e-fold window (TruncatedRedshiftNodes.Window)
    // with node weights w_k e^{−u_k²/2} π(z_k), u_k = (z_k − z_obs)/σ (constant factors cancel in the moments; the exponentials in
    // vectors); objects with σ = 0 keep z_obs and variance 0.
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    internal static void PopulationMoments(double[] z, double[] zErr, double lo, double hi, PopulationRedshiftPrior prior, double[] centre, double[] variance)
    {
        if (!(hi > lo)) return; // a one-point range (a single-object check): the flat moments stand
        const int K = 64;
        var gl = new GaussLegendre(K);
        var lnW = gl.Weights.Select(w => Math.Log(w)).ToArray();
        Span<double> zk = stackalloc double[K], lw = stackalloc double[K];
        var lwv = System.Runtime.InteropServices.MemoryMarshal.Cast<double, System.Numerics.Vector<double>>(lw);
        for (int i = 0; i < z.Length; i++)
        {
            if (!(zErr[i] > 0)) continue;
            TruncatedRedshiftNodes.Window(z[i], zErr[i], Math.Max(lo, 0), hi, out double mid, out double half);
            double max = double.NegativeInfinity, inv = 1 / zErr[i];
            for (int k = 0; k < K; k++)
            {
                zk[k] = mid + half * gl.Nodes[k];
                double u = (zk[k] - z[i]) * inv;
                lw[k] = lnW[k] - 0.5 * u * u + prior.LogDensity(zk[k]);
                if (lw[k] > max) max = lw[k];
            }
            if (double.IsNegativeInfinity(max)) continue;
            var vm = new System.Numerics.Vector<double>(max);
            for (int q = 0; q < lwv.Length; q++) lwv[q] = System.Numerics.Vector.Exp(lwv[q] - vm);
            for (int k = lwv.Length * System.Numerics.Vector<double>.Count; k < K; k++) lw[k] = Math.Exp(lw[k] - max);
            double sw = 0, m1 = 0, m2 = 0;
            for (int k = 0; k < K; k++)
            {
                double w = lw[k];
                sw += w;
                m1 += w * zk[k];
                m2 += w * zk[k] * zk[k];
            }
            m1 /= sw;
            centre[i] = m1;
            variance[i] = Math.Max(m2 / sw - m1 * m1, 0);
        }
    }

    // Linearised marginal: each object's redshift posterior N(z; z_obs, σ²) on the flat prior [lo, hi] summarised by its mean (written to
    // centre) and variance (returned): z_obs and σ² where the prior keeps all but 10⁻¹² of the Gaussian (both ends more than 7.1σ away),
    // else the truncated normal's moments, α = (lo − z)/σ, β = (hi − z)/σ, Z = Φ(β) − Φ(α): mean z + σ(φ(α) − φ(β))/Z, variance
    // σ²[1 + (αφ(α) − βφ(β))/Z − ((φ(α) − φ(β))/Z)²] (Johnson, Kotz & Balakrishnan 1994, §10.1), or, where Z < 10⁻⁸ (the Gaussian far
    // outside the prior, where that form cancels), by 32-point Gauss–Legendre on its window (TruncatedRedshiftNodes); counted in cut.
    internal static double[] LinearisedCentres(double[] z, double[] zErr, double lo, double hi, double[] centre, out int cut)
    {
        const double Keep = 7.1; // Φ(−7.1) = 6·10⁻¹³
        var variance = new double[z.Length];
        GaussLegendre? gl = null;
        Span<double> zk = stackalloc double[32], lw = stackalloc double[32];
        cut = 0;
        for (int i = 0; i < z.Length; i++)
        {
            double s = zErr[i];
            centre[i] = z[i];
            variance[i] = s * s;
            if (!(hi > lo))
            {
                // A prior of one redshift (a sample or share of one distinct z, with the default prior): the posterior is that z.
                centre[i] = lo;
                variance[i] = 0;
                cut++;
                continue;
            }
            if (!(s > 0)) continue;
            double a = (lo - z[i]) / s, b = (hi - z[i]) / s;
            if (a < -Keep && b > Keep) continue;
            cut++;
            double mass = NormalMath.Phi(b) - NormalMath.Phi(a);
            if (mass > 1e-8)
            {
                double pa = Math.Exp(-0.5 * a * a) / Math.Sqrt(2 * Math.PI), pb = Math.Exp(-0.5 * b * b) / Math.Sqrt(2 * Math.PI);
                double d = (pa - pb) / mass;
                double ta = double.IsFinite(a) ? a * pa : 0, tb = double.IsFinite(b) ? b * pb : 0;
                centre[i] = z[i] + s * d;
                variance[i] = s * s * (1 + (ta - tb) / mass - d * d);
                continue;
            }
            gl ??= new GaussLegendre(32);
            TruncatedRedshiftNodes.Fill(z[i], s, Math.Max(lo, 0), hi, gl, zk, lw);
            double mean = 0, m2 = 0;
            for (int k = 0; k < 32; k++) mean += Math.Exp(lw[k]) * zk[k];
            for (int k = 0; k < 32; k++) m2 += Math.Exp(lw[k]) * (zk[k] - mean) * (zk[k] - mean);
            centre[i] = mean;
            variance[i] = m2;
        }
        return variance;
    }

    // d ln D_A/dz at z under a fixed model: central difference with step 10⁻⁴ z (relative error ~10⁻⁹).
    private static double[] LnDaSlope(IWorldModel model, double[] z)
    {
        int n = z.Length;
        var zp = new double[n];
        var zm = new double[n];
        for (int i = 0; i < n; i++) { zp[i] = z[i] * (1 + 1e-4); zm[i] = z[i] * (1 - 1e-4); }
        var dp = ModelLuminosity.LnLuminosityDistances(model, zp);
        var dm = ModelLuminosity.LnLuminosityDistances(model, zm);
        double e = ModelLuminosity.DistanceExponent(model);
        var slope = new double[n];
        for (int i = 0; i < n; i++) slope[i] = (dp[i] - dm[i] - e * (Math.Log(1 + zp[i]) - Math.Log(1 + zm[i]))) / (zp[i] - zm[i]);
        return slope;
    }
}
