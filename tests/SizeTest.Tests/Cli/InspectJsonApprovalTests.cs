using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The inspect JSON contract is approved (<c>Approved/inspect-json.txt</c>): the whole text <c>sizetest inspect
/// fixture_binary2.vot --format json</c> prints (the fixture's own path replaced by <c>FIXTURE</c>), so any change of
/// key, order or value fails until the approved copy and docs/catalogues.md are updated (see <see cref="Approval"/>).
/// The values are the fixture's (make_fits_fixtures.py): 6 rows, 4 accepted, 2 rejected for a missing value.
/// </summary>
public sealed class InspectJsonApprovalTests
{
    [Fact]
    public void InspectJsonIsTheApprovedText()
    {
        var path = ReferenceFiles.PathOf("fixture_binary2.vot");
        var (exit, output, err) = CliRunner.Run("inspect", path, "--format", "json", "--col", "theta=theta:mas");
        Assert.True(exit == 0, err);
        Approval.Verify("inspect-json.txt", output.Replace(path.Replace("\\", "\\\\"), "FIXTURE"));
    }
}
