using SizeTest.Cli;

namespace SizeTest.Tests.Cli;

/// <summary>Runs <c>sizetest</c> in-process and captures its output.</summary>
internal static class CliRunner
{
    public static (int Exit, string Out, string Err) Run(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        int code = Program.Run(args, o, e);
        return (code, o.ToString(), e.ToString());
    }
}
