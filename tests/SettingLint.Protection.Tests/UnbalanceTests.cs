namespace SettingLint.Protection.Tests;

public sealed class UnbalanceTests
{
    // NEMA MG 1 14.36 definition (from memory), by hand: 460, 467, 450 V -> average 459 V,
    // largest deviation 9 V -> 9 / 459 = 0.019608.
    [Fact]
    public void VoltageUnbalance_NemaMg1_FromMemory() =>
        Assert.Equal(0.019608, NemaUnbalance.FromMagnitudes(460, 467, 450), 0.000001);

    // NEMA MG 1 definition, worked by hand: magnitudes 100, 94.3398, 98.4886 A ->
    // average 97.6095 A, largest deviation 3.2697 A -> 0.03350.
    [Fact]
    public void CurrentUnbalance_NemaMg1_FromMemory() =>
        Assert.Equal(0.03350, NemaUnbalance.FromMagnitudes(100, 94.3398, 98.4886), 0.00001);

    // Common practice: equal magnitudes are balanced.
    [Fact]
    public void EqualMagnitudes_AreBalanced_CommonPractice() =>
        Assert.Equal(0.0, NemaUnbalance.FromMagnitudes(480, 480, 480));

    // NEMA MG 1 Figure 14-1 points (from memory): 0 %, 1 % -> 1.00; 2 % -> 0.95; 3 % -> 0.88; 4 % -> 0.82; 5 % -> 0.75.
    [Theory]
    [InlineData(0.00, 1.00)]
    [InlineData(0.01, 1.00)]
    [InlineData(0.02, 0.95)]
    [InlineData(0.03, 0.88)]
    [InlineData(0.04, 0.82)]
    [InlineData(0.05, 0.75)]
    public void DeratingPoints_NemaMg1_Figure14_1_FromMemory(double unbalance, double expected)
    {
        var factor = UnbalanceDerating.Factor(unbalance);
        Assert.NotNull(factor);
        Assert.Equal(expected, factor.Value, 1e-9);
    }

    // NEMA MG 1 Figure 14-1 (from memory), linear between points: 2.5 % -> (0.95 + 0.88) / 2 = 0.915.
    [Fact]
    public void DeratingInterpolates_NemaMg1_Figure14_1_FromMemory() =>
        Assert.Equal(0.915, UnbalanceDerating.Factor(0.025)!.Value, 1e-9);

    // NEMA MG 1 Figure 14-1 (from memory): above 5 % operation is not recommended -> null.
    [Fact]
    public void AboveFivePercent_IsNull_NemaMg1_Figure14_1_FromMemory() =>
        Assert.Null(UnbalanceDerating.Factor(0.051));
}
