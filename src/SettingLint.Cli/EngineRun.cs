using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Cli;

/// <summary>
/// How `import` and `sheet` run a check: the one call into the engine's entry point that they make, so that a change of
/// that entry point is a change here only.
/// </summary>
internal static class EngineRun
{
    /// <summary>Checks the paths as `check` would (configuration, packs, threshold); each bound motor is given to <paramref name="motors"/> when asked.</summary>
    public static CheckResult Check(IReadOnlyList<string> paths, Action<MotorProtection>? motors = null)
    {
        var session = Session.Open(paths);
        if (motors is not null) session = session with { Rules = new RuleSet(session.Rules.Rules) { Motors = motors } };
        return session.Check(paths, null);
    }
}
