using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// The gated run in process, beyond <see cref="GatedCheckTests"/>: a baseline outside the repository, what the
/// staged view hides and hands on, --all-files on a settings-only change, absent baseline entries of a changed-files
/// run, the levels of rules the packs do not hold, and a folder's configuration judged as the engine applies it.
/// </summary>
public sealed class GateRunTests
{
    private const string M1 = GatePlant.M1;
    private const string M2 = GatePlant.M2;
    private const string M3 = GatePlant.M3;
    private const string BaselineFile = GatePlant.BaselineFile;

    private static CheckResult Run(GitWorkTree git, GateOptions options) =>
        Linter.Check(new CheckRequest(git.Root, [git.Root]) { Options = options, Parallel = false });

    private static string Motors(CheckResult result) =>
        string.Join(" ", result.CheckedFiles.Where(f => f.StartsWith("motors/", StringComparison.Ordinal)).Order(StringComparer.Ordinal));

    private static string Broken(string tag, string bus) => GatePlant.Motor(tag, bus, "pickup: 7.2 A sec", "pickup: 20 A sec");

    [Fact]
    public void The_revision_is_the_one_given_then_HEAD_for_staged_then_none()
    {
        Assert.Equal("main", new GateOptions(ChangedSince: "main", Staged: true).Revision);
        Assert.Equal("HEAD", new GateOptions(Staged: true).Revision);
        Assert.Null(new GateOptions(BaselineFile: "b").Revision);
    }

    [Fact]
    public void A_run_refuses_a_missing_session_source_or_options_by_name()
    {
        using var git = GatePlant.Create();
        var source = new DiskSource(git.Root);
        var session = Session.Open(source, git.Root);
        Assert.Equal("session", Assert.Throws<ArgumentNullException>(() => GatedCheck.Run(null!, source, git.Root, [git.Root], Level.Error, false, new GateOptions())).ParamName);
        Assert.Equal("source", Assert.Throws<ArgumentNullException>(() => GatedCheck.Run(session, null!, git.Root, [git.Root], Level.Error, false, new GateOptions())).ParamName);
        Assert.Equal("gate", Assert.Throws<ArgumentNullException>(() => GatedCheck.Run(session, source, git.Root, [git.Root], Level.Error, false, null!)).ParamName);
    }

    [Fact]
    public void A_baseline_outside_the_repository_is_read_from_the_disk_and_named_by_its_full_path()
    {
        using var git = GatePlant.Create();
        var full = Run(git, new GateOptions());
        var outside = git.Temp.WriteOutside("shared/plant.baseline", Baseline.Write(full.Findings));
        // Named relative to the working folder, as a user would from the repository.
        var result = Run(git, new GateOptions(BaselineFile: "../shared/plant.baseline"));
        Assert.Empty(result.Notifications);
        Assert.Equal(BaselineState.Unchanged, Assert.Single(result.Findings).BaselineState);
        Assert.Equal(outside.Replace('\\', '/'), result.BaselineFile);
        Assert.Equal(ExitCodes.Clean, result.ExitCode);

        File.Delete(outside);
        var missing = Run(git, new GateOptions(BaselineFile: "../shared/plant.baseline"));
        Assert.Equal("The baseline '../shared/plant.baseline' does not exist; write it with 'settinglint baseline --output ../shared/plant.baseline'.",
            Assert.Single(missing.Notifications).Message);
    }

    [Fact]
    public void What_runs_after_the_gate_is_handed_the_staged_view_not_the_working_tree()
    {
        using var git = GatePlant.Create();
        var staged = Broken("M-1", "bus-1");
        git.Write(M1, staged);
        git.Git("add", M1);
        git.Write(M1, Samples.Motor + "# working tree only\n");
        var source = new DiskSource(git.Root);
        IFileSource? seen = null;
        var result = GatedCheck.Run(Session.Open(source, git.Root), source, git.Root, [git.Root], Level.Error, false, new GateOptions(Staged: true), v => seen = v);
        Assert.Empty(result.Notifications);
        Assert.NotNull(seen);
        Assert.Equal(staged, Encoding.UTF8.GetString(seen.Read(M1)!));
    }

    [Fact]
    public void Staged_hides_a_file_deleted_from_the_index_even_when_the_working_tree_keeps_it_ignored()
    {
        // `git rm --cached` and an ignore line: the usual way to stop tracking a file. It is no part of the commit.
        using var git = GatePlant.Create();
        git.Git("rm", "-q", "--cached", M3);
        git.Write(".gitignore", M3 + "\n");
        git.Write(M3, Broken("M-3", "bus-2"));
        var result = Run(git, new GateOptions(Staged: true, AllFiles: true));
        Assert.Empty(result.Notifications);
        Assert.Equal($"{M1} {M2}", Motors(result));
        Assert.DoesNotContain(result.Findings, f => f.File == M3);
        Assert.Equal([M3], result.Scope!.Deleted.ToArray());
    }

    [Fact]
    public void Staged_hides_a_file_only_marked_with_intent_to_add()
    {
        // `git add -N` records that a file will be added, with an empty blob in the index; a commit leaves it out.
        using var git = GatePlant.Create();
        git.Write("motors/m-9.yaml", Broken("M-9", "bus-1"));
        git.Git("add", "-N", "motors/m-9.yaml");
        var result = Run(git, new GateOptions(Staged: true, AllFiles: true));
        Assert.Empty(result.Notifications);
        Assert.Equal($"{M1} {M2} {M3}", Motors(result));
        Assert.DoesNotContain(result.Findings, f => f.File == "motors/m-9.yaml");
    }

    [Fact]
    public void All_files_checks_every_file_when_only_a_motor_changed()
    {
        using var git = GatePlant.Create();
        git.Write(M3, Broken("M-3", "bus-2"));
        Assert.Equal(M3, Motors(Run(git, new GateOptions(ChangedSince: "HEAD"))));
        var all = Run(git, new GateOptions(ChangedSince: "HEAD", AllFiles: true));
        Assert.Equal($"{M1} {M2} {M3}", Motors(all));
        Assert.Equal([("TST102", M1), ("TST101", M3)], all.Findings.Select(f => (f.RuleId, f.File)));
    }

    [Fact]
    public void A_changed_files_run_lists_as_absent_only_the_entries_of_checked_or_deleted_files()
    {
        using var git = GatePlant.Create();
        static Finding Entry(string file, string key) => new("TST101", Level.Error, file, Documents.SourceSpan.At(1, 1), key, "m", System.Collections.Immutable.ImmutableSortedDictionary<string, FindingValue>.Empty);
        var findings = Run(git, new GateOptions()).Findings;
        git.Write(BaselineFile, Baseline.Write([.. findings, Entry(M3, "protection.short_circuit.pickup"), Entry("motors/gone.yaml", "protection.short_circuit.pickup")]));
        git.Commit("baseline");
        git.Write(M1, Samples.MotorWith("title: Test pump", "title: Test pump, renamed"));
        var result = Run(git, new GateOptions(BaselineFile: BaselineFile, ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        // m-3 was not checked and still exists: its entry is not known to be stale. gone.yaml no longer exists: it is.
        Assert.Equal(["motors/gone.yaml"], result.Absent.Select(a => a.File));
        Assert.Equal(BaselineState.Unchanged, Assert.Single(result.Findings).BaselineState);
    }

    [Fact]
    public void An_engine_rule_switched_off_is_judged_at_its_own_default_level()
    {
        using var git = GatePlant.Create();
        // SL011 itself is a warning by default (EngineRules): switching it off lowers it from warning.
        git.Write(".settinglint.yaml", "packs: [tests]\nrules:\n  SL011: off\n");
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        var f = Assert.Single(result.Findings, f => f.RuleId == EngineRules.GateChange);
        Assert.Equal((3, "SL011 is switched off (it was warning): it no longer reports anything."), (f.Span.StartLine, f.Message));
    }

    [Fact]
    public void A_rule_of_a_dropped_pack_is_judged_at_the_error_level_when_no_pack_holds_it_any_more()
    {
        using var git = GatePlant.Create();
        git.Write(".settinglint.yaml", "packs: [tests]\nrules:\n  TST101: warning\n");
        git.Commit("lowered");
        // The pack and its rule's override go together: TST101 is in no loaded pack now.
        git.Write(".settinglint.yaml", "packs: [builtin]\n");
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        Assert.Equal(["The rule pack tests is no longer used: its rules do not run."],
            result.Findings.Where(f => f.RuleId == EngineRules.GateChange).Select(f => f.Message));
    }

    [Fact]
    public void A_folders_severity_alone_keeps_a_rule_the_root_switched_off_off_and_taking_it_out_is_no_gate_change()
    {
        // README "Configuration": key by key, `enabled` and `severity` each on their own.
        using var git = GatePlant.Create();
        git.Write(".settinglint.yaml", "packs: [tests]\nrules:\n  TST101: off\n");
        git.Write("motors/.settinglint.yaml", "rules:\n  TST101: { severity: warning }\n");
        git.Write(M3, Broken("M-3", "bus-2"));
        git.Commit("scoped");
        Assert.DoesNotContain(Run(git, new GateOptions()).Findings, f => f.RuleId == "TST101");

        git.Write("motors/.settinglint.yaml", "rules: {}\n");
        var result = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(result.Notifications);
        Assert.DoesNotContain(result.Findings, f => f.RuleId == EngineRules.GateChange);

        // With `enabled: true` beside it the rule ran at warning there: taking that out is reported.
        git.Write("motors/.settinglint.yaml", "rules:\n  TST101: { enabled: true, severity: warning }\n");
        git.Commit("on at warning");
        Assert.Contains(Run(git, new GateOptions()).Findings, f => (f.RuleId, f.File, f.Level) == ("TST101", M3, Level.Warning));
        git.Write("motors/.settinglint.yaml", "rules: {}\n");
        var off = Assert.Single(Run(git, new GateOptions(ChangedSince: "HEAD")).Findings, f => f.RuleId == EngineRules.GateChange);
        Assert.Equal(("motors/.settinglint.yaml", "TST101 is switched off (it was warning): it no longer reports anything."), (off.File, off.Message));
    }
}
