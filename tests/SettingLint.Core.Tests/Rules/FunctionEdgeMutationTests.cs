using SettingLint.Core.Rules;
using static SettingLint.Core.Tests.Rules.FunctionCalls;

namespace SettingLint.Core.Tests.Rules;

/// <summary>
/// Pins what the rule functions do at the edges of their data, each against the source the table names: a zero or
/// infinite soft-start limit, a reduced starting voltage without its start time, a definite-time element with no
/// delay, an inverse curve with no multiplier, a relay range that does not start at a whole step, and the optional CT
/// arguments in every count the table allows.
/// </summary>
public sealed class FunctionEdgeMutationTests
{
    // Common practice: a soft starter limits the current it lets through; a limit of 0 A or an unbounded one is no
    // limit a start can be worked out from, so the profile is absent (docs/rule-language.md, start profile: "absent
    // ... for a soft starter without its current limit"), never a start at 0 A or at LRC.
    [Theory]
    [InlineData(0)]
    [InlineData(-100)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NaN)]
    public void A_soft_start_limit_that_is_no_current_gives_no_profile(double limit) =>
        Assert.True(Call("start_profile", N(1960), N(30), None, None, T("soft-starter"), N(limit)).IsAbsent);

    // The smallest real limit is a limit: 1 A is taken as it is (the profile's stall current is the limit).
    [Fact]
    public void A_small_soft_start_limit_is_taken_as_it_is() =>
        Assert.Equal(1, Number("stall_current", Call("start_profile", N(1960), N(30), None, None, T("soft-starter"), N(1))));

    // Common practice (StartProfile.For): a start at 80 % voltage whose time there is not known is taken as the
    // rated-voltage start at LRC, and its stall at LRC (1680 A, not 0.8 x 1680 = 1344 A): the allowed stall time is not
    // lengthened on a start whose length is not known.
    [Fact]
    public void A_reduced_voltage_without_its_start_time_stalls_at_lrc()
    {
        var p = Call("start_profile", N(1680), N(7), None, N(0.8), T("circuit-breaker"), None);
        Assert.Equal(1680, Number("stall_current", p));
        Assert.Equal(7, Number("start_longest", p));
    }

    // IEC 60255-151 (definite time: the operate time is the set delay) and IEEE C37.112 / IEC 60255-151 (an inverse
    // curve's multiplier must be above 0): definite time with no delay trips at once, 0 s, and with 0.5 s in 0.5 s; an
    // inverse curve with a multiplier of 0 has no trip time (absent).
    [Fact]
    public void Curve_time_at_a_multiplier_of_zero()
    {
        Assert.Equal(0, Number("curve_time", T("definite-time"), N(100), N(0), N(1000)));
        Assert.Equal(0.5, Number("curve_time", T("definite-time"), N(100), N(0.5), N(1000)));
        Assert.True(Call("curve_time", T("iec-standard-inverse"), N(100), N(0), N(1000)).IsAbsent);
        Assert.True(Call("curve_time", T("ieee-very-inverse"), N(100), N(-1), N(1000)).IsAbsent);
        // IEC 60255-151 Table 1 standard inverse, M = 10, TMS 0.05: 0.05 x 0.14 / (10^0.02 - 1) = 0.1485 s.
        Assert.Equal(0.1485, Number("curve_time", T("iec-standard-inverse"), N(100), N(0.05), N(1000)), 4);
    }

    // Common practice: a relay range starts at its minimum and goes in steps; 2.3 A is on a range from 0.3 A in 1 A steps
    // (0.3 + 2 x 1) and 2.6 A is not. Exactly 0.1 % of a step off is still on the step (the tolerance is inclusive:
    // docs/rule-language.md, "to 0.1 % of a step").
    [Theory]
    [InlineData(2.3, 0.3, 1, true)]
    [InlineData(2.6, 0.3, 1, false)]
    [InlineData(0.3, 0.3, 1, true)]
    [InlineData(0.001, 0, 1, true)]
    [InlineData(0.0011, 0, 1, false)]
    public void On_step_counts_from_the_minimum(double value, double min, double step, bool expected) =>
        Assert.Equal(expected, Call("on_step", N(value), N(min), N(step)).Flag);

    // docs/rule-language.md: ct_limit(class, burden, secondary?, rated_burden?), ct_saturation(..., secondary?,
    // rated_burden?), ct_class_complete(class, secondary, rated_burden?): each count of arguments the table allows has a type.
    [Fact]
    public void The_optional_ct_arguments_in_each_count()
    {
        Assert.Equal(Current, TypeOf("ct_limit", Text, Ohms, Current));
        Assert.Equal(Plain, TypeOf("ct_saturation", Plain, Current, Current, Text, Ohms, Current));
        Assert.Equal(Plain, TypeOf("ct_saturation", Plain, Current, Current, Text, Ohms, Current, Ohms));
        Assert.Equal(ExprType.Bool, TypeOf("ct_class_complete", Text, Current));
        var e = Assert.Throws<ArgumentException>(() => TypeOf("ct_saturation", Plain, Current, Current, Text, Ohms, Current, Current));
        Assert.Contains("argument 7 must be the CT's rated burden", e.Message, StringComparison.Ordinal);
        Assert.EndsWith("not " + Current, e.Message, StringComparison.Ordinal);
        e = Assert.Throws<ArgumentException>(() => TypeOf("ct_class_complete", Text, Current, Current));
        Assert.Contains("argument 3 must be the CT's rated burden", e.Message, StringComparison.Ordinal);
        Assert.EndsWith("not " + Current, e.Message, StringComparison.Ordinal);
        e = Assert.Throws<ArgumentException>(() => TypeOf("ct_limit", Text, Ohms, Ohms));
        Assert.Equal("argument 3 must be the CT's rated secondary current, not " + Ohms, e.Message);
    }

    // IEC 61869-2: a 5P20 CT with 1 A secondary and 15 ohm rated burden holds 20 x 1 x 15 = 300 V, 60 A into 5 ohm; its
    // rated burden is the fourth argument, not the connected burden (5 ohm would give 20 x 1 x 5 / 5 = 20 A).
    [Fact]
    public void The_rated_burden_is_the_last_argument()
    {
        Assert.Equal(60, Number("ct_limit", T("5P20"), N(5), N(1), N(15)), 9);
        Assert.True(Call("ct_class_complete", T("5P20"), N(1), None).Kind == ValKind.Bool);
        Assert.False(Call("ct_class_complete", T("5P20"), N(1), None).Flag);
    }

    // docs/rule-language.md: others_max(expr) and others_min(expr) take a number expression and give its type; a text
    // is refused with the reason.
    [Fact]
    public void The_others_functions_take_a_number_expression()
    {
        Assert.Equal(Current, TypeOf("others_max", Current));
        Assert.Equal(Plain, TypeOf("others_min", Plain));
        var e = Assert.Throws<ArgumentException>(() => TypeOf("others_max", Text));
        Assert.Contains("takes a number expression", e.Message, StringComparison.Ordinal);
        Assert.Throws<ArgumentException>(() => TypeOf("others_min", ExprType.Bool));
    }
}
