using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Fixes;

/// <summary>
/// Chooses the settings to fix from one check's findings and setting windows: a setting a rule has a finding on, in a
/// motor file with no SL0xx finding (a file the engine could not read whole is never edited), limited to some rules when asked.
/// </summary>
internal static class FixPlanner
{
    /// <summary>The key paths a fix may edit: the relay's settings, never the motor's data.</summary>
    public const string SettingPrefix = SchemaPaths.Motor.ProtectionPrefix;

    /// <summary>
    /// The settings a check's findings ask to fix, as (file, key path): an unsuppressed finding on a relay setting, of the
    /// rules asked for, in a file that every finding shows was read whole (no SL0nn finding on it, accepted or not).
    /// </summary>
    /// <param name="findings">The check's findings.</param>
    /// <param name="onlyRules">Fix only findings of these rules; empty for all.</param>
    public static HashSet<(string File, string KeyPath)> Fixable(IReadOnlyCollection<Finding> findings, IReadOnlySet<string> onlyRules)
    {
        ArgumentNullException.ThrowIfNull(findings);
        ArgumentNullException.ThrowIfNull(onlyRules);
        var unreadable = findings.Where(f => f.RuleId.StartsWith("SL0", StringComparison.Ordinal)).Select(f => f.File).ToHashSet(StringComparer.Ordinal);
        return findings
            .Where(f => f.Suppression is null && f.KeyPath.StartsWith(SettingPrefix, StringComparison.Ordinal) && !unreadable.Contains(f.File)
                && (onlyRules.Count == 0 || onlyRules.Contains(f.RuleId)))
            .Select(f => (f.File, f.KeyPath)).ToHashSet();
    }

    /// <summary>The fixes of a check, sorted by file and line; those without a value say why.</summary>
    /// <param name="fixable">The settings to fix (<see cref="Fixable"/>).</param>
    /// <param name="settings">The settings' windows, derived from the same check's rule outcomes, with what a fix needs of their motors.</param>
    /// <param name="readText">Reads a root-relative file's text as the check saw it.</param>
    /// <param name="preferences">The preferred side of the rules that state one (rule.yaml's `prefer`), by rule id; null for none.</param>
    public static ImmutableArray<SettingFix> Plan(
        IReadOnlySet<(string File, string KeyPath)> fixable,
        IEnumerable<SettingFacts> settings,
        Func<string, string?> readText,
        IReadOnlyDictionary<string, FixPreference>? preferences = null)
    {
        ArgumentNullException.ThrowIfNull(fixable);
        ArgumentNullException.ThrowIfNull(settings);
        ArgumentNullException.ThrowIfNull(readText);
        // The text of one file at a time (the settings come by file): every file's text held to the end was some 7 MB of
        // strings at 100,000 generated motors with 2,000 fixes (docs/performance.md, 2026-12-05, "Packed paths and tags").
        (string File, string? Text)? last = null;
        var fixes = ImmutableArray.CreateBuilder<SettingFix>();
        foreach (var setting in settings)
        {
            // Only settings (Fixable): a rule on the motor's data (a stall time, a CT rating) asks for the data to be checked, not rewritten.
            if (!fixable.Contains((setting.MotorFile, setting.Setting))) continue;
            if (last?.File != setting.MotorFile) last = (setting.MotorFile, readText(setting.MotorFile));
            if (last.Value.Text is not { } text) continue;
            if (FixMaker.For(setting, text, Preferred(setting.Window, preferences)) is { } fix) fixes.Add(fix);
        }
        return [.. fixes.OrderBy(f => f.MotorFile, StringComparer.Ordinal).ThenBy(f => f.Span.StartLine).ThenBy(f => f.Span.StartColumn)];
    }

    /// <summary>
    /// The side the rules bounding a window prefer, when every one of them that states a side states the same one and one
    /// of them bounds the window on that side; none otherwise (then neither is favoured, and the fix makes the least change).
    /// </summary>
    public static (PreferredSide Side, string Why)? Preferred(SettingWindow window, IReadOnlyDictionary<string, FixPreference>? preferences)
    {
        ArgumentNullException.ThrowIfNull(window);
        if (preferences is null || preferences.Count == 0) return null;
        var stated = window.Lower.Concat(window.Upper).Select(b => b.RuleId).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal)
            .Where(preferences.ContainsKey).Select(id => (Id: id, Prefer: preferences[id])).ToList();
        if (stated.Count == 0 || stated.Any(s => s.Prefer.Side != stated[0].Prefer.Side)) return null;
        // The end of the window is taken only where a rule that prefers it bounds it: the lowest pickup above the start's
        // bound, never a bound of the relay's range alone (a core-balance 50G with no lower rule keeps the least change).
        var ids = stated.Select(s => s.Id).ToHashSet(StringComparer.Ordinal);
        var bounds = stated[0].Prefer.Side == PreferredSide.Lowest ? window.Lower : window.Upper;
        if (!bounds.Any(b => ids.Contains(b.RuleId))) return null;
        var side = stated[0].Prefer.Side == PreferredSide.Lowest ? "lowest" : "highest";
        return (stated[0].Prefer.Side, string.Join(", ", stated.Select(s => s.Id)) + " prefer" + (stated.Count == 1 ? "s" : "") + " the " + side + " value: " + stated[0].Prefer.Reason);
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
