using SettingLint.Protection;
using SettingLint.Reporting.Html;
using SettingLint.Reporting.Svg;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>
/// The plots show the engineering library's values: every plotted point, read back from the SVG's pixel coordinates
/// through the transform the SVG itself declares, lies on the library's curve to 1 %.
/// </summary>
public sealed class HtmlPlotTests
{
    // An invented 4.16 kV pump motor; numbers chosen to be typical, not taken from any datasheet.
    internal static MotorPlotData Motor(OvercurrentSetting? upstream = null, double? fullLoadLevel = null) => new()
    {
        Motor = "T-9",
        FullLoadCurrent = 120,
        LockedRotorCurrent = 720,
        AccelerationTime = 4,
        AccelerationTimeMax = 6,
        SafeStallTimeCold = 16,
        SafeStallTimeHot = 12,
        Thermal = new ThermalModel(138, 480, 1440, fullLoadLevel),
        AccelerationTimer = 7.5,
        ShortCircuitPickup = 1300,
        ShortCircuitDelay = 0.05,
        GroundFaultPickup = 20,
        GroundFaultDelay = 0.1,
        FaultCurrentMin = 9000,
        FaultCurrentMax = 15000,
        InterruptingRating = 25000,
        Upstream = upstream ?? new OvercurrentSetting(CurveKind.IecVeryInverse, 1000, 0.4, 12000),
        BusTag = "BUS-T",
        PhaseCtRatio = 40,
    };

    private static SvgPlot TimeCurrent(MotorPlotData data) => new(TimeCurrentPlot.Render(data, "t", HtmlReport.Caution));

    /// <summary>
    /// The point lies on t = f(I) to 1 %: some current within 1 % of the plotted one gives the plotted time (f falls as I
    /// rises), and where the curve is not steep the time at the plotted current itself is within 1 %.
    /// </summary>
    private static void OnCurve(Func<double, double> f, (double I, double T) p, string what)
    {
        var (lo, hi) = (f(p.I * 1.01), f(p.I * 0.99));
        Assert.True(p.T >= lo * 0.99 && p.T <= hi * 1.01, $"{what}: ({p.I:R} A, {p.T:R} s) is off the curve: f(1.01 I) = {lo:R}, f(0.99 I) = {hi:R}");
        var slope = Math.Abs(Math.Log(f(p.I * 1.001) / f(p.I * 0.999)) / Math.Log(1.001 / 0.999));
        if (slope < 20)
        {
            Assert.True(Math.Abs(f(p.I) / p.T - 1) < 0.01, $"{what}: at {p.I:R} A the library gives {f(p.I):R} s, the plot {p.T:R} s");
        }
    }

    [Fact]
    public void Cold_and_hot_thermal_curves_are_the_iec_60255_149_trip_times()
    {
        var data = Motor();
        var plot = TimeCurrent(data);
        // The test's own model, built from the same invented settings: IEC 60255-149 thermal model via the engineering library.
        var model = new ThermalModel(138, 480, 1440);
        var cold = plot.Series("thermal-cold");
        var hot = plot.Series("thermal-hot");
        Assert.True(cold.Count > 50 && hot.Count > 50);
        foreach (var p in cold) OnCurve(i => model.ColdTripTime(i).Seconds, p, "cold");
        foreach (var p in hot) OnCurve(i => model.HotTripTime(i, 120).Seconds, p, "hot");
        // The curves reach from the top of the plot towards its foot, and lie right of the pickup.
        Assert.True(cold[0].Y > 0.9 * plot.A("data-y-max"));
        Assert.All(cold, p => Assert.True(p.X > 138 * 0.999));
        // The hot curve trips sooner than the cold one at LRC (IEC 60255-149 hot curve, Ip = FLC).
        Assert.True(model.HotTripTime(720, 120).Seconds < model.ColdTripTime(720).Seconds);
    }

    [Fact]
    public void A_set_full_load_level_moves_the_hot_curve()
    {
        var model = new ThermalModel(138, 480, 1440, 0.4);
        var plot = TimeCurrent(Motor(fullLoadLevel: 0.4));
        foreach (var p in plot.Series("thermal-hot")) OnCurve(i => model.TripTimeFrom(i, 0.4).Seconds, p, "hot from 40 %");
    }

    [Fact]
    public void Upstream_curve_is_the_iec_60255_151_very_inverse_curve_up_to_its_instantaneous_pickup()
    {
        var plot = TimeCurrent(Motor());
        var points = plot.Series("upstream");
        Assert.True(points.Count > 50);
        // IEC 60255-151 very inverse: t = TMS x 13.5 / (M - 1); above 12 kA the instantaneous element's 0.05 s.
        double Curve(double i) => InverseTimeCurves.OperateTime(CurveKind.IecVeryInverse, i / 1000, 0.4).Seconds;
        foreach (var p in points.Where(p => p.X < 12000 * 0.995)) OnCurve(Curve, p, "upstream");
        Assert.Contains(points, p => p.X > 12000 && Math.Abs(p.Y / OvercurrentSetting.DefaultInstantaneousTime - 1) < 0.01);
        Assert.All(points.Where(p => p.X > 12000 * 1.005), p => Assert.True(Math.Abs(p.Y / 0.05 - 1) < 0.01));
    }

    [Theory]
    [InlineData(CurveKind.IeeeExtremelyInverse, 1800, 2.5)]
    [InlineData(CurveKind.IeeeModeratelyInverse, 900, 1.0)]
    [InlineData(CurveKind.IecStandardInverse, 1200, 0.3)]
    public void Upstream_curves_without_instantaneous_follow_the_library(CurveKind kind, double pickup, double multiplier)
    {
        var plot = TimeCurrent(Motor(new OvercurrentSetting(kind, pickup, multiplier)));
        var points = plot.Series("upstream");
        Assert.True(points.Count > 50);
        foreach (var p in points) OnCurve(i => InverseTimeCurves.OperateTime(kind, i / pickup, multiplier).Seconds, p, kind.Token());
    }

    [Fact]
    public void Start_stall_points_and_element_lines_sit_at_their_values()
    {
        var plot = TimeCurrent(Motor());
        var yMin = plot.A("data-y-min");
        var yMax = plot.A("data-y-max");
        Close([(720, yMin), (720, 4), (120, 4), (120, yMax)], plot.Series("start"));
        Close([(720, yMin), (720, 6), (120, 6), (120, yMax)], plot.Series("start-longest"));
        Close((720, 16), plot.MarkerAt("stall-cold"));
        Close((720, 12), plot.MarkerAt("stall-hot"));
        Close(9000, plot.VerticalAt("fault-min"));
        Close(15000, plot.VerticalAt("fault-max"));
        Close(25000, plot.VerticalAt("interrupting-rating"));
        var sc = plot.Series("short-circuit");
        Close((1300, yMax), sc[0]);
        Close((1300, 0.05), sc[1]);
        var gf = plot.Series("ground-fault");
        Close((20, 0.1), gf[1]);
        Assert.True(plot.Has("acceleration-timer"));
    }

    [Fact]
    public void Axes_are_log_decades_and_labelled()
    {
        var svg = TimeCurrentPlot.Render(Motor(), "t", HtmlReport.Caution);
        var plot = new SvgPlot(svg);
        Assert.True(plot.XLog && plot.YLog);
        var xMin = plot.A("data-x-min");
        var xMax = plot.A("data-x-max");
        Assert.Equal(0, Math.Log10(xMin) % 1, 9);
        Assert.Equal(0, Math.Log10(xMax) % 1, 9);
        Assert.True(xMin <= 20 && xMax >= 25000);
        Assert.Contains("Current (A primary)", svg, StringComparison.Ordinal);
        Assert.Contains("Time (s)", svg, StringComparison.Ordinal);
        Assert.Contains("These rules screen settings for review;", svg, StringComparison.Ordinal);
        // Values on hover: every series has a title, and curves have hover targets with values.
        Assert.All(plot.Document.Descendants(SvgPlot.Svg + "g").Where(g => (string?)g.Attribute("class") == "series"),
            g => Assert.NotNull(g.Element(SvgPlot.Svg + "title")));
        Assert.Contains(plot.Document.Descendants(SvgPlot.Svg + "circle"), c => (string?)c.Attribute("class") == "hover"
            && ((string?)c.Element(SvgPlot.Svg + "title"))!.StartsWith("Cold trip: ", StringComparison.Ordinal));
    }

    [Fact]
    public void Missing_elements_are_named_in_the_legend_not_drawn()
    {
        var data = Motor() with { Thermal = null, ShortCircuitPickup = null, Upstream = null, FaultCurrentMin = null };
        var plot = TimeCurrent(data);
        Assert.False(plot.Has("thermal-cold"));
        Assert.False(plot.Has("upstream"));
        var legend = string.Concat(plot.Document.Descendants(SvgPlot.Svg + "g").Single(g => (string?)g.Attribute("class") == "legend").Descendants(SvgPlot.Svg + "text").Select(t => t.Value + "|"));
        Assert.Contains("Thermal 49, from cold (off or incomplete)", legend, StringComparison.Ordinal);
        Assert.Contains("Short circuit 50P (off)", legend, StringComparison.Ordinal);
        Assert.Contains("Bus upstream protection (not given)", legend, StringComparison.Ordinal);
        Assert.Null(ThermalLevelPlot.Render(data, "l", HtmlReport.Caution));
    }

    [Fact]
    public void Thermal_level_plot_follows_level_after_running_through_a_cold_and_a_hot_start()
    {
        var data = Motor();
        var plot = new SvgPlot(ThermalLevelPlot.Render(data, "l", HtmlReport.Caution)!);
        Assert.False(plot.XLog || plot.YLog);
        var model = new ThermalModel(138, 480, 1440);
        var hot0 = model.HotStartLevel(120);
        // IEC 60255-149 thermal model: LRC for the longest acceleration time (6 s), then FLC.
        double Level(double h0, double t) => t <= 6
            ? model.LevelAfterRunning(h0, 720, t)
            : model.LevelAfterRunning(model.LevelAfterRunning(h0, 720, 6), 120, t - 6);
        foreach (var (series, h0) in new[] { ("level-cold", 0.0), ("level-hot", hot0) })
        {
            var points = plot.Series(series);
            Assert.True(points.Count > 100);
            // Levels are shares of the trip level; 1 % of it is the tolerance where the level itself is near 0.
            foreach (var (t, h) in points) Assert.True(Math.Abs(Level(h0, t) - h) <= 0.01 * Math.Max(Math.Abs(h), 1), $"{series} at {t:R} s: {h:R} vs {Level(h0, t):R}");
            Close(h0, points[0].Y, absolute: 0.005);
        }
        Assert.Equal(1.0, plot.Series("trip-level")[0].Y, 2);
    }

    private static void Close((double X, double Y) expected, (double X, double Y) actual)
    {
        Close(expected.X, actual.X);
        Close(expected.Y, actual.Y);
    }

    private static void Close(IReadOnlyList<(double X, double Y)> expected, IReadOnlyList<(double X, double Y)> actual)
    {
        Assert.Equal(expected.Count, actual.Count);
        for (var i = 0; i < expected.Count; i++) Close(expected[i], actual[i]);
    }

    private static void Close(double expected, double actual, double absolute = 0) =>
        Assert.True(Math.Abs(actual - expected) <= Math.Max(absolute, 0.01 * Math.Abs(expected)), $"expected {expected:R}, plotted {actual:R}");
}
