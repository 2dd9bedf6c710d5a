namespace SettingLint.Protection.Tests;

public sealed class CtAccuracyTests
{
    // IEEE C57.13: a C class is the secondary voltage at 20 x rated secondary current into the standard burden,
    // so the standard burden is V / (20 x I_sn): V/100 for 5 A, V/20 for 1 A.
    [Theory]
    [InlineData("C100", 5, 1.0)]
    [InlineData("C100", 1, 5.0)]
    [InlineData("C400", 5, 4.0)]
    [InlineData("C400", 1, 20.0)]
    public void CClassStandardBurden_FollowsSecondary_IeeeC57_13(string token, double secondary, double standardBurden)
    {
        Assert.True(CtAccuracy.TryParse(token, secondary, null, out var ct));
        Assert.Equal(standardBurden, ct.RatedBurden, 1e-12);
        Assert.Equal(20, ct.AccuracyLimitFactor);
        Assert.Equal(double.Parse(token[1..], System.Globalization.CultureInfo.InvariantCulture), ct.AccuracyLimitVoltage, 1e-9);
    }

    // IEC 61869-2: 5P20 holds 5 % composite error up to 20 x rated current at its rated burden; the rated output in VA
    // is I_sn^2 x Z, so 15 VA is 0.6 ohm at 5 A and 15 ohm at 1 A, and the voltage at the limit 20 x 5 x 0.6 = 60 V,
    // 20 x 1 x 15 = 300 V. 10P10 at 10 VA, 1 A: 10 ohm, 10 x 1 x 10 = 100 V.
    [Theory]
    [InlineData("5P20", 15, 5, 20, 0.6, 60)]
    [InlineData("5P20", 15, 1, 20, 15, 300)]
    [InlineData("10P10", 10, 1, 10, 10, 100)]
    [InlineData("5P30", 15, 5, 30, 0.6, 90)]
    public void PClass_AccuracyLimitAtRatedBurden_Iec61869_2(string token, double va, double secondary, double alf, double ohms, double volts)
    {
        // The rated burden in ohm from the rated output in VA: Z = S / I_sn^2 (IEC 61869-2).
        Assert.True(CtAccuracy.TryParse(token, secondary, va / (secondary * secondary), out var ct));
        Assert.Equal(alf, ct.AccuracyLimitFactor);
        Assert.Equal(ohms, ct.RatedBurden, 1e-12);
        Assert.Equal(volts, ct.AccuracyLimitVoltage, 1e-9);
        Assert.Equal(token, ct.Token);
    }

    // IEC 61869-2 with the winding resistance left out (common practice when it is not known): a 5P20 15 VA 1 A CT
    // into 5 ohm reproduces about 300 V / 5 ohm = 60 A secondary (3 x its ALF, the burden being a third of the rated).
    [Fact]
    public void PClassReach_Iec61869_2()
    {
        Assert.True(CtAccuracy.TryParse("5P20", 1, 15, out var ct));
        Assert.Equal(60, ct.MaximumSecondaryCurrent(5), 1e-9);
    }

    // IEEE C37.110 by hand, 1 A C100 CT (standard burden 5 ohm, IEEE C57.13): X/R 10, If 20 pu, 2.5 ohm (0.5 pu):
    // 11 x 20 x 0.5 = 110. Taking the 5 A standard burden (1 ohm) would give 550, five times too high.
    [Fact]
    public void OneAmpSaturation_UsesItsOwnStandardBurden_IeeeC37_110()
    {
        Assert.True(CtAccuracy.TryParse("C100", 1, null, out var ct));
        var check = ct.CheckSaturation(10, 20, 2.5);
        Assert.Equal(110, check.Criterion, 1e-9);
        Assert.True(check.Saturates);
    }

    // IEEE C37.110 by hand, as before: 600:5 C200 with 1 ohm, X/R 20, 20 pu: 21 x 20 x 0.5 = 210 (5 A, unchanged).
    [Fact]
    public void FiveAmpSaturation_Unchanged_IeeeC37_110()
    {
        Assert.True(CtAccuracy.TryParse("C200", 5, null, out var ct));
        Assert.Equal(210, ct.CheckSaturation(20, 20, 1.0).Criterion, 1e-9);
    }

    // IEEE C37.110 criterion with an IEC 61869-2 class: (1 + X/R) If Zb <= ALF x Z_rated. 5P20 15 VA 1 A (15 ohm), X/R 3,
    // If 10 pu, Zb 7.5 ohm: 4 x 10 x 7.5 = 300 = 20 x 15, exactly at the limit (criterion 20, free of saturation).
    [Fact]
    public void PClassSaturation_AtLimit_IeeeC37_110_Iec61869_2()
    {
        Assert.True(CtAccuracy.TryParse("5P20", 1, 15, out var ct));
        var check = ct.CheckSaturation(3, 10, 7.5);
        Assert.Equal(20, check.Criterion, 1e-9);
        Assert.False(check.Saturates);
    }

    // IEC 61869-2 designations: an IEC class needs its rated burden; other classes and malformed tokens are refused.
    [Theory]
    [InlineData("5P20", null)]
    [InlineData("3P20", 15.0)]
    [InlineData("5P", 15.0)]
    [InlineData("P20", 15.0)]
    [InlineData("5PR20", 15.0)]
    [InlineData("PX", 15.0)]
    [InlineData("T100", null)]
    public void Refuses_Iec61869_2(string token, double? ratedBurden) =>
        Assert.False(CtAccuracy.TryParse(token, 5, ratedBurden, out _));
}
