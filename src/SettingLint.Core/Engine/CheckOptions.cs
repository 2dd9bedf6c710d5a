using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Engine;

/// <summary>What one check run is asked to do.</summary>
/// <param name="Paths">Files or folders to check: absolute, or relative to <paramref name="WorkingDirectory"/>.</param>
/// <param name="FailOn">The gate's threshold; Level.None is "never".</param>
/// <param name="Limits">The loader's limits.</param>
/// <param name="Parallel">Load and evaluate files in parallel (the order of output does not depend on it).</param>
/// <param name="Root">The repository root (absolute or relative to the working folder); null finds it from the first path, or takes the source's.</param>
/// <param name="Accept">Apply the acceptance comments in the files (off for audits: --no-suppress).</param>
/// <param name="Changes">Report only the changed files and their dependants; null reports every file.</param>
/// <param name="Source">Where files are read: null is the disk at the root; an overlay or a revision otherwise.</param>
/// <param name="WorkingDirectory">The absolute folder relative paths are resolved against; null when every path is absolute.</param>
/// <param name="ElectricalCode">The electrical code the configuration declares for a root-relative file, or null; null for none anywhere.</param>
public sealed record CheckOptions(
    IReadOnlyList<string> Paths,
    Level FailOn = Level.Error,
    LoadLimits? Limits = null,
    bool Parallel = true,
    Func<string, bool>? Include = null,
    string? Root = null,
    bool Accept = true,
    ChangeSet? Changes = null,
    IFileSource? Source = null,
    string? WorkingDirectory = null,
    Func<string, string?>? ElectricalCode = null)
{
    public LoadLimits EffectiveLimits => Limits ?? LoadLimits.Default;
}
