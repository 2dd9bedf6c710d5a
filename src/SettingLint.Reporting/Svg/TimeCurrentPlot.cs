using SettingLint.Core.Quantities;
using SettingLint.Protection;

namespace SettingLint.Reporting.Svg;

/// <summary>
/// The time-current plot of one motor, log-log, current in primary amperes and time in seconds: the start, the thermal
/// element's cold and hot curves (IEC 60255-149), the safe stall points, the acceleration timer, the short-circuit and
/// ground-fault elements, the bus's fault currents, the tripped device's interrupting rating and the bus's upstream curve,
/// the asymmetrical start current the short-circuit pickup must clear, and the grounding resistor's let-through current.
/// </summary>
public static class TimeCurrentPlot
{
    /// <summary>Total height of the plot in px.</summary>
    public const double Height = 720;

    /// <summary>The styles, one per series key (the keys are written as data-series).</summary>
    public static readonly SeriesStyle Start = new("start", "Motor start (LRC, then FLC)", "#2e7d4f", "", 3);
    public static readonly SeriesStyle LongestStart = new("start-longest", "Longest start", "#2e7d4f", "7 4", 2);
    public static readonly SeriesStyle AsymmetricalStart = new("start-asymmetrical", "Asymmetrical start (first cycles)", "#2e7d4f", "3 2", 2.5);
    public static readonly SeriesStyle ThermalCold = new("thermal-cold", "Thermal 49, from cold", "#1f4e9c", "", 2.5);
    public static readonly SeriesStyle ThermalHot = new("thermal-hot", "Thermal 49, from hot", "#c2410c", "", 2.5);
    public static readonly SeriesStyle StallCold = new("stall-cold", "Safe stall, cold", "#1f4e9c", "", 2, true);
    public static readonly SeriesStyle StallHot = new("stall-hot", "Safe stall, hot", "#c2410c", "", 2, true);
    public static readonly SeriesStyle AccelerationTimer = new("acceleration-timer", "Acceleration timer 48", "#7a3fb8", "3 3", 2.5);
    // Magenta, so that the 50P is not mistaken for the hot thermal curve (orange) or the upstream curve (ochre) where they cross.
    public static readonly SeriesStyle ShortCircuit = new("short-circuit", "Short circuit 50P", "#a0179c", "", 2.5);
    public static readonly SeriesStyle Blocked = new("short-circuit-blocked", "50P blocked above", "#a0179c", "2 4", 1.5);
    public static readonly SeriesStyle GroundFault = new("ground-fault", "Ground fault 50G/N", "#0f7b72", "9 3 2 3", 2);
    public static readonly SeriesStyle GroundFaultCurrent = new("ground-fault-current", "Resistor let-through", "#0f7b72", "1 3", 2);
    public static readonly SeriesStyle FaultMin = new("fault-min", "Bus fault current, min", "#6b7480", "2 3", 1.5);
    public static readonly SeriesStyle FaultMax = new("fault-max", "Bus fault current, max", "#394350", "6 3", 1.5);
    public static readonly SeriesStyle Interrupting = new("interrupting-rating", "Interrupting rating", "#111111", "10 4", 2.5);
    public static readonly SeriesStyle Upstream = new("upstream", "Bus upstream protection", "#9a6b00", "", 2.5);

    /// <summary>The SVG element of a motor's time-current plot; ids start with <paramref name="id"/>.</summary>
    public static string Render(MotorPlotData data, string id, string caution)
    {
        ArgumentNullException.ThrowIfNull(data);
        var x = CurrentAxis(data);
        var y = TimeAxis(data);
        var plotHeight = SvgDocument.PlotHeightFor(Height);
        var xAxis = new PlotAxis(x.Min, x.Max, SvgDocument.PlotLeft, SvgDocument.PlotLeft + SvgDocument.PlotWidth, true);
        var yAxis = new PlotAxis(y.Min, y.Max, SvgDocument.PlotTop + plotHeight, SvgDocument.PlotTop, true);
        var doc = new SvgDocument(id, Height, data.Motor + ": time-current characteristic",
            "Log-log plot of the motor's start, its protection elements and its bus, current in primary amperes, time in seconds.", xAxis, yAxis);
        doc.Frame("Current (A primary)", "Time (s)", AmpereTick, SecondTick);

        var flc = data.FullLoadCurrent;
        var lrc = data.LockedRotorCurrent;

        // Vertical references first, so that curves are drawn over them.
        if (data.FaultCurrentMin is { } fmin) doc.Vertical(FaultMin, fmin, "Bus " + data.BusTag + " minimum fault current " + A(fmin), "min fault " + A(fmin));
        else doc.Missing(FaultMin, "not given");
        if (data.FaultCurrentMax is { } fmax) doc.Vertical(FaultMax, fmax, "Bus " + data.BusTag + " maximum fault current " + A(fmax), "max fault " + A(fmax));
        else doc.Missing(FaultMax, "not given");
        if (data.InterruptingRating is { } ir) doc.Vertical(Interrupting, ir, "Interrupting rating of the tripped device " + A(ir), "interrupting " + A(ir));
        else doc.Missing(Interrupting, "not given");
        if (data.ShortCircuitBlockedAbove is { } blocked) doc.Vertical(Blocked, blocked, "Short-circuit element blocked above " + A(blocked), "50P blocked " + A(blocked));
        if (data.GroundFaultCurrent is { } gfc)
        {
            doc.Vertical(GroundFaultCurrent, gfc, $"Bus {data.BusTag} {data.Grounding} grounded: the neutral resistor lets through at most {A(gfc)} in a ground fault", "let-through " + A(gfc));
        }
        else if (data.Grounding is "low-resistance" or "high-resistance")
        {
            doc.Missing(GroundFaultCurrent, "not given");
        }

        var steps = data.StartOrLockedRotor(longest: false);
        if (flc is { } f && !steps.IsEmpty)
        {
            var style = data.StartKind is { } kind ? Start with { Label = "Motor start (" + kind + ", then FLC)" } : Start;
            doc.Polyline(style, "Motor start: " + Describe(steps) + ", then " + A(f), StartPoints(f, steps, y), (i, t) => $"Start: {A(i)}, {S(t)}", 1);
            var longest = data.StartOrLockedRotor(longest: true);
            if (!longest.IsEmpty && longest[^1].Until != steps[^1].Until)
            {
                doc.Polyline(LongestStart, "Longest start: " + Describe(longest) + ", then " + A(f), StartPoints(f, longest, y), (i, t) => $"Longest start: {A(i)}, {S(t)}", 1);
            }
        }
        else
        {
            doc.Missing(Start, "no FLC, LRC or time");
        }

        // The first cycles of a direct start, with the DC offset: what an undelayed 50P must not pick up (SL201).
        if (data.AsymmetricalStartCurrent is { } asym && data.AsymmetryFactor is { } factor && factor > 0)
        {
            var symmetrical = asym / factor;
            var until = AsymmetryShown;
            doc.Polyline(AsymmetricalStart,
                $"Asymmetrical start current {A(asym)}: {Formats.Number(factor)} x the symmetrical start current {A(symmetrical)} at the bus's highest voltage, "
                + "the first-cycle value a 50P without delay must stay above (SL201)",
                [(asym, y.Min), (asym, until), (symmetrical, until)], (i, t) => $"Asymmetrical start: {A(asym)}", 1);
        }

        if (data.Thermal is { } model)
        {
            var from = model.PickupCurrent * (1 + 1e-9);
            var cold = CurveSampler.Sample(i => model.ColdTripTime(i).Seconds, from, x.Max, yAxis);
            doc.Polyline(ThermalCold, $"Thermal trip from cold: pickup {A(model.PickupCurrent)}, tau {S(model.HeatingTimeConstant)}" + AtLrc(lrc, i => model.ColdTripTime(i)),
                cold, (i, t) => $"Cold trip: {A(i)}, {S(t)}");
            if (flc is { } fl)
            {
                var hot = CurveSampler.Sample(i => model.HotTripTime(i, fl).Seconds, from, x.Max, yAxis);
                doc.Polyline(ThermalHot, $"Thermal trip from hot (start level {Pct(model.HotStartLevel(fl))})" + AtLrc(lrc, i => model.HotTripTime(i, fl)),
                    hot, (i, t) => $"Hot trip: {A(i)}, {S(t)}");
            }
        }
        else
        {
            doc.Missing(ThermalCold, "off or incomplete");
        }

        if (lrc is { } lr)
        {
            if (data.SafeStallTimeCold is { } sc) doc.Marker(StallCold, lr, sc, $"Safe stall time from cold: {S(sc)} at LRC {A(lr)}", "cold stall " + S(sc));
            if (data.SafeStallTimeHot is { } sh) doc.Marker(StallHot, lr, sh, $"Safe stall time from hot: {S(sh)} at LRC {A(lr)}", "hot stall " + S(sh), diamond: true);
        }

        if (data.AccelerationTimer is { } timer && flc is { } fa && lrc is { } la)
        {
            doc.Horizontal(AccelerationTimer, timer, fa, la * 1.6, $"Acceleration timer 48: trips a start that lasts longer than {S(timer)}", "48 " + S(timer));
        }
        else
        {
            doc.Missing(AccelerationTimer, "off");
        }

        if (data.Upstream is { } up)
        {
            var points = UpstreamPoints(up, x.Max, yAxis);
            if (up.Curve == CurveKind.DefiniteTime && yAxis.Contains(Math.Max(up.TimeMultiplier, y.Min)))
            {
                doc.Segment(Upstream, up.PickupCurrent, y.Max, up.PickupCurrent, Math.Max(up.TimeMultiplier, y.Min));
            }
            var inst = up.InstantaneousPickupCurrent is { } ip ? ", instantaneous above " + A(ip) : "";
            doc.Polyline(Upstream, $"Bus {data.BusTag} upstream: {up.Curve.Token()}, pickup {A(up.PickupCurrent)}, multiplier {Formats.Number(up.TimeMultiplier)}{inst}",
                points, (i, t) => $"Upstream: {A(i)}, {S(t)}");
        }
        else
        {
            doc.Missing(Upstream, "not given");
        }

        if (data.ShortCircuitPickup is { } scp)
        {
            var delay = data.ShortCircuitDelay ?? 0;
            var drawn = Floor(delay, y.Min);
            var end = data.ShortCircuitBlockedAbove is { } b && b > scp ? b : x.Max;
            var sec = data.PhaseCtRatio is { } r ? " (" + Formats.Number(scp / r) + " A sec)" : "";
            doc.Polyline(ShortCircuit, $"Short circuit 50P: pickup {A(scp)} pri{sec}, delay {S(delay)}" + (drawn != delay ? " (drawn at the foot of the plot)" : ""),
                [(scp, y.Max), (scp, drawn), (end, drawn)], (i, t) => $"50P: pickup {A(scp)}, delay {S(delay)}", 1);
        }
        else
        {
            doc.Missing(ShortCircuit, "off");
        }

        if (data.GroundFaultPickup is { } gfp)
        {
            var delay = data.GroundFaultDelay ?? 0;
            var drawn = Floor(delay, y.Min);
            doc.Polyline(GroundFault, $"Ground fault 50G/N: pickup {A(gfp)} (zero-sequence current), delay {S(delay)}" + (drawn != delay ? " (drawn at the foot of the plot)" : ""),
                [(gfp, y.Max), (gfp, drawn), (Math.Min(gfp * 10, x.Max), drawn)], (i, t) => $"50G/N: pickup {A(gfp)}, delay {S(delay)}", 1);
        }
        else
        {
            doc.Missing(GroundFault, "off");
        }

        return doc.Finish(caution);
    }

    /// <summary>How long the plot shows the asymmetrical start current: about six cycles, by which the offset of a motor circuit has mostly decayed (common practice).</summary>
    public const double AsymmetryShown = 0.1;

    /// <summary>A delay below the axis (0 s for an instantaneous element) is drawn just above its foot, where the frame does not hide it.</summary>
    private static double Floor(double delay, double min) => delay >= min * 1.15 ? delay : min * 1.15;

    /// <summary>
    /// The start as a TCC shows it: each step's current up to the time it ends, across to the next step's current, and
    /// after the last step across to FLC and up (running).
    /// </summary>
    internal static (double X, double Y)[] StartPoints(double flc, IReadOnlyList<StartStep> steps, (double Min, double Max) y)
    {
        var points = new List<(double X, double Y)> { (steps[0].Current, y.Min) };
        for (var k = 0; k < steps.Count; k++)
        {
            points.Add((steps[k].Current, steps[k].Until));
            points.Add((k + 1 < steps.Count ? steps[k + 1].Current : flc, steps[k].Until));
        }
        points.Add((flc, y.Max));
        return [.. points];
    }

    /// <summary>"420 A for 30 s" or "2.1 kA up to 2 s, 1.5 kA up to 12 s".</summary>
    private static string Describe(IReadOnlyList<StartStep> steps) => steps.Count == 1
        ? A(steps[0].Current) + " for " + S(steps[0].Until)
        : string.Join(", ", steps.Select(s => A(s.Current) + " up to " + S(s.Until)));

    /// <summary>The upstream curve: its inverse-time part up to the instantaneous pickup, then the instantaneous time.</summary>
    private static IReadOnlyList<(double X, double Y)> UpstreamPoints(OvercurrentSetting up, double maxCurrent, PlotAxis time)
    {
        var from = up.PickupCurrent * (1 + 1e-9);
        var inst = up.InstantaneousPickupCurrent is { } ip && ip > up.PickupCurrent ? ip : (double?)null;
        var curveTo = Math.Min(inst ?? maxCurrent, maxCurrent);
        var points = new List<(double X, double Y)>(CurveSampler.Sample(i => up.TripTimeAt(i).Seconds, from, curveTo, time));
        if (inst is { } i0 && i0 < maxCurrent)
        {
            // The step down at the instantaneous pickup: the curve's time at it, then the instantaneous time just above it.
            var above = i0 * (1 + 1e-9);
            var t = up.TripTimeAt(above).Seconds;
            if (time.Contains(t))
            {
                points.Add((above, t));
                points.Add((maxCurrent, up.TripTimeAt(maxCurrent).Seconds));
            }
        }
        return points;
    }

    private static string AtLrc(double? lrc, Func<double, TripTime> trip) =>
        lrc is { } l ? "; at LRC " + A(l) + ": " + (trip(l) is { Trips: true } t ? S(t.Seconds) : "never") : "";

    private static (double Min, double Max) CurrentAxis(MotorPlotData d)
    {
        var values = new[]
        {
            d.FullLoadCurrent, d.LockedRotorCurrent, d.Thermal?.PickupCurrent, d.ShortCircuitPickup, d.GroundFaultPickup, d.FaultCurrentMin,
            d.FaultCurrentMax, d.InterruptingRating, d.Upstream?.PickupCurrent, d.Upstream?.InstantaneousPickupCurrent, d.ShortCircuitBlockedAbove,
            d.AsymmetricalStartCurrent, d.GroundFaultCurrent,
        }.Concat(d.StartSteps.Concat(d.LongestStartSteps).Select(s => (double?)s.Current)).OfType<double>().Where(v => double.IsFinite(v) && v > 0).ToList();
        if (values.Count == 0) return (1, 1e5);
        var lo = Math.Pow(10, Math.Floor(Math.Log10(values.Min() * 0.7)));
        var hi = Math.Pow(10, Math.Ceiling(Math.Log10(values.Max() * 1.4)));
        // Seven decades is the most a page can show legibly; the low end (a small ground-fault pickup) gives way.
        if (hi / lo > 1e7) lo = hi / 1e7;
        if (hi / lo < 100) hi = lo * 100;
        return (lo, hi);
    }

    private static (double Min, double Max) TimeAxis(MotorPlotData d)
    {
        var times = new[] { d.SafeStallTimeCold, d.SafeStallTimeHot, d.AccelerationTime, d.AccelerationTimeMax, d.AccelerationTimer }
            .OfType<double>().Where(double.IsFinite).ToList();
        var hi = 1e4;
        if (times.Count > 0 && times.Max() * 3 > hi) hi = Math.Pow(10, Math.Ceiling(Math.Log10(times.Max() * 3)));
        return (0.01, hi);
    }

    private static string AmpereTick(double v) => v >= 1e6 ? Formats.Number(v / 1e6) + "M" : v >= 1000 ? Formats.Number(v / 1000) + "k" : Formats.Number(v);

    private static string SecondTick(double v) => Formats.Number(v);

    private static string A(double v) => Formats.Si(v, Dimension.Current);

    private static string S(double v) => Formats.Si(v, Dimension.Time);

    private static string Pct(double v) => Formats.Si(v, Dimension.Fraction);
}
