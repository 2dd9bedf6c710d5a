using SettingLint.Core.Documents;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Model;

/// <summary>A value of a setting file after binding: typed, in SI units, with the span it came from.</summary>
public abstract record BoundValue(string Path, SourceSpan Span);

/// <summary>A number, dimensioned or not, converted once to SI (A primary, V primary, s, W, ohm, fraction).</summary>
/// <param name="Value">The SI value.</param>
/// <param name="Dimension">Its dimension (None for plain numbers).</param>
/// <param name="Written">The value as written, when it had a unit.</param>
/// <param name="SideRatio">For a current or voltage setting: primary per secondary of the transformer it is measured through.</param>
public sealed record MeasureValue(string Path, SourceSpan Span, double Value, Dimension Dimension, Quantity? Written, double? SideRatio)
    : BoundValue(Path, Span)
{
    /// <summary>The value in the transformer's secondary units, when it has a transformer.</summary>
    public double? Secondary => SideRatio is { } r && r > 0 ? Value / r : null;
}

/// <summary>A text value: a tag, an enum token, a file reference.</summary>
public sealed record TextValue(string Path, SourceSpan Span, string Value) : BoundValue(Path, Span);

/// <summary>A true/false value.</summary>
public sealed record FlagValue(string Path, SourceSpan Span, bool Value) : BoundValue(Path, Span);

/// <summary>A dimensioned value kept as written, because what it refers to depends on the motor (relay-model ranges).</summary>
public sealed record WrittenValue(string Path, SourceSpan Span, Quantity Quantity) : BoundValue(Path, Span);
