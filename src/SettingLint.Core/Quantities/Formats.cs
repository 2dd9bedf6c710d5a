using System.Globalization;

namespace SettingLint.Core.Quantities;

/// <summary>Writes SI values for people: three significant figures in the unit an engineer would use.</summary>
public static class Formats
{
    /// <summary>A value of a dimension in its usual unit (kA above 1 kA, ms below 1 s, percent for fractions).</summary>
    public static string Si(double value, Dimension dimension) => dimension switch
    {
        Dimension.Current => Math.Abs(value) >= 1000 ? Number(value / 1000) + " kA" : Number(value) + " A",
        Dimension.Voltage => Math.Abs(value) >= 1000 ? Number(value / 1000) + " kV" : Number(value) + " V",
        Dimension.Time => Math.Abs(value) < 1 && value != 0 ? Number(value * 1000) + " ms"
            : Math.Abs(value) >= 600 ? Number(value / 60) + " min" : Number(value) + " s",
        Dimension.Power => Number(value / 1000) + " kW",
        Dimension.Fraction => Number(value * 100) + " %",
        Dimension.Impedance => Number(value) + " ohm",
        Dimension.Frequency => Number(value) + " Hz",
        _ => Number(value),
    };

    /// <summary>A number to three significant figures (more for large integers), without exponent for everyday sizes.</summary>
    public static string Number(double v)
    {
        if (double.IsNaN(v)) return "NaN";
        if (double.IsInfinity(v)) return v > 0 ? "infinity" : "-infinity";
        if (v == 0) return "0";
        var abs = Math.Abs(v);
        if (abs >= 1000) return Math.Round(v).ToString("0", CultureInfo.InvariantCulture);
        var digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : Math.Min(6, 2 - (int)Math.Floor(Math.Log10(abs)));
        return Math.Round(v, digits).ToString("0.######", CultureInfo.InvariantCulture);
    }

    /// <summary>The same value in the unit the setting was written in (for "650 A pri (16.25 A sec)").</summary>
    public static string Secondary(double primary, double ratio, string unit) =>
        Number(primary / ratio) + " " + unit;
}
