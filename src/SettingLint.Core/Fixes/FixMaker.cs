using System.Globalization;
using SettingLint.Core.Binding;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Fixes;

/// <summary>
/// Turns the window that the rules leave a setting into a value a technician can key in: inside every bound with the
/// rules' own margins, on the relay model's step and inside its range when the motor has one, as close to the present
/// value as the window allows, and written in the unit and side of the present value.
/// </summary>
internal static class FixMaker
{
    // Extra digits tried beyond those of the present value when the window is narrower than its last digit.
    private const int MaxExtraDigits = 3;

    /// <summary>The fix of a window the present value lies outside of; null when the value already satisfies every bound.</summary>
    /// <param name="window">The setting's window, derived from the rule outcomes of the same check.</param>
    /// <param name="motor">The bound motor the window is of.</param>
    /// <param name="fileText">The motor file's text, to find the number as written.</param>
    public static SettingFix? For(SettingWindow window, MotorProtection motor, string fileText)
    {
        ArgumentNullException.ThrowIfNull(window);
        ArgumentNullException.ThrowIfNull(motor);
        var value = motor.Document.Measure(window.Setting);
        var range = RangeOf(motor, window.Setting);
        var offStep = range is { Step: > 0 } g && value is not null && !OnStep(value.Value, g.Min, g.Step);
        if (window.Holds && !offStep) return null;
        var located = value is null ? null : ValueText.NumberAt(fileText, value.Span);
        if (value is null || located is not { } at)
        {
            return None(window, motor, value, "", "", "the value is not written as a number with a unit");
        }
        var oldText = fileText.Substring(at.Start, at.Length);
        if (!double.TryParse(oldText, NumberStyles.Float, CultureInfo.InvariantCulture, out var written) || written == 0 || value.Value == 0)
        {
            return None(window, motor, value, oldText, at.Unit, "the present value is zero, so its unit's scale is unknown");
        }
        // SI per unit as written: A sec carries the CT ratio, xFLC the motor's FLC, % the rated voltage.
        var perUnit = value.Value / written;
        if (window.IsEmpty)
        {
            return None(window, motor, value, oldText, at.Unit, Conflict(window));
        }
        var lower = window.TightestLower;
        var upper = window.TightestUpper;
        var lo = Math.Max(lower?.Limit ?? double.NegativeInfinity, range?.Min ?? double.NegativeInfinity);
        var hi = Math.Min(upper?.Limit ?? double.PositiveInfinity, range?.Max ?? double.PositiveInfinity);
        bool Inside(double si) =>
            (lower is null || (lower.IsStrict ? si > lower.Limit : si >= lower.Limit * (1 - 1e-12)))
            && (upper is null || (upper.IsStrict ? si < upper.Limit : si <= upper.Limit * (1 + 1e-12)))
            && (range is null || (si >= range.Value.Min * (1 - 1e-12) && si <= range.Value.Max * (1 + 1e-12)));
        // Move the least distance: up to the lower side when below it, down to the upper side when above it.
        var up = value.Value <= lo;
        string? text = null;
        var si = double.NaN;
        if (range is { Step: > 0 } r)
        {
            var at0 = (value.Value - r.Min) / r.Step;
            // Below the window: the lowest steps above it; above: the highest below it; inside but off a step: the nearest.
            double[] ks = value.Value < lo ? [Math.Ceiling(((lo - r.Min) / r.Step) - 1e-9), Math.Ceiling(((lo - r.Min) / r.Step) - 1e-9) + 1]
                : value.Value > hi ? [Math.Floor(((hi - r.Min) / r.Step) + 1e-9), Math.Floor(((hi - r.Min) / r.Step) + 1e-9) - 1]
                : [Math.Round(at0), at0 - Math.Floor(at0) < 0.5 ? Math.Ceiling(at0) : Math.Floor(at0)];
            foreach (var k in ks)
            {
                var candidate = r.Min + (k * r.Step);
                if (text is not null || !Inside(candidate)) continue;
                si = candidate;
                text = Plain(candidate / perUnit);
            }
            if (text is null) return None(window, motor, value, oldText, at.Unit, "no step of the relay model's range lies inside the window " + Describe(window));
        }
        else
        {
            var decimals = Decimals(oldText);
            for (var d = decimals; d <= decimals + MaxExtraDigits && text is null; d++)
            {
                var scale = Math.Pow(10, d);
                var target = (up ? lo : hi) / perUnit;
                // Round inwards; perUnit is positive for every setting the rules bound (a negative one flips the sense).
                var inward = up == perUnit > 0;
                var n = (inward ? Math.Ceiling((target * scale) - 1e-9) : Math.Floor((target * scale) + 1e-9)) / scale;
                for (var tries = 0; tries < 2 && text is null; tries++, n += (inward ? 1 : -1) / scale)
                {
                    if (!Inside(n * perUnit)) continue;
                    si = n * perUnit;
                    text = n.ToString("F" + d.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
                }
            }
            if (text is null) return None(window, motor, value, oldText, at.Unit, "the window " + Describe(window) + " is narrower than the value's last digit");
        }
        return new SettingFix(motor.Document.RelativePath, motor.Tag, window.Setting, value.Span, oldText, text, at.Unit, value.Value, si,
            value.SideRatio, value.Dimension, window, null);
    }

    private static SettingFix None(SettingWindow window, MotorProtection motor, MeasureValue? value, string oldText, string unit, string reason) =>
        new(motor.Document.RelativePath, motor.Tag, window.Setting, value?.Span ?? motor.Document.SpanOf(window.Setting), oldText, null, unit,
            value?.Value ?? window.Actual, double.NaN, value?.SideRatio, value?.Dimension ?? Dimension.None, window, reason);

    /// <summary>Which rules leave no value between them, and their bounds.</summary>
    public static string Conflict(SettingWindow window)
    {
        ArgumentNullException.ThrowIfNull(window);
        var lo = window.TightestLower!;
        var up = window.TightestUpper!;
        return $"no value satisfies every rule: {lo.RuleId} needs {SettingWindows.Phrase(lo.Op)} {Show(window, lo.Limit)} ({lo.Label}), "
            + $"{up.RuleId} needs {SettingWindows.Phrase(up.Op)} {Show(window, up.Limit)} ({up.Label}); the data or the scheme must change, not the setting";
    }

    private static string Describe(SettingWindow window)
    {
        var parts = new List<string>();
        if (window.TightestLower is { } lo) parts.Add(SettingWindows.Phrase(lo.Op) + " " + Show(window, lo.Limit) + " (" + lo.RuleId + ")");
        if (window.TightestUpper is { } up) parts.Add(SettingWindows.Phrase(up.Op) + " " + Show(window, up.Limit) + " (" + up.RuleId + ")");
        return string.Join(", ", parts);
    }

    /// <summary>A bound of a window for people, in the window's dimension.</summary>
    public static string Show(SettingWindow window, double si) =>
        window.Percent ? Formats.Number(si * 100) + " %" : Formats.Si(si, window.Dim.Plain ?? Dimension.None);

    private static bool OnStep(double value, double min, double step)
    {
        var k = (value - min) / step;
        return Math.Abs(k - Math.Round(k)) <= 1e-3;
    }

    private static int Decimals(string number)
    {
        var mantissa = number.Split('e', 'E')[0];
        var dot = mantissa.IndexOf('.', StringComparison.Ordinal);
        return dot < 0 ? 0 : mantissa.Length - dot - 1;
    }

    // A step's multiple written without float noise: 0.30000000000000004 becomes 0.3.
    private static string Plain(double v) => Math.Round(v, 9).ToString("0.#########", CultureInfo.InvariantCulture);

    /// <summary>The relay model's range of a setting converted to SI for this motor, when it has one.</summary>
    private static (double Min, double Max, double Step)? RangeOf(MotorProtection motor, string setting)
    {
        const string prefix = "protection.";
        if (motor.RelayModel is not { } model || !setting.StartsWith(prefix, StringComparison.Ordinal)) return null;
        if (model.RangeOf(setting[prefix.Length..]) is not { } range) return null;
        var voltage = range.Min.Quantity.Unit.Dimension == Dimension.Voltage;
        var connection = motor.Document.Text("transformers.ground_ct.connection");
        var refs = SettingReferences.For(new SettingReferences.DocumentNumbers(motor.Document), connection, setting, voltage);
        if (range.Min.Quantity.ToSi(refs) is not { } min || range.Max.Quantity.ToSi(refs) is not { } max) return null;
        var step = range.Step?.Quantity.ToSi(refs) ?? 0;
        return (min, max, step);
    }
}
