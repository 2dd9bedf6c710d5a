using SettingLint.Core.Rules;

namespace SettingLint.Core.Tests;

/// <summary>Comparisons in rules: written settings compare to their precision, but "never" (an infinite time) is never close to a time.</summary>
public sealed class RuleComparisonTests
{
    [Theory]
    [InlineData("<", 0.54, double.PositiveInfinity, true)]   // clears before an upstream that never trips
    [InlineData("<=", double.PositiveInfinity, 20, false)]   // a thermal model that never trips is not within a stall time
    [InlineData(">=", 20, double.PositiveInfinity, false)]
    [InlineData(">", double.PositiveInfinity, 20, true)]
    [InlineData("<", double.PositiveInfinity, double.PositiveInfinity, false)]
    [InlineData("<=", double.PositiveInfinity, double.PositiveInfinity, true)]
    [InlineData(">=", 680, 680.0000001, true)]               // 1.7 x 400 A equals 680 A to the precision of settings
    public void Infinity_is_close_only_to_itself(string op, double left, double right, bool expected) =>
        Assert.Equal(expected, Compiler.Compare(op, Val.Of(left), Val.Of(right)).Flag);
}
