namespace SettingLint.Cli.Tests;

/// <summary>`settinglint hook install` end to end: real commits run the installed hook with this build of the CLI.</summary>
public sealed class GateHookTests
{
    // The hook runs this build of the CLI through the variable it honours.
    private static readonly Dictionary<string, string> ThisBuild = new()
    {
        [HookCommand.CommandVariable] = "dotnet '" + Path.Combine(AppContext.BaseDirectory, "settinglint.dll") + "'",
    };

    private static GateGitRepo Committed()
    {
        var git = new GateGitRepo();
        git.Commit("clean");
        // The developer's own core.hooksPath must not receive the test's hook.
        git.Git("config", "core.hooksPath", ".git/hooks");
        return git;
    }

    private static string HookPath(GateGitRepo git) => git.PathOf(".git/hooks/pre-commit");

    private static (int Code, string Output, string Error) Commit(GateGitRepo git, string message) =>
        git.Run(["commit", "-q", "-m", message], ThisBuild);

    [Fact]
    public void The_hook_refuses_a_bad_staged_file_and_accepts_a_good_one()
    {
        using var git = Committed();
        var install = Cli.Run(["hook", "install", git.Root]);
        Assert.True(install.Exit == 0, install.ToString());
        Assert.Contains("git commit --no-verify", install.Stdout, StringComparison.Ordinal);
        Assert.True(File.Exists(HookPath(git)));
        if (!OperatingSystem.IsWindows()) Assert.True(File.GetUnixFileMode(HookPath(git)).HasFlag(UnixFileMode.UserExecute));

        // SL203: P-201's 31.5 kA breaker on a 40 kA bus. Only the bus is staged; its motors are checked with it.
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        git.Git("add", GateGitRepo.Bus);
        var head = git.Git("rev-parse", "HEAD");
        var refused = Commit(git, "stronger source");
        Assert.NotEqual(0, refused.Code);
        var said = refused.Output + refused.Error;
        Assert.Contains("error SL203", said, StringComparison.Ordinal);
        Assert.Contains("commit refused", said, StringComparison.Ordinal);
        Assert.Contains("git commit --no-verify", said, StringComparison.Ordinal);
        Assert.Equal(head, git.Git("rev-parse", "HEAD"));

        // Fixed in the working tree but not staged: the staged content is what would be committed, so it is still refused.
        git.Edit(GateGitRepo.Bus, "fault_current_max: 40 kA", "fault_current_max: 20 kA");
        Assert.NotEqual(0, Commit(git, "still the staged 40 kA").Code);

        git.Git("add", GateGitRepo.Bus);
        var accepted = Commit(git, "a little stronger source");
        Assert.True(accepted.Code == 0, accepted.Output + accepted.Error);
        Assert.NotEqual(head, git.Git("rev-parse", "HEAD"));
    }

    [Fact]
    public void A_foreign_hook_is_left_alone_unless_forced_and_is_put_back_on_uninstall()
    {
        using var git = Committed();
        Directory.CreateDirectory(Path.GetDirectoryName(HookPath(git))!);
        const string mine = "#!/bin/sh\necho my own hook\n";
        File.WriteAllText(HookPath(git), mine);

        var refused = Cli.Run(["hook", "install", git.Root]);
        Assert.Equal(2, refused.Exit);
        Assert.Contains("did not write", refused.Stderr, StringComparison.Ordinal);
        Assert.Contains("--force", refused.Stderr, StringComparison.Ordinal);
        Assert.Equal(mine, File.ReadAllText(HookPath(git)));

        Assert.Equal(0, Cli.Run(["hook", "install", git.Root, "--force"]).Exit);
        Assert.Contains(HookCommand.Marker, File.ReadAllText(HookPath(git)), StringComparison.Ordinal);
        Assert.Equal(mine, File.ReadAllText(HookPath(git) + ".settinglint-old"));
        Assert.Equal(0, Cli.Run(["hook", "install", git.Root]).Exit); // its own hook is replaced freely

        Assert.Equal(0, Cli.Run(["hook", "uninstall", git.Root]).Exit);
        Assert.Equal(mine, File.ReadAllText(HookPath(git)));
        Assert.Equal(2, Cli.Run(["hook", "uninstall", git.Root]).Exit); // now it is a foreign hook
    }

    [Fact]
    public void The_hook_can_use_a_baseline_and_another_command()
    {
        var script = HookCommand.Script("config/it's.baseline", "dotnet tool run settinglint");
        Assert.Contains("default_command='dotnet tool run settinglint'", script, StringComparison.Ordinal);
        Assert.Contains("check --staged --baseline 'config/it'\\''s.baseline'", script, StringComparison.Ordinal);
        Assert.StartsWith("#!/bin/sh\n", script, StringComparison.Ordinal);
    }

    [Fact]
    public void Outside_a_git_repository_install_exits_2()
    {
        using var plain = new SettingLint.Tests.Support.TempRepo(git: false);
        var run = Cli.Run(["hook", "install", plain.Root]);
        Assert.Equal(2, run.Exit);
        Assert.Contains("needs a git work tree", run.Stderr, StringComparison.Ordinal);
    }
}
