using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Reporting.Html;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>Setting windows are derived from the rules' comparisons: checked on an invented motor whose bounds are worked out by hand.</summary>
public sealed class HtmlWindowTests
{
    // Invented data. FLC 100 A, LRC 6 x FLC = 600 A at 4000 V; bus max 4400 V, so the start is 660 A there.
    private const string Motor = """
        kind: motor-protection
        format: 1
        tag: W-7
        title: Invented test pump
        bus: ../buses/bus-w.yaml
        relay_model: ../models/relay-w.yaml
        motor:
          rated_output: 800 hp
          rated_voltage: 4000 V
          full_load_current: 100 A
          service_factor: 1.15
          locked_rotor_current: 6 xFLC
          acceleration_time: 5 s
          acceleration_time_max: 7 s
          safe_stall_time_cold: 16 s
          safe_stall_time_hot: 12 s
          starts_cold: 2
          starts_hot: 1
          winding_leads: 6
        starter:
          type: circuit-breaker
          interrupting_rating: 40 kA
        transformers:
          phase_ct: { primary: 150 A, secondary: 5 A, class: C100, burden: 0.5 ohm }
          ground_ct: { connection: residual }
          vt: { primary: 4200 V, secondary: 120 V }
        protection:
          short_circuit:
            enabled: true
            pickup: 50 A sec
            delay: 0 s
          ground_fault:
            enabled: true
            pickup: 60 A pri
            delay: 0.1 s
          acceleration:
            enabled: true
            time: 9 s

        """;

    private const string Bus = """
        kind: bus
        format: 1
        tag: BUS-W
        nominal_voltage: 4160 V
        max_voltage: 4400 V
        fault_current_max: 20 kA
        fault_current_min: 12 kA
        x_over_r: 10
        grounding: low-resistance
        ground_fault_current: 400 A

        """;

    private const string Relay = """
        kind: relay-model
        format: 1
        tag: RELAY-W
        ranges:
          short_circuit.pickup: { min: 2 xCT, max: 20 xCT, step: 0.1 xCT }

        """;

    private static (ReportData Data, ImmutableArray<SettingWindow> Windows) Run(string motor = Motor)
    {
        using var repo = new TempFolder(repo: true);
        repo.Write("motors/w-7.yaml", motor);
        repo.Write("buses/bus-w.yaml", Bus);
        repo.Write("models/relay-w.yaml", Relay);
        var data = ReportData.Collect(new SettingLint.Core.Linting.CheckRequest(repo.Path, []));
        Assert.Empty(data.Result.Notifications);
        return (data, SettingWindows.Derive(data.Outcomes));
    }

    private static SettingWindow Window(ImmutableArray<SettingWindow> windows, string setting) => windows.Single(w => w.Setting == setting);

    [Fact]
    public void Short_circuit_pickup_lies_between_the_asymmetrical_start_and_the_relay_range()
    {
        var w = Window(Run().Windows, "protection.short_circuit.pickup");
        // SL201: 1.7 x 660 A = 1122 A (common practice asymmetry factor). SL202: 0.866 x 12 kA / 1.5 = 6928 A.
        // SL108: the relay range 2-20 xCT of a 150 A CT, 300 A to 3000 A.
        Assert.Equal(["SL108", "SL201"], w.Lower.Select(b => b.RuleId).Order(StringComparer.Ordinal));
        Assert.Equal(["SL108", "SL202"], w.Upper.Select(b => b.RuleId).Order(StringComparer.Ordinal));
        Assert.Equal("SL201", w.TightestLower!.RuleId);
        Assert.Equal(1122, w.TightestLower.Limit, 6);
        Assert.Equal(">=", w.TightestLower.Op);
        Assert.Equal("SL108", w.TightestUpper!.RuleId);
        Assert.Equal(3000, w.TightestUpper.Limit, 6);
        Assert.Equal(0.866 * 12000 / 1.5, w.Upper.Single(b => b.RuleId == "SL202").Limit, 6);
        Assert.Equal(300, w.Lower.Single(b => b.RuleId == "SL108").Limit, 6);
        Assert.Equal(1500, w.Actual, 6);
        Assert.True(w.Holds);
        Assert.False(w.IsEmpty);
        Assert.Equal(3, w.RuleCount);
    }

    [Fact]
    public void The_window_reads_as_a_sentence_with_primary_bounds_and_the_set_value_in_both_units()
    {
        var (data, _) = Run();
        var model = ReportBuilder.Build(data, ToolInfo.ForVersion("0.1.0"));
        var view = model.Motors.Single().Windows.Single(v => v.Window.Setting == "protection.short_circuit.pickup");
        Assert.Equal("short-circuit pickup: at least 1.12 kA pri (asymmetrical start, SL201), at most 3 kA pri (relay range max, SL108); set 1.5 kA pri (50 A sec)", view.Sentence);
    }

    [Fact]
    public void Acceleration_timer_lies_between_the_longest_start_and_the_hot_stall_time()
    {
        var w = Window(Run().Windows, "protection.acceleration.time");
        // SL701: above 1.1 x 7 s = 7.7 s; SL702: below the hot safe stall time 12 s. Both strict.
        Assert.Equal(7.7, w.TightestLower!.Limit, 9);
        Assert.True(w.TightestLower.IsStrict);
        Assert.Equal("SL701", w.TightestLower.RuleId);
        Assert.Equal(12, w.TightestUpper!.Limit, 9);
        Assert.Equal("SL702", w.TightestUpper.RuleId);
        Assert.Equal(9, w.Actual, 9);
    }

    [Fact]
    public void An_alternative_under_or_is_not_a_bound_and_a_computed_left_side_bounds_nothing()
    {
        var (data, windows) = Run();
        // SL303 (residual CT): pickup >= 5 % of the start current OR a delay that rides through the start; neither alone bounds the pickup.
        Assert.Contains(data.Outcomes, o => o.RuleId == "SL303");
        var gf = Window(windows, "protection.ground_fault.pickup");
        Assert.Empty(gf.Lower);
        // SL301: below the 400 A resistor current; SL302: at most 20 % of it, 80 A.
        Assert.Equal(["SL301", "SL302"], gf.Upper.Select(b => b.RuleId).Order(StringComparer.Ordinal));
        Assert.Equal(80, gf.TightestUpper!.Limit, 9);
        // SL109 compares the CT's reach (computed) with twice the pickup: its subject is the CT class, its left side no setting.
        Assert.DoesNotContain(windows, w => w.Setting == "transformers.phase_ct.class");
    }

    [Fact]
    public void A_setting_outside_its_window_and_an_empty_window_are_told_apart()
    {
        var (_, windows) = Run(Motor.Replace("pickup: 50 A sec", "pickup: 20 A sec", StringComparison.Ordinal));
        var w = Window(windows, "protection.short_circuit.pickup");
        Assert.False(w.Holds);
        Assert.False(w.IsEmpty);
        Assert.Contains(w.Lower, b => b.RuleId == "SL201" && !b.Holds);

        // Hand-made outcomes: a lower bound of 100 A above an upper bound of 80 A leaves no room.
        CheckBound Bound(string op, double limit) => new("protection.ground_fault.pickup", op, 90, limit, "test", Dim.Current, false, true);
        RuleOutcome Outcome(string id, CheckBound b) => new(id, "m.yaml", "M", "protection.ground_fault.pickup", true, null, Level.Error) { Bounds = [b] };
        var empty = SettingWindows.Derive([Outcome("SL901", Bound(">=", 100)), Outcome("SL902", Bound("<=", 80))]).Single();
        Assert.True(empty.IsEmpty);
        var touching = SettingWindows.Derive([Outcome("SL901", Bound(">=", 80)), Outcome("SL902", Bound("<", 80))]).Single();
        Assert.True(touching.IsEmpty);
        var point = SettingWindows.Derive([Outcome("SL901", Bound(">=", 80)), Outcome("SL902", Bound("<=", 80))]).Single();
        Assert.False(point.IsEmpty);
    }

    [Fact]
    public void Only_bounds_on_the_outcome_subject_make_a_window()
    {
        // A bound whose left side is another path (or computed) is kept in the outcome but not used for the subject's window.
        var other = new CheckBound("motor.full_load_current", "<=", 1, 2, "x", Dim.Current, false, true);
        var computed = new CheckBound(null, ">=", 1, 0.5, "x", Dim.Time, false, true);
        var o = new RuleOutcome("SL999", "m.yaml", "M", "protection.thermal.time_constant", true, null, Level.Error) { Bounds = [other, computed] };
        Assert.Empty(SettingWindows.Derive([o]));
    }

    [Fact]
    public void The_demo_windows_include_the_short_circuit_pickup_of_every_motor_with_the_element_on()
    {
        var windows = SettingWindows.Derive(HtmlTestSupport.Demo.Outcomes);
        foreach (var m in HtmlTestSupport.Demo.Motors.Where(m => m.IsEnabled(SettingLint.Core.Documents.SchemaPaths.Motor.ShortCircuitEnabled)))
        {
            var w = windows.Single(x => x.MotorFile == m.Document.RelativePath && x.Setting == "protection.short_circuit.pickup");
            Assert.Contains(w.Lower, b => b.RuleId == "SL201");
            Assert.Contains(w.Upper, b => b.RuleId == "SL202");
        }
    }
}
