using System.Numerics;

namespace SettingLint.Protection;

/// <summary>Zero, positive and negative sequence phasors of a three-phase set (phase-a reference).</summary>
/// <param name="Zero">I0 = (Ia + Ib + Ic) / 3.</param>
/// <param name="Positive">I1 = (Ia + a Ib + a^2 Ic) / 3.</param>
/// <param name="Negative">I2 = (Ia + a^2 Ib + a Ic) / 3.</param>
public sealed record SequenceComponents(Complex Zero, Complex Positive, Complex Negative)
{
    // Rounding in a, a^2 leaves about 1e-16 of the inputs in I1 even when it should be exactly 0
    // (e.g. a pure zero-sequence set), so "no positive sequence" is judged relative to the whole set.
    private const double NegligibleShare = 1e-12;

    /// <summary>Unbalance |I2| / |I1| as a fraction, null when |I1| is 0 or below 1e-12 of |I0| + |I1| + |I2| (undefined); Fortescue, common practice.</summary>
    public double? NegativeToPositiveRatio
    {
        get
        {
            var positive = Positive.Magnitude;
            var scale = Zero.Magnitude + positive + Negative.Magnitude;
            return positive > NegligibleShare * scale ? Negative.Magnitude / positive : null;
        }
    }
}
