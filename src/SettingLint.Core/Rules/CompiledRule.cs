using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>A parameter of a rule: its default and meaning, with the span of its default for messages.</summary>
public sealed record RuleParameter(string Name, double Default, Dim Dim, bool Percent, string DefaultText, string Meaning, int Index)
{
    /// <summary>The value as a person reads it.</summary>
    public string Format(double value) => CheckNode.Format(value, Dim, Percent);
}

/// <summary>The top of a check: comparisons report their numbers, and/or pick the comparison that decided.</summary>
public abstract record CheckNode
{
    /// <summary>How a number of a dimension is shown: engineering units, percent for fractions, "never" for an infinite time.</summary>
    public static string Format(double value, Dim dim, bool percent)
    {
        if (double.IsPositiveInfinity(value) && dim == Dim.Time) return "never";
        if (percent && dim == Dim.None) return Formats.Si(value, Dimension.Fraction);
        return dim.Plain is { } p ? Formats.Si(value, p) : Formats.Number(value);
    }
}

/// <summary>A comparison: left is the actual value, right the limit.</summary>
internal sealed record ComparisonNode(string Op, Compiled Left, Compiled Right) : CheckNode
{
    // Decoded once; kept with the text it was decoded from, so that a copy made with 'with' and another Op decodes afresh.
    private readonly (string Op, Comparison Code) _decoded = (Op, Comparisons.Of(Op));

    /// <summary>The operator decoded.</summary>
    internal Comparison Code => ReferenceEquals(_decoded.Op, Op) ? _decoded.Code : Comparisons.Of(Op);
}

internal sealed record AndNode(CheckNode Left, CheckNode Right) : CheckNode;

internal sealed record OrNode(CheckNode Left, CheckNode Right) : CheckNode;

/// <summary>A true/false expression with no numbers to report.</summary>
internal sealed record PlainNode(Compiled Expression) : CheckNode;

/// <summary>The evaluated numbers of the comparison that decided a check.</summary>
/// <param name="Margin">How far inside the limit, in the compared unit: positive passes.</param>
public sealed record CheckNumbers(string Op, double Actual, double Limit, double? Margin, Dim Dim, bool Percent)
{
    /// <summary>Margin over the size of the limit; null when the limit is zero or infinite.</summary>
    public double? MarginRatio => Ratio(Margin, Limit);

    internal static double? Ratio(double? margin, double limit) =>
        margin is { } m && limit != 0 && double.IsFinite(limit) && double.IsFinite(m) ? m / Math.Abs(limit) : null;
}

/// <summary>A rule compiled once per run: its descriptor, effective level and parameters, and its compiled expressions.</summary>
public sealed record CompiledRule(
    RuleDescriptor Descriptor,
    string SourceFile,
    Level Level,
    ImmutableArray<RuleParameter> Parameters,
    double[] ParameterValues,
    ImmutableArray<(string Name, Compiled Value)> Lets,
    Compiled? When,
    CheckNode Check,
    string Subject,
    string Message,
    bool ForEachRange,
    SourceSpan Span,
    ImmutableArray<string> Basis)
{
    public string Id => Descriptor.Id;
}
