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
            if (finding.Suppression is not null && context.OmitSuppressed) continue;
            // With a baseline only what is new is listed: hundreds of accepted findings would hide it.
            if (finding.BaselineState == BaselineState.Unchanged) continue;
            WriteLine(output, FindingLine(result, context, finding));
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
            var fresh = result.Findings.Count(f => f.BaselineState == BaselineState.New);
            var unchanged = result.Findings.Count(f => f.BaselineState == BaselineState.Unchanged);
            var path = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, file, context.CurrentDirectory);
            WriteLine(output, string.Create(CultureInfo.InvariantCulture,
                $"Baseline {path}: {fresh} new, {unchanged} unchanged (not listed), {result.Absent.Length} absent; only new findings can fail the run."));
        }
        // What each rule that fired checks, once, and where its rationale and basis are.
        var fired = result.Findings.Where(f => f.BaselineState != BaselineState.Unchanged && !(f.Suppression is not null && context.OmitSuppressed))
            .Select(f => f.RuleId).Distinct().Order(StringComparer.Ordinal).ToList();
        if (fired.Count > 0)
        {
            WriteLine(output, "Rules:");
            foreach (var id in fired)
            {
                var title = result.Rules.FirstOrDefault(r => r.Id == id)?.Title ?? "";
                WriteLine(output, $"  {id}  {title}  (settinglint rules show {id})");
            }
        }
        WriteLine(output, ReportSummary.Of(result).ToSentence());
    }

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
