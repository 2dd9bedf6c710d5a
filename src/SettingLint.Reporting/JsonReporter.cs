using System.Text.Json;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>The findings as plain JSON for scripts: stable key order, indented, no absolute paths.</summary>
public sealed class JsonReporter : IReporter
{
    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);

        JsonOutput.Write(output, json => WriteReport(json, result, context));
    }

    private static void WriteReport(Utf8JsonWriter json, CheckResult result, ReportContext context)
    {
        json.WriteStartObject();

        json.WriteStartObject("tool");
        json.WriteString("name", context.Tool.Name);
        json.WriteString("version", context.Tool.Version);
        json.WriteEndObject();

        json.WriteString("root", ReportPaths.RootFromCurrentDirectory(result.RepositoryRoot, context.CurrentDirectory));
        if (context.Timestamps)
        {
            if (context.StartTimeUtc is { } start) json.WriteString("startTimeUtc", start.ToUniversalTime());
            if (context.EndTimeUtc is { } end) json.WriteString("endTimeUtc", end.ToUniversalTime());
        }

        var summary = ReportSummary.Of(result);
        json.WriteStartObject("summary");
        json.WriteNumber("errors", summary.Errors);
        json.WriteNumber("warnings", summary.Warnings);
        json.WriteNumber("notes", summary.Notes);
        json.WriteNumber("suppressed", summary.Suppressed);
        json.WriteNumber("files", summary.Files);
        json.WriteNumber("motors", summary.Motors);
        json.WriteNumber("configurationErrors", summary.ConfigurationErrors);
        json.WriteNumber("internalErrors", summary.InternalErrors);
        json.WriteNumber("notRun", summary.NotRun);
        json.WriteString("failOn", result.FailOn.Token());
        json.WriteNumber("exitCode", result.ExitCode);
        json.WriteEndObject();

        json.WriteStartArray("findings");
        foreach (var finding in result.Findings)
        {
            if (finding.Suppression is not null && context.OmitSuppressed) continue;
            WriteFinding(json, finding);
        }
        json.WriteEndArray();

        json.WriteStartArray("notifications");
        foreach (var notification in result.Notifications)
        {
            WriteNotification(json, notification);
        }
        json.WriteEndArray();

        json.WriteStartArray("motors");
        foreach (var motor in result.Motors)
        {
            json.WriteStringValue(motor);
        }
        json.WriteEndArray();

        // Always written (empty when every rule that applied was evaluated), so that a script can rely on it.
        json.WriteStartArray("notRun");
        foreach (var notRun in result.NotRun)
        {
            json.WriteStartObject();
            json.WriteString("ruleId", notRun.RuleId);
            json.WriteString("level", notRun.Level.Token());
            json.WriteString("file", notRun.File);
            json.WriteString("motor", notRun.Motor);
            json.WriteStartArray("missing");
            foreach (var path in notRun.MissingPaths) json.WriteStringValue(path);
            json.WriteEndArray();
            json.WriteEndObject();
        }
        json.WriteEndArray();

        // Written only by runs that have them, so that the plain report keeps its shape.
        if (result.BaselineFile is { } baseline) WriteBaseline(json, result, baseline);
        if (result.Scope is { } scope) WriteScope(json, scope);

        json.WriteEndObject();
    }

    private static void WriteBaseline(Utf8JsonWriter json, CheckResult result, string baseline)
    {
        json.WriteStartObject("baseline");
        json.WriteString("file", baseline);
        json.WriteNumber("new", result.Findings.Count(static f => f.BaselineState == BaselineState.New));
        json.WriteNumber("unchanged", result.Findings.Count(static f => f.BaselineState == BaselineState.Unchanged));
        json.WriteNumber("absent", result.Absent.Length);
        json.WriteStartArray("absentEntries");
        foreach (var absent in result.Absent)
        {
            json.WriteStartObject();
            json.WriteString("ruleId", absent.RuleId);
            json.WriteString("file", absent.File);
            json.WriteString("keyPath", absent.KeyPath);
            json.WriteString("fingerprint", absent.Fingerprint);
            json.WriteString("message", absent.Message);
            json.WriteNumber("baselineLine", absent.BaselineLine);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void WriteScope(Utf8JsonWriter json, ChangeScope scope)
    {
        json.WriteStartObject("changes");
        json.WriteString("revision", scope.Revision);
        json.WriteBoolean("staged", scope.Staged);
        void Array(string name, IEnumerable<string> items)
        {
            json.WriteStartArray(name);
            foreach (var item in items) json.WriteStringValue(item);
            json.WriteEndArray();
        }
        Array("changed", scope.Changed);
        Array("deleted", scope.Deleted);
        Array("dependants", scope.Dependants);
        if (scope.EverythingBecause is { } why) json.WriteString("everythingBecause", why);
        json.WriteEndObject();
    }

    private static void WriteFinding(Utf8JsonWriter json, Finding finding)
    {
        json.WriteStartObject();
        json.WriteString("ruleId", finding.RuleId);
        json.WriteString("level", finding.Level.Token());
        json.WriteString("file", finding.File);
        json.WriteNumber("line", finding.Span.StartLine);
        json.WriteNumber("column", finding.Span.StartColumn);
        json.WriteNumber("endLine", finding.Span.EndLine);
        json.WriteNumber("endColumn", finding.Span.EndColumn);
        json.WriteString("keyPath", finding.KeyPath);
        json.WriteString("message", finding.Message);
        // Which of its rule's messages this is ("default" for a data rule's one message; an engine rule has several).
        json.WriteString("messageId", finding.MessageId);
        json.WriteString("fingerprint", finding.Fingerprint);
        json.WriteStartObject("values");
        // The values are an ordinal sorted dictionary, so their order is stable.
        foreach (var (name, value) in finding.Values)
        {
            json.WriteStartObject(name);
            json.WriteString("text", value.Text);
            // JSON has no NaN or infinity: such a number is left to its text.
            if (value.Number is { } number && double.IsFinite(number)) json.WriteNumber("number", number);
            if (value.Unit is { } unit) json.WriteString("unit", unit);
            json.WriteEndObject();
        }
        json.WriteEndObject();
        if (finding.BaselineState is { } state) json.WriteString("baselineState", state == BaselineState.Unchanged ? "unchanged" : "new");
        if (finding.Fix is { } fix)
        {
            // A value every rule on the setting accepts, checked by a second run; it replaces exactly this region.
            json.WriteStartObject("suggested");
            json.WriteString("value", fix.Inserted);
            json.WriteString("shown", fix.Shown);
            json.WriteNumber("line", fix.Region.StartLine);
            json.WriteNumber("column", fix.Region.StartColumn);
            json.WriteNumber("endColumn", fix.Region.EndColumn);
            json.WriteEndObject();
        }
        if (finding.Suppression is { } suppression)
        {
            json.WriteStartObject("suppressed");
            json.WriteString("justification", suppression.Justification);
            json.WriteString("file", suppression.File);
            json.WriteNumber("line", suppression.Span.StartLine);
            json.WriteEndObject();
        }
        json.WriteEndObject();
    }

    private static void WriteNotification(Utf8JsonWriter json, Notification notification)
    {
        json.WriteStartObject();
        json.WriteString("kind", notification.Kind == NotificationKind.Internal ? "internal" : "configuration");
        json.WriteString("message", notification.Message);
        if (notification.File is { } file) json.WriteString("file", file);
        if (notification.Span is { } span)
        {
            json.WriteNumber("line", span.StartLine);
            json.WriteNumber("column", span.StartColumn);
            json.WriteNumber("endLine", span.EndLine);
            json.WriteNumber("endColumn", span.EndColumn);
        }
        if (notification.Exception is { } exception) json.WriteString("exception", exception);
        json.WriteEndObject();
    }
}
