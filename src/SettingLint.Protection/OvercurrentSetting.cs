namespace SettingLint.Protection;

/// <summary>
/// A time-overcurrent element with an optional instantaneous element, all currents in the same
/// (primary) amperes. The instantaneous time defaults to 0.05 s (about three cycles at 60 Hz),
/// a common-practice allowance for relay operate time; pass another value where known.
/// </summary>
public sealed record OvercurrentSetting
{
    /// <summary>Default instantaneous operate time in s; common practice.</summary>
    public const double DefaultInstantaneousTime = 0.05;

    /// <summary>Creates a setting from curve, pickup (A), multiplier, optional instantaneous pickup (A) and its time (s); common practice.</summary>
    public OvercurrentSetting(
        CurveKind curve,
        double pickupCurrent,
        double timeMultiplier,
        double? instantaneousPickupCurrent = null,
        double instantaneousTime = DefaultInstantaneousTime)
    {
        Curve = curve;
        PickupCurrent = Guard.Positive(pickupCurrent);
        TimeMultiplier = curve == CurveKind.DefiniteTime ? Guard.NonNegative(timeMultiplier) : Guard.Positive(timeMultiplier);
        InstantaneousPickupCurrent = instantaneousPickupCurrent is { } inst ? Guard.Positive(inst) : null;
        InstantaneousTime = Guard.NonNegative(instantaneousTime);
    }

    /// <summary>Time-overcurrent curve.</summary>
    public CurveKind Curve { get; }

    /// <summary>Time-overcurrent pickup in A.</summary>
    public double PickupCurrent { get; }

    /// <summary>TMS or TD; for definite time the delay in s.</summary>
    public double TimeMultiplier { get; }

    /// <summary>Instantaneous pickup in A, or null when the element is off.</summary>
    public double? InstantaneousPickupCurrent { get; }

    /// <summary>Instantaneous operate time in s.</summary>
    public double InstantaneousTime { get; }

    /// <summary>Trip time at a current in A: the sooner of the curve and, above its pickup, the instantaneous element; IEC 60255-151 / IEEE C37.112 curves, common practice for the combination.</summary>
    public TripTime TripTimeAt(double current)
    {
        Guard.NonNegative(current);
        var timed = InverseTimeCurves.OperateTime(Curve, current / PickupCurrent, TimeMultiplier);

        // Strictly above pickup, matching the curve rule that M = 1 does not operate.
        var instantaneous = InstantaneousPickupCurrent is { } pickup && current > pickup
            ? TripTime.After(InstantaneousTime)
            : TripTime.Never;
        return TripTime.Earliest(timed, instantaneous);
    }
}
