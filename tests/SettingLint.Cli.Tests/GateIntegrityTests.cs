namespace SettingLint.Cli.Tests;

/// <summary>SL011 end to end: with --changed-since, changes that loosen the gate are reported where they are made.</summary>
public sealed class GateIntegrityTests
{
    private static (string Rule, string File, int Line, string Level, string Message)[] GateFindings(CliRun run) =>
        [.. run.Json.GetProperty("findings").EnumerateArray()
            .Where(f => f.GetProperty("ruleId").GetString() == "SL011")
            .Select(f => ("SL011", f.GetProperty("file").GetString()!, f.GetProperty("line").GetInt32(), f.GetProperty("level").GetString()!, f.GetProperty("message").GetString()!))];

    [Fact]
    public void A_configuration_change_that_turns_a_rule_off_is_reported_at_its_line()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        git.Write(GateGitRepo.Config, GateGitRepo.CleanConfig + "  SL205: off\n");
        git.Commit("quieter");

        var run = git.CheckJson("--changed-since", "HEAD~1");
        var f = Assert.Single(GateFindings(run));
        Assert.Equal((GateGitRepo.Config, 4, "warning"), (f.File, f.Line, f.Level));
        Assert.Equal("SL205 is switched off (it was warning): it no longer reports anything.", f.Message);
        // For the reviewer, not the gate: the run passes even at the strictest threshold.
        Assert.Equal(0, run.Exit);
        Assert.Equal(0, git.CheckJson("--changed-since", "HEAD~1", "--fail-on", "note").Exit);
        // Without --changed-since there is nothing to compare with.
        Assert.Empty(GateFindings(git.CheckJson()));
    }

    [Fact]
    public void A_folders_configuration_that_turns_a_rule_off_or_changes_the_code_is_reported_at_its_line()
    {
        using var git = new GateGitRepo();
        git.Write("motors/.settinglint.yaml", "electrical_code: NFPA 70\n");
        git.Commit("the motors folder under the NEC");
        git.Write("motors/.settinglint.yaml", "electrical_code: IEC 60364\nrules:\n  SL205: off\n");
        git.Commit("quieter, under another code");

        var run = git.CheckJson("--changed-since", "HEAD~1");
        var found = GateFindings(run);
        Assert.Equal(2, found.Length);
        Assert.Contains(("SL011", "motors/.settinglint.yaml", 1, "warning",
            "electrical_code is now IEC 60364 (it was NFPA 70): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs."), found);
        Assert.Contains(("SL011", "motors/.settinglint.yaml", 3, "warning", "SL205 is switched off (it was warning): it no longer reports anything."), found);
    }

    [Fact]
    public void A_grown_baseline_and_a_new_acceptance_are_reported_and_a_changed_parameter_is_a_note()
    {
        using var git = new GateGitRepo();
        var file = git.PathOf("settinglint.baseline");
        Assert.Equal(0, Cli.Run(["baseline", git.Root, "--output", file]).Exit);
        git.Commit("clean, with an empty baseline");

        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        Assert.Equal(0, Cli.Run(["baseline", git.Root, "--output", file]).Exit);
        git.Edit(GateGitRepo.Contactor, "safe_stall_time_hot: ", "safe_stall_time_hot: 9");
        git.Edit(GateGitRepo.Contactor, "motor:\n", "motor:  # settinglint-accept SL102: the maker's letter confirms it (invented)\n");
        git.Write(GateGitRepo.Config, GateGitRepo.CleanConfig + "  SL205:\n    parameters: { coordination_margin: 0.2 s }\n");

        var run = git.CheckJson("--changed-since", "HEAD", "--baseline", file);
        var found = GateFindings(run);
        Assert.Contains(found, f => f.File == "settinglint.baseline" && f.Level == "warning" && f.Message.StartsWith("The baseline now accepts SL203 at motors/p-201.yaml", StringComparison.Ordinal));
        Assert.Contains(found, f => f.File == GateGitRepo.Contactor && f.Level == "warning" && f.Message.StartsWith("A new acceptance of SL102", StringComparison.Ordinal));
        Assert.Contains(found, f => f.File == GateGitRepo.Config && f.Level == "note" && f.Message.StartsWith("The parameter coordination_margin of SL205 changed from the rule's default to 0.2 s", StringComparison.Ordinal));
        Assert.Equal(3, found.Count(f => f.File == "settinglint.baseline"));
    }
}
