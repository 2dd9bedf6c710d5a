using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Cli.Server;

/// <summary>What one check of a repository gave the server: the result as `check` has it, and, for hover, the open motors and their rule outcomes.</summary>
/// <param name="Result">The findings and notifications, as `check` would report them for the same files.</param>
/// <param name="Motors">The bound motors among the files asked for, by root-relative path.</param>
/// <param name="Outcomes">Every rule outcome of those motors.</param>
public sealed record EngineRun(CheckResult Result, ImmutableDictionary<string, MotorProtection> Motors, ImmutableArray<RuleOutcome> Outcomes);

/// <summary>
/// The one place where the server drives the engine. It is built on today's API (open a session, run the checker with
/// the unsaved buffers as a <see cref="FileOverlay"/>, as `--staged` reads the index); when Core gains its single
/// entry point, only this class changes.
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
        // A session is opened for every run: the configuration and company rule packs are read from the disk each
        // time, so a saved change to them applies to the next run (the built-in pack is compiled once per process).
        var session = Session.Open([checkedPath]);
        var outcomes = new ConcurrentQueue<RuleOutcome>();
        var motors = new ConcurrentDictionary<string, MotorProtection>(StringComparer.Ordinal);
        var listening = new RuleSet(session.Rules.Rules)
        {
            Outcomes = o => { if (keep.Contains(o.MotorFile)) outcomes.Enqueue(o); },
            Motors = m => { if (keep.Contains(m.Document.RelativePath)) motors.TryAdd(m.Document.RelativePath, m); },
        };
        var threshold = session.Config.FailOn ?? Level.Error;
        CheckResult result;
        if (session.Problems.Length > 0)
        {
            result = new CheckResult(session.Root, [], [.. EngineRules.All.Concat(session.Rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal)], session.Problems, 0, [], threshold);
        }
        else
        {
            var overlay = new FileOverlay(overlays.ToImmutableDictionary(StringComparer.Ordinal), []);
            result = new Checker(listening).Run(new CheckOptions([checkedPath], threshold, Include: session.Config.Includes, Root: root, Overlay: overlay));
        }
        return new EngineRun(result, motors.ToImmutableDictionary(StringComparer.Ordinal),
            [.. outcomes.OrderBy(o => o.MotorFile, StringComparer.Ordinal).ThenBy(o => o.RuleId, StringComparer.Ordinal).ThenBy(o => o.Subject, StringComparer.Ordinal)]);
    }
}
