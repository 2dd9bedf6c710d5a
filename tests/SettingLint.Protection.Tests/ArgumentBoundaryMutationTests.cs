namespace SettingLint.Protection.Tests;

/// <summary>
/// Pins the edges of the argument checks every method shares: zero is refused where a quantity must be positive and
/// accepted where it may be zero, and NaN and infinities are refused everywhere (they would poison every later result).
/// Common practice throughout: a protection calculation refuses an impossible input instead of returning a number.
/// </summary>
public sealed class ArgumentBoundaryMutationTests
{
    // A start current must be above zero; a start may take no time (the level then stays where it was).
    [Fact]
    public void Positive_refuses_zero_and_non_finite_values()
    {
        Assert.Equal(1e-300, new StartPoint(1e-300, 1).Current);
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(0, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(-1, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(double.NaN, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(double.PositiveInfinity, 1));
    }

    [Fact]
    public void NonNegative_accepts_zero_and_refuses_below_zero_and_non_finite_values()
    {
        Assert.Equal(0, new StartPoint(600, 0).Duration);
        Assert.Equal(7.5, new StartPoint(600, 7.5).Duration);
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(600, -1e-300));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(600, double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(600, double.PositiveInfinity));
    }

    // Exact unit definition (NIST SP 811, B.9): 1 hp = 745.699872 W; any finite value converts, a negative one too.
    [Fact]
    public void Finite_accepts_any_finite_value_and_refuses_the_rest()
    {
        Assert.Equal(-2, PowerUnits.HorsepowerFromWatts(-2 * 745.699872), 1e-12);
        Assert.Equal(0, PowerUnits.HorsepowerFromWatts(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => PowerUnits.HorsepowerFromWatts(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => PowerUnits.HorsepowerFromWatts(double.NegativeInfinity));
        Assert.Throws<ArgumentOutOfRangeException>(() => PowerUnits.HorsepowerFromWatts(double.PositiveInfinity));
    }

    // The exception names the argument, so that a message can say which input was wrong.
    [Fact]
    public void The_refused_argument_is_named()
    {
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(600, -1));
        Assert.Equal("duration", e.ParamName);
        Assert.Equal(-1.0, e.ActualValue);
    }

    // The three checks say what was wrong with the value, in words a message can pass on.
    [Fact]
    public void Each_check_says_what_it_requires()
    {
        Assert.StartsWith("Value must be finite and greater than zero.", Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(0, 1)).Message, StringComparison.Ordinal);
        Assert.StartsWith("Value must be finite and not negative.", Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(1, -1)).Message, StringComparison.Ordinal);
        Assert.StartsWith("Value must be a finite number.", Assert.Throws<ArgumentOutOfRangeException>(() => PowerUnits.HorsepowerFromWatts(double.NaN)).Message, StringComparison.Ordinal);
        Assert.StartsWith("X/R must be zero or greater.", Assert.Throws<ArgumentOutOfRangeException>(() => AsymmetricalCurrent.DecayingRmsFactor(-1)).Message, StringComparison.Ordinal);
        Assert.StartsWith("Full-load level must be in [0, 1).", Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 2700, 1)).Message, StringComparison.Ordinal);
        Assert.StartsWith("Unknown curve kind.", Assert.Throws<ArgumentOutOfRangeException>(() => ((CurveKind)99).Token()).Message, StringComparison.Ordinal);
        Assert.StartsWith("Unknown curve kind.", Assert.Throws<ArgumentOutOfRangeException>(() => InverseTimeCurves.Constants((CurveKind)99)).Message, StringComparison.Ordinal);
        Assert.StartsWith("Unknown code letter.", Assert.Throws<ArgumentOutOfRangeException>(() => LockedRotorCodes.Range((LockedRotorCodeLetter)19)).Message, StringComparison.Ordinal);
    }

    // IEC 60255-149 thermal model: the level after running needs a level and a time of zero or more; a start needs a
    // start, a load current and a load time of zero or more, each named as the caller wrote it.
    [Fact]
    public void Thermal_inputs_are_checked_where_they_are_given()
    {
        var model = new ThermalModel(105, 900, 2700);
        Assert.Equal("startLevel", Assert.Throws<ArgumentOutOfRangeException>(() => model.LevelAfterRunning(-0.1, 210, 10)).ParamName);
        Assert.Equal("seconds", Assert.Throws<ArgumentOutOfRangeException>(() => model.LevelAfterRunning(0.1, 210, -10)).ParamName);
        Assert.Throws<ArgumentNullException>(() => model.CheckStart(null!, 0));
        Assert.Equal("loadCurrent", Assert.Throws<ArgumentOutOfRangeException>(() => model.CheckStart(new StartPoint(600, 1), 0, -1, 1)).ParamName);
        Assert.Equal("loadTime", Assert.Throws<ArgumentOutOfRangeException>(() => model.CheckStart(new StartPoint(600, 1), 0, 1, -1)).ParamName);
    }

    // Common practice (constant I^2 t): a safe stall time is zero or more; every check over a profile needs a model.
    [Fact]
    public void Start_profile_inputs_are_checked()
    {
        var p = StartProfile.For(1680, 7, 12, startingVoltage: 0.8);
        Assert.Throws<ArgumentOutOfRangeException>(() => p.StallTime(-1));
        Assert.Throws<ArgumentNullException>(() => p.Tightest(null!, 0));
        Assert.Throws<ArgumentNullException>(() => p.PeakLevel(null!, 0));
        Assert.Throws<ArgumentNullException>(() => p.RestartLevel(null!));
        Assert.Throws<ArgumentNullException>(() => p.TimeBetweenStarts(null!));
    }
}
