using System.Globalization;
using SettingLint.Protection;
using SettingLint.Reporting.Html;
using SettingLint.Reporting.Svg;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>
/// What the time-current plot marks beyond the curves: labels kept apart, a short-circuit colour that cannot be taken for
/// the hot thermal curve, the grounding resistor's let-through current, the asymmetrical start current SL201 compares
/// with, and a start drawn from its steps (a soft start at its current limit).
/// </summary>
public sealed class HtmlPlotMarkTests
{
    // An invented 4.16 kV pump motor on a low-resistance grounded bus; numbers chosen to be typical, not from a datasheet.
    // HtmlPlotTests' invented 4.16 kV pump motor, on a low-resistance grounded bus.
    private static MotorPlotData Motor() => HtmlPlotTests.Motor() with
    {
        Grounding = "low-resistance",
        GroundFaultCurrent = 400,
        AsymmetricalStartCurrent = 1.7 * 720,
        AsymmetryFactor = 1.7,
    };

    private static SvgPlot TimeCurrent(MotorPlotData data) => new(TimeCurrentPlot.Render(data, "t", HtmlReport.Caution));

    private static List<(string Text, double X1, double Y1, double X2, double Y2)> Labels(SvgPlot plot) =>
        [.. plot.Document.Descendants(SvgPlot.Svg + "text").Where(t => (string?)t.Attribute("class") == "label").Select(t =>
        {
            var b = ((string)t.Attribute("data-box")!).Split(' ').Select(HtmlTestSupport.Num).ToArray();
            return (t.Value, b[0], b[1], b[2], b[3]);
        })];

    private static void Apart(SvgPlot plot, string what)
    {
        var labels = Labels(plot);
        for (var i = 0; i < labels.Count; i++)
        {
            for (var j = i + 1; j < labels.Count; j++)
            {
                var (a, b) = (labels[i], labels[j]);
                var overlap = a.X1 < b.X2 && b.X1 < a.X2 && a.Y1 < b.Y2 && b.Y1 < a.Y2;
                Assert.False(overlap, $"{what}: '{a.Text}' and '{b.Text}' overlap");
            }
        }
    }

    [Fact]
    public void Labels_of_points_and_lines_that_nearly_coincide_are_kept_apart()
    {
        // Stall points 1 s apart and fault currents 5 % apart: their labels would be written over each other in place.
        var crowded = Motor() with { SafeStallTimeCold = 13, SafeStallTimeHot = 12, FaultCurrentMin = 14300, FaultCurrentMax = 15000, InterruptingRating = 15500 };
        var plot = TimeCurrent(crowded);
        Assert.Equal(7, Labels(plot).Count);
        Apart(plot, "crowded motor");
        // Every label keeps to the plot area.
        Assert.All(Labels(plot), l => Assert.True(l.X1 >= SvgDocument.PlotLeft && l.X2 <= SvgDocument.PlotLeft + SvgDocument.PlotWidth, l.Text));
    }

    [Fact]
    public void The_demo_plots_have_no_overlapping_labels()
    {
        foreach (var m in HtmlTestSupport.DemoModel().Motors) Apart(TimeCurrent(m.Plot), m.Tag);
    }

    [Fact]
    public void The_short_circuit_colour_is_far_in_hue_from_the_thermal_and_upstream_curves()
    {
        // Common practice for plots read in print and by people with weak red-green vision: curves that cross are told
        // apart by hue, so 60 degrees at least between the 50P and the curves it crosses.
        foreach (var other in new[] { TimeCurrentPlot.ThermalHot, TimeCurrentPlot.ThermalCold, TimeCurrentPlot.Upstream })
        {
            var d = Math.Abs(Hue(TimeCurrentPlot.ShortCircuit.Color) - Hue(other.Color));
            Assert.True(Math.Min(d, 360 - d) >= 60, $"50P {TimeCurrentPlot.ShortCircuit.Color} against {other.Key} {other.Color}: {Math.Min(d, 360 - d):0} degrees");
        }
    }

    private static double Hue(string hex)
    {
        double C(int at) => int.Parse(hex.AsSpan(at, 2), NumberStyles.HexNumber, CultureInfo.InvariantCulture) / 255.0;
        var (r, g, b) = (C(1), C(3), C(5));
        var max = Math.Max(r, Math.Max(g, b));
        var min = Math.Min(r, Math.Min(g, b));
        var d = max - min;
        if (d == 0) return 0;
        var h = max == r ? (g - b) / d % 6 : max == g ? ((b - r) / d) + 2 : ((r - g) / d) + 4;
        return (h * 60 + 360) % 360;
    }

    [Fact]
    public void The_grounding_resistors_let_through_current_is_marked_on_a_resistance_grounded_bus_only()
    {
        Close(400, TimeCurrent(Motor()).VerticalAt("ground-fault-current"));
        var solid = TimeCurrent(Motor() with { Grounding = "solid", GroundFaultCurrent = null });
        Assert.False(solid.Has("ground-fault-current"));
        var legend = string.Concat(solid.Document.Descendants(SvgPlot.Svg + "text").Select(t => t.Value + "|"));
        Assert.DoesNotContain("let-through", legend, StringComparison.Ordinal);
        var missing = TimeCurrent(Motor() with { GroundFaultCurrent = null });
        Assert.Contains("Resistor let-through (not given)", string.Concat(missing.Document.Descendants(SvgPlot.Svg + "text").Select(t => t.Value + "|")), StringComparison.Ordinal);
    }

    [Fact]
    public void The_asymmetrical_start_current_is_drawn_for_the_first_cycles()
    {
        var plot = TimeCurrent(Motor());
        var points = plot.Series("start-asymmetrical");
        Assert.Equal(3, points.Count);
        Close(1.7 * 720, points[0].X);
        Close(plot.A("data-y-min"), points[0].Y);
        Close(TimeCurrentPlot.AsymmetryShown, points[1].Y);
        Close(720, points[2].X);
    }

    [Fact]
    public void On_the_demo_the_asymmetrical_start_is_the_limit_SL201_compared_with()
    {
        var model = HtmlTestSupport.DemoModel();
        var p201 = model.Motors.Single(m => m.Tag == "P-201");
        var limit = p201.Margins.Single(r => r.Outcome.RuleId == "SL201").Outcome.Numbers!.Limit;
        // SL201: 1.7 (common practice) x the 948 A locked-rotor current scaled from 4000 V to the bus's 4370 V.
        Close(1.7 * 948 * 4370 / 4000, limit);
        Close(limit, TimeCurrent(p201.Plot).Series("start-asymmetrical")[0].X);
    }

    [Fact]
    public void A_start_of_several_steps_is_drawn_step_by_step_then_at_full_load()
    {
        // A reduced-voltage start as the protection library will give it: two steps of current, each until its time.
        var data = Motor() with { StartSteps = [new StartStep(460, 3), new StartStep(720, 4.5)], LongestStartSteps = [] };
        var plot = TimeCurrent(data);
        var yMin = plot.A("data-y-min");
        var yMax = plot.A("data-y-max");
        var start = plot.Series("start");
        var expected = new[] { (460.0, yMin), (460, 3), (720, 3), (720, 4.5), (120, 4.5), (120, yMax) };
        Assert.Equal(expected.Length, start.Count);
        for (var i = 0; i < expected.Length; i++)
        {
            Close(expected[i].Item1, start[i].X);
            Close(expected[i].Item2, start[i].Y);
        }
    }

    [Fact]
    public void A_soft_starter_on_the_demo_starts_at_its_current_limit_not_at_the_locked_rotor_current()
    {
        var p503 = HtmlTestSupport.DemoModel().Motors.Single(m => m.Tag == "P-503");
        var start = TimeCurrent(p503.Plot).Series("start");
        // soft_start_current_limit: 3.5 xFLC of 143 A, along the ramp (acceleration_time_max, 8 s); common practice.
        Close(3.5 * 143, start[0].X);
        Close(8, start[1].Y);
        Assert.True(start[0].X < p503.Plot.LockedRotorCurrent!.Value * 0.6);
        // No second start at LRC is drawn for the ramp.
        Assert.False(TimeCurrent(p503.Plot).Has("start-longest"));
    }

    [Fact]
    public void A_reduced_voltage_start_on_the_demo_draws_its_longest_start_at_its_lowest_voltage()
    {
        var hp102 = HtmlTestSupport.DemoModel().Motors.Single(m => m.Tag == "HP-102");
        var plot = TimeCurrent(hp102.Plot);
        var start = plot.Series("start");
        var longest = plot.Series("start-longest");
        // HP-102: 7 s at rated voltage, 12 s at the 80 % tap. Locked-rotor current scales with the voltage (common
        // practice: the motor's impedance at standstill is constant), so the 80 % start draws 0.8 x the current of the
        // full-voltage start, for 12 s, not the full-voltage LRC for 12 s.
        Close(7, start[1].Y);
        Close(12, longest[1].Y);
        Close(0.8 * start[0].X, longest[0].X);
        Assert.True(longest[0].X < hp102.Plot.LockedRotorCurrent!.Value);
    }

    [Fact]
    public void The_thermal_level_plot_follows_a_soft_start_at_its_limit()
    {
        // A 10 s ramp at 400 A (3.3 x FLC) instead of 720 A LRC: IEC 60255-149 level h(t) = x (1 - exp(-t / tau)) from
        // cold, x = (I / (k IB))^2, through the engineering library.
        var data = Motor() with { AccelerationTimeMax = 10, StartSteps = [new StartStep(400, 10)], LongestStartSteps = [new StartStep(400, 10)] };
        var plot = new SvgPlot(ThermalLevelPlot.Render(data, "l", HtmlReport.Caution)!);
        var model = new ThermalModel(138, 480, 1440);
        var cold = plot.Series("level-cold");
        Assert.True(cold.Count > 100);
        foreach (var (t, h) in cold.Where(p => p.X <= 10))
        {
            Assert.True(Math.Abs(model.LevelAfterRunning(0, 400, t) - h) <= 0.01 * Math.Max(h, 0.01), $"at {t:R} s: {h:R}");
        }
        // At the end of the ramp the level is far below what a 10 s start at LRC would give.
        var end = cold.Last(p => p.X <= 10).Y;
        Assert.True(end < 0.5 * model.LevelAfterRunning(0, 720, 10));
        Close(10, plot.VerticalAt("start-end"));
    }

    private static void Close(double expected, double actual) =>
        Assert.True(Math.Abs(actual - expected) <= 0.01 * Math.Abs(expected), $"expected {expected:R}, plotted {actual:R}");
}
