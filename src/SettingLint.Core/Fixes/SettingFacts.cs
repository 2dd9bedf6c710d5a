using SettingLint.Core.Binding;
using SettingLint.Core.Documents;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Fixes;

/// <summary>
/// What a fix of one setting needs of its motor: the window the rules leave it, its value as bound, where it is written,
/// the relay model's range and the terms it is shown in. Taken while the motor is evaluated, so that a run keeps these
/// few values of a motor that failed a rule instead of its document, bus and relay model until the suggestions are made.
/// </summary>
/// <param name="Window">The setting's window, derived from the motor's rule outcomes.</param>
/// <param name="Value">The setting's value as bound; null when it is not a number with a unit.</param>
/// <param name="Span">The value's span, else the key's.</param>
/// <param name="Range">The relay model's range of the setting in SI for this motor, when it has one.</param>
/// <param name="Terms">How the setting's other side is shown (A sec through the CT, V sec, % or xVT).</param>
internal sealed record SettingFacts(SettingWindow Window, MeasureValue? Value, SourceSpan Span, (double Min, double Max, double Step)? Range, SettingTerms? Terms)
{
    /// <summary>The motor file, relative to the repository root.</summary>
    public string MotorFile => Window.MotorFile;

    /// <summary>The motor's tag.</summary>
    public string Motor => Window.Motor;

    /// <summary>The setting's key path.</summary>
    public string Setting => Window.Setting;

    /// <summary>
    /// The facts of each relay setting of a motor that a rule failed on and some rule bounds directly: a rule's finding
    /// is on its subject, so these are the only settings of the motor a finding can ask to fix (<see cref="FixPlanner.Fixable"/>).
    /// </summary>
    /// <param name="motor">The motor, while it is evaluated.</param>
    /// <param name="outcomes">Its outcomes that bound their own subject (the others make no window).</param>
    /// <param name="failed">The subjects of its failed outcomes, bounding or not.</param>
    public static List<SettingFacts> Of(MotorProtection motor, IEnumerable<RuleOutcome> outcomes, IReadOnlySet<string> failed)
    {
        ArgumentNullException.ThrowIfNull(motor);
        ArgumentNullException.ThrowIfNull(outcomes);
        ArgumentNullException.ThrowIfNull(failed);
        // Only these settings get a window: at 10,000 motors, each with a finding on one setting, deriving every setting's
        // window took some 11 % of a check's CPU (perf, native build).
        var chosen = outcomes.Where(o => failed.Contains(o.Subject) && o.Subject.StartsWith(FixPlanner.SettingPrefix, StringComparison.Ordinal));
        return [.. SettingWindows.Derive(chosen).Select(w => For(w, motor))];
    }

    /// <summary>The facts of a setting's window, read off its motor.</summary>
    public static SettingFacts For(SettingWindow window, MotorProtection motor)
    {
        ArgumentNullException.ThrowIfNull(window);
        ArgumentNullException.ThrowIfNull(motor);
        var value = motor.Document.Measure(window.Setting);
        return new SettingFacts(window, value, value?.Span ?? motor.Document.SpanOf(window.Setting), RangeOf(motor, window.Setting), SettingTerms.For(motor, window.Setting, value));
    }

    /// <summary>The relay model's range of a setting converted to SI for this motor, when it has one.</summary>
    private static (double Min, double Max, double Step)? RangeOf(MotorProtection motor, string setting)
    {
        const string prefix = SchemaPaths.Motor.ProtectionPrefix;
        if (motor.RelayModel is not { } model || !setting.StartsWith(prefix, StringComparison.Ordinal)) return null;
        if (model.RangeOf(setting[prefix.Length..]) is not { } range) return null;
        var voltage = range.Min.Quantity.Unit.Dimension == Dimension.Voltage;
        var connection = motor.Document.Text(SchemaPaths.Motor.GroundCtConnection);
        var refs = SettingReferences.For(new SettingReferences.DocumentNumbers(motor.Document), connection, setting, voltage);
        if (range.Min.Quantity.ToSi(refs) is not { } min || range.Max.Quantity.ToSi(refs) is not { } max) return null;
        var step = range.Step?.Quantity.ToSi(refs) ?? 0;
        return (min, max, step);
    }
}
