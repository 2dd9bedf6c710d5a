using System.Globalization;
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
    /// <param name="setting">The setting's window, derived from the rule outcomes of the same check, with what the fix needs of its motor.</param>
    /// <param name="fileText">The motor file's text, to find the number as written.</param>
    /// <param name="prefer">The side the rules on the setting prefer and why; null for the least change from the present value.</param>
    public static SettingFix? For(SettingFacts setting, string fileText, (PreferredSide Side, string Why)? prefer = null)
    {
        ArgumentNullException.ThrowIfNull(setting);
        var window = setting.Window;
        var value = setting.Value;
        var range = setting.Range;
        var offStep = range is { Step: > 0 } g && value is not null && !OnStep(value.Value, g.Min, g.Step);
        if (window.Holds && !offStep) return null;
        var located = value is null ? null : ValueText.NumberAt(fileText, value.Span);
        if (value is null || located is not { } at)
        {
            return None(setting, "", "", "the value is not written as a number with a unit");
        }
        var oldText = fileText.Substring(at.Start, at.Length);
        if (!double.TryParse(oldText, NumberStyles.Float, CultureInfo.InvariantCulture, out var written) || written == 0 || value.Value == 0)
        {
            return None(setting, oldText, at.Unit, "the present value is zero, so its unit's scale is unknown");
        }
        // SI per unit as written: A sec carries the CT ratio, xFLC the motor's FLC, % the rated voltage.
        var perUnit = value.Value / written;
        if (window.IsEmpty)
        {
            return None(setting, oldText, at.Unit, Conflict(window));
        }
        var lower = window.TightestLower;
        var upper = window.TightestUpper;
        var lo = Math.Max(lower?.Limit ?? double.NegativeInfinity, range?.Min ?? double.NegativeInfinity);
        var hi = Math.Min(upper?.Limit ?? double.PositiveInfinity, range?.Max ?? double.PositiveInfinity);
        bool Inside(double si) =>
            (lower is null || (lower.IsStrict ? si > lower.Limit : si >= lower.Limit * (1 - 1e-12)))
            && (upper is null || (upper.IsStrict ? si < upper.Limit : si <= upper.Limit * (1 + 1e-12)))
            && (range is null || (si >= range.Value.Min * (1 - 1e-12) && si <= range.Value.Max * (1 + 1e-12)));
        // A preferred side is taken wherever the value is, when a rule bounds the window on that side (the most sensitive
        // pickup that still rides through the start is "lowest" above the start's bound, never the relay's bare minimum);
        // a value that only sits off the relay's step keeps to the nearest step.
        var side = window.Holds || prefer is null ? 0
            : prefer.Value.Side == PreferredSide.Lowest && lower is not null ? -1
            : prefer.Value.Side == PreferredSide.Highest && upper is not null ? 1
            : 0;
        // Otherwise move the least distance: up to the lower side when below it, down to the upper side when above it.
        var up = side != 0 ? side < 0 : value.Value <= lo;
        string? text = null;
        var si = double.NaN;
        if (range is { Step: > 0 } r)
        {
            var at0 = (value.Value - r.Min) / r.Step;
            // Below the window: the lowest steps above it; above: the highest below it; inside but off a step: the nearest.
            double[] ks = side < 0 || (side == 0 && value.Value < lo) ? [Math.Ceiling(((lo - r.Min) / r.Step) - 1e-9), Math.Ceiling(((lo - r.Min) / r.Step) - 1e-9) + 1]
                : side > 0 || value.Value > hi ? [Math.Floor(((hi - r.Min) / r.Step) + 1e-9), Math.Floor(((hi - r.Min) / r.Step) + 1e-9) - 1]
                : [Math.Round(at0), at0 - Math.Floor(at0) < 0.5 ? Math.Ceiling(at0) : Math.Floor(at0)];
            foreach (var k in ks)
            {
                var candidate = r.Min + (k * r.Step);
                if (text is not null || !Inside(candidate)) continue;
                si = candidate;
                text = Plain(candidate / perUnit);
            }
            if (text is null) return None(setting, oldText, at.Unit, "no step of the relay model's range lies inside the window " + Describe(window));
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
            if (text is null) return None(setting, oldText, at.Unit, "the window " + Describe(window) + " is narrower than the value's last digit");
        }
        return new SettingFix(setting.MotorFile, setting.Motor, window.Setting, value.Span, oldText, text, at.Unit, value.Value, si, setting.Terms, window, null)
        {
            Preference = side == 0 ? null : prefer!.Value.Why,
        };
    }

    private static SettingFix None(SettingFacts setting, string oldText, string unit, string reason) =>
        new(setting.MotorFile, setting.Motor, setting.Setting, setting.Span, oldText, null, unit,
            setting.Value?.Value ?? setting.Window.Actual, double.NaN, setting.Terms, setting.Window, reason);

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
}
