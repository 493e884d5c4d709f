using System.Text;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// A writer for human-readable reports that show text from the user's file (column names, units,
/// descriptions, cells): every line written through <see cref="WriteLine(string?)"/> or
/// <see cref="Write(string?)"/> has its control and escape characters shown as <c>\uXXXX</c>
/// (<see cref="TerminalText.Escape"/>), so a hostile header cannot drive the terminal.
/// </summary>
internal sealed class EscapingWriter(TextWriter inner) : TextWriter
{
    public override Encoding Encoding => inner.Encoding;

    public override void Write(char value) => inner.Write(value);

    public override void Write(string? value) => inner.Write(TerminalText.Escape(value));

    public override void WriteLine(string? value) => inner.WriteLine(TerminalText.Escape(value));

    public override void WriteLine() => inner.WriteLine();

    public override void Flush() => inner.Flush();
}
