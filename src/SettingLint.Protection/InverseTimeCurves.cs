namespace SettingLint.Protection;

/// <summary>Operate and reset times of the IEC 60255-151 and IEEE C37.112 inverse-time curves and of definite time.</summary>
public static class InverseTimeCurves
{
    /// <summary>Published constants of a curve, null for definite time; IEC 60255-151 Table 1, IEEE C37.112-2018 Table 1 (long-time inverse: IEC 60255-3 form, common practice).</summary>
    public static CurveConstants? Constants(CurveKind kind) => kind switch
    {
        CurveKind.IecStandardInverse => new CurveConstants(0.14, 0, 0.02, null),
        CurveKind.IecVeryInverse => new CurveConstants(13.5, 0, 1, null),
        CurveKind.IecExtremelyInverse => new CurveConstants(80, 0, 2, null),
        CurveKind.IecLongTimeInverse => new CurveConstants(120, 0, 1, null),
        CurveKind.IeeeModeratelyInverse => new CurveConstants(0.0515, 0.1140, 0.02, 4.85),
        CurveKind.IeeeVeryInverse => new CurveConstants(19.61, 0.491, 2, 21.6),
        CurveKind.IeeeExtremelyInverse => new CurveConstants(28.2, 0.1217, 2, 29.1),
        CurveKind.DefiniteTime => null,
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown curve kind."),
    };

    /// <summary>Operate time at multiple of pickup M: TMS k / (M^a - 1) (IEC) or TD (A / (M^p - 1) + B) (IEEE); definite time trips after the multiplier in s; M at or below 1 never trips; IEC 60255-151 Table 1, IEEE C37.112-2018 Table 1.</summary>
    /// <param name="kind">Curve.</param>
    /// <param name="multiple">M = current / pickup, not negative.</param>
    /// <param name="timeMultiplier">TMS or TD (greater than 0); for definite time the delay in s (not negative).</param>
    public static TripTime OperateTime(CurveKind kind, double multiple, double timeMultiplier)
    {
        Guard.NonNegative(multiple);
        var constants = Constants(kind);
        if (constants is null)
        {
            Guard.NonNegative(timeMultiplier);
            return multiple > 1 ? TripTime.After(timeMultiplier) : TripTime.Never;
        }

        Guard.Positive(timeMultiplier);

        // Both standards define the curves only above pickup; at M = 1 the formula is a pole.
        if (multiple <= 1)
        {
            return TripTime.Never;
        }

        var seconds = timeMultiplier * ((constants.A / (Math.Pow(multiple, constants.P) - 1)) + constants.B);
        return TripTime.After(seconds);
    }
}
