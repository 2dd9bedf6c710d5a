namespace SettingLint.Protection;

/// <summary>
/// First-cycle RMS multipliers of an asymmetrical (DC-offset) starting or fault current over its
/// symmetrical RMS value.
/// </summary>
public static class AsymmetricalCurrent
{
    /// <summary>sqrt(3): RMS of a symmetrical wave plus an undecayed full DC offset (sqrt2 x RMS), sqrt(1 + 2); common practice.</summary>
    public const double FullyOffsetRmsFactor = 1.7320508075688772;

    /// <summary>sqrt(1 + 2 exp(-2 pi / (X/R))): full offset with the DC term taken after a half cycle of decay; common practice.</summary>
    /// <param name="xOverR">Circuit X/R ratio, 0 (no offset, factor 1) up to positive infinity (no decay, factor sqrt(3)).</param>
    public static double DecayingRmsFactor(double xOverR)
    {
        if (double.IsNaN(xOverR) || xOverR < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(xOverR), xOverR, "X/R must be zero or greater.");
        }

        // DC = sqrt2 I exp(-t R/L); at a half cycle (omega t = pi) that is sqrt2 I exp(-pi / (X/R)),
        // and the RMS of AC plus DC is I sqrt(1 + 2 exp(-2 pi / (X/R))). X/R = 0 gives exp(-inf) = 0.
        return Math.Sqrt(1 + (2 * Math.Exp(-2 * Math.PI / xOverR)));
    }

    /// <summary>Time constant in s of the DC offset, L / R = (X/R) / (2 pi f); IEC 60909-0 (decaying aperiodic component).</summary>
    /// <param name="xOverR">X/R of the circuit, at the supply frequency.</param>
    /// <param name="frequency">Supply frequency in Hz.</param>
    public static double DcTimeConstant(double xOverR, double frequency) =>
        Guard.NonNegative(xOverR) / (2 * Math.PI * Guard.Positive(frequency));

    /// <summary>
    /// RMS of a fully offset current over its symmetrical RMS, t seconds after it starts: sqrt(1 + 2 exp(-2 t / T))
    /// with T = (X/R) / (2 pi f). The DC term sqrt2 I exp(-t / T) decays as in IEC 60909-0; the RMS of AC plus DC is
    /// common practice. sqrt(3) at t = 0; a half cycle gives <see cref="DecayingRmsFactor"/>.
    /// </summary>
    public static double RmsFactorAt(double xOverR, double frequency, double seconds)
    {
        Guard.NonNegative(seconds);
        var tau = DcTimeConstant(xOverR, frequency);
        // X/R = 0: no offset at all (exp(-inf) = 0), even at t = 0.
        var dc = tau == 0 ? 0 : Math.Exp(-2 * seconds / tau);
        return Math.Sqrt(1 + (2 * dc));
    }
}
