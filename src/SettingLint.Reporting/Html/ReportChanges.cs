using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;

namespace SettingLint.Reporting.Html;

/// <summary>How a motor file differs from the compared revision.</summary>
public enum ChangeKind
{
    /// <summary>Same settings, same outcomes, same findings.</summary>
    Unchanged,

    /// <summary>Something differs.</summary>
    Changed,

    /// <summary>The motor file is new.</summary>
    Added,

    /// <summary>The motor file is gone.</summary>
    Removed,
}

/// <summary>One value of a motor's file (or of its bus) that differs, old and new as written.</summary>
/// <param name="Path">The key path; bus values start with "bus.".</param>
/// <param name="Old">The old value as text; null when it was absent.</param>
/// <param name="New">The new value as text; null when it is absent now.</param>
public sealed record SettingChange(string Path, string? Old, string? New);

/// <summary>One rule outcome whose numbers or result differ, old and new side by side.</summary>
/// <param name="Key">Rule and subject.</param>
/// <param name="Old">The old row; null when the rule did not apply.</param>
/// <param name="New">The new row; null when the rule no longer applies.</param>
public sealed record OutcomeChange(string Key, MarginRow? Old, MarginRow? New);

/// <summary>What changed for one motor file since the compared revision.</summary>
/// <param name="File">The motor file, relative to the root.</param>
/// <param name="Tag">The motor's tag (the new one, or the old one when the file is gone).</param>
/// <param name="Kind">Added, removed, changed or unchanged.</param>
/// <param name="Settings">Values that differ.</param>
/// <param name="Outcomes">Outcomes that differ.</param>
/// <param name="NewFindings">Findings that were not there before (by fingerprint: file, rule, key path).</param>
/// <param name="FixedFindings">Findings that are gone.</param>
/// <param name="Windows">Setting windows whose sentence differs: setting, old sentence, new sentence.</param>
public sealed record MotorChange(
    string File,
    string Tag,
    ChangeKind Kind,
    ImmutableArray<SettingChange> Settings,
    ImmutableArray<OutcomeChange> Outcomes,
    ImmutableArray<Finding> NewFindings,
    ImmutableArray<Finding> FixedFindings,
    ImmutableArray<(string Setting, string? Old, string? New)> Windows)
{
    /// <summary>Whether an outcome row (by key) changed.</summary>
    public OutcomeChange? OutcomeOf(string key) => Outcomes.FirstOrDefault(o => o.Key == key);

    /// <summary>Whether a finding is new since the revision.</summary>
    public bool IsNew(Finding finding) => NewFindings.Any(f => f.Fingerprint == finding.Fingerprint);
}

/// <summary>Compares two reports of the same repository (a revision and now) motor by motor.</summary>
public static class ReportChanges
{
    /// <summary>The new model with every motor's change attached and the removed motors listed.</summary>
    public static ReportModel Compare(ReportModel before, ReportModel now, IReadOnlyList<MotorProtection> beforeMotors, IReadOnlyList<MotorProtection> nowMotors, string revision)
    {
        ArgumentNullException.ThrowIfNull(before);
        ArgumentNullException.ThrowIfNull(now);
        ArgumentNullException.ThrowIfNull(beforeMotors);
        ArgumentNullException.ThrowIfNull(nowMotors);
        var oldByFile = before.Motors.ToDictionary(m => m.File, StringComparer.Ordinal);
        var oldModels = beforeMotors.ToDictionary(m => m.Document.RelativePath, StringComparer.Ordinal);
        var newModels = nowMotors.ToDictionary(m => m.Document.RelativePath, StringComparer.Ordinal);
        var motors = now.Motors.Select(m => m with
        {
            Change = Diff(oldByFile.GetValueOrDefault(m.File), m, oldModels.GetValueOrDefault(m.File), newModels.GetValueOrDefault(m.File)),
        }).ToImmutableArray();
        var removed = before.Motors.Where(m => !now.Motors.Any(n => n.File == m.File))
            .Select(m => Diff(m, null, oldModels.GetValueOrDefault(m.File), null)).ToImmutableArray();
        return now with { Motors = motors, ChangedSince = revision, RemovedMotors = removed };
    }

    /// <summary>The change of one motor file; either side may be missing (added or removed).</summary>
    public static MotorChange Diff(MotorReport? before, MotorReport? now, MotorProtection? beforeModel, MotorProtection? nowModel)
    {
        var file = now?.File ?? before?.File ?? throw new ArgumentException("One side must be present.", nameof(now));
        var tag = now?.Tag ?? before!.Tag;
        var settings = Settings(beforeModel, nowModel);
        var oldRows = (before?.Margins ?? []).ToDictionary(r => r.Key, StringComparer.Ordinal);
        var newRows = (now?.Margins ?? []).ToDictionary(r => r.Key, StringComparer.Ordinal);
        var outcomes = oldRows.Keys.Union(newRows.Keys, StringComparer.Ordinal).Order(StringComparer.Ordinal)
            .Select(k => new OutcomeChange(k, oldRows.GetValueOrDefault(k), newRows.GetValueOrDefault(k)))
            .Where(c => RowChanged(c.Old, c.New))
            .ToImmutableArray();
        var oldFindings = before?.Findings ?? [];
        var newFindings = now?.Findings ?? [];
        var added = newFindings.Where(f => !oldFindings.Any(o => o.Fingerprint == f.Fingerprint)).ToImmutableArray();
        var fixedOnes = oldFindings.Where(o => !newFindings.Any(f => f.Fingerprint == o.Fingerprint)).ToImmutableArray();
        var oldWindows = (before?.Windows ?? []).ToDictionary(w => w.Window.Setting, w => w.Sentence, StringComparer.Ordinal);
        var newWindows = (now?.Windows ?? []).ToDictionary(w => w.Window.Setting, w => w.Sentence, StringComparer.Ordinal);
        var windows = oldWindows.Keys.Union(newWindows.Keys, StringComparer.Ordinal).Order(StringComparer.Ordinal)
            .Select(k => (Setting: k, Old: oldWindows.GetValueOrDefault(k), New: newWindows.GetValueOrDefault(k)))
            .Where(w => w.Old != w.New)
            .ToImmutableArray();
        var kind = before is null ? ChangeKind.Added
            : now is null ? ChangeKind.Removed
            : settings.IsEmpty && outcomes.IsEmpty && added.IsEmpty && fixedOnes.IsEmpty && windows.IsEmpty ? ChangeKind.Unchanged
            : ChangeKind.Changed;
        return new MotorChange(file, tag, kind, settings, outcomes, added, fixedOnes, windows);
    }

    /// <summary>Every value of the motor's file and of its bus that differs, by key path.</summary>
    private static ImmutableArray<SettingChange> Settings(MotorProtection? before, MotorProtection? now)
    {
        var oldValues = Values(before);
        var newValues = Values(now);
        return [.. oldValues.Keys.Union(newValues.Keys, StringComparer.Ordinal).Order(StringComparer.Ordinal)
            .Select(k => (Key: k, Old: oldValues.GetValueOrDefault(k), New: newValues.GetValueOrDefault(k)))
            .Where(x => !Same(x.Old, x.New))
            .Select(x => new SettingChange(x.Key, x.Old is null ? null : ReportValues.Written(x.Old), x.New is null ? null : ReportValues.Written(x.New)))];
    }

    private static Dictionary<string, BoundValue> Values(MotorProtection? motor)
    {
        var d = new Dictionary<string, BoundValue>(StringComparer.Ordinal);
        if (motor is null) return d;
        foreach (var (k, v) in motor.Document.Values) d[k] = v;
        // An inline bus is part of the motor's own file and already listed; a referenced bus is shown under "bus.".
        if (motor.Bus is { } bus && bus.Document.Path != motor.Document.Path)
        {
            foreach (var (k, v) in bus.Document.Values) d["bus." + k] = v;
        }
        return d;
    }

    private static bool Same(BoundValue? a, BoundValue? b) => (a, b) switch
    {
        (null, null) => true,
        (MeasureValue x, MeasureValue y) => x.Dimension == y.Dimension && Close(x.Value, y.Value) && Equals(x.Written, y.Written),
        (TextValue x, TextValue y) => x.Value == y.Value,
        (FlagValue x, FlagValue y) => x.Value == y.Value,
        (WrittenValue x, WrittenValue y) => x.Quantity == y.Quantity,
        _ => false,
    };

    private static bool RowChanged(MarginRow? a, MarginRow? b)
    {
        if (a is null || b is null) return a is not null || b is not null;
        if (a.Status != b.Status) return true;
        var (x, y) = (a.Outcome.Numbers, b.Outcome.Numbers);
        if (x is null || y is null) return (x is null) != (y is null);
        return !Close(x.Actual, y.Actual) || !Close(x.Limit, y.Limit);
    }

    // Values are recomputed on both sides in the same way; anything beyond rounding noise is a change.
    private static bool Close(double a, double b) =>
        a == b || (double.IsFinite(a) && double.IsFinite(b) && Math.Abs(a - b) <= 1e-9 * Math.Max(Math.Abs(a), Math.Abs(b)));
}
