using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Reporting.Svg;

namespace SettingLint.Reporting.Html;

/// <summary>Turns a run's data into the report's model: margins sorted, near misses marked, windows derived and worded.</summary>
public static class ReportBuilder
{
    /// <summary>The default near-miss share of a limit: 10 %.</summary>
    public const double DefaultNearMiss = 0.10;

    /// <summary>Builds the model of a run.</summary>
    public static ReportModel Build(ReportData data, ToolInfo tool, double nearMiss = DefaultNearMiss)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(tool);
        var titles = data.Result.Rules.ToDictionary(r => r.Id, r => r.Title, StringComparer.Ordinal);
        var windows = SettingWindows.Derive(data.Outcomes).ToLookup(w => w.MotorFile, StringComparer.Ordinal);
        var outcomes = data.Outcomes.ToLookup(o => o.MotorFile, StringComparer.Ordinal);
        var findings = data.Result.Findings.ToLookup(f => f.File, StringComparer.Ordinal);
        var notRun = data.Result.NotRun.ToLookup(n => n.File, StringComparer.Ordinal);
        var slugs = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        var motors = ImmutableArray.CreateBuilder<MotorReport>();
        foreach (var motor in data.Motors)
        {
            var file = motor.Document.RelativePath;
            var own = findings[file].ToImmutableArray();
            motors.Add(new MotorReport
            {
                Tag = motor.Tag,
                Title = motor.Document.Text("title"),
                File = file,
                Bus = motor.Bus?.Tag,
                RelayModel = motor.RelayModel?.Tag,
                Slug = UniqueSlug(motor.Tag, slugs),
                Findings = own,
                NotRun = [.. notRun[file]],
                Margins = Margins(outcomes[file], motor, own, titles, nearMiss),
                Windows = [.. windows[file].Select(w => View(w, motor.Document))],
                Plot = WithRuleLimits(MotorPlotData.From(motor), outcomes[file]),
            });
        }
        return new ReportModel(data.Result, motors.ToImmutable(), nearMiss, tool);
    }

    /// <summary>
    /// The plot with the asymmetrical start current that SL201 compared with in this run (its parameter may be set by the
    /// repository, and its limit may follow the element's delay), where the rule applied.
    /// </summary>
    public static MotorPlotData WithRuleLimits(MotorPlotData plot, IEnumerable<RuleOutcome> outcomes)
    {
        ArgumentNullException.ThrowIfNull(plot);
        ArgumentNullException.ThrowIfNull(outcomes);
        var sl201 = outcomes.FirstOrDefault(o => o.RuleId == "SL201" && o.Numbers is { Limit: > 0 } n && double.IsFinite(n.Limit));
        if (sl201?.Numbers is not { } numbers || plot.AsymmetricalStartCurrent is not { } drawn || plot.AsymmetryFactor is not { } factor) return plot;
        var symmetrical = drawn / factor;
        return plot with { AsymmetricalStartCurrent = numbers.Limit, AsymmetryFactor = numbers.Limit / symmetrical };
    }

    /// <summary>The rows of a motor's outcomes: failures first, then by margin ratio, tightest first; rows without a ratio last.</summary>
    public static ImmutableArray<MarginRow> Margins(IEnumerable<RuleOutcome> outcomes, MotorProtection motor, IReadOnlyList<Finding> findings,
        IReadOnlyDictionary<string, string> titles, double nearMiss)
    {
        ArgumentNullException.ThrowIfNull(outcomes);
        ArgumentNullException.ThrowIfNull(motor);
        var rows = new List<MarginRow>();
        foreach (var o in outcomes)
        {
            var subject = motor.Document.Measure(o.Subject);
            var n = o.Numbers;
            var status = !o.Passed ? MarginStatus.Failed
                : n?.MarginRatio is { } r && r < nearMiss ? MarginStatus.NearMiss
                : MarginStatus.Passed;
            var message = o.Passed ? null
                : findings.FirstOrDefault(f => f.RuleId == o.RuleId && f.KeyPath == o.Subject)?.Message;
            rows.Add(new MarginRow(
                o,
                titles.GetValueOrDefault(o.RuleId, o.RuleId),
                status,
                n is null ? "" : ReportValues.Text(n.Actual, n.Dim, n.Percent, subject),
                n is null ? "" : ReportValues.Text(n.Limit, n.Dim, n.Percent, subject),
                n?.Margin is { } m ? ReportValues.Text(m, n.Dim, n.Percent, subject) : "",
                ReportValues.Ratio(n?.MarginRatio),
                message));
        }
        return [.. rows
            .OrderBy(r => r.Status == MarginStatus.Failed ? 0 : 1)
            .ThenByDescending(r => r.Status == MarginStatus.Failed ? r.Outcome.Level : Level.None)
            .ThenBy(r => r.MarginRatio is null ? 1 : 0)
            .ThenBy(r => r.MarginRatio ?? 0)
            .ThenBy(r => r.Outcome.RuleId, StringComparer.Ordinal)
            .ThenBy(r => r.Outcome.Subject, StringComparer.Ordinal)];
    }

    /// <summary>A window in words, such as "short-circuit pickup: at least 1.76 kA pri (44 A sec) (asymmetrical start, SL201), ...; set 1.84 kA pri (46 A sec)".</summary>
    public static WindowView View(SettingWindow window, BoundDocument motor)
    {
        ArgumentNullException.ThrowIfNull(window);
        ArgumentNullException.ThrowIfNull(motor);
        var subject = motor.Measure(window.Setting);
        // Bounds in primary units only, the set value with its secondary too: the sentence stays short and the relay value is still there.
        string Value(double v) => ReportValues.Text(v, window.Dim, window.Percent, subject);
        string? Side(WindowBound? b)
        {
            if (b is null) return null;
            var limit = ReportValues.Text(b.Limit, window.Dim, window.Percent, subject, withSecondary: false);
            // A limit that is a bare parameter ("40 %") needs no label saying the same again.
            var label = b.Label.Length > 0 && b.Label != limit && !limit.StartsWith(b.Label + " ", StringComparison.Ordinal) ? b.Label + ", " : "";
            return SettingWindows.Phrase(b.Op) + " " + limit + " (" + label + b.RuleId + ")";
        }
        var lower = Side(window.TightestLower);
        var upper = Side(window.TightestUpper);
        var name = ReportValues.SettingName(window.Setting);
        var set = Value(window.Actual);
        var sentence = new StringBuilder(name).Append(": ");
        sentence.Append(string.Join(", ", new[] { lower, upper }.OfType<string>()));
        if (window.IsEmpty) sentence.Append(" (no value satisfies both)");
        sentence.Append("; set ").Append(set);
        if (!window.Holds) sentence.Append(", outside the window");
        return new WindowView(window, name, set, lower, upper, sentence.ToString());
    }

    /// <summary>A lower-case file name from a tag: letters, digits and dashes; a counter keeps two motors apart.</summary>
    public static string UniqueSlug(string tag, ISet<string> taken)
    {
        ArgumentNullException.ThrowIfNull(tag);
        ArgumentNullException.ThrowIfNull(taken);
        var sb = new StringBuilder();
        foreach (var c in tag.ToLowerInvariant())
        {
            if (char.IsAsciiLetterOrDigit(c)) sb.Append(c);
            else if (sb.Length > 0 && sb[^1] != '-') sb.Append('-');
        }
        var slug = sb.ToString().Trim('-');
        if (slug.Length == 0) slug = "motor";
        if (slug.Length > 60) slug = slug[..60];
        var unique = slug;
        for (var i = 2; !taken.Add(unique); i++) unique = slug + "-" + i.ToString(System.Globalization.CultureInfo.InvariantCulture);
        return unique;
    }
}
