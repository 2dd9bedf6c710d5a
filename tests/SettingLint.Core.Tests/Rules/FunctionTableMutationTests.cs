using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;
using static SettingLint.Core.Tests.Rules.FunctionCalls;

namespace SettingLint.Core.Tests.Rules;

/// <summary>
/// Pins each function of the rule language's table (docs/rule-language.md, "Functions") on values worked from the
/// standard it names: the argument order, what an absent or impossible argument gives, the arity and the types it
/// accepts. The engineering itself is pinned in SettingLint.Protection.Tests; these check that each function passes
/// the right numbers in the right places.
/// </summary>
public sealed class FunctionTableMutationTests
{
    private static readonly ExprType Voltage = ExprType.Num(Dim.Voltage);
    private static readonly ExprType Time = ExprType.Num(Dim.Time);
    private static readonly ExprType Power = ExprType.Num(Dim.Of(Dimension.Power));
    private static readonly ExprType Hertz = ExprType.Num(Dim.Of(Dimension.Frequency));
    private static readonly ExprType Profile = ExprType.StartProfile;

    private static void Refuses(string name, string mention, params ExprType[] args)
    {
        var e = Assert.Throws<ArgumentException>(() => TypeOf(name, args));
        Assert.Contains(mention, e.Message, StringComparison.Ordinal);
    }

    // docs/rule-language.md, function table: the arity of each function (int.MaxValue for a list).
    [Theory]
    [InlineData("min", 1, int.MaxValue)]
    [InlineData("max", 1, int.MaxValue)]
    [InlineData("abs", 1, 1)]
    [InlineData("sqrt", 1, 1)]
    [InlineData("ln", 1, 1)]
    [InlineData("exp", 1, 1)]
    [InlineData("present", 1, 1)]
    [InlineData("coalesce", 1, int.MaxValue)]
    [InlineData("lrc_at", 3, 3)]
    [InlineData("code_letter_min", 3, 3)]
    [InlineData("code_letter_max", 3, 3)]
    [InlineData("nec_overload_limit", 1, 1)]
    [InlineData("thermal_trip", 4, 4)]
    [InlineData("hot_level", 2, 3)]
    [InlineData("start_peak", 5, 5)]
    [InlineData("start_profile", 6, 6)]
    [InlineData("start_longest", 1, 1)]
    [InlineData("stall_current", 1, 1)]
    [InlineData("stall_time", 2, 2)]
    [InlineData("start_trip", 4, 4)]
    [InlineData("start_time", 4, 4)]
    [InlineData("start_current", 4, 4)]
    [InlineData("profile_peak", 4, 4)]
    [InlineData("restart_level", 3, 3)]
    [InlineData("restart_interval", 4, 4)]
    [InlineData("cooling_time", 3, 3)]
    [InlineData("ct_limit", 2, 4)]
    [InlineData("ct_saturation", 5, 7)]
    [InlineData("ct_class_complete", 2, 3)]
    [InlineData("coverage", 2, 2)]
    [InlineData("asym_factor", 1, 1)]
    [InlineData("asym_factor_at", 3, 3)]
    [InlineData("curve_time", 4, 4)]
    [InlineData("on_step", 3, 3)]
    [InlineData("choose", 3, 3)]
    public void Arity(string name, int min, int max)
    {
        var f = Functions.All[name];
        Assert.Equal(name, f.Name);
        Assert.Equal(min, f.MinArgs);
        Assert.Equal(max, f.MaxArgs);
    }

    // docs/rule-language.md: only these take absent arguments, and these positions are optional (their absence alone
    // is no reason for a rule not to run).
    [Fact]
    public void Absent_arguments_and_optional_positions()
    {
        string[] takesAbsent = ["coalesce", "ct_class_complete", "ct_limit", "ct_saturation", "hot_level", "nec_overload_limit", "present", "start_profile"];
        Assert.Equal(takesAbsent, Functions.All.Values.Where(f => f.TakesAbsent).Select(f => f.Name).Order(StringComparer.Ordinal));
        Assert.Equal([2], Functions.All["hot_level"].OptionalArgs!);
        Assert.Equal([2, 3], Functions.All["start_profile"].OptionalArgs!);
        Assert.Equal([3], Functions.All["ct_limit"].OptionalArgs!);
        Assert.Equal([6], Functions.All["ct_saturation"].OptionalArgs!);
        Assert.Equal([2], Functions.All["ct_class_complete"].OptionalArgs!);
        // 35 functions of one motor, and the three that read the other motors on the bus (others_count, others_max, others_min).
        Assert.Equal(38, Functions.All.Count);
        Assert.Equal(["others_count", "others_max", "others_min"], Functions.All.Keys.Where(k => k.StartsWith("others_", StringComparison.Ordinal)).Order(StringComparer.Ordinal));
    }

    // Plain mathematics: |-3| = 3, sqrt 16 = 4, ln e = 1, exp 0 = 1, exp 1 = e.
    [Fact]
    public void Arithmetic_functions()
    {
        Assert.Equal(3, Number("abs", N(-3)));
        Assert.Equal(4, Number("sqrt", N(16)));
        Assert.Equal(1, Number("ln", N(Math.E)), 12);
        Assert.Equal(1, Number("exp", N(0)));
        Assert.Equal(Math.E, Number("exp", N(1)), 12);
        Assert.Equal(Current, TypeOf("abs", Current));
        Assert.Equal(Plain, TypeOf("sqrt", Plain));
        Refuses("abs", "argument 1 must be a number", Text);
        Refuses("sqrt", "sqrt takes a plain number", Current);
        Refuses("ln", "ln takes a plain number", Time);
        Refuses("exp", "exp takes a plain number", Text);
        Assert.Equal(Voltage, TypeOf("min", Voltage, Voltage));
        Refuses("max", "takes numbers", Text);
        Refuses("min", "one dimension", Voltage, Current);
    }

    [Fact]
    public void Present_coalesce_and_choose()
    {
        Assert.False(Call("present", None).Flag);
        Assert.True(Call("present", N(0)).Flag);
        Assert.Equal(ExprType.Bool, TypeOf("present", Current));
        Assert.Equal(2, Number("coalesce", None, N(2), N(3)));
        Assert.True(Call("coalesce", None, None).IsAbsent);
        Assert.Equal(Time, TypeOf("coalesce", Time, Time));
        Refuses("coalesce", "one type", Time, Current);
        Assert.Equal(1, Number("choose", Val.Of(true), N(1), N(2)));
        Assert.Equal(2, Number("choose", Val.Of(false), N(1), N(2)));
        Assert.Equal(Text, TypeOf("choose", ExprType.Bool, Text, Text));
        Refuses("choose", "argument 1 must be a condition", Plain, Text, Text);
        Refuses("choose", "arguments 2 and 3 must be of one type", ExprType.Bool, Text, Plain);
    }

    // Common practice (fixed locked-rotor impedance): 600 A at 4000 V is 540 A at 3600 V.
    [Fact]
    public void Lrc_at_scales_in_proportion_to_voltage()
    {
        Assert.Equal(540, Number("lrc_at", N(600), N(4000), N(3600)), 9);
        Assert.Equal(Current, TypeOf("lrc_at", Current, Voltage, Voltage));
        Refuses("lrc_at", "argument 1 must be current", Voltage, Voltage, Voltage);
        Refuses("lrc_at", "argument 3 must be voltage", Current, Voltage, Current);
    }

    // NEMA MG 1 Table 10-1, code G is 5.6 to under 6.3 kVA/hp; 500 hp (372 849.936 W, NIST SP 811 B.9) at 4000 V:
    // 5.6 x 500 x 1000 / (sqrt 3 x 4000) = 404.145 A, 6.3 x ... = 454.663 A. I is not a code letter.
    [Fact]
    public void Code_letter_bounds()
    {
        Assert.Equal(404.145, Number("code_letter_min", T("G"), N(372_849.936), N(4000)), 3);
        Assert.Equal(454.663, Number("code_letter_max", T("G"), N(372_849.936), N(4000)), 3);
        Assert.True(Call("code_letter_min", T("I"), N(372_849.936), N(4000)).IsAbsent);
        Assert.Equal(Current, TypeOf("code_letter_max", Text, Power, Voltage));
        Refuses("code_letter_min", "argument 1 must be a code letter", Plain, Power, Voltage);
        Refuses("code_letter_min", "argument 2 must be a power", Text, Current, Voltage);
        Refuses("code_letter_min", "argument 3 must be a voltage", Text, Power, Current);
    }

    // NFPA 70 430.32(A)(1): 1.25 for a service factor of 1.15 or more, else 1.15, also with none marked.
    [Fact]
    public void Nec_overload_limit()
    {
        Assert.Equal(1.25, Number("nec_overload_limit", N(1.15)));
        Assert.Equal(1.15, Number("nec_overload_limit", N(1.0)));
        Assert.Equal(1.15, Number("nec_overload_limit", None));
        Assert.Equal(Plain, TypeOf("nec_overload_limit", Plain));
    }

    // IEC 60255-149 worked by hand (k IB 105 A, tau 900 s, 600 A): cold x = 32.6531, t = 900 ln(x / (x - 1)) = 27.99 s;
    // hot from (100 / 105)^2 = 0.907029, t = 900 ln((x - h) / (x - 1)) = 2.640 s.
    [Fact]
    public void Thermal_trip_and_hot_level()
    {
        Assert.Equal(27.99, Number("thermal_trip", N(600), N(105), N(900), N(0)), 2);
        Assert.Equal(2.640, Number("thermal_trip", N(600), N(105), N(900), N(0.907029)), 3);
        Assert.True(double.IsPositiveInfinity(Number("thermal_trip", N(100), N(105), N(900), N(0))));
        Assert.Equal(Time, TypeOf("thermal_trip", Current, Current, Time, Plain));
        Refuses("thermal_trip", "argument 4 must be", Current, Current, Time, Time);

        Assert.Equal(0.907029, Number("hot_level", N(100), N(105)), 6);
        Assert.Equal(0.907029, Number("hot_level", N(100), N(105), None), 6);
        Assert.Equal(0.5, Number("hot_level", N(100), N(105), N(0.5)));
        Assert.True(Call("hot_level", None, N(105)).IsAbsent);
        Assert.True(Call("hot_level", N(100), None, N(0.5)).IsAbsent);
        Assert.Equal(Plain, TypeOf("hot_level", Current, Current));
        Assert.Equal(Plain, TypeOf("hot_level", Current, Current, Plain));
        Refuses("hot_level", "argument 3 must be a fraction", Current, Current, Current);
        Refuses("hot_level", "argument 2 must be", Current, Time);
    }

    // IEC 60255-149 by hand: 600 A for 10 s from cold with k IB 105 A, tau 900 s ends at
    // 32.6531 x (1 - exp(-10 / 900)) = 0.3608 (the peak: the level still rises).
    [Fact]
    public void Start_peak()
    {
        Assert.Equal(0.3608, Number("start_peak", N(600), N(10), N(105), N(900), N(0)), 4);
        Assert.Equal(Plain, TypeOf("start_peak", Current, Time, Current, Time, Plain));
        Refuses("start_peak", "argument 2 must be", Current, Current, Current, Time, Plain);
    }

    private static Val SoftStart() => Call("start_profile", N(1960), N(30), None, None, T("soft-starter"), N(980));

    // docs/rule-language.md, start profile table; common practice. A soft starter holds 980 A (3.5 x FLC) for the 30 s
    // ramp of a 1960 A LRC motor; a stall during it may last (1960 / 980)^2 = 4 x the safe stall time.
    [Fact]
    public void Start_profile_of_a_soft_start()
    {
        var p = SoftStart();
        Assert.Equal(ValKind.StartProfile, p.Kind);
        Assert.Equal(30, Number("start_longest", p));
        Assert.Equal(980, Number("stall_current", p));
        Assert.Equal(60, Number("stall_time", p, N(15)), 9);
        Assert.True(Call("start_profile", N(1960), N(30), None, None, T("soft-starter"), None).IsAbsent);
        Assert.True(Call("start_profile", None, N(30), None, None, T("fused-contactor"), None).IsAbsent);
        Assert.True(Call("start_profile", N(1960), None, None, None, T("fused-contactor"), None).IsAbsent);
    }

    // Common practice: another starter ignores a current limit; a reduced-voltage start at 80 % with 12 s there gives
    // LRC for 7 s and 0.8 x 1680 = 1344 A for 12 s, the stall at 1344 A.
    [Fact]
    public void Start_profile_of_other_starters()
    {
        var dol = Call("start_profile", N(1680), N(7), None, None, T("fused-contactor"), N(500));
        Assert.Equal(1680, Number("stall_current", dol));
        Assert.Equal(7, Number("start_longest", dol));
        var reduced = Call("start_profile", N(1680), N(7), N(12), N(0.8), T("circuit-breaker"), None);
        Assert.Equal(1344, Number("stall_current", reduced), 9);
        Assert.Equal(12, Number("start_longest", reduced));
        Assert.Equal(Profile, TypeOf("start_profile", Current, Time, Time, Plain, Text, Current));
        Refuses("start_profile", "argument 5 must be the starter type", Current, Time, Time, Plain, Plain, Current);
        Refuses("start_profile", "argument 6 must be the soft starter's current limit", Current, Time, Time, Plain, Text, Time);
        Refuses("start_profile", "argument 4 must be", Current, Time, Time, Time, Text, Current);
    }

    // IEC 60255-149 by hand at 980 A with k IB 294 A, tau 600 s: x = 11.1111, cold t = 600 ln(x / (x - 1)) = 56.59 s.
    [Fact]
    public void The_tightest_start()
    {
        var p = SoftStart();
        Assert.Equal(56.59, Number("start_trip", p, N(294), N(600), N(0)), 2);
        Assert.Equal(30, Number("start_time", p, N(294), N(600), N(0)));
        Assert.Equal(980, Number("start_current", p, N(294), N(600), N(0)));
        Assert.Equal(Time, TypeOf("start_trip", Profile, Current, Time, Plain));
        Assert.Equal(Time, TypeOf("start_time", Profile, Current, Time, Plain));
        Assert.Equal(Current, TypeOf("start_current", Profile, Current, Time, Plain));
        Assert.Equal(Current, TypeOf("stall_current", Profile));
        Assert.Equal(Time, TypeOf("start_longest", Profile));
        Assert.Equal(Time, TypeOf("stall_time", Profile, Time));
        Refuses("start_trip", "argument 1 must be a start profile", Current, Current, Time, Plain);
        Refuses("start_trip", "argument 3 must be time", Profile, Current, Current, Plain);
        Refuses("stall_time", "argument 2 must be time", Profile, Current);
    }

    // IEC 60255-149 by hand (the direct-on-line case of StartProfileTests): 468 A for 11 s, k IB 89.7 A, tau 480 s,
    // cooling 1440 s: peak 0.6167, restart below 0.3922, start to start 663.0 s; 0.8 -> 0.4 cools in 2700 ln 2 = 1871.5 s
    // with a 2700 s cooling constant, and a level of 0 is never reached.
    [Fact]
    public void Restarts_and_cooling()
    {
        var p = Call("start_profile", N(468), N(11), None, None, T("fused-contactor"), None);
        Assert.Equal(0.6167, Number("profile_peak", p, N(89.7), N(480), N(0)), 4);
        Assert.Equal(0.3922, Number("restart_level", p, N(89.7), N(480)), 4);
        Assert.Equal(663.0, Number("restart_interval", p, N(89.7), N(480), N(1440)), 1);
        Assert.Equal(1871.5, Number("cooling_time", N(0.8), N(0.4), N(2700)), 1);
        Assert.True(double.IsPositiveInfinity(Number("cooling_time", N(0.3), N(0), N(2700))));
        Assert.Equal(0, Number("cooling_time", N(0.3), N(0.4), N(2700)));
        Assert.Equal(Plain, TypeOf("profile_peak", Profile, Current, Time, Plain));
        Assert.Equal(Plain, TypeOf("restart_level", Profile, Current, Time));
        Assert.Equal(Time, TypeOf("restart_interval", Profile, Current, Time, Time));
        Assert.Equal(Time, TypeOf("cooling_time", Plain, Plain, Time));
        Refuses("cooling_time", "argument 3 must be", Plain, Plain, Plain);
    }

    // IEEE C57.13: C400 into 2 ohm reproduces about 400 / 2 = 200 A; C100 on a 1 A CT holds 100 V, 20 A into 5 ohm.
    // IEC 61869-2: 5P20 15 ohm at 1 A holds 20 x 1 x 15 = 300 V, 60 A into 5 ohm, and needs its rated burden.
    [Fact]
    public void Ct_limit()
    {
        Assert.Equal(200, Number("ct_limit", T("C400"), N(2)), 9);
        Assert.Equal(20, Number("ct_limit", T("C100"), N(5), N(1)), 9);
        Assert.Equal(60, Number("ct_limit", T("5P20"), N(5), N(1), N(15)), 9);
        Assert.True(Call("ct_limit", T("5P20"), N(5), N(1)).IsAbsent);
        Assert.True(Call("ct_limit", T("5P20"), N(5), N(1), None).IsAbsent);
        Assert.True(Call("ct_limit", T("C400"), N(0)).IsAbsent);
        Assert.True(Call("ct_limit", T("C400"), None).IsAbsent);
        Assert.True(Call("ct_limit", None, N(2)).IsAbsent);
        Assert.True(Call("ct_limit", T("C400"), N(2), None).IsAbsent);
        Assert.True(Call("ct_limit", T("X400"), N(2)).IsAbsent);
        Assert.Equal(Current, TypeOf("ct_limit", Text, Ohms));
        Assert.Equal(Current, TypeOf("ct_limit", Text, Ohms, Current, Ohms));
        Refuses("ct_limit", "argument 1 must be a CT class", Plain, Ohms);
        Refuses("ct_limit", "argument 2 must be an impedance", Text, Plain);
        Refuses("ct_limit", "argument 3 must be the CT's rated secondary current", Text, Ohms, Voltage);
        Refuses("ct_limit", "argument 4 must be the CT's rated burden", Text, Ohms, Current, Plain);
    }

    // IEEE C37.110 by hand: 600:5 C200 into 1 ohm (0.5 pu of its 2 ohm standard burden, IEEE C57.13), X/R 20,
    // 12 000 A (20 pu): 21 x 20 x 0.5 = 210. On a 1 A C200 CT the standard burden is 10 ohm: 21 x 20 x 0.1 = 42.
    [Fact]
    public void Ct_saturation()
    {
        Assert.Equal(210, Number("ct_saturation", N(20), N(12_000), N(600), T("C200"), N(1)), 9);
        Assert.Equal(42, Number("ct_saturation", N(20), N(12_000), N(600), T("C200"), N(1), N(1)), 9);
        for (var i = 0; i < 5; i++)
        {
            Val[] args = [N(20), N(12_000), N(600), T("C200"), N(1)];
            args[i] = None;
            Assert.True(Call("ct_saturation", args).IsAbsent, "argument " + (i + 1) + " absent");
        }
        Assert.True(Call("ct_saturation", N(20), N(12_000), N(0), T("C200"), N(1)).IsAbsent);
        Assert.True(Call("ct_saturation", N(20), N(12_000), N(600), T("C200"), N(0)).IsAbsent);
        Assert.True(Call("ct_saturation", N(20), N(12_000), N(600), T("5P20"), N(1), N(5)).IsAbsent);
        Assert.Equal(Plain, TypeOf("ct_saturation", Plain, Current, Current, Text, Ohms));
        Refuses("ct_saturation", "argument 1 must be X/R", Current, Current, Current, Text, Ohms);
        Refuses("ct_saturation", "arguments 2 and 3 must be currents", Plain, Plain, Current, Text, Ohms);
        Refuses("ct_saturation", "arguments 2 and 3 must be currents", Plain, Current, Plain, Text, Ohms);
        Refuses("ct_saturation", "argument 4 must be a CT class", Plain, Current, Current, Plain, Ohms);
        Refuses("ct_saturation", "argument 5 must be an impedance", Plain, Current, Current, Text, Plain);
        Refuses("ct_saturation", "argument 6 must be the CT's rated secondary current", Plain, Current, Current, Text, Ohms, Ohms);
    }

    // IEC 61869-2: a P class gives its accuracy limit only with its rated burden; IEEE C57.13: a C class needs none.
    [Fact]
    public void Ct_class_complete()
    {
        Assert.False(Call("ct_class_complete", T("5P20"), N(1)).Flag);
        Assert.Equal(ValKind.Bool, Call("ct_class_complete", T("5P20"), N(1)).Kind);
        Assert.True(Call("ct_class_complete", T("5P20"), N(1), N(15)).Flag);
        Assert.True(Call("ct_class_complete", T("C100"), N(5)).Flag);
        Assert.True(Call("ct_class_complete", None, N(5)).IsAbsent);
        Assert.True(Call("ct_class_complete", T("C100"), None).IsAbsent);
        Assert.Equal(ExprType.Bool, TypeOf("ct_class_complete", Text, Current, Ohms));
        Refuses("ct_class_complete", "argument 1 must be a CT class", Plain, Current);
        Refuses("ct_class_complete", "argument 2 must be the CT's rated secondary current", Text, Plain);
    }

    // Common practice: 10 A pickup with 400 A available protects 1 - 10 / 400 = 97.5 % of a wye winding.
    // Common practice (RMS of AC plus a DC offset decaying as IEC 60909-0): X/R 10 after a half cycle 1.4377;
    // X/R 30 at 60 Hz after 50 ms 1.2527.
    [Fact]
    public void Coverage_and_asymmetry()
    {
        Assert.Equal(0.975, Number("coverage", N(10), N(400)), 12);
        Assert.Equal(Plain, TypeOf("coverage", Current, Current));
        Assert.Equal(1.4377, Number("asym_factor", N(10)), 4);
        Assert.Equal(1.2527, Number("asym_factor_at", N(30), N(60), N(0.05)), 4);
        Assert.Equal(Plain, TypeOf("asym_factor_at", Plain, Hertz, Time));
        Refuses("asym_factor_at", "argument 2 must be", Plain, Plain, Time);
    }

    // IEC 60255-151 Table 1 standard inverse, M = 10, TMS 1: 0.14 / (10^0.02 - 1) = 2.971 s; IEEE C37.112-2018 Table 1
    // extremely inverse, M = 10, TD 1: 28.2 / 99 + 0.1217 = 0.4065 s. The multiple is current over pickup.
    [Fact]
    public void Curve_time()
    {
        Assert.Equal(2.971, Number("curve_time", T("iec-standard-inverse"), N(100), N(1), N(1000)), 3);
        Assert.Equal(0.4065, Number("curve_time", T("ieee-extremely-inverse"), N(200), N(1), N(2000)), 4);
        Assert.True(Call("curve_time", T("IEC-Standard-Inverse"), N(100), N(1), N(1000)).IsAbsent);
        Assert.Equal(Time, TypeOf("curve_time", Text, Current, Plain, Current));
        Refuses("curve_time", "argument 1 must be a curve token", Plain, Current, Plain, Current);
        Refuses("curve_time", "argument 2 must be the pickup current", Text, Time, Plain, Current);
        Refuses("curve_time", "argument 3 must be the time multiplier", Text, Current, Time, Current);
        Refuses("curve_time", "argument 4 must be a current", Text, Current, Plain, Time);
    }

    // Common practice: a relay takes settings at min + k x step; 0.1 % of a step absorbs decimal rounding.
    [Theory]
    [InlineData(0.35, 0.05, 0.01, true)]
    [InlineData(0.355, 0.05, 0.01, false)]
    [InlineData(1.0005, 0, 1, true)]
    [InlineData(0.9995, 0, 1, true)]
    [InlineData(1.002, 0, 1, false)]
    [InlineData(0.998, 0, 1, false)]
    [InlineData(7.3, 0, 0, true)]
    [InlineData(7.3, 0, -1, true)]
    public void On_step(double value, double min, double step, bool expected) =>
        Assert.Equal(expected, Call("on_step", N(value), N(min), N(step)).Flag);

    [Fact]
    public void On_step_types()
    {
        Assert.Equal(ExprType.Bool, TypeOf("on_step", Current, Current, Current));
        Refuses("on_step", "three numbers of one dimension", Text, Text, Text);
        Refuses("on_step", "three numbers of one dimension", Current, Voltage, Current);
        Refuses("on_step", "three numbers of one dimension", Current, Current, Voltage);
    }
}
