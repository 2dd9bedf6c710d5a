namespace SettingLint.Protection.Tests;

public sealed class NecOverloadLimitTests
{
    // NFPA 70 430.32(A)(1): service factor 1.15 or more -> 125 %.
    [Theory]
    [InlineData(1.15)]
    [InlineData(1.25)]
    public void ServiceFactor115_Is125Percent_Nfpa70_430_32_A_1(double serviceFactor) =>
        Assert.Equal(1.25, NecOverloadLimit.MaximumFraction(serviceFactor));

    // NFPA 70 430.32(A)(1): service factor 1.0 and no marked rise -> 115 %.
    [Fact]
    public void ServiceFactor10_Is115Percent_Nfpa70_430_32_A_1() =>
        Assert.Equal(1.15, NecOverloadLimit.MaximumFraction(1.0));

    // NFPA 70 430.32(A)(1): no service factor marked (an IEC motor) falls under "all other motors" -> 115 %,
    // unless a marked rise of 40 C or less gives 125 %.
    [Fact]
    public void NoServiceFactorMarked_Is115Percent_Nfpa70_430_32_A_1()
    {
        Assert.Equal(1.15, NecOverloadLimit.MaximumFraction(null));
        Assert.Equal(1.25, NecOverloadLimit.MaximumFraction(null, 40));
    }

    // NFPA 70 430.32(A)(1): marked temperature rise 40 C or less -> 125 % even at SF 1.0.
    [Theory]
    [InlineData(40, 1.25)]
    [InlineData(30, 1.25)]
    [InlineData(41, 1.15)]
    [InlineData(80, 1.15)]
    public void TemperatureRise_Nfpa70_430_32_A_1(double rise, double expected) =>
        Assert.Equal(expected, NecOverloadLimit.MaximumFraction(1.0, rise));

}
