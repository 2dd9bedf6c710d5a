using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Reporting.Html;

/// <summary>One run of the check pipeline with what a report needs beyond findings: the bound motors and every rule outcome, passing or not.</summary>
/// <param name="Result">The check's result, exactly as `check` would report it.</param>
/// <param name="Motors">Every bound motor, by file path.</param>
/// <param name="Outcomes">Every rule outcome, by motor file, rule and subject.</param>
public sealed record ReportData(CheckResult Result, ImmutableArray<MotorProtection> Motors, ImmutableArray<RuleOutcome> Outcomes)
{
    /// <summary>Runs the session's check over the paths, listening to the rule engine for motors and outcomes.</summary>
    public static ReportData Collect(Session session, IReadOnlyList<string> paths)
    {
        ArgumentNullException.ThrowIfNull(session);
        ArgumentNullException.ThrowIfNull(paths);
        // Rules run in parallel per motor, so the sinks must take concurrent calls; the order is restored by sorting.
        var outcomes = new ConcurrentQueue<RuleOutcome>();
        var motors = new ConcurrentDictionary<string, MotorProtection>(StringComparer.Ordinal);
        var listening = new RuleSet(session.Rules.Rules)
        {
            Outcomes = outcomes.Enqueue,
            Motors = m => motors.TryAdd(m.Document.RelativePath, m),
        };
        var result = (session with { Rules = listening }).Check(paths, null);
        return new ReportData(
            result,
            [.. motors.Values.OrderBy(m => m.Document.RelativePath, StringComparer.Ordinal)],
            [.. outcomes.OrderBy(o => o.MotorFile, StringComparer.Ordinal).ThenBy(o => o.RuleId, StringComparer.Ordinal).ThenBy(o => o.Subject, StringComparer.Ordinal)]);
    }

    /// <summary>Opens a session for the paths and collects.</summary>
    public static ReportData Collect(IReadOnlyList<string> paths)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var p = paths.Count == 0 ? (IReadOnlyList<string>)["."] : paths;
        return Collect(Session.Open(p), p);
    }

    /// <summary>A run with nothing in it (the other side of a change view when the path did not exist yet).</summary>
    public static ReportData Empty(string root) => new(new CheckResult(root, [], [], [], 0, [], Level.Error), [], []);
}
