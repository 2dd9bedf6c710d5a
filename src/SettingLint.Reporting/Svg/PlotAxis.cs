namespace SettingLint.Reporting.Svg;

/// <summary>One axis of a plot: a value range mapped onto a pixel range, logarithmic or linear.</summary>
/// <param name="Min">The smallest value shown (above 0 on a log axis).</param>
/// <param name="Max">The largest value shown.</param>
/// <param name="Start">The pixel of <paramref name="Min"/>.</param>
/// <param name="End">The pixel of <paramref name="Max"/> (smaller than Start for a y axis, which grows upward).</param>
/// <param name="Log">Logarithmic (decades) rather than linear.</param>
public sealed record PlotAxis(double Min, double Max, double Start, double End, bool Log)
{
    /// <summary>The pixel of a value; values outside the range map outside the pixel range.</summary>
    public double ToPixel(double value)
    {
        var t = Log ? (Math.Log10(value) - Math.Log10(Min)) / (Math.Log10(Max) - Math.Log10(Min)) : (value - Min) / (Max - Min);
        return Start + (t * (End - Start));
    }

    /// <summary>Whether a value lies inside the range (with a hair of tolerance for values on the edge).</summary>
    public bool Contains(double value) => double.IsFinite(value) && value >= Min * (1 - 1e-9) && value <= Max * (1 + 1e-9) && (!Log || value > 0);

    /// <summary>The whole decades (powers of ten) from Min to Max, for grid lines.</summary>
    public IEnumerable<double> Decades()
    {
        for (var k = (int)Math.Floor(Math.Log10(Min) + 1e-9); Math.Pow(10, k) <= Max * (1 + 1e-9); k++)
        {
            var v = Math.Pow(10, k);
            if (v >= Min * (1 - 1e-9)) yield return v;
        }
    }

    /// <summary>The 2..9 multiples inside each decade, for minor grid lines.</summary>
    public IEnumerable<double> Minors()
    {
        for (var k = (int)Math.Floor(Math.Log10(Min) + 1e-9); Math.Pow(10, k) <= Max; k++)
        {
            for (var m = 2; m <= 9; m++)
            {
                var v = m * Math.Pow(10, k);
                if (v > Min && v < Max) yield return v;
            }
        }
    }

    /// <summary>Evenly spaced ticks of a linear axis: a step of 1, 2 or 5 times a power of ten, about <paramref name="count"/> of them.</summary>
    public IEnumerable<double> LinearTicks(int count = 6)
    {
        var raw = (Max - Min) / count;
        var mag = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        var step = raw / mag < 1.5 ? mag : raw / mag < 3.5 ? 2 * mag : raw / mag < 7.5 ? 5 * mag : 10 * mag;
        for (var v = Math.Ceiling(Min / step) * step; v <= Max + (step * 1e-9); v += step) yield return Math.Round(v / step) * step;
    }
}
