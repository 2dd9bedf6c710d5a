using SettingLint.Core.Documents;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>
/// How a current or voltage setting is also shown beside its primary value ("669 A pri (44.6 A sec)"): one of its
/// value's units per what. Findings and suggested values both write a setting this way, so the two always agree.
/// </summary>
/// <param name="Per">Primary SI units per unit of <paramref name="Symbol"/>.</param>
/// <param name="Symbol">The other side's unit: A sec, V sec, % or xVT.</param>
/// <param name="Dim">The dimension the terms apply to.</param>
public readonly record struct SettingTerms(double Per, string Symbol, Dim Dim)
{
    /// <summary>
    /// A current setting is also shown in A sec through its CT; a voltage setting in the terms its relay model sets it in
    /// (V sec, % of rated voltage or xVT), else in those it is written in, else in V sec. Null for other settings.
    /// </summary>
    public static SettingTerms? For(MotorProtection motor, string subject, MeasureValue? value)
    {
        ArgumentNullException.ThrowIfNull(motor);
        ArgumentNullException.ThrowIfNull(subject);
        if (value is not { Dimension: Dimension.Current or Dimension.Voltage }) return null;
        if (value.Dimension == Dimension.Current) return value.SideRatio is { } r ? new SettingTerms(r, "A sec", Dim.Current) : null;
        var setting = subject.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal) ? subject[SchemaPaths.Motor.ProtectionPrefix.Length..] : subject;
        var basis = motor.RelayModel?.RangeOf(setting)?.Min.Quantity.Unit.Basis ?? value.Written?.Unit.Basis;
        var rated = motor.Document.Measure(SchemaPaths.Motor.RatedVoltage)?.Value;
        var vtPrimary = motor.Document.Measure(SchemaPaths.Motor.VtPrimary)?.Value;
        return basis switch
        {
            UnitBasis.RatedVoltage when rated is > 0 => new SettingTerms(rated.Value / 100, "%", Dim.Voltage),
            UnitBasis.VtRating when vtPrimary is > 0 => new SettingTerms(vtPrimary.Value, "xVT", Dim.Voltage),
            _ => value.SideRatio is { } r ? new SettingTerms(r, "V sec", Dim.Voltage) : null,
        };
    }

    /// <summary>A value in SI in the engine's usual unit, followed by its other side when the terms apply ("1.84 kA pri (46 A sec)").</summary>
    public static string Show(double value, Dim dim, bool percent, SettingTerms? terms)
    {
        var text = CheckNode.Format(value, dim, percent);
        return terms is { } t && dim == t.Dim && double.IsFinite(value) ? text + " pri (" + Formats.Number(value / t.Per) + " " + t.Symbol + ")" : text;
    }
}
