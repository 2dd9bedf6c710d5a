using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;
using SettingLint.Core.Documents;

namespace SettingLint.Reporting.Html;

/// <summary>Values as a reviewer reads them: engineering units, primary with secondary for a current setting, names in words.</summary>
public static class ReportValues
{
    /// <summary>A value of a compared dimension, marked primary with its secondary value when the subject is a relay current setting measured through a CT.</summary>
    public static string Text(double value, Dim dim, bool percent, MeasureValue? subject, bool withSecondary = true)
    {
        // A relay range's values have the dimension of the setting they bound, known only from the setting.
        if (dim == Dim.ItemValue)
        {
            var d = subject?.Dimension ?? Dimension.None;
            dim = Dim.Of(d);
            percent |= d == Dimension.Fraction;
        }
        var text = CheckNode.Format(value, dim, percent);
        // Only relay settings are read on the secondary side; a motor's own currents are primary values.
        if (subject is { SideRatio: { } r, Dimension: Dimension.Current } && r > 0 && dim == Dim.Current && double.IsFinite(value)
            && subject.Path.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal))
        {
            text += withSecondary ? " pri (" + Formats.Number(value / r) + " A sec)" : " pri";
        }
        return text;
    }

    /// <summary>A margin ratio as a signed percentage ("+8.5 %", "-97 %").</summary>
    public static string Ratio(double? ratio) => ratio is { } r
        ? (r > 0 ? "+" : "") + Formats.Si(r, Dimension.Fraction)
        : "";

    /// <summary>A bound value as written in its file (46 A sec), else in SI; text and flags as they are.</summary>
    public static string Written(BoundValue? value) => value switch
    {
        // A relative or secondary current is shown with its primary value too: that is what changed for the motor.
        MeasureValue { Written: { } q } m => q.ToString() + (m.Dimension is Dimension.Current or Dimension.Voltage && q.Unit.Basis is not (UnitBasis.Absolute or UnitBasis.Primary)
            ? " (" + Formats.Si(m.Value, m.Dimension) + " pri)" : ""),
        MeasureValue m => Formats.Si(m.Value, m.Dimension),
        TextValue t => t.Value,
        FlagValue f => f.Value ? "true" : "false",
        WrittenValue w => w.Quantity.ToString(),
        null => "(absent)",
        _ => value.ToString() ?? "",
    };

    /// <summary>A key path in words: "protection.short_circuit.pickup" is "short-circuit pickup".</summary>
    public static string SettingName(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        var parts = path.Split('.');
        if (parts.Length == 3 && parts[0] == "protection" && parts[1] == "acceleration" && parts[2] == "time") return "acceleration timer";
        var words = parts.Length > 1 && parts[0] is "protection" or "motor" or "transformers" ? parts[1..] : parts;
        return string.Join(' ', words.Select(Word));
    }

    private static string Word(string part) => part switch
    {
        "short_circuit" => "short-circuit",
        "ground_fault" => "ground-fault",
        "phase_ct" => "phase CT",
        "ground_ct" => "ground CT",
        "vt" => "VT",
        _ => part.Replace('_', ' '),
    };
}
