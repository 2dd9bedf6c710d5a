namespace SettingLint.Protection.Tests;

/// <summary>
/// Pins the edges of the IEC 60255-149 thermal replica: the trip level itself (a level of exactly 1 trips, a start
/// that ends exactly on 1 does not fit), the pickup itself (x = 1 never trips), the full-load level's allowed range,
/// and the start profile's choices at their switch-over points.
/// </summary>
public sealed class ThermalBoundaryMutationTests
{
    // k IB 105 A, tau 900 s, cooling 2700 s; 210 A gives x = (210 / 105)^2 = 4 exactly, so sums below are exact.
    private static readonly ThermalModel Model = new(105, 900, 2700);

    // IEC 60255-149: the element trips when the level reaches 1. A start of no duration from level 1 at x = 4 ends at
    // 4 + (1 - 4) exp(0) = 1: it does not fit, with no headroom.
    [Fact]
    public void A_start_ending_exactly_on_the_trip_level_does_not_fit_Iec60255_149()
    {
        var fit = Model.CheckStart(new StartPoint(210, 0), 1.0);
        Assert.Equal(1.0, fit.PeakLevel);
        Assert.Equal(1.0, fit.EndLevel);
        Assert.False(fit.Fits);
        Assert.Equal(0.0, fit.Headroom);
    }

    // IEC 60255-149 by hand: 210 A for 900 s (one tau) from 0: 4 (1 - 1/e) = 2.528482; then 0 A for 900 s:
    // 2.528482 / e = 0.930176. The peak is the level after the start, the end the level after the load time.
    [Fact]
    public void The_load_phase_follows_the_start_Iec60255_149()
    {
        var fit = Model.CheckStart(new StartPoint(210, 900), 0, loadCurrent: 0, loadTime: 900);
        Assert.Equal(4 * (1 - (1 / Math.E)), fit.PeakLevel, 1e-9);
        Assert.Equal(4 * (1 - (1 / Math.E)) / Math.E, fit.EndLevel, 1e-9);
        Assert.False(fit.Fits);
        Assert.Equal(1 - fit.PeakLevel, fit.Headroom, 1e-12);
    }

    // IEC 60255-149: a level already above the whole start is the peak (the start cools it): from 0.9 at 0 A for 10 s.
    [Fact]
    public void The_start_level_can_be_the_peak_Iec60255_149()
    {
        var fit = new ThermalModel(105, 900, 2700).CheckStart(new StartPoint(1e-9, 10), 0.9);
        Assert.Equal(0.9, fit.PeakLevel, 1e-12);
        Assert.True(fit.EndLevel < 0.9);
        Assert.True(fit.Fits);
    }

    // IEC 60255-149: the full-load (hot) level is a share of the trip level in [0, 1); 0 and just below 1 are allowed.
    [Fact]
    public void Full_load_level_range_Iec60255_149()
    {
        Assert.Equal(0.0, new ThermalModel(105, 900, 2700, 0).FullLoadLevel);
        Assert.Equal(0.999, new ThermalModel(105, 900, 2700, 0.999).FullLoadLevel);
        Assert.Null(new ThermalModel(105, 900, 2700).FullLoadLevel);
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 2700, -0.001));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 2700, double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 2700, double.PositiveInfinity));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 0));
        Assert.Equal(2700, new ThermalModel(105, 900, 2700).CoolingTimeConstant);
    }

    // IEC 60255-149 by hand: 210 A from 0.2 for 900 s: 4 + (0.2 - 4) / e = 2.602059 (not 4 - 3.8 e, not a growth).
    [Fact]
    public void Level_after_running_Iec60255_149() =>
        Assert.Equal(4 + ((0.2 - 4) / Math.E), Model.LevelAfterRunning(0.2, 210, 900), 1e-9);

    // IEC 60255-149: at a level of 1 the element has tripped, even below pickup; exactly at pickup (x = 1) from a
    // level below 1 it never trips. Just above pickup it trips, late.
    [Fact]
    public void Trip_level_and_pickup_edges_Iec60255_149()
    {
        Assert.Equal(TripTime.Immediate, Model.TripTimeFrom(50, 1.0));
        Assert.Equal(TripTime.Never, Model.TripTimeFrom(105, 0.999));
        Assert.True(Model.TripTimeFrom(106, 0).Trips);
        Assert.Throws<ArgumentOutOfRangeException>(() => Model.TripTimeFrom(600, -0.1));
    }

    // IEC 60255-149 by hand: cooling from 0.8 to 0.2 with tau_cool 2700 s takes 2700 ln 4 = 3743.0 s; from a level at or
    // below the target, none; a target of 0 is never reached; a NaN target is refused.
    [Fact]
    public void Cooling_time_Iec60255_149()
    {
        Assert.Equal(2700 * Math.Log(4), Model.CoolingTime(0.8, 0.2)!.Value, 1e-9);
        Assert.Equal(0.0, Model.CoolingTime(0.2, 0.2));
        Assert.Null(Model.CoolingTime(0.2, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => Model.CoolingTime(0.2, double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => Model.CoolingTime(-0.2, 0.1));
    }

    // IEC 60255-149 hot curve with IP = FLC: (100 / 105)^2 = 0.907029 without a set level, the set level when given.
    [Fact]
    public void Hot_start_level_Iec60255_149()
    {
        Assert.Equal(Math.Pow(100.0 / 105, 2), Model.HotStartLevel(100), 1e-12);
        Assert.Equal(0.3, new ThermalModel(105, 900, 2700, 0.3).HotStartLevel(100));
        Assert.Equal(Model.TripTimeFrom(600, Math.Pow(100.0 / 105, 2)), Model.HotTripTime(600, 100));
    }

    // Common practice, constant current over a start: a start point keeps what it was given.
    [Fact]
    public void Start_point_keeps_its_values()
    {
        var p = new StartPoint(600, 7.5);
        Assert.Equal(600, p.Current);
        Assert.Equal(7.5, p.Duration);
    }

    // Common practice (docs/rule-language.md start profile table): exactly rated voltage is a direct-on-line start at LRC,
    // one start for the longest time even when a longer time is given; a longest time shorter than the rated-voltage one
    // does not shorten the start.
    [Fact]
    public void Start_profile_at_rated_voltage_CommonPractice()
    {
        var p = StartProfile.For(600, 8, 12, startingVoltage: 1.0);
        var point = Assert.Single(p.Points);
        Assert.Equal(600, point.Current);
        Assert.Equal(12, point.Duration);
        Assert.Equal(600, p.StallCurrent);
        Assert.Equal(600, p.LockedRotorCurrent);
        Assert.False(p.IsSoftStart);
        Assert.Equal(8, Assert.Single(StartProfile.For(600, 8, 6).Points).Duration);
        Assert.Equal(8, StartProfile.For(600, 8, 6).LongestDuration);
    }

    // Common practice: a soft starter's limit below what the motor draws at the voltage is the start current; its ramp
    // is the longest time; the voltage alone (no limit) at 100 % is not a soft start.
    [Fact]
    public void Soft_start_limit_CommonPractice()
    {
        var p = StartProfile.For(1960, 20, 30, startingVoltage: 0.9, softStartCurrentLimit: 980);
        var point = Assert.Single(p.Points);
        Assert.Equal(980, point.Current);
        Assert.Equal(30, point.Duration);
        Assert.Equal(980, p.StallCurrent);
        Assert.True(p.IsSoftStart);
        Assert.Throws<ArgumentOutOfRangeException>(() => StartProfile.For(1960, 20, -1));
        Assert.False(StartProfile.For(1680, 7, startingVoltage: 0.8).IsSoftStart);
        Assert.False(StartProfile.For(1680, 7, 12, startingVoltage: 0.8).IsSoftStart);
        Assert.Throws<ArgumentOutOfRangeException>(() => StartProfile.For(1960, -1));
    }

    // The profile as messages show it: "current A for duration s", starts joined by "; ".
    [Fact]
    public void Start_profile_text()
    {
        Assert.Equal("1680 A for 7 s; 1344 A for 12 s", StartProfile.For(1680, 7, 12, startingVoltage: 0.8).ToString());
        Assert.Equal("980 A for 30 s", StartProfile.For(1960, 30, softStartCurrentLimit: 980).ToString());
    }

    // A start that takes no time leaves infinite room (trip time over duration), whatever the trip time.
    [Fact]
    public void A_start_of_no_duration_has_infinite_room()
    {
        Assert.True(double.IsPositiveInfinity(new StartTrip(new StartPoint(600, 0), TripTime.After(5)).Ratio));
        Assert.True(double.IsPositiveInfinity(new StartTrip(new StartPoint(600, 0), TripTime.Immediate).Ratio));
        Assert.Equal(2.5, new StartTrip(new StartPoint(600, 2), TripTime.After(5)).Ratio);
    }

    // IEC 60255-149 model: the peak of a profile is that of its hottest start, and with no start in the way the level
    // cannot be below 0 (a start from 0 at a tiny current peaks near 0, not at a negative number).
    [Fact]
    public void Profile_peak_is_the_hottest_start_Iec60255_149()
    {
        var reduced = StartProfile.For(1680, 7, 12, startingVoltage: 0.8);
        var model = new ThermalModel(294, 450, 1350);
        var peaks = reduced.Points.Select(p => model.CheckStart(p, 0.1).PeakLevel).ToArray();
        Assert.Equal(peaks.Max(), reduced.PeakLevel(model, 0.1), 12);
        Assert.True(peaks[0] < peaks[1]);
    }
}
