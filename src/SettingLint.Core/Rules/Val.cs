namespace SettingLint.Core.Rules;

/// <summary>The static type of an expression.</summary>
public enum ValKind
{
    Absent,
    Number,
    Bool,
    Text,
}

/// <summary>A value at evaluation time: a number (SI), a flag, a text, or absent (the data is not there).</summary>
public readonly record struct Val(ValKind Kind, double Number, bool Flag, string? Text)
{
    public static Val Absent { get; }

    public static Val Of(double n) => new(ValKind.Number, n, false, null);

    public static Val Of(bool b) => new(ValKind.Bool, 0, b, null);

    public static Val Of(string s) => new(ValKind.Text, 0, false, s);

    public bool IsAbsent => Kind == ValKind.Absent;
}

/// <summary>The static type of an expression: its kind and, for numbers, its dimension.</summary>
public readonly record struct ExprType(ValKind Kind, Dim Dim)
{
    public static ExprType Num(Dim d) => new(ValKind.Number, d);

    public static ExprType Bool { get; } = new(ValKind.Bool, Dim.None);

    public static ExprType Text { get; } = new(ValKind.Text, Dim.None);

    public override string ToString() => Kind switch
    {
        ValKind.Number => Dim.ToString(),
        ValKind.Bool => "true/false",
        ValKind.Text => "text",
        _ => "absent",
    };
}
