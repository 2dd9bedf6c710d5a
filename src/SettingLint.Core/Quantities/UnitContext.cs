namespace SettingLint.Core.Quantities;

/// <summary>Where a value stands, which decides the units it may be written in.</summary>
public enum UnitContext
{
    /// <summary>Nameplate, bus and transformer data: absolute units only.</summary>
    Data,

    /// <summary>Motor and starter data that may also be a multiple of FLC (locked-rotor current, soft-start limit).</summary>
    MotorData,

    /// <summary>A relay setting under `protection`: currents and voltages say their side or are multiples.</summary>
    Setting,
}

/// <summary>The context of a key path.</summary>
public static class UnitContexts
{
    /// <summary>Settings under protection; motor and starter data (which may be xFLC, except FLC and rated voltage themselves); all else data.</summary>
    public static UnitContext Of(string path) =>
        path.StartsWith("protection.", StringComparison.Ordinal) ? UnitContext.Setting
        : path.StartsWith("motor.", StringComparison.Ordinal) && path != "motor.full_load_current" && path != "motor.rated_voltage" ? UnitContext.MotorData
        : path.StartsWith("starter.", StringComparison.Ordinal) ? UnitContext.MotorData
        : UnitContext.Data;
}

/// <summary>The units accepted for a dimension in a context.</summary>
public static class AcceptedUnits
{
    /// <summary>The unit symbols accepted, in the order they are suggested.</summary>
    public static IReadOnlyList<string> For(Dimension dimension, UnitContext context) => (dimension, context) switch
    {
        (Dimension.Current, UnitContext.Setting) => ["A pri", "A sec", "kA pri", "xFLC", "xCT"],
        (Dimension.Current, UnitContext.MotorData) => ["A", "kA", "xFLC"],
        (Dimension.Current, _) => ["A", "kA"],
        (Dimension.Voltage, UnitContext.Setting) => ["%", "V pri", "V sec", "kV pri"],
        (Dimension.Voltage, _) => ["V", "kV"],
        (Dimension.Time, _) => ["ms", "s", "min", "h"],
        (Dimension.Power, _) => ["hp", "kW"],
        (Dimension.Fraction, _) => ["%"],
        (Dimension.Impedance, _) => ["ohm"],
        _ => [],
    };
}
