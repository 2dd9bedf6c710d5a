using System.Collections.Immutable;
using System.Globalization;
using System.Text.Json;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>A SARIF 2.1.0 log (one run) for code scanning services, written directly with <see cref="Utf8JsonWriter"/>.</summary>
/// <remarks>
/// The log keeps the shape that the Sarif.Sdk object model gave it before: the same properties in the same order;
/// defaults written all the same (a level of "warning", an exit code of 0), so that consumers need not know them;
/// and the SDK's omissions (empty lists, blank texts, a short description that repeats the full one). Sarif.Sdk is
/// a test-only reference now, which the tests compare with this writer on many inputs.
/// </remarks>
public sealed class SarifReporter : IReporter
{
    /// <summary>The schema URI written as <c>$schema</c>.</summary>
    public const string SchemaUri = "https://json.schemastore.org/sarif-2.1.0.json";

    /// <summary>The uriBaseId that result locations are relative to: the repository root.</summary>
    public const string SourceRootBaseId = "%SRCROOT%";

    // The result property that maps value names to their units.
    private const string UnitsProperty = "units";

    // SARIF 3.9: UTC with a "Z"; milliseconds, truncated.
    private const string TimestampFormat = "yyyy-MM-ddTHH:mm:ss.fffZ";

    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);

        JsonOutput.Write(output, json => WriteLog(json, result, context));
    }

    private static void WriteLog(Utf8JsonWriter json, CheckResult result, ReportContext context)
    {
        json.WriteStartObject();
        json.WriteString("$schema", SchemaUri);
        json.WriteString("version", "2.1.0");
        json.WriteStartArray("runs");
        WriteRun(json, result, context);
        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteRun(Utf8JsonWriter json, CheckResult result, ReportContext context)
    {
        // A result points at the first rule of its id; a result of an unknown rule has no ruleIndex.
        var ruleIndex = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < result.Rules.Length; i++) ruleIndex.TryAdd(result.Rules[i].Id, i);
        int IndexOf(string ruleId) => ruleIndex.TryGetValue(ruleId, out var index) ? index : -1;

        json.WriteStartObject();
        json.WriteStartObject("tool");
        WriteDriver(json, result.Rules, context.Tool);
        json.WriteEndObject();

        json.WriteStartArray("invocations");
        WriteInvocation(json, result, context, IndexOf);
        json.WriteEndArray();

        json.WriteStartObject("originalUriBaseIds");
        json.WriteStartObject(SourceRootBaseId);
        json.WriteString("uri", ReportPaths.DirectoryFileUri(result.RepositoryRoot));
        json.WriteEndObject();
        json.WriteEndObject();

        json.WriteStartArray("results");
        foreach (var finding in result.Findings)
        {
            if (finding.Suppression is not null && context.OmitSuppressed) continue;
            WriteResult(json, finding, IndexOf(finding.RuleId));
        }
        // Code scanning would show an absent result as an open alert, so the code-scanning option leaves them out too.
        if (!context.OmitSuppressed && result.BaselineFile is { } baselineFile)
        {
            foreach (var absent in result.Absent) WriteAbsent(json, absent, baselineFile, IndexOf(absent.RuleId));
        }
        json.WriteEndArray();

        json.WriteString("columnKind", "utf16CodeUnits");
        json.WriteEndObject();
    }

    private static void WriteDriver(Utf8JsonWriter json, ImmutableArray<RuleDescriptor> rules, ToolInfo tool)
    {
        json.WriteStartObject("driver");
        if (!string.IsNullOrWhiteSpace(tool.Name)) json.WriteString("name", tool.Name);
        json.WriteString("version", tool.Version);
        json.WriteString("semanticVersion", tool.Version);
        json.WriteString("informationUri", tool.InformationUri.OriginalString);
        if (rules.Length > 0)
        {
            json.WriteStartArray("rules");
            foreach (var rule in rules) WriteRule(json, rule, tool);
            json.WriteEndArray();
        }
        json.WriteEndObject();
    }

    private static void WriteRule(Utf8JsonWriter json, RuleDescriptor rule, ToolInfo tool)
    {
        json.WriteStartObject();
        json.WriteString("id", rule.Id);
        json.WriteString("name", rule.Name);
        if (!string.IsNullOrEmpty(rule.Summary)) WriteText(json, "fullDescription", rule.Summary);
        WriteText(json, "help", rule.HelpText, rule.HelpMarkdown);
        // A short description that only repeats the full one is left out (compared as the SDK compared them).
        if (!string.Equals(rule.Summary.Trim(), rule.Title.Trim(), StringComparison.InvariantCultureIgnoreCase))
        {
            WriteText(json, "shortDescription", rule.Title);
        }
        json.WriteStartObject("defaultConfiguration");
        json.WriteString("level", rule.DefaultLevel.Token());
        json.WriteEndObject();
        json.WriteString("helpUri", UriText(tool.HelpUri(rule)));
        if (!rule.Tags.IsDefaultOrEmpty)
        {
            json.WriteStartObject("properties");
            json.WriteStartArray("tags");
            foreach (var tag in rule.Tags) json.WriteStringValue(tag);
            json.WriteEndArray();
            json.WriteEndObject();
        }
        json.WriteEndObject();
    }

    // A multiformatMessageString; blank texts are left out.
    private static void WriteText(Utf8JsonWriter json, string name, string text, string? markdown = null)
    {
        json.WriteStartObject(name);
        if (!string.IsNullOrWhiteSpace(text)) json.WriteString("text", text);
        if (!string.IsNullOrWhiteSpace(markdown)) json.WriteString("markdown", markdown);
        json.WriteEndObject();
    }

    private static void WriteResult(Utf8JsonWriter json, Finding finding, int ruleIndex)
    {
        json.WriteStartObject();
        WriteRuleReference(json, finding.RuleId, ruleIndex);
        json.WriteString("level", finding.Level.Token());
        WriteMessage(json, finding.Message);
        json.WriteStartArray("locations");
        WriteLocation(json, finding.File, finding.Span);
        json.WriteEndArray();
        WriteFingerprint(json, finding.Fingerprint);
        if (finding.Suppression is { } suppression)
        {
            json.WriteStartArray("suppressions");
            json.WriteStartObject();
            json.WriteString("kind", "inSource");
            json.WriteString("justification", suppression.Justification);
            json.WritePropertyName("location");
            WriteLocation(json, suppression.File, suppression.Span);
            json.WriteEndObject();
            json.WriteEndArray();
        }
        if (finding.BaselineState is { } state) json.WriteString("baselineState", state == BaselineState.Unchanged ? "unchanged" : "new");
        if (finding.Fix is { } fix) WriteFix(json, finding.File, fix);
        WriteProperties(json, finding);
        json.WriteEndObject();
    }

    // SARIF 2.1.0 3.55: a fix is artifact changes, each a list of replacements: the value's exact region and its new text.
    private static void WriteFix(Utf8JsonWriter json, string file, FindingFix fix)
    {
        json.WriteStartArray("fixes");
        json.WriteStartObject();
        WriteDescription(json, "Set " + fix.Inserted + ": " + fix.Shown + ", a value every rule on this setting accepts.");
        json.WriteStartArray("artifactChanges");
        json.WriteStartObject();
        WriteArtifactLocation(json, file);
        json.WriteStartArray("replacements");
        json.WriteStartObject();
        json.WritePropertyName("deletedRegion");
        json.WriteStartObject();
        json.WriteNumber("startLine", fix.Region.StartLine);
        json.WriteNumber("startColumn", fix.Region.StartColumn);
        json.WriteNumber("endLine", fix.Region.EndLine);
        json.WriteNumber("endColumn", fix.Region.EndColumn);
        json.WriteEndObject();
        json.WriteStartObject("insertedContent");
        json.WriteString("text", fix.Inserted);
        json.WriteEndObject();
        json.WriteEndObject();
        json.WriteEndArray();
        json.WriteEndObject();
        json.WriteEndArray();
        json.WriteEndObject();
        json.WriteEndArray();
    }

    private static void WriteDescription(Utf8JsonWriter json, string text)
    {
        json.WriteStartObject("description");
        json.WriteString("text", text);
        json.WriteEndObject();
    }

    // The property bag keeps keyPath first, then the values in their (ordinal) order, then the units of the numbers.
    private static void WriteProperties(Utf8JsonWriter json, Finding finding)
    {
        // A renamed value may meet one already called so ("keyPath" and "value.keyPath"): the name keeps its
        // first place and the later value.
        var names = new string[finding.Values.Count];
        var values = new FindingValue[names.Length];
        var count = 0;
        SortedDictionary<string, string>? units = null;
        foreach (var (name, value) in finding.Values)
        {
            var key = PropertyName(name);
            var at = Array.IndexOf(names, key, 0, count);
            if (at < 0)
            {
                at = count++;
                names[at] = key;
            }
            values[at] = value;
            if (value.Unit is { } unit && value.Number is { } number && double.IsFinite(number))
            {
                (units ??= new SortedDictionary<string, string>(StringComparer.Ordinal))[name] = unit;
            }
        }

        json.WriteStartObject("properties");
        json.WriteString("keyPath", finding.KeyPath);
        // Which of its rule's messages this is ("default" for a data rule's one message; an engine rule has several).
        json.WriteString("messageId", finding.MessageId);
        for (var i = 0; i < count; i++)
        {
            // JSON has no NaN or infinity: such a number is left to its text.
            if (values[i].Number is { } number && double.IsFinite(number)) json.WriteNumber(names[i], number);
            else json.WriteString(names[i], values[i].Text);
        }
        if (units is not null)
        {
            json.WriteStartObject(UnitsProperty);
            foreach (var (name, unit) in units) json.WriteString(name, unit);
            json.WriteEndObject();
        }
        json.WriteEndObject();
    }

    // A value may not take the name of our own properties (keyPath, messageId, units), nor "tags", which SARIF reserves for a string array.
    private static string PropertyName(string valueName) =>
        valueName is "keyPath" or "messageId" or UnitsProperty or "tags" ? "value." + valueName : valueName;

    // SARIF 2.1.0 3.27.24: a result of the baseline that this run no longer finds. It is placed on its baseline
    // entry, the line to delete, with the setting file as a related location.
    private static void WriteAbsent(Utf8JsonWriter json, AbsentResult absent, string baselineFile, int ruleIndex)
    {
        var where = absent.KeyPath.Length == 0 ? absent.File : absent.File + " " + absent.KeyPath;
        var text = "In the baseline but no longer found: " + absent.RuleId + " at " + where
            + (absent.Message.Length > 0 ? " (" + absent.Message + ")" : "") + "; remove this entry from the baseline.";

        json.WriteStartObject();
        WriteRuleReference(json, absent.RuleId, ruleIndex);
        json.WriteString("kind", "informational");
        json.WriteString("level", "none");
        WriteMessage(json, text);
        json.WriteStartArray("locations");
        // A baseline outside the repository has no URI under the root: the setting file stands in.
        if (Path.IsPathRooted(baselineFile)) WriteLocation(json, absent.File, null);
        else WriteLocation(json, baselineFile, SourceSpan.At(absent.BaselineLine, 1));
        json.WriteEndArray();
        WriteFingerprint(json, absent.Fingerprint);
        json.WriteStartArray("relatedLocations");
        WriteLocation(json, absent.File, null, id: 1);
        json.WriteEndArray();
        json.WriteString("baselineState", "absent");
        json.WriteStartObject("properties");
        json.WriteString("keyPath", absent.KeyPath);
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static void WriteRuleReference(Utf8JsonWriter json, string ruleId, int ruleIndex)
    {
        json.WriteString("ruleId", ruleId);
        if (ruleIndex >= 0) json.WriteNumber("ruleIndex", ruleIndex);
    }

    private static void WriteMessage(Utf8JsonWriter json, string text)
    {
        json.WriteStartObject("message");
        json.WriteString("text", text);
        json.WriteEndObject();
    }

    private static void WriteFingerprint(Utf8JsonWriter json, string fingerprint)
    {
        json.WriteStartObject("partialFingerprints");
        json.WriteString(Fingerprints.Key, fingerprint);
        json.WriteEndObject();
    }

    // A location object, written where the caller has placed it (an array item or a named property).
    private static void WriteLocation(Utf8JsonWriter json, string file, SourceSpan? span, int id = -1)
    {
        json.WriteStartObject();
        if (id >= 0) json.WriteNumber("id", id);
        json.WriteStartObject("physicalLocation");
        WriteArtifactLocation(json, file);
        if (span is { } region) WriteRegion(json, region);
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static void WriteArtifactLocation(Utf8JsonWriter json, string file)
    {
        json.WriteStartObject("artifactLocation");
        json.WriteString("uri", ReportPaths.UriReference(file));
        json.WriteString("uriBaseId", SourceRootBaseId);
        json.WriteEndObject();
    }

    // SARIF wants 1-based lines and columns and an end that is not before the start.
    private static void WriteRegion(Utf8JsonWriter json, SourceSpan span)
    {
        var startLine = Math.Max(1, span.StartLine);
        var startColumn = Math.Max(1, span.StartColumn);
        var endLine = Math.Max(startLine, span.EndLine);
        var endColumn = Math.Max(1, span.EndColumn);
        if (endLine == startLine && endColumn < startColumn) endColumn = startColumn;
        json.WriteStartObject("region");
        json.WriteNumber("startLine", startLine);
        json.WriteNumber("startColumn", startColumn);
        json.WriteNumber("endLine", endLine);
        json.WriteNumber("endColumn", endColumn);
        json.WriteEndObject();
    }

    private static void WriteInvocation(Utf8JsonWriter json, CheckResult result, ReportContext context, Func<string, int> ruleIndex)
    {
        json.WriteStartObject();
        if (context.Timestamps)
        {
            WriteTimestamp(json, "startTimeUtc", context.StartTimeUtc);
            WriteTimestamp(json, "endTimeUtc", context.EndTimeUtc);
        }
        json.WriteNumber("exitCode", result.ExitCode);
        WriteNotifications(json, "toolExecutionNotifications", result.Notifications, execution: true, result.NotRun, ruleIndex);
        WriteNotifications(json, "toolConfigurationNotifications", result.Notifications, execution: false, [], ruleIndex);
        json.WriteBoolean("executionSuccessful", result.Notifications.All(static n => n.Kind != NotificationKind.Internal));
        json.WriteEndObject();
    }

    // The earliest time there is stands for "not known" and is left out.
    private static void WriteTimestamp(Utf8JsonWriter json, string name, DateTimeOffset? time)
    {
        if (time is not { } known || known.UtcDateTime == DateTime.MinValue) return;
        json.WriteString(name, known.UtcDateTime.ToString(TimestampFormat, CultureInfo.InvariantCulture));
    }

    // Internal errors are execution notifications, everything else configuration ones; an empty list is left out.
    // A rule not evaluated for missing data is an execution notification too (level note, with its rule as
    // associatedRule, SARIF 2.1.0 3.58.7): it says what the run could not do, and is not a result, which code
    // scanning would show as an alert and a baseline would have to track.
    private static void WriteNotifications(Utf8JsonWriter json, string name, ImmutableArray<Notification> notifications, bool execution,
        ImmutableArray<CheckNotRun> notRun, Func<string, int> ruleIndex)
    {
        var started = false;
        foreach (var notification in notifications)
        {
            if ((notification.Kind == NotificationKind.Internal) != execution) continue;
            if (!started) json.WriteStartArray(name);
            started = true;
            WriteNotification(json, notification);
        }
        foreach (var n in notRun)
        {
            if (!started) json.WriteStartArray(name);
            started = true;
            WriteNotRun(json, n, ruleIndex(n.RuleId));
        }
        if (started) json.WriteEndArray();
    }

    private static void WriteNotRun(Utf8JsonWriter json, CheckNotRun notRun, int ruleIndex)
    {
        json.WriteStartObject();
        json.WriteStartArray("locations");
        WriteLocation(json, notRun.File, null);
        json.WriteEndArray();
        WriteMessage(json, notRun.Sentence);
        json.WriteString("level", "note");
        json.WriteStartObject("associatedRule");
        json.WriteString("id", notRun.RuleId);
        if (ruleIndex >= 0) json.WriteNumber("index", ruleIndex);
        json.WriteEndObject();
        json.WriteStartObject("properties");
        json.WriteStartArray("missingKeyPaths");
        foreach (var path in notRun.MissingPaths) json.WriteStringValue(path);
        json.WriteEndArray();
        json.WriteEndObject();
        json.WriteEndObject();
    }

    private static void WriteNotification(Utf8JsonWriter json, Notification notification)
    {
        json.WriteStartObject();
        if (notification.File is { } file)
        {
            json.WriteStartArray("locations");
            WriteLocation(json, file, notification.Span);
            json.WriteEndArray();
        }
        WriteMessage(json, notification.Message);
        json.WriteString("level", "error");
        if (notification.Kind == NotificationKind.Internal && notification.Exception is { } exception)
        {
            json.WriteStartObject("exception");
            if (ExceptionKind(exception) is { } kind) json.WriteString("kind", kind);
            json.WriteString("message", exception);
            json.WriteEndObject();
        }
        json.WriteEndObject();
    }

    // "System.IO.IOException: disk full\n   at ..." has its type before the first colon; anything else has no kind.
    internal static string? ExceptionKind(string exceptionText)
    {
        var colon = exceptionText.IndexOf(':', StringComparison.Ordinal);
        if (colon <= 0) return null;
        var head = exceptionText.AsSpan(0, colon);
        foreach (var c in head)
        {
            if (!(char.IsAsciiLetterOrDigit(c) || c is '.' or '_' or '`' or '+')) return null;
        }
        return head.ToString();
    }

    // An absolute URI as SARIF wants it; a file URI made from a local path ("/opt/docs/...") is spelt as a file URI.
    private static string UriText(Uri uri) =>
        uri.IsAbsoluteUri && uri.Scheme == Uri.UriSchemeFile && !uri.OriginalString.StartsWith("file:", StringComparison.Ordinal)
            ? uri.AbsoluteUri
            : uri.OriginalString;
}
