using SettingLint.Core.Findings;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Engine;

/// <summary>What one check run is asked to do.</summary>
/// <param name="Paths">Files or folders to check.</param>
/// <param name="FailOn">The gate's threshold; Level.None is "never".</param>
/// <param name="Limits">The loader's limits.</param>
/// <param name="Parallel">Load and evaluate files in parallel (the order of output does not depend on it).</param>
public sealed record CheckOptions(
    IReadOnlyList<string> Paths,
    Level FailOn = Level.Error,
    LoadLimits? Limits = null,
    bool Parallel = true,
    Func<string, bool>? Include = null,
    string? Root = null)
{
    public LoadLimits EffectiveLimits => Limits ?? LoadLimits.Default;
}
