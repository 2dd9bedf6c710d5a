namespace SettingLint.Protection.Tests;

// Cross-check: the NuGet package list of this environment was searched for a general-purpose
// library that computes IEC 60255-151 / IEEE C37.112 curves (terms: overcurrent, relay, IEC 60255,
// C37.112, protection, power system); none exists (only unit-conversion libraries), so the
// expected values below are worked by hand from the published constants instead.
public sealed class IecCurveTests
{
    private const double Tolerance = 0.001;

    // IEC 60255-151 Table 1, standard inverse k = 0.14, a = 0.02, TMS = 1:
    // 2^0.02 = exp(0.02 ln 2) = exp(0.0138629) = 1.0139595 -> 0.14 / 0.0139595 = 10.029 s
    // 5^0.02 = exp(0.0321888) = 1.0327124 -> 0.14 / 0.0327124 = 4.280 s
    // 10^0.02 = exp(0.0460517) = 1.0471285 -> 0.14 / 0.0471285 = 2.971 s
    [Theory]
    [InlineData(2, 10.029)]
    [InlineData(5, 4.280)]
    [InlineData(10, 2.971)]
    public void StandardInverse_Iec60255_151_Table1(double multiple, double expected) =>
        AssertTime(expected, CurveKind.IecStandardInverse, multiple);

    // IEC 60255-151 Table 1, very inverse k = 13.5, a = 1: 13.5 / 1, 13.5 / 4, 13.5 / 9.
    [Theory]
    [InlineData(2, 13.5)]
    [InlineData(5, 3.375)]
    [InlineData(10, 1.5)]
    public void VeryInverse_Iec60255_151_Table1(double multiple, double expected) =>
        AssertTime(expected, CurveKind.IecVeryInverse, multiple);

    // IEC 60255-151 Table 1, extremely inverse k = 80, a = 2: 80 / 3, 80 / 24, 80 / 99.
    [Theory]
    [InlineData(2, 26.667)]
    [InlineData(5, 3.333)]
    [InlineData(10, 0.808)]
    public void ExtremelyInverse_Iec60255_151_Table1(double multiple, double expected) =>
        AssertTime(expected, CurveKind.IecExtremelyInverse, multiple);

    // Long-time inverse k = 120, a = 1 (IEC 60255-3 form, common practice): 120 / 1, 120 / 4, 120 / 9.
    [Theory]
    [InlineData(2, 120.0)]
    [InlineData(5, 30.0)]
    [InlineData(10, 13.333)]
    public void LongTimeInverse_CommonPractice(double multiple, double expected) =>
        AssertTime(expected, CurveKind.IecLongTimeInverse, multiple);

    // IEC 60255-151: the time scales linearly with TMS; 0.1 x 2.971 s at M = 10.
    [Fact]
    public void StandardInverse_ScalesWithTms_Iec60255_151()
    {
        var time = InverseTimeCurves.OperateTime(CurveKind.IecStandardInverse, 10, 0.1);
        Assert.Equal(0.2971, time.Seconds, 0.0001);
    }

    // IEC 60255-151: the curves are defined only above pickup; M <= 1 never operates.
    [Theory]
    [InlineData(CurveKind.IecStandardInverse, 1.0)]
    [InlineData(CurveKind.IecVeryInverse, 0.5)]
    [InlineData(CurveKind.IecExtremelyInverse, 0.0)]
    [InlineData(CurveKind.IecLongTimeInverse, 1.0)]
    public void AtOrBelowPickup_NeverTrips_Iec60255_151(CurveKind kind, double multiple)
    {
        var time = InverseTimeCurves.OperateTime(kind, multiple, 1);
        Assert.False(time.Trips);
        Assert.Equal(TripTime.Never, time);
    }

    // IEC 60255-151 Table 1 constants as published.
    [Fact]
    public void Constants_Iec60255_151_Table1()
    {
        Assert.Equal(new CurveConstants(0.14, 0, 0.02, null), InverseTimeCurves.Constants(CurveKind.IecStandardInverse));
        Assert.Equal(new CurveConstants(13.5, 0, 1, null), InverseTimeCurves.Constants(CurveKind.IecVeryInverse));
        Assert.Equal(new CurveConstants(80, 0, 2, null), InverseTimeCurves.Constants(CurveKind.IecExtremelyInverse));
        Assert.Null(InverseTimeCurves.Constants(CurveKind.DefiniteTime));
    }

    private static void AssertTime(double expected, CurveKind kind, double multiple)
    {
        var time = InverseTimeCurves.OperateTime(kind, multiple, 1);
        Assert.True(time.Trips);
        Assert.Equal(expected, time.Seconds, Tolerance);
    }
}
