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

    /// <summary>Standard burden in ohm, V_class / (20 x 5 A), e.g. C100 gives 1 ohm; IEEE C57.13 standard burdens.</summary>
    public double StandardBurden => ClassVoltage / 100;

    /// <summary>Token such as "C100"; IEEE C57.13 designation.</summary>
    public string Token => "C" + ClassVoltage.ToString("R", CultureInfo.InvariantCulture);

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

    /// <summary>Reads a class token such as "C200"; throws <see cref="FormatException"/> if malformed; IEEE C57.13 designation.</summary>
    public static CClassRating Parse(string token)
    {
        ArgumentNullException.ThrowIfNull(token);
        return TryParse(token, out var rating)
            ? rating
            : throw new FormatException("Not a C-class CT rating: '" + token + "'.");
    }

    /// <summary>Secondary current in A the CT reproduces within class accuracy into a connected burden, about V_class / Zb; IEEE C57.13 class-voltage definition, approximation common practice.</summary>
    public double MaximumSecondaryCurrent(double burdenOhm) => ClassVoltage / Guard.Positive(burdenOhm);

    /// <summary>Saturation check (1 + X/R) If Zb &lt;= 20 with If per unit of CT rating and the burden in ohm taken per unit of the standard burden; IEEE C37.110.</summary>
    public SaturationCheck CheckSaturation(double xOverR, double faultCurrentPerUnit, double burdenOhm) =>
        CtSaturation.Check(xOverR, faultCurrentPerUnit, Guard.Positive(burdenOhm) / StandardBurden);

    /// <summary>Saturation check from a primary fault current in A and the CT ratio; IEEE C37.110 criterion with If = fault / rated primary.</summary>
    public SaturationCheck CheckSaturation(double xOverR, double primaryFaultCurrent, CtRatio ratio, double burdenOhm)
    {
        ArgumentNullException.ThrowIfNull(ratio);
        return CheckSaturation(xOverR, Guard.NonNegative(primaryFaultCurrent) / ratio.PrimaryRating, burdenOhm);
    }
}
