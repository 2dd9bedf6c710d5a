using SettingLint.Core.Documents;
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
        path.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal) ? UnitContext.Setting
        : path.StartsWith(SchemaPaths.Motor.MotorPrefix, StringComparison.Ordinal) && path != SchemaPaths.Motor.FullLoadCurrent && path != SchemaPaths.Motor.RatedVoltage ? UnitContext.MotorData
        : path.StartsWith(SchemaPaths.Motor.StarterPrefix, StringComparison.Ordinal) ? UnitContext.MotorData
        : UnitContext.Data;
}

/// <summary>The units accepted for a dimension in a context.</summary>
public static class AcceptedUnits
{
    private static readonly string[] CurrentSetting = ["A pri", "A sec", "kA pri", "xFLC", "xCT"];
    private static readonly string[] CurrentMotorData = ["A", "kA", "xFLC"];
    private static readonly string[] Current = ["A", "kA"];
    private static readonly string[] VoltageSetting = ["%", "V pri", "V sec", "kV pri", "xVT"];
    private static readonly string[] Voltage = ["V", "kV"];
    private static readonly string[] Time = ["ms", "s", "min", "h"];
    private static readonly string[] Power = ["hp", "kW", "MW"];
    private static readonly string[] Fraction = ["%"];
    private static readonly string[] Impedance = ["ohm", "VA"];
    private static readonly string[] Frequency = ["Hz"];

    /// <summary>The unit symbols accepted, in the order they are suggested (the same list each time: every value read asks).</summary>
    public static IReadOnlyList<string> For(Dimension dimension, UnitContext context) => (dimension, context) switch
    {
        (Dimension.Current, UnitContext.Setting) => CurrentSetting,
        (Dimension.Current, UnitContext.MotorData) => CurrentMotorData,
        (Dimension.Current, _) => Current,
        (Dimension.Voltage, UnitContext.Setting) => VoltageSetting,
        (Dimension.Voltage, _) => Voltage,
        (Dimension.Time, _) => Time,
        (Dimension.Power, _) => Power,
        (Dimension.Fraction, _) => Fraction,
        (Dimension.Impedance, _) => Impedance,
        (Dimension.Frequency, _) => Frequency,
        _ => [],
    };
}
