using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// `fix --changed-since` and `fix --staged` fix only the files the same `check` would check, and `check --staged`
/// suggests values from the staged contents: end to end in a real git repository.
/// </summary>
/// <remarks>
/// SL201 (common practice, fact of the trade): the 50P pickup must be at least 1.7 x the locked-rotor current at the
/// bus's highest voltage. The demo's P-201 starts with about 1036 A at 4370 V (its file's own note), so 1.7 x that is
/// about 1761 A pri; its relay sets the pickup in steps of 0.01 xCT of a 200:5 CT (2 A pri), and the lowest step above
/// is 8.81 xCT = 1762 A pri = 44.05 A sec, written in A sec as the file writes it. 30 A sec (1200 A pri) is too low.
/// </remarks>
public sealed class FixGitTests
{
    private const string Low = "pickup: 30 A sec ";
    private const string Fixed = "pickup: 44.05 A sec ";
    private const string Other = "motors/p-401.yaml";

    // P-401: a copy of P-301 on another bus, with a 50P pickup of 5 xCT (500 A pri), below its own start (SL201); committed
    // as it is, so that only a run over every file sees it.
    private static GateGitRepo Repo()
    {
        var git = new GateGitRepo();
        git.Write("buses/other.yaml", File.ReadAllText(git.PathOf(GateGitRepo.Bus)).Replace("tag: SG-41A", "tag: SG-41B", StringComparison.Ordinal));
        git.Write(Other, Samples.Replace(git.Read(GateGitRepo.Contactor).Replace("tag: P-301", "tag: P-401", StringComparison.Ordinal)
            .Replace("../buses/sg-41a.yaml", "../buses/other.yaml", StringComparison.Ordinal), "pickup: 9.8 xCT ", "pickup: 5 xCT "));
        git.Commit("with P-401");
        return git;
    }

    [Fact]
    public void Changed_since_fixes_the_changed_motor_and_leaves_a_file_outside_the_change_alone()
    {
        using var git = Repo();
        var other = git.Read(Other);
        git.Edit(GateGitRepo.Breaker, "pickup: 46 A sec ", Low);

        var run = Cli.Run("fix", git.Root, "--changed-since", "HEAD");
        Assert.True(run.Exit == 0, run.ToString());
        // Shown to three significant figures, as findings show values; the value written keeps the relay's step.
        Assert.Contains("set protection.short_circuit.pickup 30 A sec -> 44.05 A sec: 1.2 kA pri (30 A sec) -> 1.76 kA pri (44 A sec)", run.Stdout, StringComparison.Ordinal);
        Assert.Contains(Fixed + "                # 1840 A pri", git.Read(GateGitRepo.Breaker), StringComparison.Ordinal);
        Assert.Equal(other, git.Read(Other));
        Assert.Contains("changed 1 value in 1 file", run.Stdout, StringComparison.Ordinal);

        // A run over every file reaches P-401 too: its pickup was left wrong only because it was outside the change.
        var all = Cli.Run("fix", git.Root);
        Assert.Contains(Other + ":", all.Stdout, StringComparison.Ordinal);
        Assert.NotEqual(other, git.Read(Other));
    }

    [Fact]
    public void Staged_fixes_the_staged_text_into_the_working_tree_and_never_a_file_with_unstaged_changes()
    {
        using var git = Repo();
        var other = git.Read(Other);
        git.Edit(GateGitRepo.Breaker, "pickup: 46 A sec ", Low);
        // P-301's 50P at 5 xCT (500 A pri) is staged too, but its working copy has a further, unstaged edit.
        git.Edit(GateGitRepo.Contactor, "pickup: 9.8 xCT ", "pickup: 5 xCT ");
        git.Git("add", "-A");
        git.Edit(GateGitRepo.Contactor, "title: ", "title: (rewound) ");
        var contactor = git.Read(GateGitRepo.Contactor);

        var run = Cli.Run("fix", git.Root, "--staged");
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Contains(Fixed, git.Read(GateGitRepo.Breaker), StringComparison.Ordinal);
        Assert.Contains(GateGitRepo.Contactor + " has changes that are not staged; not written", run.Stderr, StringComparison.Ordinal);
        Assert.Equal(contactor, git.Read(GateGitRepo.Contactor));
        Assert.Equal(other, git.Read(Other));
        Assert.Contains("stage them to commit the fix", run.Stdout, StringComparison.Ordinal);
        // The index is not touched: the fix is the engineer's to stage.
        Assert.Contains(Low, git.Git("show", ":" + GateGitRepo.Breaker), StringComparison.Ordinal);
    }

    [Fact]
    public void Check_staged_suggests_from_the_staged_contents()
    {
        using var git = Repo();
        git.Edit(GateGitRepo.Breaker, "pickup: 46 A sec ", Low);
        git.Git("add", "-A");
        // The working copy differs from the index: the suggestion must be of the staged 30 A sec, at its place.
        git.Edit(GateGitRepo.Breaker, "title: ", "title: (draft) ");

        var run = git.CheckJson("--staged");
        Assert.True(run.Exit == 1, run.ToString());
        var finding = run.Json.GetProperty("findings").EnumerateArray().Single(f => f.GetProperty("ruleId").GetString() == "SL201");
        Assert.Equal(GateGitRepo.Breaker, finding.GetProperty("file").GetString());
        var suggested = finding.GetProperty("suggested");
        Assert.Equal("44.05 A sec", suggested.GetProperty("value").GetString());
        Assert.Equal("1.76 kA pri (44 A sec)", suggested.GetProperty("shown").GetString());
        // "    pickup: 30 A sec" on the staged line 42: the value is columns 13 to 21.
        Assert.Equal((42, 13, 21), (suggested.GetProperty("line").GetInt32(), suggested.GetProperty("column").GetInt32(), suggested.GetProperty("endColumn").GetInt32()));
        Assert.Contains("[suggested: 44.05 A sec]", Cli.Run("check", git.Root, "--staged").Stdout, StringComparison.Ordinal);
    }
}
