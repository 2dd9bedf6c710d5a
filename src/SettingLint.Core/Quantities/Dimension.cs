namespace SettingLint.Core.Quantities;

/// <summary>The physical dimension of a value; each has one SI unit the engine works in.</summary>
public enum Dimension
{
    /// <summary>A plain number (service factor, X/R, counts).</summary>
    None,

    /// <summary>Amperes, primary.</summary>
    Current,

    /// <summary>Volts, primary.</summary>
    Voltage,

    /// <summary>Seconds.</summary>
    Time,

    /// <summary>Watts.</summary>
    Power,

    /// <summary>A fraction (20 % is 0.2).</summary>
    Fraction,

    /// <summary>Ohms.</summary>
    Impedance,

    /// <summary>Hertz (the supply frequency).</summary>
    Frequency,
}

/// <summary>Names of dimensions as schemas and rules write them.</summary>
public static class Dimensions
{
    /// <summary>The token of a dimension (current, voltage, time, power, percent, impedance, frequency, number).</summary>
    public static string Token(this Dimension d) => d switch
    {
        Dimension.Current => "current",
        Dimension.Voltage => "voltage",
        Dimension.Time => "time",
        Dimension.Power => "power",
        Dimension.Fraction => "percent",
        Dimension.Impedance => "impedance",
        Dimension.Frequency => "frequency",
        _ => "number",
    };

    /// <summary>Reads a dimension token; null when unknown.</summary>
    public static Dimension? Parse(string token) => token switch
    {
        "current" => Dimension.Current,
        "voltage" => Dimension.Voltage,
        "time" => Dimension.Time,
        "power" => Dimension.Power,
        "percent" or "fraction" => Dimension.Fraction,
        "impedance" => Dimension.Impedance,
        "frequency" => Dimension.Frequency,
        "number" => Dimension.None,
        _ => null,
    };

    /// <summary>The SI unit symbol the engine reports a dimension in.</summary>
    public static string SiSymbol(this Dimension d) => d switch
    {
        Dimension.Current => "A",
        Dimension.Voltage => "V",
        Dimension.Time => "s",
        Dimension.Power => "W",
        Dimension.Fraction => "",
        Dimension.Impedance => "ohm",
        Dimension.Frequency => "Hz",
        _ => "",
    };

    /// <summary>"a" or "an" before the dimension's token, for messages ("an impedance").</summary>
    public static string Article(this Dimension d) => d is Dimension.Impedance ? "an" : "a";
}
