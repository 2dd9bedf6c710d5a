using System.Text.Json;

namespace SettingLint.Cli.Tests;

/// <summary>`check --changed-since REV` end to end in a real git repository: the changed files and their dependants.</summary>
public sealed class GateChangedFilesTests
{
    private static string[] Strings(JsonElement array) => [.. array.EnumerateArray().Select(e => e.GetString()!)];

    [Fact]
    public void The_committed_demo_repository_is_clean()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        var run = git.CheckJson();
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Empty(run.Findings);
        Assert.Equal(["P-201", "P-301"], Strings(run.Json.GetProperty("motors")));
    }

    // SL203, common practice: the 50P element must not trip a device that cannot interrupt the bus's fault current.
    // P-201's breaker interrupts 31.5 kA; raising SG-41A's maximum fault level from 18 kA to 40 kA breaks that.
    [Fact]
    public void A_stronger_bus_re_checks_its_motors_and_finds_the_short_circuit_problem()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        git.Commit("stronger source");

        var run = git.CheckJson("--changed-since", "HEAD~1");
        Assert.True(run.Exit == 1, run.ToString());
        Assert.Contains(run.Findings, f => f is { Rule: "SL203", File: GateGitRepo.Breaker });
        Assert.DoesNotContain(run.Findings, f => f is { Rule: "SL203", File: GateGitRepo.Contactor }); // blocked above 5 kA
        var changes = run.Json.GetProperty("changes");
        Assert.Equal("HEAD~1", changes.GetProperty("revision").GetString());
        Assert.Equal([GateGitRepo.Bus], Strings(changes.GetProperty("changed")));
        Assert.Equal([GateGitRepo.Breaker, GateGitRepo.Contactor], Strings(changes.GetProperty("dependants")));
        Assert.Equal(["P-201", "P-301"], Strings(run.Json.GetProperty("motors")));

        // Nothing changed since the last commit: nothing to check, exit 0.
        Assert.Equal(0, Cli.Run(["check", git.Root, "--changed-since", "HEAD"]).Exit);
    }

    [Fact]
    public void A_changed_motor_re_checks_the_other_motors_on_its_bus_and_no_file_elsewhere()
    {
        using var git = new GateGitRepo();
        git.Write("buses/other.yaml", File.ReadAllText(git.PathOf(GateGitRepo.Bus)).Replace("tag: SG-41A", "tag: SG-41B", StringComparison.Ordinal));
        // P-401 has a planted error (hot safe stall time above the cold one, SL102) that a changed-files run must not see.
        git.Write("motors/p-401.yaml", SettingLint.Tests.Support.Samples.Replace(git.Read(GateGitRepo.Contactor).Replace("tag: P-301", "tag: P-401", StringComparison.Ordinal)
            .Replace("../buses/sg-41a.yaml", "../buses/other.yaml", StringComparison.Ordinal), "safe_stall_time_hot: ", "safe_stall_time_hot: 9"));
        git.Commit("with P-401");
        git.Edit(GateGitRepo.Breaker, "title: High-lift pump 1", "title: High-lift pump 1 (rewound 2025)");

        // The rules compare motors on one bus (for example SL603), so P-301 is checked again; P-401 is on another bus.
        var run = git.CheckJson("--changed-since", "HEAD");
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Equal([GateGitRepo.Breaker], Strings(run.Json.GetProperty("changes").GetProperty("changed")));
        Assert.Equal([GateGitRepo.Contactor], Strings(run.Json.GetProperty("changes").GetProperty("dependants")));
        Assert.Equal(2, run.Json.GetProperty("summary").GetProperty("files").GetInt32());

        // The same findings as a full run gives for those two files: the quick plan loads all they depend on.
        var full = git.CheckJson();
        Assert.Contains(full.Findings, f => f.File == "motors/p-401.yaml");
        Assert.Equal(full.Findings.Where(f => f.File is GateGitRepo.Breaker or GateGitRepo.Contactor), run.Findings);
    }

    [Fact]
    public void A_changed_relay_model_re_checks_every_motor_that_uses_it()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Edit(GateGitRepo.Model, "short_circuit.pickup:          { min: 1.00 xCT, max: 20.00 xCT, step: 0.01 xCT }",
            "short_circuit.pickup:          { min: 1.00 xCT, max: 5.00 xCT, step: 0.01 xCT }");
        var run = git.CheckJson("--changed-since", "HEAD");
        Assert.Equal([GateGitRepo.Breaker, GateGitRepo.Contactor], Strings(run.Json.GetProperty("changes").GetProperty("dependants")));
        // SL108: P-201's 46 A sec on a 200:5 CT is 9.2 x CT, above the new 5 x CT maximum.
        Assert.Contains(run.Findings, f => f is { Rule: "SL108", File: GateGitRepo.Breaker });
        Assert.Equal(1, run.Exit);
    }

    [Fact]
    public void A_deleted_bus_re_checks_its_motors_which_lose_their_reference()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        File.Delete(git.PathOf(GateGitRepo.Bus));
        var run = git.CheckJson("--changed-since", "HEAD");
        Assert.True(run.Exit == 1, run.ToString());
        Assert.Equal([GateGitRepo.Bus], Strings(run.Json.GetProperty("changes").GetProperty("deleted")));
        Assert.Contains(run.Findings, f => f is { Rule: "SL007", File: GateGitRepo.Breaker });
        Assert.Contains(run.Findings, f => f is { Rule: "SL007", File: GateGitRepo.Contactor });
    }

    [Fact]
    public void A_changed_configuration_re_checks_everything()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Write(GateGitRepo.Config, GateGitRepo.CleanConfig + "fail_on: error\n");
        var run = git.CheckJson("--changed-since", "HEAD");
        Assert.Contains("configuration .settinglint.yaml", run.Json.GetProperty("changes").GetProperty("everythingBecause").GetString(), StringComparison.Ordinal);
        Assert.Equal(4, run.Json.GetProperty("summary").GetProperty("files").GetInt32());
    }

    [Fact]
    public void An_untracked_new_motor_counts_as_changed_and_a_text_file_changes_nothing()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Write("notes.txt", "not a setting file\n");
        var nothing = Cli.Run(["check", git.Root, "--changed-since", "HEAD"]);
        Assert.Equal(0, nothing.Exit);
        Assert.Contains("0 files (0 motors)", nothing.Stdout, StringComparison.Ordinal);

        git.Write("motors/p-302.yaml", git.Read(GateGitRepo.Contactor).Replace("tag: P-301", "tag: P-302", StringComparison.Ordinal)
            .Replace("full_load_current: ", "full_load_current: 0", StringComparison.Ordinal));
        var run = git.CheckJson("--changed-since", "HEAD");
        Assert.Contains("motors/p-302.yaml", Strings(run.Json.GetProperty("changes").GetProperty("changed")));
    }

    [Fact]
    public void Outside_a_git_repository_it_says_so_and_exits_2()
    {
        using var plain = new SettingLint.Tests.Support.TempRepo(git: false);
        SettingLint.Tests.Support.Samples.WriteMinimal(plain);
        var run = Cli.Run(["check", plain.Root, "--changed-since", "HEAD"]);
        Assert.Equal(2, run.Exit);
        Assert.Contains("--changed-since needs git", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("not inside a git work tree", run.Stdout, StringComparison.Ordinal);

        var staged = Cli.Run(["check", plain.Root, "--staged", "--format", "sarif"]);
        Assert.Equal(2, staged.Exit);
        Assert.Contains("--staged needs git", staged.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void An_unknown_revision_exits_2()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        var run = Cli.Run(["check", git.Root, "--changed-since", "no-such-branch"]);
        Assert.Equal(2, run.Exit);
        Assert.Contains("'no-such-branch' is not a revision", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void All_files_needs_a_revision()
    {
        using var git = new GateGitRepo();
        var run = Cli.Run(["check", git.Root, "--all-files"]);
        Assert.Equal(2, run.Exit);
        Assert.Contains("--all-files goes with --changed-since or --staged", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void All_files_checks_everything_and_still_reports_changes_to_the_gate()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        git.Edit(GateGitRepo.Breaker, "  short_circuit:                     # 50P",
            "  short_circuit:                     # 50P  # settinglint-accept SL203 SL205: breaker replacement ordered, work order 7 (invented)");
        var run = git.CheckJson("--changed-since", "HEAD", "--all-files");
        Assert.Equal(4, run.Json.GetProperty("summary").GetProperty("files").GetInt32());
        Assert.Contains("--all-files", run.Json.GetProperty("changes").GetProperty("everythingBecause").GetString(), StringComparison.Ordinal);
        Assert.Equal(2, run.Findings.Count(f => f is { Rule: "SL011", File: GateGitRepo.Breaker }));
        Assert.Equal(2, run.Json.GetProperty("summary").GetProperty("suppressed").GetInt32());
    }
}
