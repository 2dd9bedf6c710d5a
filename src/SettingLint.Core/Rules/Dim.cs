using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>A dimension as exponents of the engine's base units, so that * and / can be type-checked.</summary>
public readonly record struct Dim(sbyte Ampere, sbyte Volt, sbyte Second, sbyte Watt, sbyte Ohm, sbyte Item)
{
    public static Dim None { get; }

    public static Dim Current { get; } = new(1, 0, 0, 0, 0, 0);

    public static Dim Voltage { get; } = new(0, 1, 0, 0, 0, 0);

    public static Dim Time { get; } = new(0, 0, 1, 0, 0, 0);

    /// <summary>The dimension of a relay range's values: it differs per range, so it matches only itself.</summary>
    public static Dim ItemValue { get; } = new(0, 0, 0, 0, 0, 1);

    /// <summary>The dimension of an engine dimension (fractions and plain numbers are both dimensionless).</summary>
    public static Dim Of(Dimension d) => d switch
    {
        Dimension.Current => Current,
        Dimension.Voltage => Voltage,
        Dimension.Time => Time,
        Dimension.Power => new(0, 0, 0, 1, 0, 0),
        Dimension.Impedance => new(0, 0, 0, 0, 1, 0),
        // Per second: cycles / frequency is a time.
        Dimension.Frequency => new(0, 0, -1, 0, 0, 0),
        _ => None,
    };

    public static Dim operator *(Dim a, Dim b) =>
        new((sbyte)(a.Ampere + b.Ampere), (sbyte)(a.Volt + b.Volt), (sbyte)(a.Second + b.Second), (sbyte)(a.Watt + b.Watt), (sbyte)(a.Ohm + b.Ohm), (sbyte)(a.Item + b.Item));

    public static Dim operator /(Dim a, Dim b) =>
        new((sbyte)(a.Ampere - b.Ampere), (sbyte)(a.Volt - b.Volt), (sbyte)(a.Second - b.Second), (sbyte)(a.Watt - b.Watt), (sbyte)(a.Ohm - b.Ohm), (sbyte)(a.Item - b.Item));

    /// <summary>The engine dimension this is, when it is a plain one (for formatting).</summary>
    public Dimension? Plain =>
        this == None ? Dimension.None : this == Current ? Dimension.Current : this == Voltage ? Dimension.Voltage
        : this == Time ? Dimension.Time : this == Of(Dimension.Power) ? Dimension.Power : this == Of(Dimension.Impedance) ? Dimension.Impedance
        : this == Of(Dimension.Frequency) ? Dimension.Frequency : null;

    public override string ToString()
    {
        if (this == None) return "a plain number";
        if (this == ItemValue) return "a relay-range value";
        return Plain is { } p ? p.Token() : $"A^{Ampere} V^{Volt} s^{Second} W^{Watt} ohm^{Ohm}";
    }
}
