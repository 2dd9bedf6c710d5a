using System.Globalization;

namespace SettingLint.Core.Quantities;

/// <summary>Why a value could not be read as a quantity; each gets its own message.</summary>
public enum QuantityError
{
    None,
    NotANumber,
    MissingUnit,
    UnknownUnit,
    WrongDimension,
    NotAccepted,
    NeedsSide,
    NotFinite,
}

/// <summary>The outcome of reading a quantity.</summary>
public readonly record struct QuantityParse(Quantity? Value, QuantityError Error, string? UnitText)
{
    public bool Ok => Error == QuantityError.None;
}

/// <summary>Reads `number unit`: a number by the YAML 1.2 float grammar (no `_` separators), white space, a known unit.</summary>
public static class QuantityParser
{
    /// <summary>Parses a quantity and checks it against the dimension and context of its key.</summary>
    public static QuantityParse Parse(string text, Dimension dimension, UnitContext context)
    {
        var s = text.Trim();
        var split = 0;
        while (split < s.Length && !char.IsWhiteSpace(s[split])) split++;
        var numberText = s[..split];
        var unitText = NormaliseSpaces(s.AsSpan(split));
        if (!TryNumber(numberText, out var number))
        {
            // "6.2xFLC": a number glued to its unit.
            var glued = 0;
            while (glued < s.Length && (char.IsAsciiDigit(s[glued]) || s[glued] is '.' or '-' or '+' or 'e' or 'E')) glued++;
            if (glued > 0 && glued < s.Length && TryNumber(s[..glued], out _) && Unit.All.ContainsKey(NormaliseSpaces(s.AsSpan(glued))))
            {
                return new QuantityParse(null, QuantityError.NotANumber, NormaliseSpaces(s.AsSpan(glued)));
            }
            return new QuantityParse(null, QuantityError.NotANumber, null);
        }
        if (!double.IsFinite(number)) return new QuantityParse(null, QuantityError.NotFinite, unitText);
        if (unitText.Length == 0) return new QuantityParse(null, QuantityError.MissingUnit, null);
        if (!Unit.All.TryGetValue(unitText, out var unit))
        {
            return new QuantityParse(null, QuantityError.UnknownUnit, unitText);
        }
        if (unit.Dimension != dimension && !(dimension == Dimension.Voltage && unit.Symbol == "%" && context == UnitContext.Setting))
        {
            return new QuantityParse(null, QuantityError.WrongDimension, unitText);
        }
        if (dimension == Dimension.Voltage && unit.Symbol == "%")
        {
            unit = PercentOfRated;
        }
        var accepted = AcceptedUnits.For(dimension, context);
        if (!accepted.Contains(unit.Symbol))
        {
            var needsSide = context == UnitContext.Setting && unit.Basis == UnitBasis.Absolute;
            return new QuantityParse(null, needsSide ? QuantityError.NeedsSide : QuantityError.NotAccepted, unitText);
        }
        return new QuantityParse(new Quantity(number, unit), QuantityError.None, unitText);
    }

    /// <summary>A voltage setting in percent of the motor's rated voltage.</summary>
    public static Unit PercentOfRated { get; } = new("%", Dimension.Voltage, 0.01, UnitBasis.RatedVoltage);

    /// <summary>Reads a number by the YAML 1.2 core-schema float grammar; `1_000`, `0x10` and `.inf` are not numbers here.</summary>
    public static bool TryNumber(string text, out double value)
    {
        value = 0;
        if (text.Length == 0) return false;
        if (Documents.CoreSchema.Resolve(text) is not (Documents.ScalarType.Int or Documents.ScalarType.Float)) return false;
        // Of the core schema's numbers, only hexadecimal (0x), octal (0o), infinity and NaN have an x, o, n or N in them.
        if (text.AsSpan().IndexOfAny('x', 'o', 'n') >= 0 || text.Contains('N', StringComparison.Ordinal)) return false;
        return double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    private static string NormaliseSpaces(ReadOnlySpan<char> s)
    {
        // Most units are written with single spaces ("A sec"): only those that are not are split and joined again.
        var t = s.Trim();
        var plain = true;
        for (var i = 0; i < t.Length && plain; i++)
        {
            plain = !char.IsWhiteSpace(t[i]) || (t[i] == ' ' && !char.IsWhiteSpace(t[i + 1]));
        }
        if (plain) return t.Length == 0 ? "" : new string(t);
        var parts = new string(t).Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
        return string.Join(' ', parts);
    }

    /// <summary>A message for a parse error, naming the accepted forms.</summary>
    public static string Explain(QuantityParse parse, string text, Dimension dimension, UnitContext context)
    {
        var accepted = string.Join(", ", AcceptedUnits.For(dimension, context).Select(u => "'" + u + "'"));
        var what = dimension.Token();
        var a = dimension.Article();
        return parse.Error switch
        {
            QuantityError.MissingUnit => $"'{text}' has no unit; {a} {what} needs one of {accepted}, for example '{Example(dimension, context)}'.",
            QuantityError.NotANumber when parse.UnitText is not null => $"'{text}' needs a space between the number and the unit, for example '{Example(dimension, context)}'.",
            QuantityError.NotANumber => $"'{text}' is not a number followed by a unit; {a} {what} is written like '{Example(dimension, context)}' (units: {accepted}).",
            QuantityError.NotFinite => $"'{text}' is not a finite number.",
            QuantityError.UnknownUnit => $"'{parse.UnitText}' is not a known unit; {a} {what} takes {accepted}.",
            QuantityError.WrongDimension => $"'{parse.UnitText}' is a unit of {Unit.All[parse.UnitText!].Dimension.Token()}, but this key is {a} {what}: use {accepted}.",
            QuantityError.NeedsSide => $"'{text}' does not say which side of the transformer it is on; in protection settings {a} {what} is {accepted}.",
            QuantityError.NotAccepted => $"'{parse.UnitText}' is not accepted here; {a} {what} here takes {accepted}.",
            _ => $"'{text}' is not a valid {what}.",
        };
    }

    private static string Example(Dimension dimension, UnitContext context) => (dimension, context) switch
    {
        (Dimension.Current, UnitContext.Setting) => "7.2 A sec",
        (Dimension.Current, _) => "58 A",
        (Dimension.Voltage, UnitContext.Setting) => "90 %",
        (Dimension.Voltage, _) => "4000 V",
        (Dimension.Time, _) => "4.5 s",
        (Dimension.Power, _) => "450 hp",
        (Dimension.Fraction, _) => "10 %",
        (Dimension.Impedance, _) => "0.3 ohm",
        (Dimension.Frequency, _) => "50 Hz",
        _ => "1",
    };
}
