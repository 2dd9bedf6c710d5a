using System.CommandLine;
using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;
using SettingLint.Reporting;

namespace SettingLint.Cli;

/// <summary>The options of `check`, parsed once.</summary>
/// <param name="Paths">Files or folders to check.</param>
/// <param name="Format">text, json, sarif or markdown.</param>
/// <param name="Output">A file to write to instead of standard output.</param>
/// <param name="FailOn">The gate's threshold.</param>
/// <param name="Timestamps">Write start and end times into SARIF.</param>
public sealed record CheckOptionsRecord(IReadOnlyList<string> Paths, string Format, string? Output, Level? FailOn, bool Timestamps, bool SarifOmitSuppressed)
{
    /// <summary>Ignore the acceptance comments (--no-suppress).</summary>
    public bool NoSuppress { get; init; }

    /// <summary>The baseline file (--baseline).</summary>
    public string? Baseline { get; init; }

    /// <summary>The git revision of a changed-files run (--changed-since).</summary>
    public string? ChangedSince { get; init; }

    /// <summary>Check the staged contents (--staged).</summary>
    public bool Staged { get; init; }

    /// <summary>With a revision, check every file (--all-files).</summary>
    public bool AllFiles { get; init; }

    /// <summary>A file to append the markdown summary to (--summary).</summary>
    public string? Summary { get; init; }

    /// <summary>The prefix of file links in markdown (--link-base).</summary>
    public string? LinkBase { get; init; }

    /// <summary>Attach to each finding on a setting a value that every rule on it accepts (off with --no-suggest).</summary>
    public bool Suggest { get; init; } = true;
    /// <summary>List every accepted finding in text instead of one line per rule (--show-accepted).</summary>
    public bool ShowAccepted { get; init; }
}

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
        var omit = new Option<bool>("--sarif-omit-suppressed") { Description = "Leave suppressed findings and absent baseline entries out of the report (hosted code scanning ignores SARIF suppressions and baseline states)." };
        var noSuppress = new Option<bool>("--no-suppress") { Description = "Ignore every '# settinglint-accept' comment, for audits: accepted findings count again." };
        var baseline = new Option<string?>("--baseline") { Description = "Compare with this baseline file (written by 'settinglint baseline'): only findings not in it fail the run." };
        var changedSince = new Option<string?>("--changed-since") { Description = "Check only the setting files changed since this git revision and the files that depend on them, and report changes that loosen the gate." };
        var staged = new Option<bool>("--staged") { Description = "Check the contents staged for commit, against HEAD unless --changed-since names another revision (the pre-commit check)." };
        var allFiles = new Option<bool>("--all-files") { Description = "With --changed-since or --staged: check every file, still reporting changes that loosen the gate." };
        var summary = new Option<string?>("--summary") { Description = "Also append the markdown summary to this file (a CI job summary such as $GITHUB_STEP_SUMMARY)." };
        var noSuggest = new Option<bool>("--no-suggest") { Description = "Do not work out a suggested value for findings on a setting (each costs a second check of its file)." };
        var linkBase = new Option<string?>("--link-base") { Description = "Prefix of the file links in markdown, such as https://github.com/OWNER/REPO/blob/COMMIT/ (default: relative links)." };
        var showAccepted = new Option<bool>("--show-accepted") { Description = "Text: list each finding accepted in the source (by default one line per rule says how many and where)." };
        var command = new Command("check", "Check setting files and report findings; the exit code is the gate.")
        {
            paths, format, output, failOn, timestamps, omit, noSuppress, baseline, changedSince, staged, allFiles, summary, linkBase, noSuggest, showAccepted,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(paths) ?? [];
            var bad = given.FirstOrDefault(p => p.StartsWith('-'));
            if (bad is not null)
            {
                stderr.WriteLine($"settinglint: unknown option '{bad}'. Try '{ToolCommand.Current} check --help'.");
                return ExitCodes.Usage;
            }
            var options = new CheckOptionsRecord(
                given,
                parse.GetValue(format) ?? "text",
                parse.GetValue(output),
                parse.GetValue(failOn) is { } fo ? ParseFailOn(fo) : null,
                parse.GetValue(timestamps),
                parse.GetValue(omit))
            {
                NoSuppress = parse.GetValue(noSuppress),
                Baseline = parse.GetValue(baseline),
                ChangedSince = parse.GetValue(changedSince),
                Staged = parse.GetValue(staged),
                AllFiles = parse.GetValue(allFiles),
                Summary = parse.GetValue(summary),
                LinkBase = parse.GetValue(linkBase),
                Suggest = !parse.GetValue(noSuggest),
                ShowAccepted = parse.GetValue(showAccepted),
            };
            if (options.AllFiles && options.ChangedSince is null && !options.Staged)
            {
                stderr.WriteLine("settinglint: --all-files goes with --changed-since or --staged.");
                return ExitCodes.Usage;
            }
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
        var gate = new GateOptions(!options.NoSuppress, options.Baseline, options.ChangedSince, options.Staged, options.AllFiles);
        var result = Linter.Check(new CheckRequest(Directory.GetCurrentDirectory(), paths) { FailOn = options.FailOn, Options = gate });
        // A staged check reads the index; the suggestions would read the working tree, so they wait for a plain check.
        if (!options.Staged && options.Suggest && result.Notifications.IsEmpty)
        {
            var session = Session.Open([Path.GetFullPath(paths[0])]);
            var set = FixFinder.Compute(session.Rules, result.RepositoryRoot, session.Config.Includes, null, result.Findings, ImmutableHashSet<string>.Empty, session.Config.ElectricalCodeOf, result.LoadedFiles);
            // A conflict stands with the findings on its setting: unchanged from the baseline when they all are.
            var conflicts = set.Conflicts().Select(c =>
            {
                var states = result.Findings.Where(f => f.File == c.File && f.KeyPath == c.KeyPath && f.Suppression is null).Select(f => f.BaselineState).ToList();
                return states.Any(s => s is not null) ? c with { BaselineState = states.Any(s => s is not BaselineState.Unchanged) ? BaselineState.New : BaselineState.Unchanged } : c;
            });
            result = result with { Findings = [.. set.Attach(result.Findings).AddRange(conflicts).Order(Finding.Order)] };
        }
        var context = new ReportContext(Directory.GetCurrentDirectory(), options.Timestamps, options.SarifOmitSuppressed, ToolInfo.ForVersion(Version))
        {
            ShowAccepted = options.ShowAccepted,
            Command = ToolCommand.Current,
            StartTimeUtc = options.Timestamps ? started : null,
            EndTimeUtc = options.Timestamps ? DateTimeOffset.UtcNow : null,
        };
        var reporter = options.Format == "markdown" ? new MarkdownReporter { LinkBase = options.LinkBase } : Reporters.For(options.Format);
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
        if (options.Summary is { } summaryFile)
        {
            // Appended: a CI job summary file collects the output of every step.
            var dir = Path.GetDirectoryName(Path.GetFullPath(summaryFile));
            if (dir is not null) Directory.CreateDirectory(dir);
            using var writer = new StreamWriter(summaryFile, append: true, new System.Text.UTF8Encoding(false));
            new MarkdownReporter { LinkBase = options.LinkBase }.Write(result, context, writer);
        }
        return result.ExitCode;
    }

    /// <summary>The tool's version, from the assembly's informational version without build metadata.</summary>
    public static string Version { get; } =
        (typeof(CheckCommand).Assembly.GetCustomAttributes(typeof(System.Reflection.AssemblyInformationalVersionAttribute), false)
            .OfType<System.Reflection.AssemblyInformationalVersionAttribute>().FirstOrDefault()?.InformationalVersion ?? "0.0.0")
            .Split('+')[0];
}
