namespace SettingLint.Protection.Tests;

/// <summary>
/// Pins the edges of the overcurrent curves, the instantaneous element, the CT accuracy classes and the other live
/// protection methods: values exactly at a pickup or a limit, the smallest inputs each accepts, and the inputs each
/// refuses.
/// </summary>
public sealed class CurveAndCtBoundaryMutationTests
{
    // IEC 60255-151 Table 1 very inverse: at 800 A on a 100 A pickup, M = 8: 13.5 / 7 = 1.9286 s. An instantaneous
    // element set at 800 A acts strictly above its pickup (as a curve does not act at M = 1; common practice), so at
    // 800 A the curve acts and just above it the 0.05 s instantaneous.
    [Fact]
    public void Instantaneous_acts_strictly_above_its_pickup_Iec60255_151()
    {
        var setting = new OvercurrentSetting(CurveKind.IecVeryInverse, 100, 1, 800);
        Assert.Equal(13.5 / 7, setting.TripTimeAt(800).Seconds, 1e-9);
        Assert.Equal(0.05, setting.TripTimeAt(800.001).Seconds);
        Assert.Equal(OvercurrentSetting.DefaultInstantaneousTime, setting.InstantaneousTime);
        Assert.Equal(0.05, OvercurrentSetting.DefaultInstantaneousTime);
    }

    // Common practice: a setting keeps what it was given; a definite-time delay may be 0 s (an instantaneous-only
    // element), a curve's multiplier may not.
    [Fact]
    public void Overcurrent_setting_values_and_limits()
    {
        var s = new OvercurrentSetting(CurveKind.IeeeVeryInverse, 150, 2.5, 1200, 0.1);
        Assert.Equal(CurveKind.IeeeVeryInverse, s.Curve);
        Assert.Equal(150, s.PickupCurrent);
        Assert.Equal(2.5, s.TimeMultiplier);
        Assert.Equal(1200, s.InstantaneousPickupCurrent);
        Assert.Equal(0.1, s.InstantaneousTime);
        Assert.Null(new OvercurrentSetting(CurveKind.IeeeVeryInverse, 150, 2.5).InstantaneousPickupCurrent);

        var definite = new OvercurrentSetting(CurveKind.DefiniteTime, 100, 0);
        Assert.Equal(TripTime.Immediate, definite.TripTimeAt(150));
        Assert.Throws<ArgumentOutOfRangeException>(() => new OvercurrentSetting(CurveKind.IecVeryInverse, 100, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => new OvercurrentSetting(CurveKind.DefiniteTime, 100, -0.1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new OvercurrentSetting(CurveKind.IecVeryInverse, 100, 1, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => new OvercurrentSetting(CurveKind.IecVeryInverse, 100, 1, 800, -0.01));
        Assert.Throws<ArgumentOutOfRangeException>(() => new OvercurrentSetting(CurveKind.IecVeryInverse, 0, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => s.TripTimeAt(-1));
    }

    // IEC 60255-151 and IEEE C37.112 define the curves above pickup only: a definite-time element at M just above 1
    // trips after its delay; negative multiples and multipliers are refused; an unknown curve has no constants.
    [Fact]
    public void Curve_edges_Iec60255_151_IeeeC37_112()
    {
        Assert.Equal(0.3, InverseTimeCurves.OperateTime(CurveKind.DefiniteTime, 1.0001, 0.3).Seconds);
        Assert.Equal(TripTime.Never, InverseTimeCurves.OperateTime(CurveKind.DefiniteTime, 1, 0.3));
        Assert.Null(InverseTimeCurves.Constants(CurveKind.DefiniteTime));
        Assert.Throws<ArgumentOutOfRangeException>(() => InverseTimeCurves.OperateTime(CurveKind.IecVeryInverse, -1, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => InverseTimeCurves.OperateTime(CurveKind.DefiniteTime, 2, -1));
        Assert.Throws<ArgumentOutOfRangeException>(() => InverseTimeCurves.OperateTime(CurveKind.IecVeryInverse, 2, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => InverseTimeCurves.Constants((CurveKind)99));
        Assert.Throws<ArgumentOutOfRangeException>(() => ((CurveKind)99).Token());
    }

    // IEC 60255-151 Table 1 (k, alpha; B = 0 and no timed reset) and IEEE C37.112-2018 Table 1 (A, B, p, tr).
    [Theory]
    [InlineData(CurveKind.IecStandardInverse, 0.14, 0, 0.02, null)]
    [InlineData(CurveKind.IecVeryInverse, 13.5, 0, 1, null)]
    [InlineData(CurveKind.IecExtremelyInverse, 80, 0, 2, null)]
    [InlineData(CurveKind.IecLongTimeInverse, 120, 0, 1, null)]
    [InlineData(CurveKind.IeeeModeratelyInverse, 0.0515, 0.1140, 0.02, 4.85)]
    [InlineData(CurveKind.IeeeVeryInverse, 19.61, 0.491, 2, 21.6)]
    [InlineData(CurveKind.IeeeExtremelyInverse, 28.2, 0.1217, 2, 29.1)]
    public void Published_curve_constants(CurveKind kind, double a, double b, double p, double? reset) =>
        Assert.Equal(new CurveConstants(a, b, p, reset), InverseTimeCurves.Constants(kind));

    // IEEE C57.13: the C class and its standard burden V / (20 I_sn); a token is read in either case.
    [Fact]
    public void C_class_from_its_token_IeeeC57_13()
    {
        Assert.True(CtAccuracy.TryParse("c400", 5, null, out var ct));
        Assert.Equal("C400", ct.Token);
        Assert.Equal(5, ct.RatedSecondary);
        Assert.Equal(20, ct.AccuracyLimitFactor);
        Assert.Equal(4, ct.RatedBurden, 12);
        Assert.Equal(400, ct.AccuracyLimitVoltage, 9);
        Assert.Equal(20, CtAccuracy.CClassLimitFactor);
        Assert.Equal(ct, CtAccuracy.CClass(400, 5));
    }

    // IEC 61869-2: 5P and 10P classes only, the ALF a positive whole number, the P in either case; the rated burden
    // (ohm, finite, above 0) is needed; the secondary must be a finite current above 0.
    [Theory]
    [InlineData("10P20", 5, 0.6, true)]
    [InlineData("5p20", 5, 0.6, true)]
    [InlineData("5P0", 5, 0.6, false)]
    [InlineData("0P20", 5, 0.6, false)]
    [InlineData("15P20", 5, 0.6, false)]
    [InlineData("5P20", 5, 0.0, false)]
    [InlineData("5P20", 5, double.PositiveInfinity, false)]
    [InlineData("5P20", 5, double.NaN, false)]
    [InlineData("5P20", 0, 0.6, false)]
    [InlineData("5P20", -5, 0.6, false)]
    [InlineData("5P20", double.NaN, 0.6, false)]
    [InlineData("5P20", double.PositiveInfinity, 0.6, false)]
    [InlineData("C400", 0, null, false)]
    [InlineData("5", 5, 0.6, false)]
    [InlineData("C", 5, null, false)]
    [InlineData(null, 5, 0.6, false)]
    public void P_class_tokens_and_data_Iec61869_2(string? token, double secondary, double? ratedBurden, bool readable)
    {
        Assert.Equal(readable, CtAccuracy.TryParse(token, secondary, ratedBurden, out var ct));
        Assert.Equal(readable, ct is not null);
        if (ct is not null)
        {
            Assert.Equal(token!.ToUpperInvariant(), ct.Token);
            Assert.Equal(20, ct.AccuracyLimitFactor);
            Assert.Equal(ratedBurden, ct.RatedBurden);
            Assert.Equal(secondary, ct.RatedSecondary);
        }
    }

    // IEEE C37.110: free of saturation up to a criterion of 20, saturated above it. C400 on 5 A (standard burden
    // 4 ohm, IEEE C57.13) into 0.5 ohm at X/R 15: 16 x 10 x 0.125 = 20 exactly; at 10.01 pu it is 20.02.
    [Fact]
    public void Saturation_limit_is_20_IeeeC37_110()
    {
        Assert.True(CtAccuracy.TryParse("C400", 5, null, out var ct));
        var at = ct.CheckSaturation(15, 10, 0.5);
        Assert.Equal(20, at.Criterion, 9);
        Assert.False(at.Saturates);
        var above = ct.CheckSaturation(15, 10.01, 0.5);
        Assert.Equal(20.02, above.Criterion, 9);
        Assert.True(above.Saturates);
        Assert.Equal(20, CtSaturation.Limit);
        Assert.Equal(0, CtSaturation.Criterion(0, 0, 5));
        Assert.Throws<ArgumentOutOfRangeException>(() => CtSaturation.Criterion(-1, 10, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => ct.CheckSaturation(15, 10, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => ct.MaximumSecondaryCurrent(0));
    }

    // Common practice (RMS of AC plus a decaying DC offset): X/R must be a number of zero or more; time and frequency
    // as for IEC 60909-0's time constant, T = (X/R) / (2 pi f), f above 0.
    [Fact]
    public void Asymmetry_inputs()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => AsymmetricalCurrent.DecayingRmsFactor(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => AsymmetricalCurrent.DecayingRmsFactor(-0.1));
        Assert.Throws<ArgumentOutOfRangeException>(() => AsymmetricalCurrent.RmsFactorAt(10, 60, -0.01));
        Assert.Throws<ArgumentOutOfRangeException>(() => AsymmetricalCurrent.RmsFactorAt(10, 0, 0.01));
        Assert.Equal(10 / (2 * Math.PI * 60), AsymmetricalCurrent.DcTimeConstant(10, 60), 15);
        Assert.Equal(1.0, AsymmetricalCurrent.RmsFactorAt(0, 60, 0.05));
    }

    // Common practice: a ground element with no pickup covers the whole winding; a pickup below 0 or no available
    // current is refused.
    [Fact]
    public void Ground_fault_coverage_edges()
    {
        Assert.Equal(100, GroundFaultCoverage.ProtectedPercent(0, 400));
        Assert.Equal(50, GroundFaultCoverage.ProtectedPercent(200, 400));
        Assert.Throws<ArgumentOutOfRangeException>(() => GroundFaultCoverage.ProtectedPercent(-1, 400));
        Assert.Throws<ArgumentOutOfRangeException>(() => GroundFaultCoverage.ProtectedPercent(10, 0));
    }

    // NFPA 70 430.32(A)(1): "1.15 or more" takes 125 %, just below it 115 %; a service factor of 0 or a negative rise
    // is no marking.
    [Fact]
    public void Nec_limit_edges_Nfpa70_430_32_A_1()
    {
        Assert.Equal(1.15, NecOverloadLimit.MaximumFraction(1.149));
        Assert.Equal(1.25, NecOverloadLimit.MaximumFraction(null, 39.9));
        Assert.Equal(1.15, NecOverloadLimit.MaximumFraction(null, 40.1));
        Assert.Throws<ArgumentOutOfRangeException>(() => NecOverloadLimit.MaximumFraction(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => NecOverloadLimit.MaximumFraction(1.0, -1));
    }

    // NEMA MG 1 Table 10-1: a code letter is one upper-case letter of the table; the LRC band of V is open-ended; an
    // unknown letter has no band. Common practice: LRC in proportion to voltage, 0 V draws nothing.
    [Fact]
    public void Code_letter_edges_NemaMg1_Table10_1()
    {
        Assert.True(LockedRotorCodes.TryParse("A", out var a));
        Assert.Equal(LockedRotorCodeLetter.A, a);
        Assert.True(LockedRotorCodes.TryParse("V", out var v));
        Assert.Equal(LockedRotorCodeLetter.V, v);
        Assert.False(LockedRotorCodes.TryParse("W", out _));
        Assert.False(LockedRotorCodes.TryParse("Z", out _));
        Assert.False(LockedRotorCodes.TryParse("[", out _));
        Assert.False(LockedRotorCodes.TryParse("@", out _));
        Assert.False(LockedRotorCodes.TryParse("GG", out _));
        Assert.False(LockedRotorCodes.TryParse("", out _));
        Assert.False(LockedRotorCodes.TryParse(null, out _));
        Assert.True(double.IsPositiveInfinity(LockedRotorCodes.LockedRotorCurrentRangeFromWatts(LockedRotorCodeLetter.V, 372_849.936, 4000).Maximum));
        Assert.Throws<ArgumentOutOfRangeException>(() => LockedRotorCodes.Range((LockedRotorCodeLetter)19));
        Assert.Throws<ArgumentOutOfRangeException>(() => LockedRotorCodes.Range((LockedRotorCodeLetter)(-1)));
        Assert.Throws<ArgumentOutOfRangeException>(() => LockedRotorCodes.LockedRotorCurrentRangeFromWatts(LockedRotorCodeLetter.G, 0, 4000));
        Assert.Equal(0, LockedRotorCodes.ScaleToVoltage(600, 4000, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => LockedRotorCodes.ScaleToVoltage(600, 0, 4000));
    }

    // Common practice: the sooner of two trips acts; a trip needs a time of zero or more; "0 s" is immediate.
    [Fact]
    public void Trip_time_edges()
    {
        Assert.Equal(TripTime.After(1), TripTime.Earliest(TripTime.After(1), TripTime.Never));
        Assert.Equal(TripTime.After(1), TripTime.Earliest(TripTime.After(2), TripTime.After(1)));
        Assert.True(TripTime.Immediate.Trips);
        Assert.Equal(0, TripTime.Immediate.Seconds);
        Assert.Equal("0 s", TripTime.Immediate.ToString());
        Assert.Throws<ArgumentOutOfRangeException>(() => TripTime.After(-0.001));
    }
}
