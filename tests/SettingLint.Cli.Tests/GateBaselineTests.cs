using System.Text.Json;
using SettingLint.Tests.Shared;
using Xunit.Abstractions;

namespace SettingLint.Cli.Tests;

/// <summary>`settinglint baseline` and `check --baseline` end to end: states, moved lines, absent entries, SARIF, exit codes.</summary>
public sealed class GateBaselineTests(ITestOutputHelper output)
{
    // The demo repository on a 40 kA bus: SL203 on P-201 and SL205 on both motors.
    private static GateGitRepo Stronger()
    {
        var git = new GateGitRepo();
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        return git;
    }

    private static string Baseline(GateGitRepo git)
    {
        var file = git.PathOf("settinglint.baseline");
        var run = Cli.Run(["baseline", git.Root, "--output", file]);
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Contains("Wrote 3 findings (1 error, 2 warnings, 0 notes) of 4 setting files", run.Stdout, StringComparison.Ordinal);
        return file;
    }

    private static string[] States(CliRun run) =>
        [.. run.Json.GetProperty("findings").EnumerateArray().Select(f => f.GetProperty("ruleId").GetString() + " " + f.GetProperty("baselineState").GetString())];

    [Fact]
    public void Todays_findings_are_unchanged_against_their_own_baseline_and_the_run_passes()
    {
        using var git = Stronger();
        var baseline = Baseline(git);
        Assert.Equal(1, git.CheckJson().Exit);
        var run = git.CheckJson("--baseline", baseline);
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Equal(["SL203 unchanged", "SL205 unchanged", "SL205 unchanged"], States(run));
        var b = run.Json.GetProperty("baseline");
        Assert.Equal((0, 3, 0), (b.GetProperty("new").GetInt32(), b.GetProperty("unchanged").GetInt32(), b.GetProperty("absent").GetInt32()));
    }

    [Fact]
    public void Lines_inserted_above_a_baselined_finding_keep_it_unchanged()
    {
        using var git = Stronger();
        var baseline = Baseline(git);
        var before = git.CheckJson("--baseline", baseline).Findings.First(f => f.Rule == "SL203").Line;
        git.Edit(GateGitRepo.Breaker, "motor:\n", "# Rewound in 2025 (invented); data from the repair shop.\n\nmotor:\n");
        git.Edit(GateGitRepo.Breaker, "protection:\n", "protection:\n  # Elements by function; see the setting sheet.\n");
        var run = git.CheckJson("--baseline", baseline);
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Equal(before + 3, run.Findings.First(f => f.Rule == "SL203").Line);
        Assert.Equal(["SL203 unchanged", "SL205 unchanged", "SL205 unchanged"], States(run));
    }

    [Fact]
    public void A_new_finding_fails_and_a_fixed_one_is_listed_as_absent()
    {
        using var git = Stronger();
        var baseline = Baseline(git);
        // New: P-301's hot safe stall time above its cold one (SL102). Fixed: P-201 gets a 50 kA breaker (SL203 gone).
        git.Edit(GateGitRepo.Contactor, "safe_stall_time_hot: ", "safe_stall_time_hot: 9");
        git.Edit(GateGitRepo.Breaker, "interrupting_rating: 31.5 kA", "interrupting_rating: 50 kA");
        var run = git.CheckJson("--baseline", baseline);
        Assert.True(run.Exit == 1, run.ToString());
        Assert.Contains("SL102 new", States(run));
        var absent = Assert.Single(run.Json.GetProperty("baseline").GetProperty("absentEntries").EnumerateArray());
        Assert.Equal(("SL203", GateGitRepo.Breaker, "protection.short_circuit.enabled"),
            (absent.GetProperty("ruleId").GetString(), absent.GetProperty("file").GetString(), absent.GetProperty("keyPath").GetString()));

        var text = Cli.Run(["check", git.Root, "--baseline", baseline]);
        var lines = text.Stdout.Split('\n');
        Assert.Contains(lines, l => l.Contains("error SL102", StringComparison.Ordinal));
        Assert.DoesNotContain(lines, l => l.Contains("warning SL205", StringComparison.Ordinal)); // unchanged ones are not listed
        Assert.Contains(lines, l => l.EndsWith(": absent SL203: motors/p-201.yaml protection.short_circuit.enabled is no longer found; remove this entry from the baseline.", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("Baseline ", StringComparison.Ordinal) && l.Contains("1 new, 2 unchanged (not listed), 1 absent", StringComparison.Ordinal));
        Assert.Equal("1 error, 0 warnings, 0 notes in 4 files (2 motors); 2 in the baseline (not listed)", lines[^2]);

        // The new finding accepted in the source: it is no longer new, and the summary says where each finding is.
        git.Edit(GateGitRepo.Contactor, "  safe_stall_time_hot: 9", "  # settinglint-accept SL102: hot figure from the maker's test report (invented)\n  safe_stall_time_hot: 9");
        var accepted = Cli.Run(["check", git.Root, "--baseline", baseline]);
        Assert.True(accepted.Exit == 0, accepted.ToString());
        var after = accepted.Stdout.Split('\n');
        Assert.Contains(after, l => l.StartsWith("Baseline ", StringComparison.Ordinal) && l.Contains(": 0 new, 2 unchanged (not listed), 1 absent", StringComparison.Ordinal));
        Assert.Contains(after, l => l.StartsWith("settinglint: accepted SL102: 1 finding accepted in the source, in ", StringComparison.Ordinal));
        Assert.Equal("0 errors, 0 warnings, 0 notes in 4 files (2 motors); 2 in the baseline (not listed); 1 accepted in the source", after[^2]);
    }

    [Fact]
    public void SARIF_sets_a_baseline_state_on_every_result_and_writes_absent_results()
    {
        using var git = Stronger();
        var baseline = Baseline(git);
        git.Edit(GateGitRepo.Contactor, "safe_stall_time_hot: ", "safe_stall_time_hot: 9");
        git.Edit(GateGitRepo.Breaker, "interrupting_rating: 31.5 kA", "interrupting_rating: 50 kA");
        var run = Cli.Run(["check", git.Root, "--baseline", baseline, "--format", "sarif"]);
        Assert.Equal(1, run.Exit);
        Assert.Empty(SarifValidation.SchemaErrors(run.Stdout));
        var results = JsonDocument.Parse(run.Stdout).RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().ToList();
        Assert.Equal(
            ["SL205 unchanged", "SL102 new", "SL205 unchanged", "SL203 absent"],
            results.Select(r => r.GetProperty("ruleId").GetString() + " " + r.GetProperty("baselineState").GetString()));
        var absent = results[^1];
        Assert.Equal(("none", "informational"), (absent.GetProperty("level").GetString(), absent.GetProperty("kind").GetString()));
        var location = absent.GetProperty("locations")[0].GetProperty("physicalLocation");
        Assert.Equal("settinglint.baseline", location.GetProperty("artifactLocation").GetProperty("uri").GetString());
        var entryLine = location.GetProperty("region").GetProperty("startLine").GetInt32();
        Assert.StartsWith("SL203 motors/p-201.yaml ", File.ReadAllLines(baseline)[entryLine - 1], StringComparison.Ordinal);

        // Code scanning would show an absent result as an open alert: the code-scanning option leaves it out.
        var scanning = Cli.Run(["check", git.Root, "--baseline", baseline, "--format", "sarif", "--sarif-omit-suppressed"]);
        Assert.DoesNotContain("\"absent\"", scanning.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_or_edited_baseline_exits_2_with_its_line()
    {
        using var git = Stronger();
        var missing = Cli.Run(["check", git.Root, "--baseline", git.PathOf("nope.baseline")]);
        Assert.Equal(2, missing.Exit);
        Assert.Contains("does not exist", missing.Stdout, StringComparison.Ordinal);

        var baseline = Baseline(git);
        var text = File.ReadAllText(baseline);
        File.WriteAllText(baseline, text.Replace("SL203 motors/p-201.yaml", "SL203 motors/p-999.yaml", StringComparison.Ordinal));
        var edited = Cli.Run(["check", git.Root, "--baseline", baseline]);
        Assert.Equal(2, edited.Exit);
        var line = Array.FindIndex(File.ReadAllLines(baseline), l => l.StartsWith("SL203", StringComparison.Ordinal)) + 1;
        Assert.Contains($"settinglint.baseline:{line}:1: error: Baseline: The fingerprint does not match", edited.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void The_baseline_command_needs_an_output_and_a_working_configuration()
    {
        using var git = Stronger();
        Assert.Equal(2, Cli.Run(["baseline", git.Root]).Exit);
        git.Write(GateGitRepo.Config, "rules:\n  SL110: sometimes\n");
        var broken = Cli.Run(["baseline", git.Root, "--output", git.PathOf("b.baseline")]);
        Assert.Equal(2, broken.Exit);
        Assert.Contains("the baseline was not written", broken.Stderr, StringComparison.Ordinal);
        Assert.False(File.Exists(git.PathOf("b.baseline")));
    }

    [Fact]
    public void Accepted_findings_are_not_written_to_the_baseline()
    {
        using var git = Stronger();
        git.Edit(GateGitRepo.Breaker, "  short_circuit:                     # 50P",
            "  short_circuit:                     # 50P # settinglint-accept SL203: breaker replacement ordered (invented)");
        var file = git.PathOf("settinglint.baseline");
        Assert.Equal(0, Cli.Run(["baseline", git.Root, "--output", file]).Exit);
        Assert.DoesNotContain("SL203", File.ReadAllText(file), StringComparison.Ordinal);
        Assert.Equal(0, Cli.Run(["check", git.Root, "--baseline", file]).Exit);
    }

    [MultitoolFact]
    public void SARIF_with_baseline_states_passes_the_multitool()
    {
        using var git = Stronger();
        var baseline = Baseline(git);
        git.Edit(GateGitRepo.Contactor, "safe_stall_time_hot: ", "safe_stall_time_hot: 9");
        git.Edit(GateGitRepo.Breaker, "interrupting_rating: 31.5 kA", "interrupting_rating: 50 kA");
        var run = Cli.Run(["check", git.Root, "--baseline", baseline, "--format", "sarif"]);
        Assert.Contains("\"absent\"", run.Stdout, StringComparison.Ordinal);
        Multitool(git, run.Stdout);
    }

    private void Multitool(GateGitRepo git, string sarif)
    {
        ToolFacts.RequireMultitool();
        var path = Path.Combine(git.Temp.Outer, "baseline.sarif");
        File.WriteAllText(path, sarif);
        var (errors, text) = SarifValidation.RunMultitool(path);
        output.WriteLine(text);
        Assert.Equal(0, errors);
    }
}
