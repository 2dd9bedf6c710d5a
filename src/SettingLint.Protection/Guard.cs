using System.Runtime.CompilerServices;

namespace SettingLint.Protection;

// Shared argument checks: the built-in throw helpers let NaN through, which would
// silently poison every downstream calculation.
internal static class Guard
{
    internal static double Finite(double value, [CallerArgumentExpression(nameof(value))] string? name = null)
    {
        if (!double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(name, value, "Value must be a finite number.");
        }

        return value;
    }

    internal static double Positive(double value, [CallerArgumentExpression(nameof(value))] string? name = null)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            throw new ArgumentOutOfRangeException(name, value, "Value must be finite and greater than zero.");
        }

        return value;
    }

    internal static double NonNegative(double value, [CallerArgumentExpression(nameof(value))] string? name = null)
    {
        if (!double.IsFinite(value) || value < 0)
        {
            throw new ArgumentOutOfRangeException(name, value, "Value must be finite and not negative.");
        }

        return value;
    }
}
