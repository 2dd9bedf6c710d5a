using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>Everything one run produced; every output format renders this and nothing else.</summary>
/// <param name="RepositoryRoot">Absolute path of the repository root; finding files are relative to it.</param>
/// <param name="Findings">Sorted by <see cref="Finding.Order"/>.</param>
/// <param name="Rules">Every rule that can fire in this run, sorted by id.</param>
/// <param name="Notifications">Configuration and internal notifications.</param>
/// <param name="FilesChecked">Setting files checked (files without a kind are not counted).</param>
/// <param name="FailOn">The gate's threshold.</param>
public sealed record CheckResult(
    string RepositoryRoot,
    ImmutableArray<Finding> Findings,
    ImmutableArray<RuleDescriptor> Rules,
    ImmutableArray<Notification> Notifications,
    int FilesChecked,
    Level FailOn)
{
    /// <summary>The setting files whose findings are reported, and the motors among them, packed.</summary>
    public RunFiles Files { get; init; } = RunFiles.Empty;

    /// <summary>Names (tags, or file names when there is no tag) of the motors checked, sorted; made anew on each call (<see cref="RunFiles.MotorNames"/>).</summary>
    public ImmutableArray<string> Motors => Files.MotorNames();

    /// <summary>How many motors were checked.</summary>
    public int MotorCount => Files.MotorCount;

    /// <summary>The exit code of the gate: 3 internal error, 2 configuration, 1 findings at or above the threshold, else 0.</summary>
    public int ExitCode
    {
        get
        {
            if (Notifications.Any(n => n.Kind == NotificationKind.Internal)) return ExitCodes.Internal;
            if (Notifications.Any(n => n.Kind == NotificationKind.Configuration)) return ExitCodes.Usage;
            return Findings.Any(Fails) ? ExitCodes.Findings : ExitCodes.Clean;
        }
    }

    /// <summary>
    /// Whether a finding counts against the gate: at or above the threshold, not suppressed, not unchanged from the
    /// baseline, and not a report of a change to the gate itself (that one is for the reviewer of the change).
    /// </summary>
    public bool Fails(Finding finding) =>
        FailOn != Level.None && finding.Level >= FailOn && finding.Suppression is null
        && finding.BaselineState != BaselineState.Unchanged && finding.RuleId != EngineRules.GateChange;

    /// <summary>The baseline file the run was compared with, relative to the root; null when there was none.</summary>
    public string? BaselineFile { get; init; }

    /// <summary>Baseline entries that no longer match a finding, so that the baseline can be pruned.</summary>
    public ImmutableArray<AbsentResult> Absent { get; init; } = [];

    /// <summary>Root-relative paths of the setting files whose findings are reported, sorted; made anew on each call (<see cref="RunFiles.Files"/>).</summary>
    public ImmutableArray<string> CheckedFiles => Files.Files();

    /// <summary>Rules that applied to a motor but were not evaluated because input data is missing, in <see cref="CheckNotRun.Order"/>.</summary>
    public ImmutableArray<CheckNotRun> NotRun { get; init; } = [];

    /// <summary>What a changed-files run looked at; null for a run over every file.</summary>
    public ChangeScope? Scope { get; init; }

    /// <summary>
    /// The discovered files a changed-files run read, root-relative and sorted, when its quick read of references let it
    /// read fewer than all; null when it read every discovered file. A second run over the same selection (the fix
    /// suggestions) reads only these instead of every file of the repository again.
    /// </summary>
    public IReadOnlyList<string>? LoadedFiles { get; init; }
}

/// <summary>A baseline entry with no finding in this run (SARIF baselineState absent).</summary>
/// <param name="RuleId">The rule of the entry.</param>
/// <param name="File">The setting file of the entry, relative to the root.</param>
/// <param name="KeyPath">The key path of the entry.</param>
/// <param name="Fingerprint">The entry's fingerprint.</param>
/// <param name="Message">The message recorded with the entry when the baseline was written; empty when there is none.</param>
/// <param name="BaselineLine">The entry's line in the baseline file.</param>
public sealed record AbsentResult(string RuleId, string File, string KeyPath, string Fingerprint, string Message, int BaselineLine);

/// <summary>The files a changed-files run checked, and why.</summary>
/// <param name="Revision">The revision compared with, as given (HEAD for --staged alone).</param>
/// <param name="Staged">Whether the staged contents were checked rather than the working tree.</param>
/// <param name="Changed">Changed or added files, relative to the root, sorted.</param>
/// <param name="Deleted">Deleted files, relative to the root, sorted.</param>
/// <param name="Dependants">Setting files checked because a file they depend on changed, sorted.</param>
/// <param name="EverythingBecause">Why every file was checked (a changed configuration, rule or baseline file); null when only the changed files and their dependants were.</param>
public sealed record ChangeScope(
    string Revision,
    bool Staged,
    ImmutableArray<string> Changed,
    ImmutableArray<string> Deleted,
    ImmutableArray<string> Dependants,
    string? EverythingBecause);

/// <summary>The process exit codes, pinned by tests.</summary>
public static class ExitCodes
{
    public const int Clean = 0;
    public const int Findings = 1;
    public const int Usage = 2;
    public const int Internal = 3;
}
