using SettingLint.Cli.Server;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Server;

/// <summary>A document is checked as `check FOLDER` would check it: FOLDER holds its configuration, the root is found from FOLDER.</summary>
public sealed class WorkspaceLayoutTests
{
    [Fact]
    public void The_nearest_configuration_below_the_git_root_names_the_checked_folder()
    {
        using var repo = new TempRepo();
        repo.Write("plant/.settinglint.yaml", "packs: [builtin]\n");
        var motor = repo.Write("plant/motors/m.yaml", "kind: motor-protection\n");
        Assert.Equal(new CheckScope(repo.PathOf("plant"), repo.Root), WorkspaceLayout.ScopeOf(motor, []));
    }

    [Fact]
    public void Without_a_configuration_the_git_root_is_checked()
    {
        using var repo = new TempRepo();
        var motor = repo.Write("motors/m.yaml", "kind: motor-protection\n");
        Assert.Equal(new CheckScope(repo.Root, repo.Root), WorkspaceLayout.ScopeOf(motor, []));
    }

    [Fact]
    public void Outside_git_and_without_configuration_the_workspace_folder_is_checked()
    {
        using var repo = new TempRepo(git: false);
        var motor = repo.Write("motors/m.yaml", "kind: motor-protection\n");
        Assert.Equal(new CheckScope(repo.Root, repo.Root), WorkspaceLayout.ScopeOf(motor, [repo.Outer, repo.Root]));
        Assert.Equal(repo.PathOf("motors"), WorkspaceLayout.ScopeOf(motor, []).CheckedPath);
    }

    [Fact]
    public void Only_file_uris_have_a_path()
    {
        Assert.Equal("/tmp/a b/m.yaml", WorkspaceLayout.PathOf("file:///tmp/a%20b/m.yaml"));
        Assert.Null(WorkspaceLayout.PathOf("untitled:Untitled-1"));
    }
}
