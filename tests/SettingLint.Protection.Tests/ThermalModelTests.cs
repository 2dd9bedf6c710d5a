namespace SettingLint.Protection.Tests;

public sealed class ThermalModelTests
{
    // Worked example, IEC 60255-149 equations: FLC = IB = 100 A, k = 1.05 so k IB = 105 A,
    // tau = 900 s, cooling 2700 s, I = 600 A (6 x FLC).
    private static readonly ThermalModel Model = new(105, 900, 2700);

    // IEC 60255-149 cold curve by hand: x = (600 / 105)^2 = 32.6531; x / (x - 1) = 32.6531 / 31.6531
    // = 1.031593; ln = 0.0311037; t = 900 x 0.0311037 = 27.99 s.
    [Fact]
    public void ColdTrip_WorkedExample_Iec60255_149()
    {
        var time = Model.ColdTripTime(600);
        Assert.True(time.Trips);
        Assert.Equal(27.99, time.Seconds, 0.01);
    }

    // IEC 60255-149 hot curve by hand, IP = FLC = 100 A: h = (100 / 105)^2 = 0.907029;
    // (x - h) / (x - 1) = 31.74603 / 31.65306 = 1.0029372; ln = 0.0029329; t = 900 x 0.0029329 = 2.640 s.
    [Fact]
    public void HotTrip_WorkedExample_Iec60255_149()
    {
        var time = Model.HotTripTime(600, 100);
        Assert.True(time.Trips);
        Assert.Equal(2.640, time.Seconds, 0.001);
    }

    // IEC 60255-149: a set full-load level replaces (FLC / k IB)^2 as the hot start level.
    [Fact]
    public void HotStartLevel_UsesSetFullLoadLevel_Iec60255_149()
    {
        var withLevel = new ThermalModel(105, 900, 2700, fullLoadLevel: 0.5);
        Assert.Equal(0.5, withLevel.HotStartLevel(100), 1e-12);
        Assert.Equal(0.907029, Model.HotStartLevel(100), 1e-6);
    }

    // IEC 60255-149: the steady level is x = (I / k IB)^2; 210 A gives 4.
    [Fact]
    public void SteadyLevel_Iec60255_149() => Assert.Equal(4.0, Model.SteadyLevel(210), 1e-12);

    // IEC 60255-149: at or below pickup (x <= 1) the element never trips.
    [Theory]
    [InlineData(105)]
    [InlineData(50)]
    [InlineData(0)]
    public void AtOrBelowPickup_NeverTrips_Iec60255_149(double current)
    {
        var time = Model.TripTimeFrom(current, 0.9);
        Assert.False(time.Trips);
        Assert.True(double.IsPositiveInfinity(time.Seconds));
    }

    // IEC 60255-149: a level already at or above the trip level trips at once, whatever the current.
    [Theory]
    [InlineData(600, 1.0)]
    [InlineData(600, 1.2)]
    [InlineData(50, 1.0)]
    public void LevelAtOrAboveOne_TripsAtOnce_Iec60255_149(double current, double level)
    {
        var time = Model.TripTimeFrom(current, level);
        Assert.True(time.Trips);
        Assert.Equal(0, time.Seconds);
    }

    // IEC 60255-149 closed form h(t) = x + (h0 - x) exp(-t / tau) against a numerical
    // integration (RK4, 0.01 s steps) of dh/dt = (x - h) / tau: the trip time from 0.3 at 600 A
    // and the level after 60 s at 150 A.
    [Fact]
    public void ClosedForm_MatchesNumericalIntegration_Iec60255_149()
    {
        const double tau = 900;
        const double step = 0.01;
        var x = (600.0 / 105) * (600.0 / 105);
        static double Slope(double level, double steady) => (steady - level) / tau;

        var h = 0.3;
        var t = 0.0;
        double? crossing = null;
        while (crossing is null && t < 200)
        {
            var k1 = Slope(h, x);
            var k2 = Slope(h + (step * k1 / 2), x);
            var k3 = Slope(h + (step * k2 / 2), x);
            var k4 = Slope(h + (step * k3), x);
            var next = h + (step * (k1 + (2 * k2) + (2 * k3) + k4) / 6);
            if (next >= 1)
            {
                crossing = t + (step * (1 - h) / (next - h));
            }

            h = next;
            t += step;        }

        Assert.NotNull(crossing);
        Assert.Equal(crossing.Value, Model.TripTimeFrom(600, 0.3).Seconds, 0.001);

        // Integrate separately for 60 s at a current that does not trip within it (I = 150 A).
        var x2 = (150.0 / 105) * (150.0 / 105);
        var h2 = 0.2;
        for (var i = 0; i < 6000; i++)
        {
            var k1 = Slope(h2, x2);
            var k2 = Slope(h2 + (step * k1 / 2), x2);
            var k3 = Slope(h2 + (step * k2 / 2), x2);
            var k4 = Slope(h2 + (step * k3), x2);
            h2 += step * (k1 + (2 * k2) + (2 * k3) + k4) / 6;
        }

        Assert.Equal(h2, Model.LevelAfterRunning(0.2, 150, 60), 1e-9);
    }

    // IEC 60255-149: cooling time tau_cool ln(h0 / h1); 0.8 -> 0.4 is 2700 ln 2 = 1871.5 s.
    [Fact]
    public void CoolingTime_Iec60255_149()
    {
        var time = Model.CoolingTime(0.8, 0.4);
        Assert.NotNull(time);
        Assert.Equal(1871.5, time.Value, 0.1);
    }

    // IEC 60255-149: already cool enough is 0; a target of 0 or below is never reached.
    [Fact]
    public void CoolingTime_EdgeCases_Iec60255_149()
    {
        Assert.Equal(0.0, Model.CoolingTime(0.3, 0.4));
        Assert.Null(Model.CoolingTime(0.3, 0));
        Assert.Null(Model.CoolingTime(0.3, -0.1));
    }

    // IEC 60255-149 model, common practice start check, by hand: LRC 600 A for 10 s from cold,
    // x = 32.6531: h = 32.6531 (1 - exp(-10 / 900)) = 32.6531 x 0.0110496 = 0.36080; then 100 A
    // (x = 0.907029) for 60 s: h = 0.907029 + (0.36080 - 0.907029) x 0.935507 = 0.39603, still
    // rising towards x, so the peak is the end level.
    [Fact]
    public void StartFits_FromCold_PeakAtEnd_Iec60255_149()
    {
        var fit = Model.CheckStart(new StartPoint(600, 10), 0, 100, 60);
        Assert.True(fit.Fits);
        Assert.Equal(0.3960, fit.PeakLevel, 0.0001);
        Assert.Equal(0.3960, fit.EndLevel, 0.0001);
        Assert.Equal(0.6040, fit.Headroom, 0.0001);
    }

    // Same start, then 50 A (x = 0.226757): the level falls after acceleration, so the peak is
    // 0.36080 and the end 0.226757 + (0.36080 - 0.226757) x 0.935507 = 0.35216.
    [Fact]
    public void StartFits_FromCold_PeakAtEndOfAcceleration_Iec60255_149()
    {
        var fit = Model.CheckStart(new StartPoint(600, 10), 0, 50, 60);
        Assert.True(fit.Fits);
        Assert.Equal(0.3608, fit.PeakLevel, 0.0001);
        Assert.Equal(0.3522, fit.EndLevel, 0.0001);
        Assert.Equal(1 - fit.PeakLevel, fit.Headroom, 1e-12);
    }

    // IEC 60255-149: from hot (0.907) a 10 s start at 600 A passes 1 (hot trip time 2.64 s).
    [Fact]
    public void StartDoesNotFit_FromHot_Iec60255_149()
    {
        var fit = Model.CheckStart(new StartPoint(600, 10), Model.HotStartLevel(100));
        Assert.False(fit.Fits);
        Assert.True(fit.Headroom < 0);
        Assert.Equal(fit.EndLevel, fit.PeakLevel, 1e-12);
    }

    // Common practice: invalid constants are rejected rather than producing NaN times.
    [Fact]
    public void InvalidInputs_Throw_CommonPractice()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(0, 900, 2700));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, double.NaN, 2700));
        Assert.Throws<ArgumentOutOfRangeException>(() => new ThermalModel(105, 900, 2700, 1.0));
        Assert.Throws<ArgumentOutOfRangeException>(() => Model.TripTimeFrom(-1, 0));
    }
}
