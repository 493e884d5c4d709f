using System.CommandLine;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// The catalogue options shared by verbs that read a catalogue (<c>inspect</c>, and for
/// <c>fit</c>/<c>simulate</c> to reuse): <c>--col</c>, <c>--hdu</c>, <c>--size-def</c>, <c>--keep</c>,
/// <c>--catalog-format</c>, <c>--delimiter</c>, <c>--header</c>. <see cref="ToLoadOptions"/> turns them into
/// <see cref="CatalogueLoadOptions"/>.
/// </summary>
internal sealed class CatalogueOptions
{
    public Option<string[]> Col { get; } = new("--col")
    {
        Description = "Map a column to a role: ROLE=NAME[:UNIT] (repeatable). Roles: id, z, z_err, theta, theta_err, mu, mu_err, mag, mag_err, band. Units: arcsec (default), mas, arcmin, deg, rad; frac or % for relative errors.",
        Arity = ArgumentArity.ZeroOrMore,
        AllowMultipleArgumentsPerToken = false,
    };

    public Option<string?> Hdu { get; } = CliOptions.Text("--hdu", "Which table: a FITS HDU index (1 = first extension) or EXTNAME, or a VOTable TABLE index (1-based) or name. Default: the first table.");

    public Option<string?> SizeDef { get; } = CliOptions.Text("--size-def", "How the sizes were measured: effective (default), petrosian, isophotal:LEVEL (mag/arcsec2) or fwhm.");

    public Option<string[]> Keep { get; } = new("--keep")
    {
        Description = "Keep a further numeric column by name (repeatable), e.g. a K-correction or extinction column.",
        Arity = ArgumentArity.ZeroOrMore,
        AllowMultipleArgumentsPerToken = false,
    };

    public Option<string?> CatalogueFormat { get; } = CliOptions.Text("--catalog-format", "The catalogue's format if detection is wrong: csv (any delimited text), fits, votable or parquet.");

    public Option<string?> Delimiter { get; } = CliOptions.Text("--delimiter", "Text catalogues: the field delimiter (a character, or 'tab', or 'space' for runs of blanks). Default: detected.");

    public Option<string?> Header { get; } = CliOptions.Text("--header", "Text catalogues: whether the first line is a header: auto (default), yes or no.");

    public Option<int> MaxLineBytes { get; } = new("--max-line-bytes")
    {
        Description = "Text catalogues: the longest line accepted, in bytes (a longer one is refused naming file and line).",
        DefaultValueFactory = _ => SizeTest.Foundation.Files.LineCappedStream.DefaultMaxLineBytes,
    };

    public void AddTo(Command command)
    {
        command.Options.Add(MaxLineBytes);
        command.Options.Add(Header);
        command.Options.Add(Col);
        command.Options.Add(Hdu);
        command.Options.Add(SizeDef);
        command.Options.Add(Keep);
        command.Options.Add(CatalogueFormat);
        command.Options.Add(Delimiter);
    }

    /// <summary>Builds load options; throws <see cref="InputException"/> on a bad value.</summary>
    public CatalogueLoadOptions ToLoadOptions(ParseResult parse)
    {
        var mapping = ColumnMapping.FromOptions(parse.GetValue(Col), parse.GetValue(SizeDef), parse.GetValue(Keep));
        CatalogueFormat? format = null;
        if (parse.GetValue(CatalogueFormat) is { } f)
        {
            if (!CatalogueReaders.TryParseFormat(f, out var cf)) throw new InputException($"unknown catalogue format '{f}'{NameSuggestions.Hint(f, CatalogueReaders.FormatNames)}; use {string.Join(", ", CatalogueReaders.FormatNames)}");
            format = cf;
        }
        char? delimiter = parse.GetValue(Delimiter) switch
        {
            null => null,
            "tab" or "\\t" => '\t',
            "space" or "whitespace" or " " => ' ',
            { Length: 1 } d => d[0],
            var d => throw new InputException($"--delimiter '{d}' must be one character, 'tab' or 'space'"),
        };
        bool? header = parse.GetValue(Header)?.Trim().ToLowerInvariant() switch
        {
            null or "auto" => null,
            "yes" or "true" => true,
            "no" or "false" => false,
            var h => throw new InputException($"--header '{h}' must be auto, yes or no{NameSuggestions.Hint(h, ["auto", "yes", "no"])}"),
        };
        return new CatalogueLoadOptions
        {
            Mapping = mapping,
            Reader = new ReaderOptions { Format = format, Table = parse.GetValue(Hdu), Delimiter = delimiter, HasHeader = header, MaxLineBytes = parse.GetValue(MaxLineBytes) > 0 ? parse.GetValue(MaxLineBytes) : throw new InputException("--max-line-bytes must be positive") },
        };
    }
}
