namespace SettingLint.Protection;

/// <summary>
/// First-order thermal replica of IEC 60255-149. Thermal levels are shares of the trip level:
/// the element trips when the level reaches 1, and running steadily at current I settles at
/// x = (I / (k IB))^2.
/// </summary>
public sealed record ThermalModel
{
    /// <summary>Creates a model from pickup k IB (A), heating and cooling time constants (s) and an optional hot level; IEC 60255-149.</summary>
    /// <param name="pickupCurrent">Thermal pickup k IB in A: the current whose steady level is exactly the trip level.</param>
    /// <param name="heatingTimeConstant">Heating time constant tau in s.</param>
    /// <param name="coolingTimeConstant">Cooling time constant in s, used while the motor is stopped.</param>
    /// <param name="fullLoadLevel">Level at full load for hot starts, a share of the trip level in [0, 1); null to derive it from FLC.</param>
    public ThermalModel(double pickupCurrent, double heatingTimeConstant, double coolingTimeConstant, double? fullLoadLevel = null)
    {
        PickupCurrent = Guard.Positive(pickupCurrent);
        HeatingTimeConstant = Guard.Positive(heatingTimeConstant);
        CoolingTimeConstant = Guard.Positive(coolingTimeConstant);
        if (fullLoadLevel is { } level && (!double.IsFinite(level) || level < 0 || level >= 1))
        {
            // A hot level at or above 1 would mean the motor trips while carrying full load.
            throw new ArgumentOutOfRangeException(nameof(fullLoadLevel), level, "Full-load level must be in [0, 1).");
        }

        FullLoadLevel = fullLoadLevel;
    }

    /// <summary>Thermal pickup k IB in A.</summary>
    public double PickupCurrent { get; }

    /// <summary>Heating time constant tau in s.</summary>
    public double HeatingTimeConstant { get; }

    /// <summary>Cooling time constant in s (motor stopped).</summary>
    public double CoolingTimeConstant { get; }

    /// <summary>Optional full-load level (share of trip level) used as the hot start level.</summary>
    public double? FullLoadLevel { get; }

    /// <summary>Steady level x = (I / (k IB))^2 reached after running long at a current in A; IEC 60255-149 thermal model.</summary>
    public double SteadyLevel(double current)
    {
        var ratio = Guard.NonNegative(current) / PickupCurrent;
        return ratio * ratio;
    }

    /// <summary>Trip time t = tau ln((x - h) / (x - 1)) from start level h; level at or above 1 trips at once, x at or below 1 never trips; IEC 60255-149 operate-time equation.</summary>
    public TripTime TripTimeFrom(double current, double startLevel)
    {
        Guard.NonNegative(startLevel);
        var x = SteadyLevel(current);

        // Checked before the pickup test: an element already at its trip level trips whatever the current.
        if (startLevel >= 1)
        {
            return TripTime.Immediate;
        }

        if (x <= 1)
        {
            return TripTime.Never;
        }

        return TripTime.After(HeatingTimeConstant * Math.Log((x - startLevel) / (x - 1)));
    }

    /// <summary>Cold-curve trip time, start level 0: t = tau ln(x / (x - 1)); IEC 60255-149 cold curve.</summary>
    public TripTime ColdTripTime(double current) => TripTimeFrom(current, 0);

    /// <summary>Hot start level: the set full-load level, else (FLC / (k IB))^2; IEC 60255-149 hot curve with IP = FLC.</summary>
    public double HotStartLevel(double fullLoadCurrent) => FullLoadLevel ?? SteadyLevel(fullLoadCurrent);

    /// <summary>Hot-curve trip time t = tau ln((I^2 - IP^2) / (I^2 - (k IB)^2)) with IP = FLC; IEC 60255-149 hot curve.</summary>
    public TripTime HotTripTime(double current, double fullLoadCurrent) =>
        TripTimeFrom(current, HotStartLevel(fullLoadCurrent));

    /// <summary>Level after running at a current for a time: h(t) = x + (h0 - x) exp(-t / tau); IEC 60255-149 thermal model.</summary>
    public double LevelAfterRunning(double startLevel, double current, double seconds)
    {
        Guard.NonNegative(startLevel);
        Guard.NonNegative(seconds);
        var x = SteadyLevel(current);
        return x + ((startLevel - x) * Math.Exp(-seconds / HeatingTimeConstant));
    }

    /// <summary>Time in s to cool while stopped from one level to another, tau_cool ln(h0 / h1); 0 if already at or below; null when the target is 0 or negative (never reached); IEC 60255-149 thermal model.</summary>
    public double? CoolingTime(double startLevel, double targetLevel)
    {
        Guard.NonNegative(startLevel);
        Guard.Finite(targetLevel);

        // Exponential decay approaches zero but never reaches it.
        if (targetLevel <= 0)
        {
            return null;
        }

        if (startLevel <= targetLevel)
        {
            return 0;
        }

        return CoolingTimeConstant * Math.Log(startLevel / targetLevel);
    }

    /// <summary>Whether a start (its current for its duration, then an optional load current for a further time) fits from a start level, with end level, peak and headroom; IEC 60255-149 thermal model, common practice for the start check.</summary>
    public StartFit CheckStart(StartPoint start, double startLevel, double loadCurrent = 0, double loadTime = 0)
    {
        ArgumentNullException.ThrowIfNull(start);
        Guard.NonNegative(startLevel);
        Guard.NonNegative(loadCurrent);
        Guard.NonNegative(loadTime);

        var afterAcceleration = LevelAfterRunning(startLevel, start.Current, start.Duration);
        var end = LevelAfterRunning(afterAcceleration, loadCurrent, loadTime);

        // Each phase is an exponential approach to its steady level, so it is monotonic and
        // its extreme lies at one of its ends: the peak is the largest of the three end points.
        var peak = Math.Max(startLevel, Math.Max(afterAcceleration, end));
        return new StartFit(peak < 1, end, peak, 1 - peak);
    }
}
