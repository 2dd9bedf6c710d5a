using System.Diagnostics.CodeAnalysis;
using System.Globalization;

namespace SettingLint.Protection;

/// <summary>
/// The relaying accuracy of a protection CT, whichever standard rates it, reduced to the one figure the
/// checks need: the secondary voltage the CT holds within its class at its accuracy limit
/// (IEEE C57.13 C class: the class voltage at 20 x rated secondary current into the standard burden;
/// IEC 61869-2 P class: the accuracy limit factor x rated secondary current x the rated burden).
/// </summary>
public sealed record CtAccuracy
{
    /// <summary>The C-class multiple of rated secondary current, 20; IEEE C57.13.</summary>
    public const double CClassLimitFactor = 20;

    private CtAccuracy(string token, double ratedSecondary, double limitFactor, double ratedBurden)
    {
        Token = token;
        RatedSecondary = Guard.Positive(ratedSecondary);
        AccuracyLimitFactor = Guard.Positive(limitFactor);
        RatedBurden = Guard.Positive(ratedBurden);
    }

    /// <summary>The class as written, such as C400 or 5P20.</summary>
    public string Token { get; }

    /// <summary>Rated secondary current in A (5 or 1, usually).</summary>
    public double RatedSecondary { get; }

    /// <summary>Multiple of rated current up to which the class holds at the rated burden: 20 for C classes, the ALF for P classes.</summary>
    public double AccuracyLimitFactor { get; }

    /// <summary>Burden in ohm at which the accuracy limit applies: the C class's standard burden, or the P class's rated burden.</summary>
    public double RatedBurden { get; }

    /// <summary>Secondary terminal voltage in V at the accuracy limit, ALF x I_sn x Z_rated (the class voltage of a C class).</summary>
    public double AccuracyLimitVoltage => AccuracyLimitFactor * RatedSecondary * RatedBurden;

    /// <summary>
    /// An IEEE C57.13 C class: V_class at 20 x I_sn into the standard burden, so the standard burden is
    /// V_class / (20 x I_sn): C100 is 1 ohm with 5 A secondary and 5 ohm with 1 A secondary.
    /// </summary>
    public static CtAccuracy CClass(double classVoltage, double ratedSecondary) =>
        new("C" + Guard.Positive(classVoltage).ToString("R", CultureInfo.InvariantCulture), ratedSecondary, CClassLimitFactor,
            classVoltage / (CClassLimitFactor * Guard.Positive(ratedSecondary)));

    /// <summary>
    /// Reads a class token, C followed by its voltage (C400) or an IEC class, 5P or 10P followed by the ALF (5P20).
    /// An IEC class needs its rated burden in ohm (null: no accuracy can be derived and the result is false).
    /// </summary>
    public static bool TryParse([NotNullWhen(true)] string? token, double ratedSecondary, double? ratedBurdenOhm, [NotNullWhen(true)] out CtAccuracy? accuracy)
    {
        accuracy = null;
        if (token is not { Length: > 1 } || !double.IsFinite(ratedSecondary) || ratedSecondary <= 0) return false;
        if (CClassRating.TryParse(token, out var c))
        {
            accuracy = CClass(c.ClassVoltage, ratedSecondary);
            return true;
        }
        var p = token.IndexOfAny(['P', 'p']);
        if (p <= 0
            || !int.TryParse(token.AsSpan(0, p), NumberStyles.None, CultureInfo.InvariantCulture, out var error) || error is not (5 or 10)
            || !int.TryParse(token.AsSpan(p + 1), NumberStyles.None, CultureInfo.InvariantCulture, out var alf) || alf <= 0
            || ratedBurdenOhm is not ({ } z and > 0) || !double.IsFinite(z))
        {
            return false;
        }
        accuracy = new CtAccuracy(error.ToString(CultureInfo.InvariantCulture) + "P" + alf.ToString(CultureInfo.InvariantCulture), ratedSecondary, alf, z);
        return true;
    }

    /// <summary>
    /// Secondary current in A the CT reproduces within its class into a connected burden in ohm, about
    /// V_al / Zb. IEEE C57.13 class-voltage definition; for P classes IEC 61869-2 with the CT's own winding
    /// resistance left out (not in the data), which credits a burden below the rated one in full; common practice.
    /// </summary>
    public double MaximumSecondaryCurrent(double burdenOhm) => AccuracyLimitVoltage / Guard.Positive(burdenOhm);

    /// <summary>
    /// IEEE C37.110 saturation criterion (1 + X/R) If Zb, with If per unit of the CT's rated current and Zb per unit
    /// of the burden into which the CT holds its class at 20 x rated current (V_al / (20 I_sn)); free of
    /// saturation at 20 or less. For a C class that burden is the standard burden; for a P class it is ALF / 20 x
    /// the rated burden, so the test reads (1 + X/R) If Zb &lt;= ALF x Z_rated.
    /// </summary>
    public SaturationCheck CheckSaturation(double xOverR, double faultCurrentPerUnit, double burdenOhm) =>
        CtSaturation.Check(xOverR, faultCurrentPerUnit, Guard.Positive(burdenOhm) / (AccuracyLimitVoltage / (CClassLimitFactor * RatedSecondary)));
}
