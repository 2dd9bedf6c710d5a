namespace SettingLint.Protection;

/// <summary>
/// A motor start as seen by the thermal element: locked-rotor current for the acceleration
/// time, then load current for an optional further time.
/// </summary>
public sealed record StartProfile
{
    /// <summary>Creates a start profile from LRC (A), acceleration time (s), load current (A) and load time (s); common practice.</summary>
    public StartProfile(double lockedRotorCurrent, double accelerationTime, double loadCurrent = 0, double loadTime = 0)
    {
        LockedRotorCurrent = Guard.NonNegative(lockedRotorCurrent);
        AccelerationTime = Guard.NonNegative(accelerationTime);
        LoadCurrent = Guard.NonNegative(loadCurrent);
        LoadTime = Guard.NonNegative(loadTime);
    }

    /// <summary>Locked-rotor (starting) current in A.</summary>
    public double LockedRotorCurrent { get; }

    /// <summary>Acceleration time in s at locked-rotor current.</summary>
    public double AccelerationTime { get; }

    /// <summary>Running current in A after acceleration.</summary>
    public double LoadCurrent { get; }

    /// <summary>Time in s at load current after acceleration; 0 to stop at the end of acceleration.</summary>
    public double LoadTime { get; }
}
