using SizeTest.Cli;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The <c>--help</c> text of the root command and of every visible verb is approved
/// (<c>Approved/help-VERB.txt</c>, <c>Approved/help-sizetest.txt</c> for the root). A changed help
/// text fails until the approved copy is regenerated (see <see cref="Approval"/>).
/// </summary>
public sealed class HelpApprovalTests
{
    /// <summary>The visible verbs, read from the command tree itself.</summary>
    public static TheoryData<string> Verbs()
    {
        var data = new TheoryData<string>();
        foreach (var name in VisibleVerbs()) data.Add(name);
        return data;
    }

    private static IEnumerable<string> VisibleVerbs() =>
        Program.BuildRoot(new CliContext(TextWriter.Null, TextWriter.Null, false)).Subcommands.Where(c => !c.Hidden).Select(c => c.Name).Order(StringComparer.Ordinal);

    /// <summary>
    /// The help text with the executable name fixed: System.CommandLine names the root after the
    /// host process (the test host here), so it is written as "sizetest" as users see it.
    /// </summary>
    private static string Help(params string[] args)
    {
        var (exit, stdout, stderr) = CliRunner.Run(args);
        Assert.True(exit == 0, $"{string.Join(' ', args)} exited {exit}: {stderr}");
        var host = Program.BuildRoot(new CliContext(TextWriter.Null, TextWriter.Null, false)).Name;
        return host == "sizetest" ? stdout : stdout.Replace(host, "sizetest", StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(Verbs))]
    public void VerbHelpMatchesItsApprovedCopy(string verb) => Approval.Verify($"help-{verb}.txt", Help(verb, "--help"));

    [Fact]
    public void RootHelpMatchesItsApprovedCopy() => Approval.Verify("help-sizetest.txt", Help("--help"));

    [Fact]
    public void EveryApprovedHelpFileBelongsToAVerb()
    {
        var expected = VisibleVerbs().Select(v => $"help-{v}.txt").Append("help-sizetest.txt").ToHashSet(StringComparer.Ordinal);
        var stale = Approval.Existing("help-*.txt").Where(f => !expected.Contains(f)).ToList();
        foreach (var f in stale) Approval.Remove(f);
        if (!Approval.Approving) Assert.True(stale.Count == 0, "Approved help files without a verb: " + string.Join(", ", stale));
    }
}
