namespace SettingLint.Tests.Shared;

/// <summary>Where this source tree is, found from the test assembly upward.</summary>
public static class RepositoryPaths
{
    public static string Root()
    {
        for (var d = AppContext.BaseDirectory; d is not null; d = Path.GetDirectoryName(d))
        {
            if (File.Exists(Path.Combine(d, "SettingLint.sln"))) return d;
        }
        throw new InvalidOperationException("SettingLint.sln not found above the test assembly.");
    }
}
