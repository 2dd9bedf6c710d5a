using System.Collections.Frozen;

namespace SettingLint.Core.Quantities;

/// <summary>What a unit's number is measured against.</summary>
public enum UnitBasis
{
    /// <summary>An absolute value (primary where it matters): A, kV, s.</summary>
    Absolute,

    /// <summary>Explicitly primary: A pri, V pri.</summary>
    Primary,

    /// <summary>Secondary of the element's CT or of the VT: A sec, V sec.</summary>
    Secondary,

    /// <summary>A multiple of the motor's full-load current: xFLC.</summary>
    FullLoadCurrent,

    /// <summary>A multiple of the CT's primary rating: xCT.</summary>
    CtRating,

    /// <summary>Percent of the motor's rated voltage, on a voltage element: %.</summary>
    RatedVoltage,

    /// <summary>A multiple of the VT's primary rating: xVT.</summary>
    VtRating,

    /// <summary>Volt-amperes at the CT's rated secondary current, a burden: VA (Z = VA / I_sn^2).</summary>
    CtSecondaryPower,
}

/// <summary>A unit as written: its symbol, dimension, factor to SI, and basis.</summary>
public sealed record Unit(string Symbol, Dimension Dimension, double Factor, UnitBasis Basis)
{
    /// <summary>Every unit the format knows, by symbol (internal white space normalised to one space).</summary>
    public static FrozenDictionary<string, Unit> All { get; } = new Unit[]
    {
        new("A", Dimension.Current, 1, UnitBasis.Absolute),
        new("kA", Dimension.Current, 1000, UnitBasis.Absolute),
        new("A pri", Dimension.Current, 1, UnitBasis.Primary),
        new("kA pri", Dimension.Current, 1000, UnitBasis.Primary),
        new("A sec", Dimension.Current, 1, UnitBasis.Secondary),
        new("xFLC", Dimension.Current, 1, UnitBasis.FullLoadCurrent),
        new("xCT", Dimension.Current, 1, UnitBasis.CtRating),
        new("V", Dimension.Voltage, 1, UnitBasis.Absolute),
        new("kV", Dimension.Voltage, 1000, UnitBasis.Absolute),
        new("V pri", Dimension.Voltage, 1, UnitBasis.Primary),
        new("kV pri", Dimension.Voltage, 1000, UnitBasis.Primary),
        new("V sec", Dimension.Voltage, 1, UnitBasis.Secondary),
        new("ms", Dimension.Time, 0.001, UnitBasis.Absolute),
        new("s", Dimension.Time, 1, UnitBasis.Absolute),
        new("min", Dimension.Time, 60, UnitBasis.Absolute),
        new("h", Dimension.Time, 3600, UnitBasis.Absolute),
        new("hp", Dimension.Power, 745.699872, UnitBasis.Absolute),
        new("kW", Dimension.Power, 1000, UnitBasis.Absolute),
        new("%", Dimension.Fraction, 0.01, UnitBasis.Absolute),
        new("ohm", Dimension.Impedance, 1, UnitBasis.Absolute),
        new("VA", Dimension.Impedance, 1, UnitBasis.CtSecondaryPower),
        new("xVT", Dimension.Voltage, 1, UnitBasis.VtRating),
        new("Hz", Dimension.Frequency, 1, UnitBasis.Absolute),
    }.ToFrozenDictionary(u => u.Symbol, StringComparer.Ordinal);
}
