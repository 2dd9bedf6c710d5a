using System.Numerics;

namespace SettingLint.Protection;

/// <summary>NEMA unbalance: largest deviation from the average of three magnitudes, over the average.</summary>
public static class NemaUnbalance
{
    /// <summary>Unbalance fraction, max |m - avg| / avg, of three magnitudes (V or A); NEMA MG 1 14.36 definition (clause from memory).</summary>
    public static double FromMagnitudes(double first, double second, double third)
    {
        Guard.NonNegative(first);
        Guard.NonNegative(second);
        Guard.NonNegative(third);
        var average = (first + second + third) / 3;
        if (average <= 0)
        {
            throw new ArgumentException("At least one magnitude must be greater than zero.", nameof(first));
        }

        var deviation = Math.Max(Math.Abs(first - average), Math.Max(Math.Abs(second - average), Math.Abs(third - average)));
        return deviation / average;
    }

    /// <summary>Unbalance fraction from the magnitudes of three phasors; NEMA MG 1 definition applied to magnitudes, common practice.</summary>
    public static double FromPhasors(Complex first, Complex second, Complex third) =>
        FromMagnitudes(first.Magnitude, second.Magnitude, third.Magnitude);
}
