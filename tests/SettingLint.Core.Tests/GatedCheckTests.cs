using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// The gate in process on a real git work tree: which files a changed-files run loads and reports, what forces a
/// full check, and `--staged` reading the index (configuration, settings and baseline) rather than the working tree.
/// </summary>
public sealed class GatedCheckTests
{
    private const string M1 = GatePlant.M1;
    private const string M2 = GatePlant.M2;
    private const string M3 = GatePlant.M3;
    private const string BaselineFile = GatePlant.BaselineFile;

    private static GitWorkTree Plant() => GatePlant.Create();

    private static string Motor(string tag, string bus, string? old = null, string? now = null) => GatePlant.Motor(tag, bus, old, now);

    private static CheckResult Run(GitWorkTree git, GateOptions options) =>
        Linter.Check(new CheckRequest(git.Root, [git.Root]) { Options = options, Parallel = false });

    private static (string Rule, string File)[] Found(CheckResult result) =>
        [.. result.Findings.Select(f => (f.RuleId, f.File))];

    [Fact]
    public void A_full_run_sees_the_bus_rule_fire_on_m1()
    {
        using var git = Plant();
        var result = Run(git, new GateOptions());
        Assert.Empty(result.Notifications);
        Assert.Equal([("TST102", M1)], Found(result));
    }

    [Fact]
    public void A_changed_motor_is_checked_with_the_motors_on_its_bus_and_nothing_on_other_buses()
    {
        using var git = Plant();
        git.Write(M1, Samples.MotorWith("title: Test pump", "title: Test pump, renamed"));
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        // TST102 on m-1 needs m-2's 30 s start: without m-2 loaded it could not fire.
        Assert.Equal([("TST102", M1)], Found(result));
        // Loaded: the changed motor and its bus mate; m-3 on the other bus is not read.
        Assert.Equal([M1, M2], result.CheckedFiles.Where(f => f.StartsWith("motors/", StringComparison.Ordinal)).Order(StringComparer.Ordinal));
        var scope = result.Scope!;
        Assert.Equal(("HEAD", false, null), (scope.Revision, scope.Staged, scope.EverythingBecause));
        Assert.Equal([M1], scope.Changed.ToArray());
        // m-2 shares the changed motor's bus: the rules over the bus may judge it differently now.
        Assert.Equal([M2], scope.Dependants.ToArray());
    }

    [Fact]
    public void The_load_plan_holds_the_changed_motor_its_bus_mates_and_nothing_on_other_buses()
    {
        var changes = new ChangeSet("HEAD", "0123", false, ImmutableSortedSet.Create(StringComparer.Ordinal, M1),
            ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal), null, ImmutableDictionary<string, byte[]>.Empty);
        MotorReferences[] motors = [new(M1, "buses/bus-1.yaml", null), new(M2, "buses/bus-1.yaml", null), new(M3, "buses/bus-2.yaml", null)];
        string[] files = [M1, M2, M3, "buses/bus-1.yaml", "buses/bus-2.yaml"];
        var plan = changes.LoadPlan("/r", motors, [], files)!;
        Assert.Equal([M1, M2], plan.Order(StringComparer.Ordinal));
        // A changed file the quick read could not place may be a motor on any bus: then everything is loaded.
        Assert.Null(changes.LoadPlan("/r", motors, [M1], files));
        // An unchanged file the quick read could not place is loaded, in case it is a motor on a selected bus.
        Assert.Equal([M1, M2, "motors/odd.yaml"], changes.LoadPlan("/r", motors, ["motors/odd.yaml"], files)!.Order(StringComparer.Ordinal));

        // A changed relay model selects its motor only; the unchanged motors on that motor's bus are loaded beside it
        // (the rules over the bus read them) but not reported.
        const string Model = "models/r.yaml";
        var model = changes with { Changed = ImmutableSortedSet.Create(StringComparer.Ordinal, Model) };
        MotorReferences[] withModel = [new(M1, "buses/bus-1.yaml", Model), new(M2, "buses/bus-1.yaml", null), new(M3, "buses/bus-2.yaml", null)];
        var (selected, dependants) = model.Select("/r", withModel, [.. files, Model]);
        Assert.Equal([Model, M1], selected.ToArray());
        Assert.Equal([M1], dependants.ToArray());
        Assert.Equal([Model, M1, M2], model.LoadPlan("/r", withModel, [], [.. files, Model])!.Order(StringComparer.Ordinal));
    }

    [Fact]
    public void A_changed_bus_reports_every_motor_on_it_as_a_dependant()
    {
        using var git = Plant();
        git.Write("buses/bus-1.yaml", Samples.Bus.Replace("x_over_r: 15", "x_over_r: 16", StringComparison.Ordinal));
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Equal([M1, M2], result.Scope!.Dependants.ToArray());
        Assert.DoesNotContain(M3, result.CheckedFiles);
    }

    [Theory]
    [InlineData("tests/TST101/rule.yaml", "the rule file tests/TST101/rule.yaml changed")]
    [InlineData("tests/pack.yaml", "the rule file tests/pack.yaml changed")]
    [InlineData(".settinglint.yaml", "the configuration .settinglint.yaml changed")]
    public void A_changed_rule_pack_file_or_configuration_forces_a_full_check(string file, string because)
    {
        using var git = Plant();
        git.Write(file, git.Read(file) + "# touched\n");
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        Assert.Equal(because, result.Scope!.EverythingBecause);
        Assert.Equal([M1, M2, M3], result.CheckedFiles.Where(f => f.StartsWith("motors/", StringComparison.Ordinal)).Order(StringComparer.Ordinal));
        Assert.Equal([("TST102", M1)], Found(result));
    }

    [Fact]
    public void A_changed_baseline_forces_a_full_check_and_its_new_entry_is_a_gate_change()
    {
        using var git = Plant();
        git.Write(BaselineFile, Baseline.Write([]));
        git.Commit("empty baseline");
        var full = Run(git, new GateOptions(BaselineFile: BaselineFile));
        git.Write(BaselineFile, Baseline.Write(full.Findings));
        var result = Run(git, new GateOptions(BaselineFile: BaselineFile, ChangedSince: "HEAD"));
        Assert.Equal("the baseline settinglint.baseline changed", result.Scope!.EverythingBecause);
        var tst = Assert.Single(result.Findings, f => f.RuleId == "TST102");
        Assert.Equal(BaselineState.Unchanged, tst.BaselineState);
        var gate = Assert.Single(result.Findings, f => f.RuleId == EngineRules.GateChange);
        Assert.Equal((BaselineFile, Level.Warning), (gate.File, gate.Level));
        Assert.Contains("The baseline now accepts TST102 at motors/m-1.yaml motor.safe_stall_time_hot", gate.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Staged_reads_the_settings_from_the_index_not_the_working_tree()
    {
        using var git = Plant();
        var broken = Samples.MotorWith("pickup: 7.2 A sec", "pickup: 20 A sec");
        // Staged: the broken pickup; working tree: the file as committed.
        git.Write(M1, broken);
        git.Git("add", M1);
        git.Write(M1, Samples.Motor);
        var staged = Run(git, new GateOptions(Staged: true));
        Assert.Empty(staged.Notifications);
        Assert.Contains(("TST101", M1), Found(staged));
        Assert.True(staged.Scope!.Staged);
        Assert.DoesNotContain(("TST101", M1), Found(Run(git, new GateOptions(ChangedSince: "HEAD"))));

        // The other way round: clean in the index, broken in the working tree only.
        git.Git("reset", "-q", M1);
        git.Write(M1, broken);
        var cleanIndex = Run(git, new GateOptions(Staged: true));
        Assert.DoesNotContain(("TST101", M1), Found(cleanIndex));
    }

    [Fact]
    public void Staged_reads_the_baseline_from_the_index_and_hides_untracked_files()
    {
        using var git = Plant();
        git.Write(BaselineFile, Baseline.Write([]));
        git.Commit("empty baseline");
        var broken = Samples.MotorWith("pickup: 7.2 A sec", "pickup: 20 A sec");
        git.Write(M1, broken);
        var found = Run(git, new GateOptions(BaselineFile: BaselineFile));
        Assert.Contains(found.Findings, f => f.RuleId == "TST101" && f.BaselineState == BaselineState.New);
        // The baseline accepting the finding is staged, then the working tree's copy goes back to empty.
        git.Write(BaselineFile, Baseline.Write(found.Findings));
        git.Git("add", BaselineFile, M1);
        git.Write(BaselineFile, Baseline.Write([]));
        // An untracked motor in the working tree is no part of the commit.
        git.Write("motors/m-9.yaml", Motor("M-9", "bus-1", "pickup: 7.2 A sec", "pickup: 30 A sec"));

        var staged = Run(git, new GateOptions(BaselineFile: BaselineFile, Staged: true));
        Assert.Empty(staged.Notifications);
        var tst = Assert.Single(staged.Findings, f => f.RuleId == "TST101");
        Assert.Equal((M1, BaselineState.Unchanged), (tst.File, tst.BaselineState));
        Assert.DoesNotContain(staged.Findings, f => f.File == "motors/m-9.yaml");
        Assert.Equal(ExitCodes.Clean, staged.ExitCode);

        var tree = Run(git, new GateOptions(BaselineFile: BaselineFile));
        Assert.Contains(tree.Findings, f => f.RuleId == "TST101" && f.File == M1 && f.BaselineState == BaselineState.New);
        Assert.Contains(tree.Findings, f => f.RuleId == "TST101" && f.File == "motors/m-9.yaml");
    }

    [Fact]
    public void A_missing_baseline_or_git_stops_the_run_with_the_way_out()
    {
        using var git = Plant();
        var missing = Run(git, new GateOptions(BaselineFile: "no.baseline"));
        Assert.Equal(ExitCodes.Usage, missing.ExitCode);
        Assert.Equal("The baseline 'no.baseline' does not exist; write it with 'settinglint baseline --output no.baseline'.", Assert.Single(missing.Notifications).Message);

        git.Write(BaselineFile, "settinglint-baseline 1\nSL201 motors/m-1.yaml\n");
        var broken = Run(git, new GateOptions(BaselineFile: BaselineFile));
        var n = Assert.Single(broken.Notifications);
        Assert.Equal((BaselineFile, 2), (n.File, n.Span!.Value.StartLine));
        Assert.StartsWith("Baseline: A baseline entry is four values", n.Message, StringComparison.Ordinal);

        using var plain = new TempRepo(git: false);
        Samples.WriteMinimal(plain);
        var noGit = Linter.Check(new CheckRequest(plain.Root, [plain.Root]) { Root = plain.Root, Options = new GateOptions(Staged: true) });
        Assert.Equal(ExitCodes.Usage, noGit.ExitCode);
        Assert.StartsWith("--staged needs git: ", Assert.Single(noGit.Notifications).Message, StringComparison.Ordinal);
        var since = Linter.Check(new CheckRequest(plain.Root, [plain.Root]) { Root = plain.Root, Options = new GateOptions(ChangedSince: "HEAD") });
        Assert.StartsWith("--changed-since needs git: ", Assert.Single(since.Notifications).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void All_files_reports_every_file_and_still_the_changes_to_the_gate()
    {
        using var git = Plant();
        git.Write(".settinglint.yaml", "packs: [tests]\nrules:\n  TST102: off\n");
        git.Write(M3, Motor("M-3", "bus-2", "pickup: 7.2 A sec", "pickup: 20 A sec"));
        var result = Run(git, new GateOptions(ChangedSince: "HEAD", AllFiles: true));
        Assert.Equal([(EngineRules.GateChange, ".settinglint.yaml"), ("TST101", M3)], Found(result));
        var scope = result.Scope!;
        Assert.Equal("every file was asked for (--all-files)", scope.EverythingBecause);
        Assert.Equal([".settinglint.yaml", M3], scope.Changed.ToArray());
        Assert.Contains(M1, result.CheckedFiles);
    }

    [Fact]
    public void The_summary_counts_new_baselined_accepted_and_gate_changes_apart()
    {
        using var git = Plant();
        // m-1: TST102 (baselined); m-3: TST101 accepted in the source; m-2: TST101 new.
        git.Write(BaselineFile, Baseline.Write(Run(git, new GateOptions()).Findings));
        git.Commit("baseline");
        git.Write(M3, Motor("M-3", "bus-2", "pickup: 7.2 A sec", "pickup: 20 A sec  # settinglint-accept TST101: the fuses clear it first"));
        git.Write(M2, Motor("M-2", "bus-1", "acceleration_time: 4.5 s", "acceleration_time: 30 s").Replace("pickup: 7.2 A sec", "pickup: 30 A sec", StringComparison.Ordinal));
        var result = Run(git, new GateOptions(BaselineFile: BaselineFile, ChangedSince: "HEAD", AllFiles: true));
        var byState = result.Findings.Select(f => (f.RuleId, f.File, f.BaselineState, Accepted: f.Suppression is not null)).ToArray();
        Assert.Contains(("TST102", M1, (BaselineState?)BaselineState.Unchanged, false), byState);
        Assert.Contains(("TST101", M2, (BaselineState?)BaselineState.New, false), byState);
        Assert.Contains(("TST101", M3, (BaselineState?)BaselineState.New, true), byState);
        // The new acceptance is a change to the gate.
        Assert.Equal([M3], result.Findings.Where(f => f.RuleId == EngineRules.GateChange).Select(f => f.File));
        // Only the new, unaccepted finding fails; the others are counted apart.
        Assert.Equal([("TST101", M2)], result.Findings.Where(result.Fails).Select(f => (f.RuleId, f.File)));
        Assert.Equal(ExitCodes.Findings, result.ExitCode);
    }
}
