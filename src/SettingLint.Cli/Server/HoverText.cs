using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;
using SettingLint.Reporting.Html;
using SettingLint.Core.Documents;

namespace SettingLint.Cli.Server;

/// <summary>What the last check knew of one open motor, enough to answer hovers on it.</summary>
/// <param name="Motor">The bound motor.</param>
/// <param name="Outcomes">Every rule outcome of the motor, passing or not.</param>
/// <param name="Findings">The motor file's findings.</param>
/// <param name="Titles">Rule titles by id.</param>
public sealed record MotorFacts(MotorProtection Motor, IReadOnlyList<RuleOutcome> Outcomes, IReadOnlyList<Finding> Findings, IReadOnlyDictionary<string, string> Titles);

/// <summary>
/// Hover text in markdown. On a quantity: the value as written, primary and secondary, and its window; on an element's
/// key under protection: the margins of its rules and the windows of its settings. Margins and windows are the HTML
/// report's (<see cref="ReportBuilder"/>), so the editor and the report say the same.
/// </summary>
public static class HoverText
{
    /// <summary>The hover at a position of a motor file, or null when nothing there has one.</summary>
    public static Hover? At(MotorFacts facts, LspPosition position)
    {
        ArgumentNullException.ThrowIfNull(facts);
        var doc = facts.Motor.Document;
        foreach (var value in doc.Values.Values)
        {
            if (value is MeasureValue m && DiagnosticMapper.Contains(m.Span, position))
            {
                return new Hover(new MarkupContent("markdown", Quantity(facts, m)), DiagnosticMapper.RangeOf(m.Span));
            }
        }
        foreach (var element in Elements(doc))
        {
            var path = SchemaPaths.Motor.ProtectionPrefix + element;
            var span = doc.SpanOf(path);
            if (DiagnosticMapper.Contains(span, position))
            {
                return new Hover(new MarkupContent("markdown", Element(facts, path)), DiagnosticMapper.RangeOf(span));
            }
        }
        return null;
    }

    /// <summary>The element names under protection, in the order of their first value's path.</summary>
    public static IEnumerable<string> Elements(BoundDocument doc)
    {
        ArgumentNullException.ThrowIfNull(doc);
        return doc.Values.Keys
            .Where(k => k.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal) && k.IndexOf('.', SchemaPaths.Motor.ProtectionPrefix.Length) > 0)
            .Select(k => k[SchemaPaths.Motor.ProtectionPrefix.Length..k.IndexOf('.', SchemaPaths.Motor.ProtectionPrefix.Length)])
            .Distinct(StringComparer.Ordinal);
    }

    private static string Quantity(MotorFacts facts, MeasureValue m)
    {
        var sb = new StringBuilder();
        sb.Append("**").Append(ReportValues.SettingName(m.Path)).Append("** `").Append(m.Path).Append("`\n\n");
        if (m.Written is { } written) sb.Append("- written: ").Append(written.ToString()).Append('\n');
        var side = m.Dimension is Dimension.Current or Dimension.Voltage;
        sb.Append(side ? "- primary: " : "- value: ").Append(Formats.Si(m.Value, m.Dimension)).Append('\n');
        if (side)
        {
            sb.Append(m.Secondary is { } secondary
                ? "- secondary: " + Formats.Si(secondary, m.Dimension) + " (transformer ratio " + Formats.Number(m.SideRatio!.Value) + ")\n"
                : "- secondary: none (no transformer measures this value)\n");
        }
        var window = SettingWindows.Derive(facts.Outcomes).FirstOrDefault(w => w.Setting == m.Path);
        if (window is not null) sb.Append("\nWindow: ").Append(ReportBuilder.View(window, facts.Motor.Document).Sentence).Append('\n');
        AppendMargins(sb, facts, o => o.Subject == m.Path);
        return sb.ToString().TrimEnd();
    }

    private static string Element(MotorFacts facts, string path)
    {
        var sb = new StringBuilder();
        sb.Append("**").Append(ReportValues.SettingName(path)).Append("** `").Append(path).Append("`\n");
        var prefix = path + ".";
        var windows = SettingWindows.Derive(facts.Outcomes).Where(w => w.Setting.StartsWith(prefix, StringComparison.Ordinal)).ToList();
        sb.Append("\nSetting windows:\n");
        if (windows.Count == 0) sb.Append("- none: no rule bounds a setting of this element directly\n");
        foreach (var w in windows) sb.Append("- ").Append(ReportBuilder.View(w, facts.Motor.Document).Sentence).Append('\n');
        AppendMargins(sb, facts, o => o.Subject.StartsWith(prefix, StringComparison.Ordinal));
        return sb.ToString().TrimEnd();
    }

    // The report's margin rows, failures first then tightest first.
    private static void AppendMargins(StringBuilder sb, MotorFacts facts, Func<RuleOutcome, bool> which)
    {
        var rows = ReportBuilder.Margins(facts.Outcomes.Where(which), facts.Motor, facts.Findings, facts.Titles, ReportBuilder.DefaultNearMiss);
        sb.Append("\nMargins:\n");
        if (rows.IsEmpty) sb.Append("- none: no rule applied\n");
        foreach (var r in rows)
        {
            var status = r.Status switch
            {
                MarginStatus.Failed => "fails",
                MarginStatus.NearMiss => "near miss",
                _ => "passes",
            };
            sb.Append("- ").Append(r.Outcome.RuleId).Append(' ').Append(status).Append(": ").Append(r.Title);
            if (r.Actual.Length > 0) sb.Append("; needs ").Append(r.Actual).Append(' ').Append(r.Outcome.Numbers!.Op).Append(' ').Append(r.Limit);
            if (r.Ratio.Length > 0) sb.Append(", margin ").Append(r.Margin).Append(" (").Append(r.Ratio).Append(')');
            sb.Append('\n');
        }
    }
}
