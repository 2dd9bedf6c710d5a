using System.Collections.Immutable;
using System.Globalization;
using SettingLint.Core.Findings;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>
/// A named value a fixture marker expects a finding to carry: `limit=858 A`, `margin_ratio=-2.3 %`, `curve=never`.
/// A number is compared in SI units to half a unit of its last written digit; anything else is compared as text.
/// </summary>
/// <param name="Name">The finding value's name.</param>
/// <param name="Written">The value as the marker writes it.</param>
/// <param name="Si">The number in SI units (A primary, V primary, s, fractions), or null for a text value.</param>
/// <param name="Tolerance">Half a unit of the last digit written, in SI units.</param>
/// <param name="SiUnit">The SI unit symbol of the marker's unit ("" for a fraction or plain number).</param>
internal sealed record MarkerValue(string Name, string Written, double? Si, double Tolerance, string SiUnit)
{
    /// <summary>True when the finding's value is the marker's to the precision written.</summary>
    public bool Matches(FindingValue value)
    {
        if (Si is not { } expected) return string.Equals(value.Text, Written, StringComparison.Ordinal);
        if (value.Number is not { } actual) return false;
        // A marker without a unit may check any value's number; one with a unit must name the value's dimension.
        if (SiUnit.Length > 0 && !string.Equals(SiUnit, value.Unit ?? "", StringComparison.Ordinal)) return false;
        return Math.Abs(actual - expected) <= Tolerance * (1 + 1e-9) + 1e-12;
    }
}

/// <summary>Reads the text after `expect:`: rule ids, each followed by its named values.</summary>
internal static class FixtureMarker
{
    /// <summary>The ids and their values in order; <paramref name="problem"/> says what could not be read.</summary>
    public static ImmutableArray<(string Id, ImmutableArray<MarkerValue> Values)> Parse(string text, out string? problem)
    {
        problem = null;
        var tokens = text.Split([' ', ',', '\t'], StringSplitOptions.RemoveEmptyEntries);
        var result = ImmutableArray.CreateBuilder<(string, ImmutableArray<MarkerValue>)>();
        string? id = null;
        var values = ImmutableArray.CreateBuilder<MarkerValue>();
        void Flush()
        {
            if (id is not null) result.Add((id, values.ToImmutable()));
            values.Clear();
        }
        for (var i = 0; i < tokens.Length; i++)
        {
            var token = tokens[i];
            var eq = token.IndexOf('=', StringComparison.Ordinal);
            if (eq < 0)
            {
                Flush();
                id = token;
                continue;
            }
            if (id is null)
            {
                problem ??= $"the value '{token}' comes before any rule id.";
                continue;
            }
            var name = token[..eq];
            var written = token[(eq + 1)..];
            // A unit is the following tokens that are neither a value nor a rule id: `858 A`, `1.76 kA pri`.
            var unitTokens = new List<string>();
            while (i + 1 < tokens.Length && !tokens[i + 1].Contains('=', StringComparison.Ordinal) && !LooksLikeId(tokens[i + 1]))
            {
                unitTokens.Add(tokens[++i]);
            }
            var unitText = string.Join(' ', unitTokens);
            if (Read(name, written, unitText, out var value, out var why)) values.Add(value);
            else problem ??= why;
        }
        Flush();
        return result.ToImmutable();
    }

    private static bool LooksLikeId(string token) =>
        token.Length >= 5 && char.IsAsciiLetterUpper(token[0]) && char.IsAsciiDigit(token[^1]) && char.IsAsciiDigit(token[^2]) && char.IsAsciiDigit(token[^3]);

    private static bool Read(string name, string written, string unitText, out MarkerValue value, out string? problem)
    {
        problem = null;
        var shown = unitText.Length == 0 ? written : written + " " + unitText;
        if (!double.TryParse(written, NumberStyles.Float, CultureInfo.InvariantCulture, out var number))
        {
            value = new MarkerValue(name, shown, null, 0, "");
            return true;
        }
        var factor = 1.0;
        var siUnit = "";
        if (unitText.Length > 0)
        {
            if (!Unit.All.TryGetValue(unitText, out var unit) || unit.Basis is UnitBasis.Secondary or UnitBasis.FullLoadCurrent or UnitBasis.CtRating or UnitBasis.VtRating or UnitBasis.CtSecondaryPower)
            {
                value = new MarkerValue(name, shown, null, 0, "");
                problem = $"the value {name}={shown} has a unit a marker cannot compare; write it in A, kA, A pri, V, kV, s, ms, min, %, or as a plain number.";
                return false;
            }
            factor = unit.Factor;
            siUnit = unit.Dimension == Dimension.Fraction ? "" : unit.Dimension.SiSymbol();
        }
        var mantissa = written.Split('e', 'E')[0];
        var dot = mantissa.IndexOf('.', StringComparison.Ordinal);
        var decimals = dot < 0 ? 0 : mantissa.Length - dot - 1;
        var exponent = written.Length > mantissa.Length ? int.Parse(written[(mantissa.Length + 1)..], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture) : 0;
        var tolerance = 0.5 * Math.Pow(10, exponent - decimals) * factor;
        value = new MarkerValue(name, shown, number * factor, tolerance, siUnit);
        return true;
    }
}
