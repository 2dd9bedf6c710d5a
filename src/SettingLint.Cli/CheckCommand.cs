using System.CommandLine;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Reporting;

namespace SettingLint.Cli;

/// <summary>The options of `check`, parsed once.</summary>
/// <param name="Paths">Files or folders to check.</param>
/// <param name="Format">text, json or sarif.</param>
/// <param name="Output">A file to write to instead of standard output.</param>
/// <param name="FailOn">The gate's threshold.</param>
/// <param name="Timestamps">Write start and end times into SARIF.</param>
public sealed record CheckOptionsRecord(IReadOnlyList<string> Paths, string Format, string? Output, Level? FailOn, bool Timestamps, bool SarifOmitSuppressed);

/// <summary>`settinglint check [PATH...]`.</summary>
public static class CheckCommand
{
    /// <summary>The failure thresholds accepted by --fail-on.</summary>
    public static readonly string[] FailOnValues = ["error", "warning", "note", "never"];

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var paths = new Argument<string[]>("paths") { Description = "Files or folders to check (default: the current folder).", Arity = ArgumentArity.ZeroOrMore };
        var format = new Option<string>("--format", "-f") { Description = "Output format: " + string.Join(", ", Reporters.Formats) + ".", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong([.. Reporters.Formats]);
        var output = new Option<string?>("--output", "-o") { Description = "Write the report to this file instead of standard output." };
        var failOn = new Option<string?>("--fail-on") { Description = "Exit 1 when a finding is at or above this level: error (default, or the configuration's fail_on), warning, note, never." };
        failOn.AcceptOnlyFromAmong(FailOnValues);
        var timestamps = new Option<bool>("--timestamps") { Description = "Write the run's start and end times into SARIF (off, so that output is reproducible)." };
        var omit = new Option<bool>("--sarif-omit-suppressed") { Description = "Leave suppressed findings out of the report (hosted code scanning ignores SARIF suppressions)." };
        var command = new Command("check", "Check setting files and report findings; the exit code is the gate.")
        {
            paths, format, output, failOn, timestamps, omit,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(paths) ?? [];
            var bad = given.FirstOrDefault(p => p.StartsWith('-'));
            if (bad is not null)
            {
                stderr.WriteLine($"settinglint: unknown option '{bad}'. Try 'settinglint check --help'.");
                return ExitCodes.Usage;
            }
            var options = new CheckOptionsRecord(
                given,
                parse.GetValue(format) ?? "text",
                parse.GetValue(output),
                parse.GetValue(failOn) is { } fo ? ParseFailOn(fo) : null,
                parse.GetValue(timestamps),
                parse.GetValue(omit));
            return Execute(options, stdout, stderr);
        });
        return command;
    }

    /// <summary>Reads a --fail-on value; "never" is Level.None.</summary>
    public static Level ParseFailOn(string value) => value == "never" ? Level.None : Levels.Parse(value) ?? Level.Error;

    /// <summary>Runs the check and writes the report; returns the gate's exit code.</summary>
    public static int Execute(CheckOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        var started = DateTimeOffset.UtcNow;
        var paths = options.Paths.Count == 0 ? (IReadOnlyList<string>)["."] : options.Paths;
        var result = Session.Open(paths).Check(paths, options.FailOn);
        var context = new ReportContext(Directory.GetCurrentDirectory(), options.Timestamps, options.SarifOmitSuppressed, ToolInfo.ForVersion(Version))
        {
            StartTimeUtc = options.Timestamps ? started : null,
            EndTimeUtc = options.Timestamps ? DateTimeOffset.UtcNow : null,
        };
        var reporter = Reporters.For(options.Format);
        if (options.Output is { } file)
        {
            var dir = Path.GetDirectoryName(Path.GetFullPath(file));
            if (dir is not null) Directory.CreateDirectory(dir);
            using var writer = new StreamWriter(file, append: false, new System.Text.UTF8Encoding(false));
            reporter.Write(result, context, writer);
        }
        else
        {
            reporter.Write(result, context, stdout);
        }
        return result.ExitCode;
    }

    /// <summary>The tool's version, from the assembly's informational version without build metadata.</summary>
    public static string Version { get; } =
        (typeof(CheckCommand).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyInformationalVersionAttribute), false)
            .OfType<System.Reflection.AssemblyInformationalVersionAttribute>().FirstOrDefault()?.InformationalVersion ?? "0.0.0")
            .Split('+')[0];
}
