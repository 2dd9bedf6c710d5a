namespace SettingLint.Core.Rules;

/// <summary>The static type of an expression.</summary>
public enum ValKind
{
    Absent,
    Number,
    Bool,
    Text,

    /// <summary>A motor's start profile (<see cref="SettingLint.Protection.StartProfile"/>), read only by the functions that take one.</summary>
    StartProfile,
}

/// <summary>A value at evaluation time: a number (SI), a flag, a text, a start profile, or absent (the data is not there).</summary>
/// <remarks>
/// Two fields, not four: rules copy values at every step, and a reference that is the text itself or a marker for the other
/// kinds (null when absent) makes a value 16 bytes instead of 24.
/// </remarks>
public readonly struct Val : IEquatable<Val>
{
    private static readonly object NumberMark = new();
    private static readonly object TrueMark = new();
    private static readonly object FalseMark = new();

    // A text value without a text (Of(null!)) stays a text, as it was when the kind was a field of its own.
    private static readonly object NullTextMark = new();

    private readonly object? _tag;
    private readonly double _number;

    private Val(object tag, double number)
    {
        _tag = tag;
        _number = number;
    }

    public static Val Absent => default;

    public ValKind Kind => _tag is null ? ValKind.Absent
        : ReferenceEquals(_tag, NumberMark) ? ValKind.Number
        : _tag is string || ReferenceEquals(_tag, NullTextMark) ? ValKind.Text
        : _tag is Protection.StartProfile ? ValKind.StartProfile
        : ValKind.Bool;

    /// <summary>The number (SI) of a number; 0 for the other kinds.</summary>
    public double Number => _number;

    /// <summary>The flag of a true/false value; false for the other kinds.</summary>
    public bool Flag => ReferenceEquals(_tag, TrueMark);

    /// <summary>The text of a text value; null for the other kinds.</summary>
    public string? Text => _tag as string;

    /// <summary>The profile of a start-profile value; null for the other kinds.</summary>
    public Protection.StartProfile? Profile => _tag as Protection.StartProfile;

    public bool IsAbsent => _tag is null;

    public static Val Of(double n) => new(NumberMark, n);

    public static Val Of(bool b) => new(b ? TrueMark : FalseMark, 0);

    public static Val Of(string s) => new(s ?? NullTextMark, 0);

    public static Val Of(Protection.StartProfile p) => p is null ? Absent : new(p, 0);

    public static bool operator ==(Val left, Val right) => left.Equals(right);

    public static bool operator !=(Val left, Val right) => !left.Equals(right);

    public bool Equals(Val other) =>
        Kind == other.Kind && _number.Equals(other._number) && Flag == other.Flag && string.Equals(Text, other.Text, StringComparison.Ordinal)
        && Equals(Profile, other.Profile);

    public override bool Equals(object? obj) => obj is Val v && Equals(v);

    public override int GetHashCode() => HashCode.Combine(Kind, _number, Flag, Text);

    public override string ToString() => Kind switch
    {
        ValKind.Number => _number.ToString(System.Globalization.CultureInfo.InvariantCulture),
        ValKind.Bool => Flag ? "true" : "false",
        ValKind.Text => Text!,
        ValKind.StartProfile => Profile!.ToString(),
        _ => "(absent)",
    };
}

/// <summary>The static type of an expression: its kind and, for numbers, its dimension.</summary>
public readonly record struct ExprType(ValKind Kind, Dim Dim)
{
    public static ExprType Num(Dim d) => new(ValKind.Number, d);

    public static ExprType Bool { get; } = new(ValKind.Bool, Dim.None);

    public static ExprType Text { get; } = new(ValKind.Text, Dim.None);

    public static ExprType StartProfile { get; } = new(ValKind.StartProfile, Dim.None);

    public override string ToString() => Kind switch
    {
        ValKind.Number => Dim.ToString(),
        ValKind.Bool => "true/false",
        ValKind.Text => "text",
        ValKind.StartProfile => "a start profile",
        _ => "absent",
    };
}
