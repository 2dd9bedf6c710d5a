using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Fixes;

/// <summary>
/// Chooses the settings to fix from one check's findings and setting windows: a setting a rule has a finding on, in a
/// motor file with no SL0xx finding (a file the engine could not read whole is never edited), limited to some rules when asked.
/// </summary>
internal static class FixPlanner
{
    /// <summary>The key paths a fix may edit: the relay's settings, never the motor's data.</summary>
    public const string SettingPrefix = "protection.";

    /// <summary>The fixes of a check, sorted by file and line; those without a value say why.</summary>
    /// <param name="findings">The check's findings.</param>
    /// <param name="windows">The windows derived from the same check's rule outcomes.</param>
    /// <param name="motors">The bound motors of that check, by root-relative file.</param>
    /// <param name="readText">Reads a root-relative file's text as the check saw it.</param>
    /// <param name="onlyRules">Fix only findings of these rules; empty for all.</param>
    public static ImmutableArray<SettingFix> Plan(
        IEnumerable<Finding> findings,
        IEnumerable<SettingWindow> windows,
        IReadOnlyDictionary<string, MotorProtection> motors,
        Func<string, string?> readText,
        IReadOnlySet<string> onlyRules)
    {
        ArgumentNullException.ThrowIfNull(findings);
        ArgumentNullException.ThrowIfNull(windows);
        ArgumentNullException.ThrowIfNull(motors);
        ArgumentNullException.ThrowIfNull(readText);
        ArgumentNullException.ThrowIfNull(onlyRules);
        var all = findings.Where(f => f.Suppression is null).ToList();
        var unreadable = all.Where(f => f.RuleId.StartsWith("SL0", StringComparison.Ordinal)).Select(f => f.File).ToHashSet(StringComparer.Ordinal);
        var wanted = all.Where(f => onlyRules.Count == 0 || onlyRules.Contains(f.RuleId))
            .Select(f => (f.File, f.KeyPath)).ToHashSet();
        var texts = new Dictionary<string, string?>(StringComparer.Ordinal);
        var fixes = ImmutableArray.CreateBuilder<SettingFix>();
        foreach (var window in windows)
        {
            // Only settings: a rule on the motor's data (a stall time, a CT rating) asks for the data to be checked, not rewritten.
            if (!window.Setting.StartsWith(SettingPrefix, StringComparison.Ordinal)) continue;
            if (unreadable.Contains(window.MotorFile) || !wanted.Contains((window.MotorFile, window.Setting))) continue;
            if (!motors.TryGetValue(window.MotorFile, out var motor)) continue;
            if (!texts.TryGetValue(window.MotorFile, out var text)) texts[window.MotorFile] = text = readText(window.MotorFile);
            if (text is null) continue;
            if (FixMaker.For(window, motor, text) is { } fix) fixes.Add(fix);
        }
        return [.. fixes.OrderBy(f => f.MotorFile, StringComparer.Ordinal).ThenBy(f => f.Span.StartLine).ThenBy(f => f.Span.StartColumn)];
    }

    /// <summary>A file's text with the fixes' numbers replaced, each exactly over the characters of the old number.</summary>
    public static string Apply(string text, IEnumerable<SettingFix> fixes)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(fixes);
        var edits = new List<(int Start, int Length, string New)>();
        foreach (var fix in fixes)
        {
            if (fix.NewText is null) continue;
            if (ValueText.NumberAt(text, fix.Span) is not { } at || text.Substring(at.Start, at.Length) != fix.OldText)
            {
                throw new InvalidOperationException($"{fix.MotorFile}: the value of {fix.Setting} is no longer '{fix.OldText}'.");
            }
            edits.Add((at.Start, at.Length, fix.NewText));
        }
        var sb = new System.Text.StringBuilder(text);
        foreach (var (start, length, replacement) in edits.OrderByDescending(e => e.Start))
        {
            sb.Remove(start, length).Insert(start, replacement);
        }
        return sb.ToString();
    }
}
