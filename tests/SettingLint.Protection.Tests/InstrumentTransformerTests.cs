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
        Assert.True(CClassRating.TryParse(token, out var rating));
        Assert.Equal(volts, rating.ClassVoltage);
        // The standard burden is the class voltage over 20 x 5 A.
        Assert.Equal(burden, rating.ClassVoltage / 100, 1e-12);
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

    // IEEE C37.110 by hand: X/R 15, If 10 pu, C400 with 0.5 ohm -> Zb = 0.5 / 4 = 0.125 pu; 16 x 10 x 0.125 = 20, not saturated.
    [Fact]
    public void SaturationAtLimit_IsFree_IeeeC37_110()
    {
        var check = CtSaturation.Check(15, 10, 0.125);
        Assert.Equal(20.0, check.Criterion, 1e-9);
        Assert.False(check.Saturates);
    }

    // IEEE C37.110 by hand: 600:5 CT, 12 000 A fault (20 pu), X/R 20, C200 with 1 ohm (0.5 pu): 21 x 20 x 0.5 = 210, saturates.
    [Fact]
    public void SaturationAboveLimit_IeeeC37_110()
    {
        var check = CtSaturation.Check(20, 12_000.0 / 600, 0.5);
        Assert.Equal(210.0, check.Criterion, 1e-9);
        Assert.True(check.Saturates);
    }
}
