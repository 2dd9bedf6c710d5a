using System.CommandLine;
using System.Globalization;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Reporting;
using SettingLint.Reporting.Html;

namespace SettingLint.Cli;

/// <summary>The options of `report`, parsed once.</summary>
/// <param name="Path">The file or folder to report on.</param>
/// <param name="Format">html (a folder of pages and SVG plots) or json (margins and windows).</param>
/// <param name="Output">The report folder; for json, null writes to standard output.</param>
/// <param name="NearMiss">The near-miss share of a limit (0.1 is 10 %).</param>
/// <param name="ChangedSince">A git revision to compare with, or null.</param>
public sealed record ReportOptionsRecord(string Path, string Format, string? Output, double NearMiss, string? ChangedSince);

/// <summary>`settinglint report [PATH] --output DIR`: the reviewer's report with margins, setting windows and plots.</summary>
public static class ReportCommand
{
    /// <summary>The folder written when --output is not given (html).</summary>
    public const string DefaultFolder = "settinglint-report";

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var path = new Argument<string?>("path") { Description = "The file or folder to report on (default: the current folder).", Arity = ArgumentArity.ZeroOrOne };
        var output = new Option<string?>("--output", "-o") { Description = "The report folder (default: " + DefaultFolder + "); with --format json, leave it out to write to standard output." };
        var format = new Option<string>("--format", "-f") { Description = "html: index.html, one page per motor and the plots as SVG files; json: margins and setting windows.", DefaultValueFactory = _ => "html" };
        format.AcceptOnlyFromAmong("html", "json");
        var nearMiss = new Option<string>("--near-miss") { Description = "Mark a passing rule as a near miss when its margin is inside this share of the limit (default 10%).", DefaultValueFactory = _ => "10%" };
        var changedSince = new Option<string?>("--changed-since") { Description = "Compare with a git revision (HEAD~1, origin/main): mark the settings, margins and findings that changed, old and new side by side." };
        var command = new Command("report",
            "Write a review report: per motor, every rule's margin (failures and near misses first), the window the rules leave each setting, a time-current plot and a thermal-level plot.\n\n"
            + "Caution: " + HtmlReport.Caution)
        {
            path, output, format, nearMiss, changedSince,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(path);
            if (given is not null && given.StartsWith('-'))
            {
                stderr.WriteLine($"settinglint: unknown option '{given}'. Try 'settinglint report --help'.");
                return ExitCodes.Usage;
            }
            var share = ParseShare(parse.GetValue(nearMiss) ?? "10%");
            if (share is null)
            {
                stderr.WriteLine("settinglint: --near-miss takes a percentage from 0 to 100, such as 10%.");
                return ExitCodes.Usage;
            }
            var options = new ReportOptionsRecord(given ?? ".", parse.GetValue(format) ?? "html", parse.GetValue(output), share.Value, parse.GetValue(changedSince));
            return Execute(options, stdout, stderr);
        });
        return command;
    }

    /// <summary>Reads a percentage ("10%", "10 %", "10") as a share (0.1); null when it is not one from 0 to 100.</summary>
    public static double? ParseShare(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var t = text.Trim();
        if (t.EndsWith('%')) t = t[..^1].TrimEnd();
        if (!double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out var percent) || !double.IsFinite(percent) || percent < 0 || percent > 100) return null;
        return percent / 100;
    }

    /// <summary>Runs the check with the report's listeners and writes the report; 0 when written, 2 for usage or configuration, 3 after an internal error.</summary>
    public static int Execute(ReportOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        ArgumentNullException.ThrowIfNull(options);
        // With the suggested values, so that each finding and window shows what `fix` would write.
        var request = new CheckRequest(Directory.GetCurrentDirectory(), [options.Path]) { Suggest = true };
        var data = ReportData.Collect(request);
        var configuration = data.Result.Notifications.Where(n => n.Kind == NotificationKind.Configuration).ToList();
        if (configuration.Count > 0)
        {
            foreach (var n in configuration) stderr.WriteLine(Where(n) + "error: " + n.Message);
            return ExitCodes.Usage;
        }
        var tool = ToolInfo.ForVersion(CheckCommand.Version);
        var model = ReportBuilder.Build(data, tool, options.NearMiss);
        if (options.ChangedSince is { } revision)
        {
            try
            {
                model = WithChanges(model, data, request, options, revision, tool);
            }
            catch (GitException ex)
            {
                stderr.WriteLine("settinglint: --changed-since: " + ex.Message);
                return ExitCodes.Usage;
            }
        }
        foreach (var n in data.Result.Notifications) stderr.WriteLine(Where(n) + "internal error: " + n.Message);
        try
        {
            Write(model, options, stdout);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A folder the user named that cannot be written is their mistake to correct, not an internal error.
            stderr.WriteLine("settinglint: cannot write the report to '" + (options.Output ?? DefaultFolder) + "': " + ex.Message);
            return ExitCodes.Usage;
        }
        return data.Result.Notifications.Any(n => n.Kind == NotificationKind.Internal) ? ExitCodes.Internal : ExitCodes.Clean;
    }

    private static void Write(ReportModel model, ReportOptionsRecord options, TextWriter stdout)
    {
        if (options.Format == "json" && options.Output is null)
        {
            stdout.Write(ReportJson.Render(model));
        }
        else if (options is { Format: "json", Output: { } jsonFolder })
        {
            var file = Path.Combine(jsonFolder, "report.json");
            Directory.CreateDirectory(jsonFolder);
            File.WriteAllText(file, ReportJson.Render(model), new System.Text.UTF8Encoding(false));
            stdout.WriteLine("settinglint: wrote " + file);
        }
        else
        {
            var folder = options.Output ?? DefaultFolder;
            HtmlReport.Write(model, folder);
            stdout.WriteLine($"settinglint: wrote the report of {Count(model.Motors.Length, "motor")} to {Path.Combine(folder, "index.html")}");
            stdout.WriteLine("Caution: " + HtmlReport.Caution);
        }
    }

    /// <summary>The same check over the repository as it was at the revision (read from git, not copied), compared motor by motor.</summary>
    private static ReportModel WithChanges(ReportModel now, ReportData nowData, CheckRequest request, ReportOptionsRecord options, string revision, ToolInfo tool)
    {
        var root = nowData.Result.RepositoryRoot;
        var then = GitRevisionSource.At(root, revision);
        var checkedPath = SourcePaths.Absolute(options.Path, request.WorkingDirectory);
        // The checked path may not exist yet at the revision: then every motor is new.
        var oldData = then.Probe(checkedPath) is EntryKind.File or EntryKind.Folder ? ReportData.Collect(request with { Source = then, Suggest = false }) : ReportData.Empty(root);
        var before = ReportBuilder.Build(oldData, tool, options.NearMiss);
        return ReportChanges.Compare(before, now, oldData.Motors, nowData.Motors, revision);
    }

    private static string Where(Notification n) =>
        n.File is null ? "settinglint: " : n.Span is { } s ? $"{n.File}:{s.StartLine}:{s.StartColumn}: " : n.File + ": ";

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}
