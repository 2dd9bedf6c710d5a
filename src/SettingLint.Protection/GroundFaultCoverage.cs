namespace SettingLint.Protection;

/// <summary>
/// Share of a wye winding covered by a ground element. With impedance grounding the fault current
/// falls in proportion to the fault's distance from the neutral, so faults nearer the neutral than
/// pickup / available go undetected.
/// </summary>
public static class GroundFaultCoverage
{
    /// <summary>Protected share in percent, 100 (1 - pickup / available), clamped at 0 when pickup is at or above the available current; common practice.</summary>
    /// <param name="pickupCurrent">Ground element pickup in A (primary).</param>
    /// <param name="availableFaultCurrent">Ground fault current in A for a terminal fault (limited by the grounding impedance).</param>
    public static double ProtectedPercent(double pickupCurrent, double availableFaultCurrent)
    {
        Guard.NonNegative(pickupCurrent);
        Guard.Positive(availableFaultCurrent);

        // A pickup above the available current covers nothing; a negative share would be meaningless.
        return Math.Max(0, 100 * (1 - (pickupCurrent / availableFaultCurrent)));
    }
}
