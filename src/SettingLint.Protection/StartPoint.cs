namespace SettingLint.Protection;

/// <summary>
/// One way a motor may start, as the thermal element sees it: a current held for a time. The current is taken as
/// constant over the whole time, which is conservative for a direct-on-line start (the current falls as the motor
/// nears full speed) and close for a soft starter held at its current limit; common practice.
/// </summary>
public sealed record StartPoint
{
    /// <summary>Creates a start point from a current (A) and a duration (s); both finite, the current above zero.</summary>
    public StartPoint(double current, double duration)
    {
        Current = Guard.Positive(current);
        Duration = Guard.NonNegative(duration);
    }

    /// <summary>Current drawn during the start, A.</summary>
    public double Current { get; }

    /// <summary>How long the start lasts, s.</summary>
    public double Duration { get; }
}
