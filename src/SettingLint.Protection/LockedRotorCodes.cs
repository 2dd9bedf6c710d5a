using System.Diagnostics.CodeAnalysis;

namespace SettingLint.Protection;

/// <summary>
/// NEMA MG 1 locked-rotor code letters (Table 10-1, MG 1 Part 10.37.2): kVA/hp bands and the LRC
/// band of a letter, for three-phase motors where
/// kVA/hp = sqrt(3) V I_LR / 1000 / hp. Power is offered in W and in hp.
/// </summary>
public static class LockedRotorCodes
{
    // Band lower bounds in kVA/hp, in enum order; each band ends where the next begins.
    private static readonly double[] LowerBounds =
    [
        0, 3.15, 3.55, 4.0, 4.5, 5.0, 5.6, 6.3, 7.1, 8.0, 9.0, 10.0, 11.2, 12.5, 14.0, 16.0, 18.0, 20.0, 22.4,
    ];

    /// <summary>kVA/hp band of a letter (lower included, upper excluded, V open-ended); NEMA MG 1 Table 10-1.</summary>
    public static KvaPerHorsepowerRange Range(LockedRotorCodeLetter letter)
    {
        var index = (int)letter;
        if (index < 0 || index >= LowerBounds.Length)
        {
            throw new ArgumentOutOfRangeException(nameof(letter), letter, "Unknown code letter.");
        }

        var upper = index + 1 < LowerBounds.Length ? LowerBounds[index + 1] : double.PositiveInfinity;
        return new KvaPerHorsepowerRange(LowerBounds[index], upper);
    }

    /// <summary>LRC band in A of a letter, I_LR = kVA/hp x hp x 1000 / (sqrt(3) V) (max infinite for V); NEMA MG 1 Table 10-1.</summary>
    public static CurrentRange LockedRotorCurrentRangeFromHorsepower(LockedRotorCodeLetter letter, double ratedHorsepower, double lineVoltage)
    {
        var band = Range(letter);
        var amperesPerKvaPerHp = Guard.Positive(ratedHorsepower) * 1000 / (Math.Sqrt(3) * Guard.Positive(lineVoltage));
        return new CurrentRange(band.Lower * amperesPerKvaPerHp, band.Upper * amperesPerKvaPerHp);
    }

    /// <summary>LRC band in A of a letter for a rating in W; NEMA MG 1 Table 10-1 with hp = W / 745.699872.</summary>
    public static CurrentRange LockedRotorCurrentRangeFromWatts(LockedRotorCodeLetter letter, double ratedWatts, double lineVoltage) =>
        LockedRotorCurrentRangeFromHorsepower(letter, PowerUnits.HorsepowerFromWatts(Guard.Positive(ratedWatts)), lineVoltage);

    /// <summary>LRC scaled to another voltage in proportion, I2 = I1 V2 / V1 (fixed locked-rotor impedance); common practice.</summary>
    public static double ScaleToVoltage(double lockedRotorCurrent, double fromVoltage, double toVoltage) =>
        Guard.NonNegative(lockedRotorCurrent) * Guard.NonNegative(toVoltage) / Guard.Positive(fromVoltage);

    /// <summary>Reads a single code letter, upper case, rejecting the unused I, O and Q; NEMA MG 1 Table 10-1.</summary>
    public static bool TryParse([NotNullWhen(true)] string? text, out LockedRotorCodeLetter letter)
    {
        letter = default;

        // Enum.TryParse would also accept digits and names in any case; the nameplate field is one letter.
        if (text is not { Length: 1 } || text[0] is < 'A' or > 'Z')
        {
            return false;
        }

        return Enum.TryParse(text, ignoreCase: false, out letter) && Enum.IsDefined(letter);
    }
}
