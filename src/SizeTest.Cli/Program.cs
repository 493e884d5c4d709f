using System.CommandLine;
using System.CommandLine.Completions;
using System.CommandLine.Parsing;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>Entry point of the <c>sizetest</c> executable.</summary>
public static class Program
{
    /// <summary>Runs with the process's console streams.</summary>
    public static int Main(string[] args)
    {
        using var interrupts = InterruptCleanup.Install();
        return Run(args, Console.Out, Console.Error);
    }

    /// <summary>
    /// Runs one command line with the given writers (tests call this in-process).
    /// Exit codes: 0 success; 1 the analysis ran but failed; 2 bad usage or bad input.
    /// </summary>
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr)
    {
        var context = new CliContext(stdout, stderr, args.Contains("--verbose"));
        var root = BuildRoot(context);
        ParseResult parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            // An unknown verb gives "Required command was not provided" first and "Unrecognized command or argument 'fitt'" after it:
            // the second says what is wrong.
            var first = parse.Errors.Count > 1 && parse.Errors[0].Message.StartsWith("Required command", StringComparison.Ordinal)
                && parse.Errors[1].Message.StartsWith("Unrecognized", StringComparison.Ordinal) ? parse.Errors[1] : parse.Errors[0];
            var message = PlainTypeNames(string.Join(" ", first.Message.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)));
            if (!message.Contains("did you mean", StringComparison.Ordinal)) message += UnknownWordHint(parse);
            if (!message.Contains("did you mean", StringComparison.Ordinal)) message += AllowedValueHint(first);
            stderr.WriteLine($"sizetest: {message} (see '{string.Join(' ', new[] { "sizetest", CommandPath(parse) }.Where(s => s.Length > 0))} --help')");
            return ExitCodes.BadInput;
        }
        try
        {
            return parse.Invoke(new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false });
        }
        catch (Exception ex)
        {
            return context.Fail(ex);
        }
    }

    // An unrecognised first word is most often a mistyped verb, a later one a mistyped option: suggest the closest. Options
    // are compared without their leading dashes ('-modle' is one edit from '--model'; '--h0' is a name of two characters).
    private static string UnknownWordHint(ParseResult parse)
    {
        var command = parse.CommandResult.Command;
        foreach (var word in parse.UnmatchedTokens)
        {
            string? closest;
            if (word.StartsWith('-'))
            {
                var options = command.Options.Where(o => !o.Hidden).SelectMany(o => o.Aliases.Prepend(o.Name)).DistinctBy(n => n.TrimStart('-')).ToDictionary(n => n.TrimStart('-'));
                closest = NameSuggestions.Closest(word.TrimStart('-'), options.Keys) is { } bare ? options[bare] : null;
            }
            else closest = NameSuggestions.Closest(word, command.Subcommands.Where(c => !c.Hidden).Select(c => c.Name));
            if (closest is not null) return NameSuggestions.DidYouMean(closest);
        }
        return "";
    }

    // A value outside an option's list (AcceptOnlyFromAmong, whose values are the option's completions): suggest the closest.
    private static string AllowedValueHint(ParseError error)
    {
        if (error.SymbolResult is not (OptionResult or ArgumentResult { Parent: OptionResult })) return "";
        var result = error.SymbolResult as OptionResult ?? (OptionResult)((ArgumentResult)error.SymbolResult).Parent!;
        var allowed = result.Option.GetCompletions(CompletionContext.Empty).Select(c => c.Label).ToArray();
        if (allowed.Length == 0) return "";
        foreach (var token in result.Tokens)
            if (!allowed.Contains(token.Value) && NameSuggestions.Closest(token.Value, allowed) is { } closest)
                return NameSuggestions.DidYouMean(closest);
        return "";
    }

    // Parse messages name .NET types ("as expected type 'System.Int32'"); say what the user must type instead.
    internal static string PlainTypeNames(string message)
    {
        foreach (var (type, plain) in new[]
        {
            ("System.Int32", "a whole number up to 2147483647 (no exponent)"), ("System.Int64", "a whole number"),
            ("System.Double", "a number"), ("System.Boolean", "true or false"), ("System.String", "text"),
            ("System.Nullable`1[System.Int32]", "a whole number up to 2147483647 (no exponent)"), ("System.Nullable`1[System.Int64]", "a whole number"),
            ("System.Nullable`1[System.Double]", "a number"),
        }.OrderByDescending(t => t.Item1.Length))
            message = message.Replace($" as expected type '{type}'", $"; expected {plain}").Replace(type, plain);
        return message;
    }

    private static string CommandPath(ParseResult parse)
    {
        var names = new List<string>();
        for (var r = parse.CommandResult; r is not null; r = r.Parent as System.CommandLine.Parsing.CommandResult)
            if (r.Command is not RootCommand) names.Insert(0, r.Command.Name);
        return string.Join(' ', names);
    }

    /// <summary>Builds the command tree. Each verb lives in its own file and adds itself here.</summary>
    internal static RootCommand BuildRoot(CliContext context)
    {
        var root = new RootCommand("SizeTest: angular-size and surface-brightness tests of world models (expanding FLRW versus static).");
        root.Options.Add(CliOptions.Verbose);
        foreach (var verb in Verbs(context))
            root.Subcommands.Add(verb);
        return root;
    }

    private static IEnumerable<Command> Verbs(CliContext context)
    {
        // One line per verb; this order is the order of 'sizetest --help' (approved in tests/SizeTest.Tests/Cli/Approved/).
        yield return ModelsCommand.Create(context);
        yield return PredictCommand.Create(context);
        yield return InspectCommand.Create(context);
        yield return FitCommand.Create(context);
        yield return ReportCommand.Create(context);
        yield return StudyCommands.Run(context);
        yield return StudyCommands.Demo(context);
        yield return SimulateCommand.Create(context);
        yield return PowerCommand.Create(context);
        yield return RanksCommand.Create(context);
    }
}
