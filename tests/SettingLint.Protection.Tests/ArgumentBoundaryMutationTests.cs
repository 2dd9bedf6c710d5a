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
}
