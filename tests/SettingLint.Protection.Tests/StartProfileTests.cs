namespace SettingLint.Protection.Tests;

/// <summary>
/// The start profile and the checks read from it. Trip times are the IEC 60255-149 operate-time equation
/// t = tau ln((x - h) / (x - 1)), x = (I / (k IB))^2 (IEC 60255-149:2013, the clause of the thermal characteristic
/// equations; from memory, the clause number not checked), worked by hand beside each assertion. The stall time at a current below LRC is the
/// safe stall time x (LRC / I)^2, constant I^2 t: common practice.
/// </summary>
public sealed class StartProfileTests
{
    // Soft-started motor: 400 V, FLC 280 A, LRC 7 x FLC = 1960 A, 30 s ramp at a 3.5 x FLC = 980 A limit;
    // thermal pickup 1.05 x FLC = 294 A, tau 10 min = 600 s, full-load level 25 %.
    private static readonly ThermalModel SoftModel = new(294, 600, 1800, fullLoadLevel: 0.25);

    private static StartProfile SoftStart => StartProfile.For(1960, 30, softStartCurrentLimit: 980);

    // Reduced-voltage start: FLC 280 A, LRC 6 x FLC = 1680 A; 7 s at 100 %, 12 s at 80 %;
    // thermal pickup 1.05 x FLC = 294 A, tau 450 s, full-load level 19 %.
    private static readonly ThermalModel ReducedModel = new(294, 450, 1350, fullLoadLevel: 0.19);

    private static StartProfile ReducedStart => StartProfile.For(1680, 7, 12, startingVoltage: 0.8);

    // A soft starter holds the start at its limit: one start, 980 A for the 30 s ramp; a stall during it draws 980 A.
    [Fact]
    public void SoftStart_IsHeldAtTheLimit_CommonPractice()
    {
        var p = SoftStart;
        var point = Assert.Single(p.Points);
        Assert.Equal(980, point.Current, 1e-9);
        Assert.Equal(30, point.Duration, 1e-9);
        Assert.Equal(980, p.StallCurrent, 1e-9);
        Assert.True(p.IsSoftStart);
    }

    // Common practice, constant I^2 t: a stall at 3.5 x from a 7 x motor may last (7 / 3.5)^2 = 4 x the safe stall
    // time: 15 s hot gives 60 s, 20 s cold gives 80 s.
    [Fact]
    public void SoftStart_StallTimeScalesWithCurrentSquared_CommonPractice()
    {
        Assert.Equal(4.0, SoftStart.StallTimeFactor, 1e-12);
        Assert.Equal(60.0, SoftStart.StallTime(15), 1e-9);
        Assert.Equal(80.0, SoftStart.StallTime(20), 1e-9);
    }

    // IEC 60255-149 by hand at 980 A: x = (980 / 294)^2 = 11.1111.
    // Cold: t = 600 ln(11.1111 / 10.1111) = 600 x 0.094311 = 56.59 s (about 57 s).
    // Hot from 0.25: t = 600 ln(10.8611 / 10.1111) = 600 x 0.071553 = 42.93 s (about 43 s).
    // Both exceed 1.1 x 30 s = 33 s, so the ramp fits hot and cold.
    [Fact]
    public void SoftStart_RampFitsHotAndCold_Iec60255_149()
    {
        var cold = SoftStart.Tightest(SoftModel, 0);
        Assert.Equal(56.59, cold.Trip.Seconds, 0.01);
        Assert.Equal(980, cold.Point.Current, 1e-9);
        var hot = SoftStart.Tightest(SoftModel, 0.25);
        Assert.Equal(42.93, hot.Trip.Seconds, 0.01);
        Assert.True(hot.Ratio >= 1.1);
    }

    // IEC 60255-149 by hand at LRC 1960 A: x = (1960 / 294)^2 = 44.4444.
    // Cold: t = 600 ln(44.4444 / 43.4444) = 600 x 0.022757 = 13.65 s < 20 s cold stall.
    // Hot: t = 600 ln(44.1944 / 43.4444) = 600 x 0.017116 = 10.27 s < 15 s hot stall.
    // A stall once the ramp has ended is at LRC, and the model protects it.
    [Fact]
    public void SoftStart_StallAtFullVoltageIsProtected_Iec60255_149()
    {
        Assert.Equal(13.65, SoftModel.ColdTripTime(1960).Seconds, 0.01);
        Assert.Equal(10.27, SoftModel.TripTimeFrom(1960, 0.25).Seconds, 0.01);
    }

    // A limit above what the motor can draw at the starting voltage is not reached: 8 x FLC limit on a 7 x motor at
    // 90 % gives 0.9 x 1960 = 1764 A; common practice.
    [Fact]
    public void SoftStart_LimitAboveTheMotorsCurrent_IsCappedAtLrcAtThatVoltage_CommonPractice()
    {
        var p = StartProfile.For(1960, 30, startingVoltage: 0.9, softStartCurrentLimit: 2240);
        Assert.Equal(1764, Assert.Single(p.Points).Current, 1e-9);
    }

    // Reduced voltage: two starts, LRC for 7 s at 100 % and 0.8 x 1680 = 1344 A for 12 s at 80 % (the locked-rotor
    // current in proportion to the voltage, common practice). A stall at 80 % may last 13 / 0.8^2 = 20.31 s hot.
    [Fact]
    public void ReducedVoltage_TwoStarts_StallAtTheLowestVoltage_CommonPractice()
    {
        var p = ReducedStart;
        Assert.Equal(2, p.Points.Count);
        Assert.Equal(1680, p.Points[0].Current, 1e-9);
        Assert.Equal(7, p.Points[0].Duration, 1e-9);
        Assert.Equal(1344, p.Points[1].Current, 1e-9);
        Assert.Equal(12, p.Points[1].Duration, 1e-9);
        Assert.Equal(12, p.LongestDuration, 1e-9);
        Assert.Equal(1344, p.StallCurrent, 1e-9);
        Assert.Equal(20.3125, p.StallTime(13), 1e-9);
    }

    // IEC 60255-149 by hand, hot from 0.19.
    // At 1680 A: x = (1680 / 294)^2 = 32.6531; t = 450 ln(32.4631 / 31.6531) = 450 x 0.025268 = 11.37 s: the 11.4 s
    // the old check compared with the 12 s start at 80 %. Over the 7 s start at 100 % it is 11.37 / 7 = 1.62.
    // At 1344 A: x = 0.64 x 32.6531 = 20.8980; t = 450 ln(20.7080 / 19.8980) = 450 x 0.039901 = 17.96 s (about 18 s);
    // 17.96 / 12 = 1.50. The tightest point is the 12 s start, and it fits with the 1.1 margin.
    [Fact]
    public void ReducedVoltage_HotStartFits_AtEveryPoint_Iec60255_149()
    {
        Assert.Equal(11.37, ReducedModel.TripTimeFrom(1680, 0.19).Seconds, 0.01);
        var hot = ReducedStart.Tightest(ReducedModel, 0.19);
        Assert.Equal(1344, hot.Point.Current, 1e-9);
        Assert.Equal(17.96, hot.Trip.Seconds, 0.01);
        Assert.Equal(1.496, hot.Ratio, 0.001);
    }

    // The tightest point is the smallest trip / duration, not the longest start: a 10 s start at 100 % with the same
    // 12 s at 80 % from cold: at 1680 A t = 450 ln(32.6531 / 31.6531) = 450 x 0.031103 = 14.00 s, 14.00 / 10 = 1.40;
    // at 1344 A t = 450 ln(20.8980 / 19.8980) = 450 x 0.049034 = 22.07 s, 22.07 / 12 = 1.84; IEC 60255-149.
    [Fact]
    public void Tightest_IsTheSmallestRatio_Iec60255_149()
    {
        var p = StartProfile.For(1680, 10, 12, startingVoltage: 0.8);
        var cold = p.Tightest(ReducedModel, 0);
        Assert.Equal(1680, cold.Point.Current, 1e-9);
        Assert.Equal(14.00, cold.Trip.Seconds, 0.01);
        Assert.Equal(1.400, cold.Ratio, 0.001);
    }

    // Direct-on-line at rated voltage: one start at LRC for the longest time, a stall at LRC (factor 1); common practice.
    [Fact]
    public void DirectOnLine_IsLrcForTheLongestStart_CommonPractice()
    {
        var p = StartProfile.For(600, 4.5, 6.5);
        var point = Assert.Single(p.Points);
        Assert.Equal(600, point.Current, 1e-9);
        Assert.Equal(6.5, point.Duration, 1e-9);
        Assert.Equal(1.0, p.StallTimeFactor, 1e-12);
        Assert.False(p.IsSoftStart);
    }

    // A lower voltage with no start time at it: only the rated-voltage start is known, and its stall is not
    // lengthened; common practice (no guess at the longer start).
    [Fact]
    public void ReducedVoltage_WithoutItsStartTime_KeepsTheStallAtLrc_CommonPractice()
    {
        var p = StartProfile.For(1680, 7, startingVoltage: 0.8);
        Assert.Equal(1680, Assert.Single(p.Points).Current, 1e-9);
        Assert.Equal(1.0, p.StallTimeFactor, 1e-12);
    }

    // IEC 60255-149 model, by hand, a start from cold then a further start (cooling tau 1440 s): LRC 468 A for 11 s,
    // pickup 89.7 A, tau 480 s: x = (468 / 89.7)^2 = 27.2212, d = exp(-11 / 480) = 0.977344, p = x (1 - d) = 0.6167;
    // a further start fits from below (1 - p) / d = 0.3922; cooling 1440 ln(0.6167 / 0.3922) = 652.0 s; start to
    // start 11 + 652.0 = 663.0 s. The one-start profile gives what the single-start algebra gave.
    [Fact]
    public void TimeBetweenStarts_DirectOnLine_Iec60255_149()
    {
        var model = new ThermalModel(89.7, 480, 1440);
        var p = StartProfile.For(468, 11);
        Assert.Equal(0.6167, p.PeakLevel(model, 0), 0.0001);
        Assert.Equal(0.3922, p.RestartLevel(model), 0.0001);
        Assert.Equal(663.0, p.TimeBetweenStarts(model), 0.1);
    }

    // IEC 60255-149 model, by hand, reduced voltage (cooling tau 1350 s):
    // 1680 A for 7 s: x = 32.6531, d = exp(-7 / 450) = 0.984565, p = 0.5040, (1 - p) / d = 0.5038;
    // 1344 A for 12 s: x = 20.8980, d = exp(-12 / 450) = 0.973686, p = 0.5499, (1 - p) / d = 0.4622.
    // Every start fits from below 0.4622. After the 12 s start: 12 + 1350 ln(0.5499 / 0.4622) = 246.4 s; after the
    // 7 s one: 7 + 1350 ln(0.5040 / 0.4622) = 123.8 s; the longer is needed. Taking LRC for the 12 s start instead
    // (p = 0.8592, from below 0.1446) would ask for 12 + 1350 ln(0.8592 / 0.1446) = 2418 s, ten times as long.
    [Fact]
    public void TimeBetweenStarts_ReducedVoltage_Iec60255_149()
    {
        Assert.Equal(0.5499, ReducedStart.PeakLevel(ReducedModel, 0), 0.0001);
        Assert.Equal(0.4622, ReducedStart.RestartLevel(ReducedModel), 0.0001);
        Assert.Equal(246.4, ReducedStart.TimeBetweenStarts(ReducedModel), 0.1);
        Assert.Equal(2418.1, StartProfile.For(1680, 12).TimeBetweenStarts(ReducedModel), 0.1);
    }

    // IEC 60255-149 model: a start that does not fit from cold leaves no level to cool to: 1680 A for 30 s with tau
    // 450 s ends at 32.6531 (1 - exp(-30 / 450)) = 2.106 > 1, so no interval is long enough.
    [Fact]
    public void TimeBetweenStarts_IsInfinite_WhenAStartDoesNotFit_Iec60255_149() =>
        Assert.True(double.IsPositiveInfinity(StartProfile.For(1680, 30).TimeBetweenStarts(ReducedModel)));

    // Common practice: bad inputs throw instead of giving NaN times.
    [Fact]
    public void InvalidInputs_Throw_CommonPractice()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => StartProfile.For(0, 5));
        Assert.Throws<ArgumentOutOfRangeException>(() => StartProfile.For(600, 5, startingVoltage: 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => StartProfile.For(600, 5, softStartCurrentLimit: -1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new StartPoint(600, double.NaN));
    }
}
