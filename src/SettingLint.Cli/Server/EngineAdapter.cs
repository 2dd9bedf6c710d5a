using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Cli.Server;

/// <summary>What one check of a repository gave the server: the result as `check` has it, and, for hover, the open motors and their rule outcomes.</summary>
/// <param name="Result">The findings and notifications, as `check` would report them for the same files.</param>
/// <param name="Motors">The bound motors among the files asked for, by root-relative path.</param>
/// <param name="Outcomes">Every rule outcome of those motors.</param>
public sealed record EngineRun(CheckResult Result, ImmutableDictionary<string, MotorProtection> Motors, ImmutableArray<RuleOutcome> Outcomes);

/// <summary>
/// The one place where the server drives the engine: <see cref="Linter.Check"/> over the disk with the unsaved buffers
/// as an <see cref="OverlaySource"/>, observing the motors and rule outcomes that hover needs.
/// </summary>
public sealed class EngineAdapter
{
    /// <summary>
    /// Checks a repository as `check CHECKED` does (same configuration, rules, levels and acceptance comments), reading
    /// the given root-relative files from memory instead of the disk, and keeps motors and outcomes for the files in <paramref name="keep"/>.
    /// </summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="checkedPath">The folder `check` would be given (where the configuration is found).</param>
    /// <param name="overlays">Root-relative path to the bytes of an unsaved buffer.</param>
    /// <param name="keep">Root-relative paths whose motors and outcomes are kept for hover; the rest are dropped at once.</param>
    public EngineRun Check(string root, string checkedPath, IReadOnlyDictionary<string, byte[]> overlays, IReadOnlySet<string> keep)
    {
        ArgumentNullException.ThrowIfNull(overlays);
        ArgumentNullException.ThrowIfNull(keep);
        // Every run reads the configuration and company rule packs through the same overlay as the motors, so an
        // unsaved edit to an open one applies at once, and a saved one too (the built-in pack is compiled once per process).
        var observer = new Keeper(keep);
        var result = Linter.Check(new CheckRequest(root, [checkedPath])
        {
            Root = root,
            Source = new OverlaySource(new DiskSource(root), overlays),
            Observers = [observer],
        });
        var (motors, outcomes) = (observer.Motors, observer.Outcomes);
        return new EngineRun(result, motors.ToImmutableDictionary(StringComparer.Ordinal),
            [.. outcomes.OrderBy(o => o.MotorFile, StringComparer.Ordinal).ThenBy(o => o.RuleId, StringComparer.Ordinal).ThenBy(o => o.Subject, StringComparer.Ordinal)]);
    }
}

/// <summary>Keeps the motors and rule outcomes of some files (the open ones); the rest are dropped as they come.</summary>
internal sealed class Keeper(IReadOnlySet<string> keep) : ICheckObserver
{
    public ConcurrentQueue<RuleOutcome> Outcomes { get; } = new();

    public ConcurrentDictionary<string, MotorProtection> Motors { get; } = new(StringComparer.Ordinal);

    public void OnMotor(MotorProtection motor)
    {
        if (keep.Contains(motor.Document.RelativePath)) Motors.TryAdd(motor.Document.RelativePath, motor);
    }

    public void OnOutcome(RuleOutcome outcome)
    {
        if (keep.Contains(outcome.MotorFile)) Outcomes.Enqueue(outcome);
    }
}
