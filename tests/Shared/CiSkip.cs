namespace SettingLint.Tests.Shared;

/// <summary>
/// When a test that needs something outside the repository (a tool, a test corpus) is skipped: outside CI, with the
/// reason, when it is missing; never under CI=true, so that a missing tool fails the test there (its body asserts it).
/// </summary>
public static class CiSkip
{
    /// <summary>Whether the run is CI's (CI=true, as hosted runners and .ci/run set it).</summary>
    public static bool OnCi => string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase);

    /// <summary>Why such a test is skipped, or null when it runs (what it needs is there, or this is CI).</summary>
    public static string? Reason(bool present, string missing) => present || OnCi ? null : missing + " Skipped outside CI; under CI=true this test fails instead.";
}
