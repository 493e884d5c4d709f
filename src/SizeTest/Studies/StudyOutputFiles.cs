using System.Globalization;
using System.Text;
using SizeTest.Foundation.Files;
using SizeTest.Inference;

namespace SizeTest.Studies;

/// <summary>
/// The one writer of a fit's output files, used by <c>sizetest fit</c> (one process or rank 0 under <c>mpirun</c>) and
/// by <c>sizetest run</c>: results.json, results.csv, rejects.csv, samples_MODEL.csv (nested sampling) and
/// profile_MODEL_PARAMETER.csv. (MCMC chains, chains_MODEL.csv, are written by the chain store while sampling.)
/// Every file goes through <see cref="AtomicFile"/> into the output folder's staging directory.
/// </summary>
public static class StudyOutputFiles
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private static string R(double v) => double.IsFinite(v) ? v.ToString("R", Inv) : "";

    /// <summary>Writes the files into <paramref name="folder"/> and returns their relative names.</summary>
    /// <param name="folder">The output folder (not yet committed).</param>
    /// <param name="result">The study result.</param>
    /// <param name="rejectCsv">The reject log as CSV (all ranks' rejects).</param>
    public static IReadOnlyList<string> Write(OutputFolder folder, FitResult result, string rejectCsv)
    {
        ArgumentNullException.ThrowIfNull(folder);
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(rejectCsv);
        var files = new List<string>();
        void Text(string name, string text) { AtomicFile.WriteAllText(folder.PathOf(name), text); files.Add(name); }
        Text("results.json", ResultsJson.Serialize(result));
        Text("results.csv", StudyResultsCsv.Write(result));
        Text("rejects.csv", rejectCsv);
        foreach (var draws in result.Samples.Where(x => x.Sampler == SamplerKind.Nested && x.Rows.Count > 0))
            Text($"samples_{draws.Model}.csv", SamplesCsv(draws));
        foreach (var p in result.Profiles)
            Text($"profile_{p.Model}_{p.Parameter}.csv", ProfileCsv(p));
        return files;
    }

    /// <summary>A profile as CSV: the parameter value, the profiled ln L, whether the refit converged.</summary>
    public static string ProfileCsv(ProfileLikelihoodResult p)
    {
        ArgumentNullException.ThrowIfNull(p);
        var sb = new StringBuilder($"{p.Parameter},log_likelihood,converged\n");
        foreach (var pt in p.Points) sb.Append(Inv, $"{R(pt.Value)},{R(pt.LogLikelihood)},{(pt.Converged ? "true" : "false")}\n");
        return sb.ToString();
    }

    /// <summary>Nested-sampling weighted samples as CSV: the free parameters, log_likelihood, log_weight.</summary>
    public static string SamplesCsv(PosteriorDraws s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var sb = new StringBuilder(string.Join(',', s.ParameterNames) + ",log_likelihood,log_weight\n");
        foreach (var row in s.Rows) sb.Append(string.Join(',', row.Select(R))).Append('\n');
        return sb.ToString();
    }
}
