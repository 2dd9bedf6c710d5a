namespace SettingLint.Protection.Tests;

public sealed class OvercurrentSettingTests
{
    // IEC 60255-151 Table 1: pickup 100 A, 1000 A is M = 10, standard inverse TMS 1 -> 2.971 s.
    [Fact]
    public void CurveOnly_AtPrimaryCurrent_Iec60255_151_Table1()
    {
        var setting = new OvercurrentSetting(CurveKind.IecStandardInverse, 100, 1);
        Assert.Equal(2.971, setting.TripTimeAt(1000).Seconds, 0.001);
    }

    // Common practice: above the instantaneous pickup the 0.05 s default wins over the curve.
    [Fact]
    public void Instantaneous_DefaultTime_CommonPractice()
    {
        var setting = new OvercurrentSetting(CurveKind.IecStandardInverse, 100, 1, instantaneousPickupCurrent: 800);
        Assert.Equal(0.05, setting.TripTimeAt(1000).Seconds, 1e-12);

        // Below the instantaneous pickup the curve alone acts (IEC 60255-151 Table 1, M = 7):
        // 7^0.02 = exp(0.0389182) = 1.0396854 -> 0.14 / 0.0396854 = 3.528 s.
        Assert.Equal(3.528, setting.TripTimeAt(700).Seconds, 0.001);
    }

    // Common practice: the instantaneous time is a parameter; the curve still wins when faster.
    [Fact]
    public void Instantaneous_SlowerThanCurve_CurveWins_CommonPractice()
    {
        // IEEE C37.112-2018 Table 1 EI at M = 10, TD = 1: 0.4065 s, faster than a 0.5 s instantaneous.
        var setting = new OvercurrentSetting(CurveKind.IeeeExtremelyInverse, 100, 1, 500, instantaneousTime: 0.5);
        Assert.Equal(0.4065, setting.TripTimeAt(1000).Seconds, 0.001);
    }

    // Common practice: a definite-time element trips after its delay above pickup, never at or below.
    [Fact]
    public void DefiniteTime_CommonPractice()
    {
        var setting = new OvercurrentSetting(CurveKind.DefiniteTime, 100, 0.3);
        Assert.Equal(0.3, setting.TripTimeAt(150).Seconds, 1e-12);
        Assert.False(setting.TripTimeAt(100).Trips);
    }

    // IEC 60255-151: below pickup and below the instantaneous pickup nothing trips.
    [Fact]
    public void BelowBothPickups_NeverTrips_Iec60255_151() =>
        Assert.False(new OvercurrentSetting(CurveKind.IecVeryInverse, 100, 1, 800).TripTimeAt(90).Trips);
}
