using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Tests.Inference;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The results.json schema is approved (<c>Approved/results-schema.txt</c>): every key path of the
/// file a small <c>fit</c> writes, with the JSON types seen at that path (arrays as <c>[]</c>, the
/// per-parameter map as <c>{name}</c>). Adding, removing or retyping a key fails the suite until the
/// approved copy and docs/results-schema.md are updated (see <see cref="Approval"/>).
/// </summary>
public sealed class ResultsSchemaApprovalTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "sizetest-schema-" + Guid.NewGuid().ToString("N"));

    public ResultsSchemaApprovalTests() => Directory.CreateDirectory(_dir);

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    /// <summary>Objects whose keys are data (parameter names), collapsed to one placeholder key.</summary>
    private static readonly string[] MapPaths = ["models[].parameters"];

    /// <summary>Every leaf path with its set of JSON types, one line per path, sorted.</summary>
    internal static string Schema(JsonElement root)
    {
        var types = new SortedDictionary<string, SortedSet<string>>(StringComparer.Ordinal);
        void Walk(JsonElement e, string path)
        {
            switch (e.ValueKind)
            {
                case JsonValueKind.Object:
                    bool map = MapPaths.Contains(path);
                    if (!e.EnumerateObject().Any()) Add(path, "object (empty)");
                    foreach (var p in e.EnumerateObject()) Walk(p.Value, map ? $"{path}.{{name}}" : path.Length == 0 ? p.Name : $"{path}.{p.Name}");
                    break;
                case JsonValueKind.Array:
                    if (e.GetArrayLength() == 0) Add(path + "[]", "array (empty)");
                    foreach (var item in e.EnumerateArray()) Walk(item, path + "[]");
                    break;
                case JsonValueKind.True or JsonValueKind.False: Add(path, "boolean"); break;
                default: Add(path, e.ValueKind.ToString().ToLowerInvariant()); break;
            }
        }
        void Add(string path, string type)
        {
            if (!types.TryGetValue(path, out var set)) types[path] = set = new SortedSet<string>(StringComparer.Ordinal);
            set.Add(type);
        }
        Walk(root, "");
        var sb = new StringBuilder("# results.json schema: key path -> JSON types (approved; see DEVELOPERS.md, \"Approval files\")\n");
        foreach (var (path, set) in types) sb.Append(path).Append(": ").Append(string.Join(" | ", set)).Append('\n');
        return sb.ToString();
    }

    /// <summary>A synthetic (mock) catalogue: EdS, R0 = 4 kpc, a = −1, 0.2 dex, SB evolution; one bad row.</summary>
    private string WriteCatalogue(int n = 200, int seed = 5)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed);
        var sb = new StringBuilder("# synthetic mock catalogue for the schema approval test\nid,z,theta,theta_err,mu,mu_err\n");
        for (int i = 0; i < obs.Count; i++)
        {
            double th = Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(CultureInfo.InvariantCulture, $"g{i},{obs.Z[i]:R},{th:R},{0.05 * th:R},{obs.Mu![i]:R},0.1\n");
        }
        sb.Append("bad,-1,0.5,0.01,22,0.1\n");
        var path = Path.Combine(_dir, "mock.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    [Fact]
    public void ResultsJsonSchemaMatchesItsApprovedCopy()
    {
        var outDir = Path.Combine(_dir, "out");
        // Small but touching every section: two models, bootstrap, cross-validation, a profile, an expected range.
        var (exit, _, err) = CliRunner.Run("fit", WriteCatalogue(), "--models", "eds,static-linear", "--starts", "1",
            "--bootstrap", "3", "--cv-folds", "2", "--profile", "size_evolution", "--expect", "size_evolution=-1.5:-0.5",
            "--seed", "2", "--out", outDir);
        Assert.True(exit is 0 or 1, err); // 1 = a model did not converge; the file is written and its schema is the same
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        Approval.Verify("results-schema.txt", Schema(doc.RootElement));
    }

    [Fact]
    public void AChangedSchemaIsDetected()
    {
        // The schema text of a document and of the same document with one key renamed differ, so the approval fails.
        using var a = JsonDocument.Parse("""{"models":[{"name":"x","parameters":{"h0":{"value":70}}}],"seed":1}""");
        using var b = JsonDocument.Parse("""{"models":[{"name":"x","parameters":{"h0":{"val":70}}}],"seed":1}""");
        Assert.Contains("models[].parameters.{name}.value: number", Schema(a.RootElement));
        Assert.NotEqual(Schema(a.RootElement), Schema(b.RootElement));
        Assert.Contains("- models[].parameters.{name}.value: number", Approval.Diff(Schema(a.RootElement), Schema(b.RootElement)));
    }

    [Fact]
    public void EveryApprovedKeyIsDocumented()
    {
        // docs/results-schema.md documents the format: every key name of the approved schema (each segment of each key
        // path, without [] and the {name} placeholder) must appear there in backticks (an array as `name` or `name[]`), so the page cannot fall behind.
        string page = File.ReadAllText(Path.Combine(Approval.Folder, "..", "..", "..", "..", "docs", "results-schema.md"));
        var names = File.ReadAllLines(Path.Combine(Approval.Folder, "results-schema.txt"))
            .Where(l => l.Length > 0 && !l.StartsWith('#'))
            .SelectMany(l => l[..l.IndexOf(':')].Split('.'))
            .Select(seg => seg.Replace("[]", "", StringComparison.Ordinal))
            .Where(seg => seg.Length > 0 && seg != "{name}")
            .Distinct(StringComparer.Ordinal);
        var missing = names.Where(n => !page.Contains($"`{n}`", StringComparison.Ordinal) && !page.Contains($"`{n}[]`", StringComparison.Ordinal)).ToList();
        Assert.True(missing.Count == 0, "keys of Approved/results-schema.txt not documented in docs/results-schema.md: " + string.Join(", ", missing));
    }
}
