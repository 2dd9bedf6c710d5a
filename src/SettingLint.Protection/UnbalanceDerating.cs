namespace SettingLint.Protection;

/// <summary>
/// Motor derating for voltage unbalance, read from the NEMA MG 1 Figure 14-1 curve. The points are
/// from memory (published reproductions differ by about 0.02) and are joined linearly.
/// </summary>
public static class UnbalanceDerating
{
    // Curve points at 0, 1, 2, 3, 4 and 5 % unbalance; the curve is flat to 1 %, where derating begins.
    private static readonly double[] FactorAtWholePercent = [1.00, 1.00, 0.95, 0.88, 0.82, 0.75];

    /// <summary>Highest voltage unbalance (fraction) for which the curve gives a factor: 0.05.</summary>
    public const double MaximumUnbalance = 0.05;

    /// <summary>Derating factor for a voltage unbalance fraction 0..0.05, linear between whole percents; null above 5 % (operation not recommended); NEMA MG 1 Figure 14-1, points from memory.</summary>
    public static double? Factor(double voltageUnbalance)
    {
        Guard.NonNegative(voltageUnbalance);
        if (voltageUnbalance > MaximumUnbalance)
        {
            return null;
        }

        var percent = voltageUnbalance * 100;
        var index = Math.Min((int)Math.Floor(percent), FactorAtWholePercent.Length - 2);
        var share = percent - index;
        return FactorAtWholePercent[index] + (share * (FactorAtWholePercent[index + 1] - FactorAtWholePercent[index]));
    }
}
