using SizeTest.Catalogues.Text;
using SizeTest.Cosmology;
using SizeTest.Simulation;

namespace SizeTest.Tests.Studies;

/// <summary>A temporary folder with a small synthetic catalogue (MockSurveyGenerator) and a study file pointing at it.</summary>
internal sealed class StudyFixture : IDisposable
{
    public StudyFixture(int n = 300, string extra = "")
    {
        Dir = Path.Combine(Path.GetTempPath(), "sizetest-study-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Dir);
        var lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());
        var mock = MockSurveyGenerator.Generate(new MockSurveySpec(lcdm, new SurveyDesign(n, RedshiftDistribution.Uniform(0.1, 2.5)), 7), parallel: false);
        CsvTableWriter.Write(Path.Combine(Dir, "mock.csv"), mock.ToTable("mock"));
        StudyPath = Path.Combine(Dir, "study.toml");
        File.WriteAllText(StudyPath, Text(extra));
    }

    public string Dir { get; }
    public string StudyPath { get; }
    public string Out(string name = "out") => Path.Combine(Dir, name);

    public static string Text(string extra = "") => $"""
        name = "mock-study"
        seed = 11

        [catalogue]
        path = "mock.csv"
        synthetic = true

        [models]
        names = ["lcdm", "tired-light"]
        observable = "size"

        [parameters]
        size_evolution = "free"

        [inference]
        starts = 1

        [report]
        formats = ["html", "svg"]
        bin_resamples = 20
        {extra}
        """;

    public void Dispose()
    {
        try { Directory.Delete(Dir, recursive: true); } catch (IOException) { }
    }
}
