using System.Globalization;

namespace SettingLint.Protection;

/// <summary>
/// Outcome of an operate-time calculation: either the element trips after <see cref="Seconds"/>,
/// or it never trips. A type rather than a bare number so "never" cannot be mistaken for a time.
/// </summary>
public readonly record struct TripTime
{
    // Stored as 0 for "never" so that default(TripTime) equals Never.
    private readonly double _seconds;

    private TripTime(bool trips, double seconds)
    {
        Trips = trips;
        _seconds = seconds;
    }

    /// <summary>The element that never operates (e.g. current at or below pickup); common practice.</summary>
    public static TripTime Never => default;

    /// <summary>The element operates at once, time 0 s; common practice.</summary>
    public static TripTime Immediate => new(true, 0);

    /// <summary>True when the element operates.</summary>
    public bool Trips { get; }

    /// <summary>Operate time in s when <see cref="Trips"/> is true; positive infinity when it never trips.</summary>
    public double Seconds => Trips ? _seconds : double.PositiveInfinity;

    /// <summary>A trip after the given time in s (finite, not negative); common practice.</summary>
    public static TripTime After(double seconds) => new(true, Guard.NonNegative(seconds));

    /// <summary>The sooner of two outcomes (a trip beats never), as parallel elements act; common practice.</summary>
    public static TripTime Earliest(TripTime first, TripTime second) =>
        first.Seconds <= second.Seconds ? first : second;

    /// <summary>Invariant text, e.g. "2.5 s" or "never"; common practice.</summary>
    public override string ToString() =>
        Trips ? _seconds.ToString("R", CultureInfo.InvariantCulture) + " s" : "never";
}
