namespace SettingLint.Reporting.Svg;

/// <summary>
/// Samples a falling time-current curve for drawing: every point is (I, f(I)) exactly as the engineering library gives
/// it. Points are spread evenly in log current and in log time, so the steep part near pickup is as smooth as the rest.
/// </summary>
internal static class CurveSampler
{
    /// <summary>The visible points of t = f(I) for I in [from, to], where f falls as I rises and is +infinity where it never trips.</summary>
    public static IReadOnlyList<(double X, double Y)> Sample(Func<double, double> f, double from, double to, PlotAxis time, int perAxis = 90)
    {
        if (!(from > 0) || !(to > from)) return [];
        var entry = Crossing(f, from, to, time.Max);
        var exit = Crossing(f, from, to, time.Min, below: true);
        if (entry is null || exit is null || exit < entry) return [];
        var (a, b) = (entry.Value, exit.Value);
        var currents = new SortedSet<double>();
        for (var i = 0; i <= perAxis; i++)
        {
            currents.Add(a * Math.Pow(b / a, (double)i / perAxis));
        }
        var (ta, tb) = (f(a), f(b));
        if (double.IsFinite(ta) && double.IsFinite(tb) && ta > tb && tb > 0)
        {
            for (var i = 1; i < perAxis; i++)
            {
                var t = ta * Math.Pow(tb / ta, (double)i / perAxis);
                if (Crossing(f, a, b, t) is { } c) currents.Add(c);
            }
        }
        var points = new List<(double X, double Y)>(currents.Count);
        foreach (var c in currents)
        {
            var t = f(c);
            if (double.IsFinite(t)) points.Add((c, t));
        }
        return points;
    }

    /// <summary>
    /// The lowest current in [from, to] whose time is at or below a level (or, with <paramref name="below"/>, the highest whose time
    /// is at or above it); the end of the range when the whole range qualifies; null when no current does.
    /// </summary>
    private static double? Crossing(Func<double, double> f, double from, double to, double level, bool below = false)
    {
        if (!below)
        {
            if (f(from) <= level) return from;
            if (f(to) > level) return null;
            double lo = from, hi = to;
            for (var i = 0; i < 80; i++)
            {
                var mid = Math.Sqrt(lo * hi);
                if (f(mid) <= level) hi = mid; else lo = mid;
            }
            return hi;
        }
        if (f(to) >= level) return to;
        if (f(from) < level) return null;
        double l = from, h = to;
        for (var i = 0; i < 80; i++)
        {
            var mid = Math.Sqrt(l * h);
            if (f(mid) >= level) l = mid; else h = mid;
        }
        return l;
    }
}
