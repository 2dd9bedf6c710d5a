namespace SettingLint.Tests.Shared;

/// <summary>
/// Tests that need a tool outside the repository (the SARIF multitool, a test corpus): reported as skipped, with the
/// reason, when the tool is missing on a developer's machine; never passed without it. Under CI=true they are not
/// skipped, so that a missing tool fails them (their body asserts the tool is there).
/// </summary>
public static class ToolFacts
{
    /// <summary>Whether the run is CI's (CI=true, as hosted runners and .ci/run set it).</summary>
    public static bool OnCi => CiSkip.OnCi;

    /// <summary>Why a test that needs a tool is skipped, or null when it runs (the tool is there, or this is CI).</summary>
    public static string? SkipReason(bool present, string missing) => CiSkip.Reason(present, missing);

    /// <summary>The reason the SARIF multitool tests skip, or null when they run.</summary>
    public static string? MultitoolSkip() => SkipReason(SarifValidation.MultitoolPath() is not null,
        "Sarif.Multitool is not installed: set " + SarifValidation.MultitoolVariable + " or run `npm install @microsoft/sarif-multitool` in .tools (as .ci/run does).");

    /// <summary>The multitool, or a failure that says CI must have it (a test skipped outside CI never gets here without it).</summary>
    public static string RequireMultitool() =>
        SarifValidation.MultitoolPath() ?? throw new Xunit.Sdk.XunitException("Sarif.Multitool is required on CI (.ci/run installs it) and was not found.");
}

/// <summary>A fact that needs the SARIF multitool (see <see cref="ToolFacts"/>).</summary>
[AttributeUsage(AttributeTargets.Method)]
public sealed class MultitoolFactAttribute : FactAttribute
{
    public MultitoolFactAttribute()
    {
        if (ToolFacts.MultitoolSkip() is { } reason) Skip = reason;
    }
}

/// <summary>A theory that needs the SARIF multitool (see <see cref="ToolFacts"/>).</summary>
[AttributeUsage(AttributeTargets.Method)]
public sealed class MultitoolTheoryAttribute : TheoryAttribute
{
    public MultitoolTheoryAttribute()
    {
        if (ToolFacts.MultitoolSkip() is { } reason) Skip = reason;
    }
}
