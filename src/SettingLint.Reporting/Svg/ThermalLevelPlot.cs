using SettingLint.Core.Quantities;
using SettingLint.Protection;

namespace SettingLint.Reporting.Svg;

/// <summary>
/// The thermal level (share of the trip level) through a cold and a hot start: LRC for the longest acceleration time,
/// then FLC; IEC 60255-149 model via <see cref="ThermalModel.LevelAfterRunning"/>. The element trips where a line reaches 100 %.
/// </summary>
public static class ThermalLevelPlot
{
    /// <summary>Total height of the plot in px.</summary>
    public const double Height = 460;

    /// <summary>The styles, one per series key.</summary>
    public static readonly SeriesStyle Cold = new("level-cold", "Level, cold start", "#1f4e9c", "", 2.5);
    public static readonly SeriesStyle Hot = new("level-hot", "Level, hot start", "#c2410c", "", 2.5);
    public static readonly SeriesStyle Trip = new("trip-level", "Trip level (100 %)", "#b3261e", "6 3", 1.5);
    public static readonly SeriesStyle StartEnd = new("start-end", "End of the longest start", "#2e7d4f", "3 3", 1.5);
    public static readonly SeriesStyle ColdPeak = new("level-cold-end", "Cold start, level at its end", "#1f4e9c", "", 2, true);
    public static readonly SeriesStyle HotPeak = new("level-hot-end", "Hot start, level at its end", "#c2410c", "", 2, true);

    /// <summary>The times plotted: the start and a while at FLC after it, long enough to see where the level heads.</summary>
    public static double Span(double accelerationTime) => Math.Max(60, 5 * accelerationTime);

    /// <summary>The level at a time through a start of steps (each step's current until its time), then FLC.</summary>
    public static double LevelAt(ThermalModel model, double startLevel, IReadOnlyList<StartStep> steps, double flc, double t)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(steps);
        var level = startLevel;
        var from = 0.0;
        foreach (var step in steps)
        {
            if (t <= step.Until) return model.LevelAfterRunning(level, step.Current, t - from);
            level = model.LevelAfterRunning(level, step.Current, step.Until - from);
            from = step.Until;
        }
        return model.LevelAfterRunning(level, flc, t - from);
    }

    /// <summary>The SVG element, or null when the motor has no thermal model, FLC, LRC or acceleration time to draw.</summary>
    public static string? Render(MotorPlotData data, string id, string caution)
    {
        ArgumentNullException.ThrowIfNull(data);
        // The longest start as the time-current plot draws it (a soft start at its limit, not at LRC).
        var steps = data.StartOrLockedRotor(longest: data.AccelerationTimeMax is not null);
        if (data.Thermal is not { } model || data.FullLoadCurrent is not { } flc || steps.IsEmpty || data.HotStartLevel is not { } hotLevel)
        {
            return null;
        }
        var acc = steps[^1].Until;
        var current = steps.Length == 1 ? A(steps[0].Current) : string.Join(", ", steps.Select(s => A(s.Current)));
        var span = Span(acc);
        var times = Times(span, acc);
        var cold = times.Select(t => (t, LevelAt(model, 0, steps, flc, t))).ToList();
        var hot = times.Select(t => (t, LevelAt(model, hotLevel, steps, flc, t))).ToList();
        var peak = Math.Max(cold.Max(p => p.Item2), hot.Max(p => p.Item2));
        var top = Math.Max(1.2, Math.Ceiling(peak * 1.1 / 0.2) * 0.2);
        var plotHeight = SvgDocument.PlotHeightFor(Height);
        var x = new PlotAxis(0, span, SvgDocument.PlotLeft, SvgDocument.PlotLeft + SvgDocument.PlotWidth, false);
        var y = new PlotAxis(0, top, SvgDocument.PlotTop + plotHeight, SvgDocument.PlotTop, false);
        var doc = new SvgDocument(id, Height, data.Motor + ": thermal level through a cold and a hot start",
            "Thermal level of the IEC 60255-149 model, in percent of the trip level, against time: the longest start's current (locked-rotor current, or a soft starter's limit) for the longest acceleration time, then full-load current.", x, y);
        doc.Frame("Time from the start (s)", "Thermal level (% of trip)", v => Formats.Number(v), v => Formats.Number(v * 100));
        doc.Vertical(StartEnd, acc, $"End of the longest start: {S(acc)} at {current}", "start ends " + S(acc));
        doc.Polyline(Trip, "Trip level: the element trips when the level reaches 100 %", [(0, 1.0), (span, 1.0)]);
        doc.Polyline(Cold, $"Cold start from 0 %: {Pct(cold.First(p => p.t == acc).Item2)} at the end of the start", cold,
            (t, h) => $"Cold start: {S(t)}, level {Pct(h)}", 20);
        doc.Polyline(Hot, $"Hot start from {Pct(hotLevel)}: {Pct(hot.First(p => p.t == acc).Item2)} at the end of the start", hot,
            (t, h) => $"Hot start: {S(t)}, level {Pct(h)}", 20);
        var coldEnd = cold.First(p => p.t == acc).Item2;
        var hotEnd = hot.First(p => p.t == acc).Item2;
        doc.Marker(ColdPeak, acc, coldEnd, $"Cold start: level {Pct(coldEnd)} at the end of the start ({S(acc)})", Pct(coldEnd));
        doc.Marker(HotPeak, acc, hotEnd, $"Hot start: level {Pct(hotEnd)} at the end of the start ({S(acc)})", Pct(hotEnd));
        return doc.Finish(caution);
    }

    /// <summary>Evenly spaced times with the end of the start among them, so the corner of each line is exact.</summary>
    private static List<double> Times(double span, double acc)
    {
        var set = new SortedSet<double> { acc };
        const int n = 240;
        for (var i = 0; i <= n; i++) set.Add(span * i / n);
        return [.. set];
    }

    private static string A(double v) => Formats.Si(v, Dimension.Current);

    private static string S(double v) => Formats.Si(v, Dimension.Time);

    private static string Pct(double v) => Formats.Si(v, Dimension.Fraction);
}
