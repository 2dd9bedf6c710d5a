using System.Diagnostics.CodeAnalysis;
using System.Globalization;

namespace SettingLint.Protection;

/// <summary>
/// IEEE C57.13 C-class relaying accuracy of a CT (5 A secondary basis): the class voltage is the
/// secondary terminal voltage the CT delivers at 20 times rated current (100 A) into its
/// standard burden within 10 % ratio error, so the standard burden is V_class / 100 ohm.
/// </summary>
public sealed record CClassRating
{
    /// <summary>Creates a rating from its class voltage in V (e.g. 100 for C100); IEEE C57.13.</summary>
    public CClassRating(double classVoltage) => ClassVoltage = Guard.Positive(classVoltage);

    /// <summary>Class voltage in V.</summary>
    public double ClassVoltage { get; }

    /// <summary>Reads a class token "C" followed by digits, e.g. "C400" (C in either case); IEEE C57.13 designation.</summary>
    public static bool TryParse([NotNullWhen(true)] string? token, [NotNullWhen(true)] out CClassRating? rating)
    {
        rating = null;
        if (token is not { Length: > 1 } || (token[0] != 'C' && token[0] != 'c'))
        {
            return false;
        }

        if (!int.TryParse(token.AsSpan(1), NumberStyles.None, CultureInfo.InvariantCulture, out var volts) || volts <= 0)
        {
            return false;
        }

        rating = new CClassRating(volts);
        return true;
    }
}
