using System.CommandLine;
using System.CommandLine.Parsing;
using SettingLint.Core.Findings;

namespace SettingLint.Cli;

/// <summary>The command tree. Each command parses its options into an immutable record and calls one handler.</summary>
public static class CliApp
{
    /// <summary>The caution every report and the help of `report` carry.</summary>
    public const string Caution = "Caution: " + SettingLint.Core.Findings.Caution.Text;

    /// <summary>Runs the command line and returns the exit code (0 clean, 1 findings, 2 usage or configuration, 3 internal error).</summary>
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr)
    {
        // Start-up: the YAML parser, the schemas and the built-in rules get ready on the thread pool while the rest starts.
        if (args.Length > 0 && args[0] is "check" or "report" or "baseline" or "rules" or "fix" or "server" or "import" or "sheet")
        {
            SettingLint.Core.Loading.YamlLoader.Warm();
            SettingLint.Core.Validation.SchemaSet.Shared.Warm();
            if (args[0] != "rules") SettingLint.Core.Rules.RuleLoader.Warm();
        }
        var root = Build(stdout, stderr);
        ParseResult parse;
        try
        {
            parse = root.Parse(args);
        }
        catch (Exception ex)
        {
            stderr.WriteLine("settinglint: " + ex.Message);
            return ExitCodes.Usage;
        }
        if (parse.Errors.Count > 0)
        {
            foreach (var e in parse.Errors) stderr.WriteLine("settinglint: " + e.Message);
            stderr.WriteLine("Try '" + SettingLint.Reporting.ToolCommand.Current + " --help'.");
            return ExitCodes.Usage;
        }
        try
        {
            return parse.Invoke(new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false });
        }
        catch (Exception ex)
        {
            stderr.WriteLine("settinglint: internal error: " + ex);
            return ExitCodes.Internal;
        }
    }

    private static RootCommand Build(TextWriter stdout, TextWriter stderr)
    {
        var root = new RootCommand("SettingLint: checks induction-motor protection settings against nameplate, datasheet, transformers, starter and bus.\n\n" + Caution);
        root.Subcommands.Add(CheckCommand.Create(stdout, stderr));
        root.Subcommands.Add(BaselineCommand.Create(stdout, stderr));
        root.Subcommands.Add(HookCommand.Create(stdout, stderr));
        root.Subcommands.Add(RulesCommand.Create(stdout, stderr));
        root.Subcommands.Add(ReportCommand.Create(stdout, stderr));
        root.Subcommands.Add(FixCommand.Create(stdout, stderr));
        root.Subcommands.Add(SchemaCommand.Create(stdout, stderr));
        root.Subcommands.Add(ConfigCommand.Create(stdout, stderr));
        root.Subcommands.Add(ServerCommand.Create(stderr));
        root.Subcommands.Add(ImportCommand.Create(stdout, stderr));
        root.Subcommands.Add(NewCommand.Create(stdout, stderr));
        root.Subcommands.Add(SheetCommand.Create(stdout, stderr));
        return root;
    }
}
