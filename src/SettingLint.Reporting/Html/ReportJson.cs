using System.Text.Json;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;

namespace SettingLint.Reporting.Html;

/// <summary>The report's margins and setting windows as JSON (`report --format json` and report.json): stable order, no absolute paths.</summary>
public static class ReportJson
{
    /// <summary>The whole document, ending with a newline.</summary>
    public static string Render(ReportModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        return JsonOutput.Render(json => Write(json, model), 16384);
    }

    private static void Write(Utf8JsonWriter json, ReportModel model)
    {
        json.WriteStartObject();
        json.WriteStartObject("tool");
        json.WriteString("name", model.Tool.Name);
        json.WriteString("version", model.Tool.Version);
        json.WriteEndObject();
        json.WriteString("caution", HtmlReport.Caution);
        json.WriteNumber("nearMiss", model.NearMiss);
        if (model.ChangedSince is { } rev) json.WriteString("changedSince", rev);
        var summary = ReportSummary.Of(model.Result);
        json.WriteStartObject("summary");
        json.WriteNumber("errors", summary.Errors);
        json.WriteNumber("warnings", summary.Warnings);
        json.WriteNumber("notes", summary.Notes);
        json.WriteNumber("suppressed", summary.Suppressed);
        json.WriteNumber("files", summary.Files);
        json.WriteNumber("motors", model.Motors.Length);
        json.WriteNumber("notRun", summary.NotRun);
        json.WriteEndObject();
        json.WriteStartArray("motors");
        foreach (var m in model.Motors) Motor(json, m);
        json.WriteEndArray();
        if (!model.RemovedMotors.IsEmpty)
        {
            json.WriteStartArray("removedMotors");
            foreach (var r in model.RemovedMotors)
            {
                json.WriteStartObject();
                json.WriteString("tag", r.Tag);
                json.WriteString("file", r.File);
                json.WriteEndObject();
            }
            json.WriteEndArray();
        }
        json.WriteEndObject();
    }

    private static void Motor(Utf8JsonWriter json, MotorReport m)
    {
        json.WriteStartObject();
        json.WriteString("tag", m.Tag);
        if (m.Title is { } t) json.WriteString("title", t);
        json.WriteString("file", m.File);
        if (m.Bus is { } b) json.WriteString("bus", b);
        json.WriteString("page", HtmlReport.PagePath(m));
        json.WriteStartObject("counts");
        json.WriteNumber("errors", m.Count(Level.Error));
        json.WriteNumber("warnings", m.Count(Level.Warning));
        json.WriteNumber("notes", m.Count(Level.Note));
        json.WriteNumber("suppressed", m.Suppressed);
        json.WriteNumber("rulesApplied", m.Margins.Length);
        json.WriteNumber("rulesPassed", m.Passed);
        json.WriteNumber("nearMisses", m.NearMisses);
        json.WriteNumber("notRun", m.NotRun.Length);
        json.WriteEndObject();
        json.WriteStartArray("notRun");
        foreach (var n in m.NotRun)
        {
            json.WriteStartObject();
            json.WriteString("ruleId", n.RuleId);
            json.WriteString("level", n.Level.Token());
            json.WriteStartArray("missing");
            foreach (var path in n.MissingPaths) json.WriteStringValue(path);
            json.WriteEndArray();
            json.WriteEndObject();
        }
        json.WriteEndArray();
        if (m.Worst is { } w)
        {
            json.WriteStartObject("worstMargin");
            json.WriteString("ruleId", w.Outcome.RuleId);
            json.WriteString("subject", w.Outcome.Subject);
            json.WriteBoolean("passed", w.Outcome.Passed);
            Number(json, "marginRatio", w.MarginRatio);
            json.WriteEndObject();
        }
        json.WriteStartArray("margins");
        foreach (var row in m.Margins) Margin(json, row);
        json.WriteEndArray();
        json.WriteStartArray("windows");
        foreach (var v in m.Windows) Window(json, v);
        json.WriteEndArray();
        if (m.Change is { } c) Change(json, c);
        json.WriteEndObject();
    }

    private static void Margin(Utf8JsonWriter json, MarginRow row)
    {
        var o = row.Outcome;
        json.WriteStartObject();
        json.WriteString("ruleId", o.RuleId);
        json.WriteString("title", row.Title);
        json.WriteString("level", o.Level.Token());
        json.WriteString("subject", o.Subject);
        json.WriteBoolean("passed", o.Passed);
        json.WriteString("status", row.Status switch { MarginStatus.Failed => "failed", MarginStatus.NearMiss => "near-miss", _ => "passed" });
        if (o.Numbers is { } n)
        {
            json.WriteString("op", n.Op);
            Value(json, "actual", row.Actual, n.Actual);
            Value(json, "limit", row.Limit, n.Limit);
            if (n.Margin is { } margin) Value(json, "margin", row.Margin, margin);
            Number(json, "marginRatio", n.MarginRatio);
        }
        if (row.Message is { } msg) json.WriteString("message", msg);
        json.WriteEndObject();
    }

    private static void Window(Utf8JsonWriter json, WindowView v)
    {
        var w = v.Window;
        json.WriteStartObject();
        json.WriteString("setting", w.Setting);
        json.WriteString("name", v.Name);
        Value(json, "set", v.Set, w.Actual);
        Bound(json, "lower", w.TightestLower, v.LowerText);
        Bound(json, "upper", w.TightestUpper, v.UpperText);
        json.WriteNumber("rules", w.RuleCount);
        json.WriteBoolean("holds", w.Holds);
        json.WriteBoolean("empty", w.IsEmpty);
        json.WriteString("text", v.Sentence);
        json.WriteStartArray("bounds");
        foreach (var b in w.Lower.Concat(w.Upper))
        {
            json.WriteStartObject();
            json.WriteString("ruleId", b.RuleId);
            json.WriteString("op", b.Op);
            Number(json, "limit", b.Limit);
            json.WriteString("label", b.Label);
            json.WriteBoolean("holds", b.Holds);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteEndObject();
    }

    private static void Bound(Utf8JsonWriter json, string name, WindowBound? b, string? text)
    {
        if (b is null)
        {
            json.WriteNull(name);
            return;
        }
        json.WriteStartObject(name);
        json.WriteString("ruleId", b.RuleId);
        json.WriteString("op", b.Op);
        Number(json, "limit", b.Limit);
        json.WriteString("label", b.Label);
        if (text is not null) json.WriteString("text", text);
        json.WriteEndObject();
    }

    private static void Change(Utf8JsonWriter json, MotorChange c)
    {
        json.WriteStartObject("change");
        json.WriteString("kind", c.Kind.ToString().ToLowerInvariant());
        json.WriteStartArray("settings");
        foreach (var s in c.Settings)
        {
            json.WriteStartObject();
            json.WriteString("path", s.Path);
            if (s.Old is { } old) json.WriteString("old", old); else json.WriteNull("old");
            if (s.New is { } now) json.WriteString("new", now); else json.WriteNull("new");
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteStartArray("margins");
        foreach (var o in c.Outcomes)
        {
            json.WriteStartObject();
            json.WriteString("key", o.Key);
            Side(json, "old", o.Old);
            Side(json, "new", o.New);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        Findings(json, "newFindings", c.NewFindings);
        Findings(json, "fixedFindings", c.FixedFindings);
        json.WriteEndObject();
    }

    private static void Findings(Utf8JsonWriter json, string name, IEnumerable<Finding> findings)
    {
        json.WriteStartArray(name);
        foreach (var f in findings)
        {
            json.WriteStartObject();
            json.WriteString("ruleId", f.RuleId);
            json.WriteString("level", f.Level.Token());
            json.WriteString("keyPath", f.KeyPath);
            json.WriteString("message", f.Message);
            json.WriteString("fingerprint", f.Fingerprint);
            json.WriteEndObject();
        }
        json.WriteEndArray();
    }

    private static void Side(Utf8JsonWriter json, string name, MarginRow? row)
    {
        if (row is null)
        {
            json.WriteNull(name);
            return;
        }
        json.WriteStartObject(name);
        json.WriteBoolean("passed", row.Outcome.Passed);
        json.WriteString("actual", row.Actual);
        json.WriteString("limit", row.Limit);
        json.WriteString("margin", row.Margin);
        Number(json, "marginRatio", row.MarginRatio);
        json.WriteEndObject();
    }

    private static void Value(Utf8JsonWriter json, string name, string text, double number)
    {
        json.WriteStartObject(name);
        json.WriteString("text", text);
        Number(json, "number", number);
        json.WriteEndObject();
    }

    // JSON has no infinity or NaN: such a number is left to its text (or null).
    private static void Number(Utf8JsonWriter json, string name, double? value)
    {
        if (value is { } v && double.IsFinite(v)) json.WriteNumber(name, v);
        else json.WriteNull(name);
    }
}
