using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>Everything one run produced; every output format renders this and nothing else.</summary>
/// <param name="RepositoryRoot">Absolute path of the repository root; finding files are relative to it.</param>
/// <param name="Findings">Sorted by <see cref="Finding.Order"/>.</param>
/// <param name="Rules">Every rule that can fire in this run, sorted by id.</param>
/// <param name="Notifications">Configuration and internal notifications.</param>
/// <param name="FilesChecked">Setting files checked (files without a kind are not counted).</param>
/// <param name="Motors">Tags (or file paths when there is no tag) of the motors checked, sorted.</param>
/// <param name="FailOn">The gate's threshold.</param>
public sealed record CheckResult(
    string RepositoryRoot,
    ImmutableArray<Finding> Findings,
    ImmutableArray<RuleDescriptor> Rules,
    ImmutableArray<Notification> Notifications,
    int FilesChecked,
    ImmutableArray<string> Motors,
    Level FailOn)
{
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

    /// <summary>Whether a finding counts against the gate: at or above the threshold and not suppressed.</summary>
    public bool Fails(Finding finding) =>
        FailOn != Level.None && finding.Level >= FailOn && finding.Suppression is null;
}

/// <summary>The process exit codes, pinned by tests.</summary>
public static class ExitCodes
{
    public const int Clean = 0;
    public const int Findings = 1;
    public const int Usage = 2;
    public const int Internal = 3;
}
