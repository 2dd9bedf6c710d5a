using System.Runtime.CompilerServices;

namespace SettingLint.Core.Rules;

/// <summary>A comparison operator, decoded once when a rule compiles.</summary>
internal enum Comparison
{
    Less,
    LessOrEqual,
    Greater,
    GreaterOrEqual,
    Equal,
    NotEqual,
}

internal static class Comparisons
{
    /// <summary>The operator as written; anything else compares as "!=", as the string form always did.</summary>
    public static Comparison Of(string op) => op switch
    {
        "<" => Comparison.Less,
        "<=" => Comparison.LessOrEqual,
        ">" => Comparison.Greater,
        ">=" => Comparison.GreaterOrEqual,
        "==" => Comparison.Equal,
        _ => Comparison.NotEqual,
    };
}

/// <summary>The arguments of one function call, on the stack.</summary>
[InlineArray(Size)]
internal struct ArgBuffer
{
    public const int Size = 8;

    private Val _first;
}
