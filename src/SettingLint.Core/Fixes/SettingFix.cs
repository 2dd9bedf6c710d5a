using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Fixes;

/// <summary>
/// What the rules on one setting of one motor suggest: a compliant value written in the form of the present one, or the
/// reason there is none (the rules leave no value, or the value cannot be rewritten in its own terms).
/// </summary>
/// <param name="MotorFile">The motor file, relative to the repository root.</param>
/// <param name="Motor">The motor's tag.</param>
/// <param name="Setting">The setting's key path (protection.short_circuit.pickup).</param>
/// <param name="Span">The value's span in the file.</param>
/// <param name="OldText">The number as written in the file (the characters a fix replaces).</param>
/// <param name="NewText">The suggested number in the same unit, or null when there is none.</param>
/// <param name="Unit">The unit as written (A sec, xCT, %, s), empty for a plain number.</param>
/// <param name="OldSi">The present value in SI units.</param>
/// <param name="NewSi">The suggested value in SI units (NaN when there is none).</param>
/// <param name="Terms">How the setting's other side is shown (A sec through the CT, V sec, % or xVT), as findings show it.</param>
/// <param name="Window">The window the rules leave, which the suggestion lies in.</param>
/// <param name="Reason">Why there is no suggestion; null when there is one.</param>
public sealed record SettingFix(
    string MotorFile,
    string Motor,
    string Setting,
    SourceSpan Span,
    string OldText,
    string? NewText,
    string Unit,
    double OldSi,
    double NewSi,
    SettingTerms? Terms,
    SettingWindow Window,
    string? Reason)
{
    /// <summary>A value can be written.</summary>
    public bool HasValue => NewText is not null;

    /// <summary>The rules that bound the setting.</summary>
    public ImmutableArray<string> RuleIds => [.. Window.Lower.Concat(Window.Upper).Select(b => b.RuleId).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal)];

    /// <summary>The suggested value as it would be written ("46 A sec").</summary>
    public string? Written => NewText is null ? null : Unit.Length == 0 ? NewText : NewText + " " + Unit;

    /// <summary>The present value as written.</summary>
    public string OldWritten => Unit.Length == 0 ? OldText : OldText + " " + Unit;

    /// <summary>The region of the value as written in a text: its number and unit, without quotes.</summary>
    public SourceSpan ValueRegion(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        if (ValueText.NumberAt(text, Span) is not { } at) return Span;
        var start = ValueText.Offset(text, Span.StartLine, 1);
        var column = at.Start - start + 1;
        var length = at.Length + (Unit.Length == 0 ? 0 : text.AsSpan(at.Start + at.Length).IndexOf(Unit, StringComparison.Ordinal) + Unit.Length);
        return new SourceSpan(Span.StartLine, column, Span.StartLine, column + length);
    }

    /// <summary>Why the value sits where it does in the window, when a rule prefers a side ("SL201 prefers the lowest: ..."); null for the least change.</summary>
    public string? Preference { get; init; }

    /// <summary>A value in SI shown as findings show the setting, with its other side ("1.84 kA pri (46 A sec)").</summary>
    public string Shown(double si) => SettingTerms.Show(si, Window.Dim, Window.Percent, Terms);
}
