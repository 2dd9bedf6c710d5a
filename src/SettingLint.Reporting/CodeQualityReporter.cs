using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>
/// The code-quality report that GitLab merge requests show beside the changed lines: a JSON array of issues, each with
/// description, check_name, fingerprint, severity and location (path from the repository root, lines.begin). Findings
/// accepted in the source are left out (a person accepted them); findings in the baseline stay, since GitLab itself
/// shows only what a merge request adds compared with its target branch. Problems of the run (a bad configuration or
/// rule file, an internal error) are blocker issues, so that a gate that could not judge is not read as a clean one.
/// </summary>
public sealed class CodeQualityReporter : IReporter
{
    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);
        JsonOutput.Write(output, json => WriteIssues(json, result));
    }

    /// <summary>The severity of a finding's level: GitLab's scale is info, minor, major, critical, blocker.</summary>
    public static string Severity(Level level) => level switch
    {
        Level.Error => "critical",
        Level.Warning => "minor",
        _ => "info",
    };

    private static void WriteIssues(Utf8JsonWriter json, CheckResult result)
    {
        // GitLab keeps one issue per fingerprint; ours is of file, rule and key path, so a second finding of a rule at
        // the same key path (one per relay range, say) gets its own by counting.
        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        string Unique(string fingerprint)
        {
            var n = seen[fingerprint] = seen.GetValueOrDefault(fingerprint) + 1;
            return n == 1 ? fingerprint : Hash(fingerprint + "\n" + n.ToString(System.Globalization.CultureInfo.InvariantCulture));
        }

        json.WriteStartArray();
        foreach (var n in result.Notifications)
        {
            var kind = n.Kind == NotificationKind.Internal ? "internal-error" : "configuration-error";
            var file = n.File ?? ".settinglint.yaml";
            WriteIssue(json, "SettingLint " + kind + ": " + n.Message, kind, Unique(Hash(kind + "\n" + file + "\n" + n.Message)), "blocker", file, Math.Max(1, n.Span?.StartLine ?? 1));
        }
        foreach (var f in result.Findings)
        {
            if (f.Suppression is not null) continue;
            WriteIssue(json, f.RuleId + ": " + f.Message, f.RuleId, Unique(f.Fingerprint), Severity(f.Level), f.File, Math.Max(1, f.Span.StartLine));
        }
        json.WriteEndArray();
    }

    private static void WriteIssue(Utf8JsonWriter json, string description, string check, string fingerprint, string severity, string path, int line)
    {
        json.WriteStartObject();
        json.WriteString("description", description);
        json.WriteString("check_name", check);
        json.WriteString("fingerprint", fingerprint);
        json.WriteString("severity", severity);
        json.WriteStartObject("location");
        json.WriteString("path", path);
        json.WriteStartObject("lines");
        json.WriteNumber("begin", line);
        json.WriteEndObject();
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static string Hash(string text) =>
        Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)).AsSpan(0, 16));
}
