using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Reporting.Svg;

namespace SettingLint.Reporting.Html;

/// <summary>Where an outcome stands: failed, passed inside the near-miss share of its limit, or passed.</summary>
public enum MarginStatus
{
    /// <summary>The rule's check is false (a finding).</summary>
    Failed,

    /// <summary>Passed, but the margin is less than the near-miss share of the limit.</summary>
    NearMiss,

    /// <summary>Passed with room.</summary>
    Passed,
}

/// <summary>One rule that applied to a motor, with its numbers as text for the page and the outcome behind them.</summary>
/// <param name="Outcome">The rule engine's outcome.</param>
/// <param name="Title">The rule's title.</param>
/// <param name="Status">Failed, near miss or passed.</param>
/// <param name="Actual">The left side of the deciding comparison, as text; empty for a check without numbers.</param>
/// <param name="Limit">Its right side.</param>
/// <param name="Margin">How far inside the limit (negative outside), in the compared unit.</param>
/// <param name="Ratio">The margin over the limit, signed percent.</param>
/// <param name="Message">The finding's message when the rule failed.</param>
public sealed record MarginRow(RuleOutcome Outcome, string Title, MarginStatus Status, string Actual, string Limit, string Margin, string Ratio, string? Message)
{
    /// <summary>The margin over the limit, when the comparison gives one.</summary>
    public double? MarginRatio => Outcome.Numbers?.MarginRatio;

    /// <summary>Identifies the row across two runs (a change view): rule and subject.</summary>
    public string Key => Outcome.RuleId + " " + Outcome.Subject;
}

/// <summary>A setting window with its words: the setting's name, each bound as text and the sentence a reviewer reads.</summary>
/// <param name="Window">The derived window.</param>
/// <param name="Name">The setting in words.</param>
/// <param name="Set">The value the setting has, as text.</param>
/// <param name="LowerText">The binding lower bound, as text; null when nothing bounds it from below.</param>
/// <param name="UpperText">The binding upper bound, as text; null when nothing bounds it from above.</param>
/// <param name="Sentence">"short-circuit pickup: at least ... (..., SL201), at most ... (..., SL202); set ...".</param>
public sealed record WindowView(SettingWindow Window, string Name, string Set, string? LowerText, string? UpperText, string Sentence);

/// <summary>Everything the report shows of one motor.</summary>
public sealed record MotorReport
{
    /// <summary>The motor's tag.</summary>
    public required string Tag { get; init; }

    /// <summary>Its title, when given.</summary>
    public string? Title { get; init; }

    /// <summary>Its file, relative to the root.</summary>
    public required string File { get; init; }

    /// <summary>The bus's tag, when the reference resolved.</summary>
    public string? Bus { get; init; }

    /// <summary>The relay model's tag, when given.</summary>
    public string? RelayModel { get; init; }

    /// <summary>A file-name-safe name, unique in the report, for its page and plots.</summary>
    public required string Slug { get; init; }

    /// <summary>The findings in the motor's file, in report order.</summary>
    public ImmutableArray<Finding> Findings { get; init; } = [];

    /// <summary>The rules that applied but were not evaluated because input data is missing, by rule.</summary>
    public ImmutableArray<CheckNotRun> NotRun { get; init; } = [];

    /// <summary>Every rule that applied: failures first, then tightest first.</summary>
    public ImmutableArray<MarginRow> Margins { get; init; } = [];

    /// <summary>Every setting window, bounded by several rules or not, by setting.</summary>
    public ImmutableArray<WindowView> Windows { get; init; } = [];

    /// <summary>The numbers the plots are drawn from.</summary>
    public required MotorPlotData Plot { get; init; }

    /// <summary>What changed since the compared revision; null without a change view.</summary>
    public MotorChange? Change { get; init; }

    /// <summary>Unsuppressed findings at a level.</summary>
    public int Count(Level level) => Findings.Count(f => f.Level == level && f.Suppression is null);

    /// <summary>Suppressed findings.</summary>
    public int Suppressed => Findings.Count(f => f.Suppression is not null);

    /// <summary>Outcomes that passed within the near-miss share of their limit.</summary>
    public int NearMisses => Margins.Count(m => m.Status == MarginStatus.NearMiss);

    /// <summary>Outcomes that passed.</summary>
    public int Passed => Margins.Count(m => m.Status != MarginStatus.Failed);

    /// <summary>
    /// The row that says most about the motor: the first failed or tightest rule at level error or warning (notes such as
    /// CT saturation are points to judge and would hide everything else), else the first row.
    /// </summary>
    public MarginRow? Worst => Margins.FirstOrDefault(r => r.Outcome.Level >= Level.Warning) ?? Margins.FirstOrDefault();

    /// <summary>Windows bounded by two or more rules: the ones the report shows as a table.</summary>
    public IEnumerable<WindowView> SharedWindows => Windows.Where(w => w.Window.RuleCount >= 2);
}

/// <summary>The whole report: the run, every motor, and the options it was made with.</summary>
/// <param name="Result">The check's result.</param>
/// <param name="Motors">One entry per motor, by file path.</param>
/// <param name="NearMiss">The near-miss share of a limit (0.1 is 10 %).</param>
/// <param name="Tool">Who made it.</param>
public sealed record ReportModel(CheckResult Result, ImmutableArray<MotorReport> Motors, double NearMiss, ToolInfo Tool)
{
    /// <summary>The revision of the change view, as given; null without one.</summary>
    public string? ChangedSince { get; init; }

    /// <summary>Motor files at the compared revision that are gone now.</summary>
    public ImmutableArray<MotorChange> RemovedMotors { get; init; } = [];

    /// <summary>Findings in files that are not motors (buses, relay models, files that did not bind).</summary>
    public IEnumerable<Finding> OtherFindings => Result.Findings.Where(f => !Motors.Any(m => m.File == f.File));
}
