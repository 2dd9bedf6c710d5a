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
            WriteLine(output, FindingLine(result, context, finding));
        }
        WriteLine(output, ReportSummary.Of(result).ToSentence());
    }

    /// <summary>The line of one finding.</summary>
    internal static string FindingLine(CheckResult result, ReportContext context, Finding finding)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(finding);
        var path = ReportPaths.FromCurrentDirectory(result.RepositoryRoot, finding.File, context.CurrentDirectory);
        var line = string.Create(CultureInfo.InvariantCulture,
            $"{path}:{finding.Span.StartLine}:{finding.Span.StartColumn}: {finding.Level.Token()} {finding.RuleId}: {OneLine(finding.Message)}");
        return finding.Suppression is { } suppression
            ? line + " [suppressed: " + OneLine(suppression.Justification) + "]"
            : line;
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
