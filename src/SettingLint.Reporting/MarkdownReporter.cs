using System.Globalization;
using System.Text;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>A summary in markdown for a pull-request comment or a CI job summary: counts, new findings with their numbers, the motors checked.</summary>
public sealed class MarkdownReporter : IReporter
{
    /// <summary>The caution every summary ends with.</summary>
    public const string Caution = SettingLint.Core.Findings.Caution.Text;

    /// <summary>At most this many findings are tabled; a pull-request comment has a size limit.</summary>
    public const int MaxRows = 100;

    /// <summary>
    /// Put before each file link (such as https://host/owner/repo/blob/COMMIT/); without it links are relative to the
    /// repository root, which is right for a file viewed in the repository.
    /// </summary>
    public string? LinkBase { get; init; }

    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);
        var md = new StringBuilder();
        var baseline = result.BaselineFile is not null;
        var exit = result.ExitCode;
        md.Append("## SettingLint: ").Append(exit switch
        {
            ExitCodes.Clean => "the gate passes",
            ExitCodes.Findings => "the gate fails",
            _ => "the check could not run",
        }).Append("\n\n");

        if (!result.Notifications.IsEmpty)
        {
            md.Append("### Problems of the run\n\n");
            foreach (var n in result.Notifications)
            {
                var kind = n.Kind == NotificationKind.Internal ? "internal error" : "error";
                var where = n.File is { } f ? Link(f, n.Span?.StartLine) + ": " : "";
                md.Append("- ").Append(where).Append(kind).Append(": ").Append(Inline(n.Message)).Append('\n');
            }
            md.Append('\n');
        }

        var findings = result.Findings.Where(f => f.RuleId != EngineRules.GateChange).ToList();
        var open = findings.Where(f => f.Suppression is null && f.BaselineState != BaselineState.Unchanged).ToList();
        var failing = open.Count(result.Fails);
        var notRun = result.NotRun.IsEmpty ? "" : "; " + Count(result.NotRun.Length, "check") + " not run for missing data";
        md.Append(Invariant($"{Count(failing, "finding")} at or above fail-on level {FailOnToken(result.FailOn)}; {Count(result.FilesChecked, "setting file")} checked ({Count(result.MotorCount, "motor")}){notRun}; exit code {exit}.\n\n"));

        md.Append(baseline ? "| level | new | in the baseline | accepted in source |\n|---|---:|---:|---:|\n" : "| level | found | accepted in source |\n|---|---:|---:|\n");
        foreach (var level in (Level[])[Level.Error, Level.Warning, Level.Note])
        {
            var atLevel = findings.Where(f => f.Level == level).ToList();
            var accepted = atLevel.Count(f => f.Suppression is not null);
            var fresh = atLevel.Count(f => f.Suppression is null && f.BaselineState != BaselineState.Unchanged);
            var known = atLevel.Count(f => f.Suppression is null && f.BaselineState == BaselineState.Unchanged);
            md.Append(baseline ? Invariant($"| {level.Token()} | {fresh} | {known} | {accepted} |\n") : Invariant($"| {level.Token()} | {fresh} | {accepted} |\n"));
        }
        md.Append('\n');
        if (baseline && !result.Absent.IsEmpty)
        {
            // Rewriting the baseline would also accept today's new findings: the entries to delete are named instead.
            md.Append(Invariant($"{Count(result.Absent.Length, "baseline entry", "baseline entries")} no longer found; delete {(result.Absent.Length == 1 ? "it" : "them")} from the baseline:\n\n"));
            foreach (var a in result.Absent.Take(MaxRows))
            {
                md.Append("- ").Append(Link(result.BaselineFile!, a.BaselineLine)).Append(": ").Append(a.RuleId).Append(' ')
                    .Append(Inline(a.KeyPath.Length == 0 ? a.File : a.File + " " + a.KeyPath)).Append('\n');
            }
            md.Append('\n');
        }

        if (open.Count > 0)
        {
            md.Append(baseline ? "### New findings\n\n" : "### Findings\n\n");
            // The column of suggested values is there only when some finding has one, so that other summaries keep their shape.
            var suggested = open.Take(MaxRows).Any(f => f.Fix is not null);
            md.Append("| level | rule | where | finding | actual | limit | margin |").Append(suggested ? " suggested |" : "")
                .Append("\n|---|---|---|---|---:|---:|---:|").Append(suggested ? "---:|" : "").Append('\n');
            foreach (var f in open.Take(MaxRows))
            {
                md.Append("| ").Append(f.Level.Token()).Append(" | ").Append(f.RuleId).Append(" | ").Append(Link(f.File, f.Span.StartLine))
                    .Append(" | ").Append(Cell(f.Message))
                    .Append(" | ").Append(Cell(Value(f, "actual"))).Append(" | ").Append(Cell(Value(f, "limit"))).Append(" | ").Append(Cell(Value(f, "margin")))
                    .Append(" |");
                if (suggested) md.Append(' ').Append(Cell(f.Fix is { } fix ? fix.Inserted + " (" + fix.Shown + ")" : "")).Append(" |");
                md.Append('\n');
            }
            if (open.Count > MaxRows) md.Append(Invariant($"\n{open.Count - MaxRows} more not shown; the SARIF or JSON report has them all.\n"));
            md.Append('\n');
        }

        var gateChanges = result.Findings.Where(f => f.RuleId == EngineRules.GateChange).ToList();
        if (gateChanges.Count > 0)
        {
            md.Append("### Changes that loosen the gate\n\n");
            md.Append("For the reviewer: confirm each is intended.\n\n| level | where | change |\n|---|---|---|\n");
            foreach (var f in gateChanges)
            {
                md.Append("| ").Append(f.Level.Token()).Append(" | ").Append(Link(f.File, f.Span.StartLine)).Append(" | ").Append(Cell(f.Message)).Append(" |\n");
            }
            md.Append('\n');
        }

        if (!result.NotRun.IsEmpty)
        {
            // A gate that passes must not read as "checked" where a rule could not run.
            md.Append("### Checks not run for missing data\n\n");
            md.Append(Invariant($"{Count(result.NotRun.Length, "check")} could not be evaluated because input data is missing; the gate does not cover them.\n\n"));
            md.Append("| motor | rule | missing |\n|---|---|---|\n");
            foreach (var n in result.NotRun.Take(MaxRows))
            {
                md.Append("| ").Append(Cell(n.Motor)).Append(' ').Append(Link(n.File, null)).Append(" | ").Append(n.RuleId).Append(" | ")
                    .Append(Cell(string.Join(", ", n.MissingPaths.Select(p => "`" + p + "`")))).Append(" |\n");
            }
            if (result.NotRun.Length > MaxRows) md.Append(Invariant($"\n{result.NotRun.Length - MaxRows} more not shown; the JSON report has them all.\n"));
            md.Append('\n');
        }

        if (result.Scope is { } scope) md.Append(Inline(TextReporter.ScopeLine(scope))).Append("\n\n");

        var motors = string.Join(", ", result.Motors.Select(Inline));
        if (result.MotorCount > 20)
        {
            md.Append(Invariant($"<details><summary>Motors checked ({result.MotorCount})</summary>\n\n{motors}\n\n</details>\n\n"));
        }
        else
        {
            md.Append(Invariant($"**Motors checked ({result.MotorCount}):** {(motors.Length == 0 ? "none" : motors)}\n\n"));
        }

        md.Append("> ").Append(Caution).Append('\n');
        output.Write(md.ToString());
    }

    private string Link(string file, int? line)
    {
        var text = line is { } l ? Invariant($"{file}:{l}") : file;
        var target = (LinkBase ?? "") + ReportPaths.UriReference(file) + (line is { } n ? Invariant($"#L{n}") : "");
        return "[" + Inline(text) + "](" + target + ")";
    }

    private static string Value(Finding finding, string name) => finding.Values.TryGetValue(name, out var v) ? v.Text : "";

    private static string FailOnToken(Level level) => level == Level.None ? "never" : level.Token();

    // Markdown that stays on one line and cannot open a table cell, a tag or a link by accident.
    private static string Inline(string text) =>
        text.ReplaceLineEndings(" ").Replace("<", "&lt;", StringComparison.Ordinal).Replace(">", "&gt;", StringComparison.Ordinal)
            .Replace("[", "\\[", StringComparison.Ordinal).Replace("]", "\\]", StringComparison.Ordinal);

    private static string Cell(string text) => Inline(text).Replace("|", "\\|", StringComparison.Ordinal);

    private static string Count(int n, string noun, string? plural = null) =>
        n.ToString(CultureInfo.InvariantCulture) + " " + (n == 1 ? noun : plural ?? noun + "s");

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
