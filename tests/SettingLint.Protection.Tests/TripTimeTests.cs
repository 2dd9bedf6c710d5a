namespace SettingLint.Protection.Tests;

public sealed class TripTimeTests
{
    // Common practice: "never" is a state, not a number; default is never.
    [Fact]
    public void Never_IsDefault_CommonPractice()
    {
        Assert.Equal(TripTime.Never, default);
        Assert.False(TripTime.Never.Trips);
        Assert.True(double.IsPositiveInfinity(TripTime.Never.Seconds));
        Assert.Equal("never", TripTime.Never.ToString());
    }

    // Common practice: the earliest of parallel elements acts; a trip beats never.
    [Fact]
    public void Earliest_CommonPractice()
    {
        Assert.Equal(TripTime.After(0.2), TripTime.Earliest(TripTime.After(0.5), TripTime.After(0.2)));
        Assert.Equal(TripTime.After(3), TripTime.Earliest(TripTime.Never, TripTime.After(3)));
        Assert.Equal(TripTime.Never, TripTime.Earliest(TripTime.Never, TripTime.Never));
        Assert.Equal("0.25 s", TripTime.After(0.25).ToString());
    }
}
