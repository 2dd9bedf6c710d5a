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

    // IEC 60909-0 (decaying aperiodic component): T = X / (omega R); X/R 10 at 50 Hz is 10 / 314.16 = 31.83 ms.
    [Fact]
    public void DcTimeConstant_Iec60909() =>
        Assert.Equal(0.031831, AsymmetricalCurrent.DcTimeConstant(10, 50), 1e-6);

    // IEC 60909-0 decay, RMS of AC plus DC common practice, by hand: sqrt(1 + 2 exp(-2 t 2 pi f / (X/R))).
    // X/R 30, 60 Hz, 50 ms: exp(-1.256637) = 0.284610, sqrt(1.569219) = 1.2527.
    // X/R 20, 60 Hz, 50 ms: exp(-1.884956) = 0.151836, sqrt(1.303672) = 1.1418.
    // X/R 12, 60 Hz, 50 ms: exp(-3.141593) = 0.043214, sqrt(1.086428) = 1.0423.
    // X/R 12, 50 Hz, 100 ms: exp(-5.235988) = 0.005322, sqrt(1.010643) = 1.0053.
    [Theory]
    [InlineData(30, 60, 0.05, 1.2527)]
    [InlineData(20, 60, 0.05, 1.1418)]
    [InlineData(12, 60, 0.05, 1.0423)]
    [InlineData(12, 50, 0.1, 1.0053)]
    public void RmsFactorAt_Iec60909_CommonPractice(double xOverR, double frequency, double seconds, double expected) =>
        Assert.Equal(expected, AsymmetricalCurrent.RmsFactorAt(xOverR, frequency, seconds), 0.0001);

    // Common practice: undecayed at t = 0 (sqrt 3); a half cycle after the start it is the half-cycle factor at
    // either frequency; no offset without reactance.
    [Fact]
    public void RmsFactorAt_Limits_CommonPractice()
    {
        Assert.Equal(AsymmetricalCurrent.FullyOffsetRmsFactor, AsymmetricalCurrent.RmsFactorAt(12, 60, 0), 1e-12);
        Assert.Equal(AsymmetricalCurrent.DecayingRmsFactor(12), AsymmetricalCurrent.RmsFactorAt(12, 60, 1.0 / 120), 1e-12);
        Assert.Equal(AsymmetricalCurrent.DecayingRmsFactor(12), AsymmetricalCurrent.RmsFactorAt(12, 50, 1.0 / 100), 1e-12);
        Assert.Equal(1.0, AsymmetricalCurrent.RmsFactorAt(0, 50, 0), 1e-12);
    }
}
