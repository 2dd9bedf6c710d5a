using System.CommandLine;
using System.Globalization;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;

namespace SettingLint.Cli;

/// <summary>The options of `baseline`, parsed once.</summary>
/// <param name="Paths">Files or folders to check.</param>
/// <param name="Output">The baseline file to write.</param>
public sealed record BaselineOptionsRecord(IReadOnlyList<string> Paths, string Output);

/// <summary>`settinglint baseline [PATH...] --output FILE`: accepts today's findings so that only new ones fail.</summary>
public static class BaselineCommand
{
    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var paths = new Argument<string[]>("paths") { Description = "Files or folders to check (default: the current folder).", Arity = ArgumentArity.ZeroOrMore };
        var output = new Option<string>("--output", "-o") { Description = "The baseline file to write (suggested: " + Baseline.SuggestedFileName + " at the repository root).", Required = true };
        var command = new Command("baseline", "Write today's findings (those not accepted in the source) to a baseline file; 'check --baseline FILE' then fails only on new ones.")
        {
            paths, output,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(paths) ?? [];
            if (given.FirstOrDefault(p => p.StartsWith('-')) is { } bad)
            {
                stderr.WriteLine($"settinglint: unknown option '{bad}'. Try 'settinglint baseline --help'.");
                return ExitCodes.Usage;
            }
            return Execute(new BaselineOptionsRecord(given, parse.GetValue(output)!), stdout, stderr);
        });
        return command;
    }

    /// <summary>Runs the check and writes the baseline; nothing is written when the run has problems.</summary>
    public static int Execute(BaselineOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        var paths = options.Paths.Count == 0 ? (IReadOnlyList<string>)["."] : options.Paths;
        var result = Linter.Check(new CheckRequest(Directory.GetCurrentDirectory(), paths) { FailOn = Level.Note });
        if (!result.Notifications.IsEmpty)
        {
            foreach (var n in result.Notifications)
            {
                var where = n.File is null ? "settinglint: " : n.Span is { } s ? $"{n.File}:{s.StartLine}:{s.StartColumn}: " : n.File + ": ";
                stderr.WriteLine(where + (n.Kind == NotificationKind.Internal ? "internal error: " : "error: ") + n.Message);
            }
            stderr.WriteLine("settinglint: the baseline was not written.");
            return result.ExitCode;
        }
        var accepted = result.Findings.Where(f => f.Suppression is null).ToList();
        var dir = Path.GetDirectoryName(Path.GetFullPath(options.Output));
        if (dir is not null) Directory.CreateDirectory(dir);
        File.WriteAllText(options.Output, Baseline.Write(accepted), new System.Text.UTF8Encoding(false));
        string Of(Level l, string noun) => Count(accepted.Count(f => f.Level == l), noun);
        stdout.WriteLine($"Wrote {Count(accepted.Count, "finding")} ({Of(Level.Error, "error")}, {Of(Level.Warning, "warning")}, {Of(Level.Note, "note")}) of {Count(result.FilesChecked, "setting file")} to {options.Output}.");
        stdout.WriteLine($"'settinglint check --baseline {options.Output}' now fails only on findings that are not in it.");
        return ExitCodes.Clean;
    }

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}
