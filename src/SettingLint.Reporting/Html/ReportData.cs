using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Reporting.Html;

/// <summary>One check with what a report needs beyond findings: the bound motors and every rule outcome, passing or not.</summary>
/// <param name="Result">The check's result, exactly as `check` would report it.</param>
/// <param name="Motors">Every bound motor, by file path.</param>
/// <param name="Outcomes">Every rule outcome, by motor file, rule and subject.</param>
public sealed record ReportData(CheckResult Result, ImmutableArray<MotorProtection> Motors, ImmutableArray<RuleOutcome> Outcomes)
{
    /// <summary>Runs the check of the request through <see cref="Linter.Check"/> with a <see cref="ReportObserver"/> listening.</summary>
    public static ReportData Collect(CheckRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        var observer = new ReportObserver();
        var result = Linter.Check(request with { Observers = request.Observers.Add(observer) });
        return observer.ToData(result);
    }

    /// <summary>A run with nothing in it (the other side of a change view when the path did not exist yet).</summary>
    public static ReportData Empty(string root) => new(new CheckResult(root, [], [], [], 0, Level.Error), [], []);
}

/// <summary>Keeps what one check shows a report: the motors and every outcome (calls come from several threads).</summary>
public sealed class ReportObserver : ICheckObserver
{
    private readonly ConcurrentQueue<RuleOutcome> _outcomes = new();
    private readonly ConcurrentDictionary<string, MotorProtection> _motors = new(StringComparer.Ordinal);

    public void OnMotor(MotorProtection motor)
    {
        ArgumentNullException.ThrowIfNull(motor);
        _motors.TryAdd(motor.Document.RelativePath, motor);
    }

    public void OnOutcome(RuleOutcome outcome) => _outcomes.Enqueue(outcome);

    /// <summary>The report's data of the check this observer listened to, in a fixed order.</summary>
    public ReportData ToData(CheckResult result) => new(
        result,
        [.. _motors.Values.OrderBy(m => m.Document.RelativePath, StringComparer.Ordinal)],
        [.. _outcomes.OrderBy(o => o.MotorFile, StringComparer.Ordinal).ThenBy(o => o.RuleId, StringComparer.Ordinal).ThenBy(o => o.Subject, StringComparer.Ordinal)]);
}
