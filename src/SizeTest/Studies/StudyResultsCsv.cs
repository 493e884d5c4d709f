using System.Globalization;
using System.Text;
using SizeTest.Inference;

namespace SizeTest.Studies;

/// <summary><c>results.csv</c> of a study: one row per (model, parameter), models in rank order (the layout <c>sizetest fit</c> writes).</summary>
public static class StudyResultsCsv
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private static string R(double v) => double.IsFinite(v) ? v.ToString("R", Inv) : "";

    /// <summary>The CSV text (LF line ends, header first).</summary>
    public static string Write(FitResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var sb = new StringBuilder();
        sb.Append("rank,model,parameter,value,lo,hi,fixed,unit,log_likelihood,k,n,aic,aicc,bic,delta_aic,delta_bic,akaike_weight,converged\n");
        int position = 0;
        bool comparable = result.Verdict.Comparable;
        foreach (var m in result.Models)
        {
            position++;
            // The models' own rank (tied models share it); empty when the verdict says they cannot be ranked.
            string rank = !comparable ? "" : (m.Rank > 0 ? m.Rank : position).ToString(Inv);
            foreach (var p in m.Parameters)
                sb.Append(Inv, $"{rank},{m.Name},{p.Name},{R(p.Value)},{R(p.Lo)},{R(p.Hi)},{(p.Fixed ? "true" : "false")},{p.Unit},{R(m.LogLikelihood)},{m.K},{m.N},{R(m.Aic)},{R(m.Aicc)},{R(m.Bic)},{R(m.DeltaAic)},{R(m.DeltaBic)},{R(m.AkaikeWeight)},{(m.Converged ? "true" : "false")}\n");
        }
        return sb.ToString();
    }
}
