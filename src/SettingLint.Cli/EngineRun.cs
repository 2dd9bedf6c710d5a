using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Model;
using SettingLint.Core.Sources;

namespace SettingLint.Cli;

/// <summary>
/// How `import` and `sheet` run a check: through the engine's one entry point, as `check` would (configuration, packs,
/// threshold), optionally over another file source (a revision), giving each bound motor to an observer when asked.
/// </summary>
internal static class EngineRun
{
    /// <summary>Checks the paths (relative to the current folder) as `check` would; each bound motor is given to <paramref name="motors"/> when asked.</summary>
    public static CheckResult Check(IReadOnlyList<string> paths, Action<MotorProtection>? motors = null, IFileSource? source = null) =>
        Linter.Check(new CheckRequest(Directory.GetCurrentDirectory(), paths)
        {
            Source = source,
            Root = source?.Root,
            Observers = motors is null ? [] : [new MotorObserver(motors)],
        });

    private sealed class MotorObserver(Action<MotorProtection> motors) : ICheckObserver
    {
        public void OnMotor(MotorProtection motor) => motors(motor);
    }
}
