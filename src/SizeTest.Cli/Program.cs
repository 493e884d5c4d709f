using System.CommandLine;
using SizeTest.Common;

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
            var message = string.Join(" ", parse.Errors[0].Message.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
            stderr.WriteLine($"sizetest: {message} (see 'sizetest {CommandPath(parse)} --help')");
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
