using System.Globalization;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>Compiler-style lines (<c>path:line:col: level SLnnn: message</c>) and a summary; no JSON library, so it starts fast.</summary>
public sealed class TextReporter : IReporter
{
    /// <summary>The prefix of lines that have no file.</summary>
    internal const string Prefix = "settinglint";

    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);

        // Notifications first: a broken configuration explains missing or odd findings below it.
        foreach (var notification in result.Notifications)
        {
            WriteLine(output, NotificationLine(result, context, notification));
        }
        foreach (var finding in result.Findings)
        {
            if (finding.Suppression is not null && !Listed(context)) continue;
            // With a baseline only what is new is listed: hundreds of accepted findings would hide it.
            if (finding.BaselineState == BaselineState.Unchanged) continue;
            WriteLine(output, FindingLine(result, context, finding));
        }
        // Accepted findings: one line per rule, how many and where, unless --show-accepted lists them one by one.
        if (!context.ShowAccepted && !context.OmitSuppressed)
        {
            foreach (var rule in result.Findings.Where(f => f.Suppression is not null).GroupBy(f => f.RuleId, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal))
            {
                var files = rule.Select(f => ReportPaths.FromCurrentDirectory(result.RepositoryRoot, f.File, context.CurrentDirectory)).Distinct(StringComparer.Ordinal).ToList();
                var shown = files.Count <= 3 ? string.Join(", ", files) : string.Join(", ", files.Take(3)) + " and " + Plural(files.Count - 3, "other file");
                WriteLine(output, $"{Prefix}: accepted {rule.Key}: {Plural(rule.Count(), "finding")} accepted in the source, in {shown} (--show-accepted lists them)");
            }
        }
        if (result.BaselineFile is { } baseline)
        {
            var baselinePath = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, baseline, context.CurrentDirectory);
            foreach (var absent in result.Absent)
            {
                var where = absent.KeyPath.Length == 0 ? absent.File : absent.File + " " + absent.KeyPath;
                WriteLine(output, string.Create(CultureInfo.InvariantCulture,
                    $"{baselinePath}:{absent.BaselineLine}:1: absent {absent.RuleId}: {where} is no longer found; remove this entry from the baseline."));
            }
        }
        if (result.Scope is { } scope) WriteLine(output, ScopeLine(scope));
        if (result.BaselineFile is { } file)
        {
            // New means listed above and able to fail the run: an accepted finding or a change to the gate is neither.
            var fresh = result.Findings.Count(f => f.BaselineState == BaselineState.New && f.Suppression is null && f.RuleId != EngineRules.GateChange);
            var unchanged = result.Findings.Count(f => f.BaselineState == BaselineState.Unchanged);
            var path = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, file, context.CurrentDirectory);
            WriteLine(output, string.Create(CultureInfo.InvariantCulture,
                $"Baseline {path}: {fresh} new, {unchanged} unchanged (not listed), {result.Absent.Length} absent; only new findings can fail the run."));
        }
        // What each rule that fired checks, once, and where its rationale and basis are.
        var fired = result.Findings.Where(f => f.BaselineState != BaselineState.Unchanged && (f.Suppression is null || Listed(context)))
            .Select(f => f.RuleId).Distinct().Order(StringComparer.Ordinal).ToList();
        if (fired.Count > 0)
        {
            WriteLine(output, "Rules:");
            foreach (var id in fired)
            {
                var title = result.Rules.FirstOrDefault(r => r.Id == id)?.Title ?? "";
                WriteLine(output, $"  {id}  {title}  ({context.Command} rules show {id})");
            }
        }
        WriteNotRun(result, context, output);
        WriteLine(output, SummaryLine(result));
    }

    /// <summary>The rules not evaluated for missing data, one line per motor: "  motors/p-1.yaml (P-1): SL202 (bus.fault_current_min)".</summary>
    private static void WriteNotRun(CheckResult result, ReportContext context, TextWriter output)
    {
        if (result.NotRun.IsEmpty) return;
        WriteLine(output, "Checks not run for missing data:");
        foreach (var motor in result.NotRun.GroupBy(n => (n.File, n.Motor)))
        {
            var path = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, motor.Key.File, context.CurrentDirectory);
            WriteLine(output, "  " + path + " (" + OneLine(motor.Key.Motor) + "): " + string.Join(", ", motor.Select(n => n.RuleId + " (" + n.MissingText + ")")));
        }
    }

    /// <summary>
    /// The last line. Its error, warning and note counts are of the findings listed above that can fail the run; those
    /// in the baseline, accepted in the source and the changes to the gate (SL011) are counted apart, so that every
    /// number says where its findings are.
    /// </summary>
    internal static string SummaryLine(CheckResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        var listed = result.Findings.Where(f => f.Suppression is null && f.BaselineState != BaselineState.Unchanged && f.RuleId != EngineRules.GateChange).ToList();
        var text = string.Create(CultureInfo.InvariantCulture,
            $"{Plural(listed.Count(f => f.Level == Level.Error), "error")}, {Plural(listed.Count(f => f.Level == Level.Warning), "warning")}, {Plural(listed.Count(f => f.Level == Level.Note), "note")} in {Plural(result.FilesChecked, "file")} ({Plural(result.MotorCount, "motor")})");
        var inBaseline = result.Findings.Count(f => f.BaselineState == BaselineState.Unchanged && f.Suppression is null);
        if (inBaseline > 0) text += "; " + inBaseline.ToString(CultureInfo.InvariantCulture) + " in the baseline (not listed)";
        var accepted = result.Findings.Count(f => f.Suppression is not null);
        if (accepted > 0) text += "; " + accepted.ToString(CultureInfo.InvariantCulture) + " accepted in the source";
        var gate = result.Findings.Count(f => f.RuleId == EngineRules.GateChange && f.Suppression is null && f.BaselineState != BaselineState.Unchanged);
        if (gate > 0) text += "; " + Plural(gate, "change") + " to the gate (SL011)";
        var configuration = result.Notifications.Count(static n => n.Kind == NotificationKind.Configuration);
        if (configuration > 0) text += "; " + Plural(configuration, "configuration error");
        var internalErrors = result.Notifications.Count(static n => n.Kind == NotificationKind.Internal);
        if (internalErrors > 0) text += "; " + Plural(internalErrors, "internal error");
        // Clean must not silently mean "not checked": the count is there whenever a rule could not run.
        if (!result.NotRun.IsEmpty) text += "; " + Plural(result.NotRun.Length, "check") + " not run for missing data";
        return text;
    }

    // Accepted findings are listed one by one only when asked for, and never when left out.
    private static bool Listed(ReportContext context) => context.ShowAccepted && !context.OmitSuppressed;

    /// <summary>The line that says what a changed-files run checked.</summary>
    internal static string ScopeLine(ChangeScope scope)
    {
        ArgumentNullException.ThrowIfNull(scope);
        var since = scope.Staged ? "Staged changes against " + scope.Revision : "Changed since " + scope.Revision;
        var counts = string.Create(CultureInfo.InvariantCulture, $"{Plural(scope.Changed.Length, "file")} changed, {scope.Deleted.Length} deleted");
        if (scope.EverythingBecause is { } why) return since + ": " + counts + "; every file checked: " + why + ".";
        var dependants = scope.Dependants.IsEmpty
            ? "no dependants"
            : Plural(scope.Dependants.Length, "dependant") + " re-checked (" + string.Join(", ", scope.Dependants) + ")";
        return since + ": " + counts + "; " + dependants + ".";
    }

    private static string Plural(int n, string noun) =>
        n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");

    /// <summary>The line of one finding.</summary>
    internal static string FindingLine(CheckResult result, ReportContext context, Finding finding)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(finding);
        var path = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, finding.File, context.CurrentDirectory);
        var line = string.Create(CultureInfo.InvariantCulture,
            $"{path}:{finding.Span.StartLine}:{finding.Span.StartColumn}: {finding.Level.Token()} {finding.RuleId}: {OneLine(finding.Message)}");
        if (finding.Suppression is { } suppression) return line + " [suppressed: " + OneLine(suppression.Justification) + "]";
        return finding.Fix is { } fix ? line + " [suggested: " + fix.Inserted + "]" : line;
    }

    /// <summary>The line of one notification: located like a finding when it has a file, else prefixed with the tool's name.</summary>
    internal static string NotificationLine(CheckResult result, ReportContext context, Notification notification)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(notification);
        var what = notification.Kind == NotificationKind.Internal ? "internal error" : "error";
        var where = Prefix;
        if (notification.File is { } file)
        {
            where = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, file, context.CurrentDirectory);
            if (notification.Span is { } span)
            {
                where += string.Create(CultureInfo.InvariantCulture, $":{span.StartLine}:{span.StartColumn}");
            }
        }
        return where + ": " + what + ": " + OneLine(notification.Message);
    }

    // One line per item keeps the output readable by editors' problem matchers.
    private static string OneLine(string text) =>
        text.Contains('\n', StringComparison.Ordinal) || text.Contains('\r', StringComparison.Ordinal)
            ? text.ReplaceLineEndings(" ")
            : text;

    private static void WriteLine(TextWriter output, string line)
    {
        output.Write(line);
        output.Write('\n');
    }
}
