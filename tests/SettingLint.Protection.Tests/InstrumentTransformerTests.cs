using CsCheck;
using SettingLint.Tests.Shared;

namespace SettingLint.Protection.Tests;

public sealed class InstrumentTransformerTests
{
    // IEEE C57.13: C100 is 100 V at 20 x 5 A into its standard burden, 1 ohm.
    [Theory]
    [InlineData("C100", 100, 1.0)]
    [InlineData("C200", 200, 2.0)]
    [InlineData("C400", 400, 4.0)]
    [InlineData("C800", 800, 8.0)]
    [InlineData("c50", 50, 0.5)]
    public void ParseClass_IeeeC57_13(string token, double volts, double burden)
    {
        var rating = CClassRating.Parse(token);
        Assert.Equal(volts, rating.ClassVoltage);
        Assert.Equal(burden, rating.StandardBurden, 1e-12);
        Assert.Equal(token.ToUpperInvariant(), rating.Token);
    }

    // IEEE C57.13 designation: malformed tokens are rejected.
    [Theory]
    [InlineData("T100")]
    [InlineData("C")]
    [InlineData("C-100")]
    [InlineData("C1.5")]
    [InlineData("C0")]
    [InlineData("")]
    [InlineData(null)]
    public void ParseClass_Rejects_IeeeC57_13(string? token) => Assert.False(CClassRating.TryParse(token, out _));

    // IEEE C57.13 class voltage, common-practice approximation: C400 into 2 ohm reproduces about 200 A secondary.
    [Fact]
    public void MaximumSecondaryCurrent_IeeeC57_13() =>
        Assert.Equal(200.0, CClassRating.Parse("C400").MaximumSecondaryCurrent(2), 1e-9);

    // IEEE C37.110 by hand: X/R 15, If 10 pu, C400 with 0.5 ohm -> Zb = 0.125 pu; 16 x 10 x 0.125 = 20, not saturated.
    [Fact]
    public void SaturationAtLimit_IsFree_IeeeC37_110()
    {
        var check = CClassRating.Parse("C400").CheckSaturation(15, 10, 0.5);
        Assert.Equal(20.0, check.Criterion, 1e-9);
        Assert.False(check.Saturates);
    }

    // IEEE C37.110 by hand: 600:5 CT, 12 000 A fault (20 pu), X/R 20, C200 with 1 ohm (0.5 pu): 21 x 20 x 0.5 = 210, saturates.
    [Fact]
    public void SaturationFromPrimaryCurrent_IeeeC37_110()
    {
        var check = CClassRating.Parse("C200").CheckSaturation(20, 12_000, new CtRatio(600, 5), 1.0);
        Assert.Equal(210.0, check.Criterion, 1e-9);
        Assert.True(check.Saturates);
        Assert.Equal(check, CtSaturation.Check(20, 20, 0.5));
    }

    // Common practice: ideal ratio conversions, 600:5 maps 1200 A to 10 A; 4200:120 maps 4160 V to 118.857 V.
    [Fact]
    public void RatioConversions_CommonPractice()
    {
        Assert.Equal(10.0, new CtRatio(600, 5).ToSecondary(1200), 1e-12);
        Assert.Equal(120.0, new CtRatio(600, 5).Ratio, 1e-12);
        Assert.Equal(118.857, new VtRatio(4200, 120).ToSecondary(4160), 0.001);
        Assert.Equal(4200.0, new VtRatio(4200, 120).ToPrimary(120), 1e-9);
    }

    // Common practice: CT conversions round-trip.
    [Trait("Category", "Property")]
    [Fact]
    public void CtRoundTrip_CommonPractice() =>
        Gen.Select(Gen.Double[1, 10_000], Gen.Double[0.5, 10], Gen.Double[-100_000, 100_000]).SampleSeeded((primary, secondary, current) =>
        {
            var ratio = new CtRatio(primary, secondary);
            Assert.Equal(current, ratio.ToPrimary(ratio.ToSecondary(current)), 1e-9 * Math.Max(1, Math.Abs(current)));
            Assert.Equal(current, ratio.ToSecondary(ratio.ToPrimary(current)), 1e-9 * Math.Max(1, Math.Abs(current)));
        });

    // Common practice: VT conversions round-trip.
    [Trait("Category", "Property")]
    [Fact]
    public void VtRoundTrip_CommonPractice() =>
        Gen.Select(Gen.Double[100, 500_000], Gen.Double[50, 240], Gen.Double[0, 1_000_000]).SampleSeeded((primary, secondary, voltage) =>
        {
            var ratio = new VtRatio(primary, secondary);
            Assert.Equal(voltage, ratio.ToPrimary(ratio.ToSecondary(voltage)), 1e-9 * Math.Max(1, voltage));
        });
}
