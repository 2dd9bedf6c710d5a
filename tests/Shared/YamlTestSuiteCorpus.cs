namespace SettingLint.Tests.Shared;

/// <summary>The public YAML test suite's cases (shared/corpora/yaml-test-suite, beside the clone), read by the loader's tests.</summary>
public static class YamlTestSuiteCorpus
{
    /// <summary>The corpus folder, found upward from the test assembly (inside or beside each folder); null when absent.</summary>
    public static string? Folder()
    {
        for (var d = AppContext.BaseDirectory; d is not null; d = Path.GetDirectoryName(d))
        {
            var c = Path.Combine(d, "shared", "corpora", "yaml-test-suite");
            if (Directory.Exists(c)) return c;
            var beside = Path.Combine(Path.GetDirectoryName(d) ?? d, "shared", "corpora", "yaml-test-suite");
            if (Directory.Exists(beside)) return beside;
        }
        return null;
    }

    /// <summary>The corpus folder, or a failure that says CI must have it (a test skipped outside CI never gets here without it).</summary>
    public static string Require() =>
        Folder() ?? throw new Xunit.Sdk.XunitException("The YAML test suite corpus (shared/corpora) must be beside the clone in CI.");
}

/// <summary>A fact that needs the YAML test suite corpus (see <see cref="CiSkip"/>).</summary>
[AttributeUsage(AttributeTargets.Method)]
public sealed class YamlCorpusFactAttribute : FactAttribute
{
    public YamlCorpusFactAttribute()
    {
        if (CiSkip.Reason(YamlTestSuiteCorpus.Folder() is not null, "The YAML test suite corpus (shared/corpora) is not beside the clone.") is { } reason) Skip = reason;
    }
}
