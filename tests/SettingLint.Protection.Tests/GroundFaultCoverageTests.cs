namespace SettingLint.Protection.Tests;

public sealed class GroundFaultCoverageTests
{
    // Common practice: 10 A pickup with 400 A available covers 100 (1 - 10 / 400) = 97.5 % of the winding.
    [Fact]
    public void Coverage_CommonPractice() =>
        Assert.Equal(97.5, GroundFaultCoverage.ProtectedPercent(10, 400), 1e-9);

    // Common practice: pickup at or above the available current covers nothing, clamped at 0.
    [Theory]
    [InlineData(400)]
    [InlineData(500)]
    public void PickupAboveAvailable_ClampsToZero_CommonPractice(double pickup) =>
        Assert.Equal(0.0, GroundFaultCoverage.ProtectedPercent(pickup, 400));
}
