namespace SettingLint.Protection.Tests;

public sealed class AsymmetricalCurrentTests
{
    // Common practice: full offset, undecayed: sqrt(1 + 2) = 1.7320508.
    [Fact]
    public void FullyOffset_IsSqrt3_CommonPractice() =>
        Assert.Equal(1.7320508, AsymmetricalCurrent.FullyOffsetRmsFactor, 1e-7);

    // Common practice, by hand: X/R = 10: exp(-2 pi / 10) = exp(-0.6283185) = 0.5334881;
    // sqrt(1 + 1.0669762) = sqrt(2.0669762) = 1.4377.
    // X/R = 4: exp(-1.5707963) = 0.2078796; sqrt(1.4157592) = 1.1898.
    [Theory]
    [InlineData(10, 1.4377)]
    [InlineData(4, 1.1898)]
    public void Decaying_CommonPractice(double xOverR, double expected) =>
        Assert.Equal(expected, AsymmetricalCurrent.DecayingRmsFactor(xOverR), 0.0001);

    // Common practice: limits, X/R = 0 has no offset (1); X/R -> infinity no decay (sqrt 3).
    [Fact]
    public void DecayingLimits_CommonPractice()
    {
        Assert.Equal(1.0, AsymmetricalCurrent.DecayingRmsFactor(0), 1e-12);
        Assert.Equal(AsymmetricalCurrent.FullyOffsetRmsFactor, AsymmetricalCurrent.DecayingRmsFactor(double.PositiveInfinity), 1e-12);
        Assert.True(AsymmetricalCurrent.DecayingRmsFactor(1e6) < AsymmetricalCurrent.FullyOffsetRmsFactor);
    }
}
