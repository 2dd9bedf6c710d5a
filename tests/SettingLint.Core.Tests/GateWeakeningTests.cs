using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>
/// SL011 (gate weakened), comparison by comparison: each change to a configuration file, a rule file of a company pack
/// or the baseline that lets more through is reported with its level, key path and values, and a change that tightens
/// the gate or says the same thing again is not reported (a false SL011 is as bad as a missed one). The semantics of
/// a scoped configuration are the ones README "Configuration" gives: a nearer file overrides a farther one key by key,
/// `enabled` and `severity` each on their own.
/// </summary>
public sealed class GateWeakeningTests
{
    private const string Root = ".settinglint.yaml";
    private const string Site = "site-a/.settinglint.yaml";

    // SL302 is a warning by default; every other rule an error.
    private static Level? DefaultLevel(string id) => id == "SL302" ? Level.Warning : Level.Error;

    private static ImmutableSortedSet<string> Set(IEnumerable<string> items) => ImmutableSortedSet.CreateRange(StringComparer.Ordinal, items);

    /// <summary>
    /// The SL011 findings when the files go from Old to Now (null: absent on that side) and the others stay as given;
    /// <paramref name="readNew"/> replaces the new side's reader when given.
    /// </summary>
    private static ImmutableArray<Finding> Find(
        (string File, string? Old, string? Now)[] changed,
        (string File, string Text)[]? unchanged = null,
        IEnumerable<string>? packs = null,
        string? baseline = null,
        IReadOnlyList<Finding>? findings = null,
        Func<string, byte[]?>? readNew = null)
    {
        var now = (unchanged ?? []).ToDictionary(u => u.File, u => Encoding.UTF8.GetBytes(u.Text), StringComparer.Ordinal);
        foreach (var c in changed.Where(c => c.Now is not null)) now[c.File] = Encoding.UTF8.GetBytes(c.Now!);
        var changes = new ChangeSet("HEAD", "0123", false,
            Set(changed.Where(c => c.Now is not null).Select(c => c.File)),
            Set(changed.Where(c => c.Now is null).Select(c => c.File)),
            null,
            changed.Where(c => c.Old is not null).ToImmutableDictionary(c => c.File, c => Encoding.UTF8.GetBytes(c.Old!), StringComparer.Ordinal));
        return GateChanges.Find("/r", changes, readNew ?? (rel => now.GetValueOrDefault(rel)), packs ?? ["builtin"], baseline, DefaultLevel, findings ?? []);
    }

    private static ImmutableArray<Finding> One(string file, string? old, string? now, params (string File, string Text)[] unchanged) =>
        Find([(file, old, now)], unchanged);

    private static (string File, int Line, string KeyPath, Level Level, string Message) Row(Finding f)
    {
        Assert.Equal(EngineRules.GateChange, f.RuleId);
        return (f.File, f.Span.StartLine, f.KeyPath, f.Level, f.Message);
    }

    // ---- the root configuration: what loosens is reported

    [Theory]
    // fail_on: a less strict threshold, at its line.
    [InlineData("fail_on: note\n", "# gate\nfail_on: warning\n", 2, "fail_on", "fail_on is now warning (it was note): fewer findings fail the run.")]
    [InlineData("fail_on: error\n", "fail_on: never\n", 1, "fail_on", "fail_on is now never (it was error): fewer findings fail the run.")]
    // enabled: false in its other YAML spellings.
    [InlineData("rules:\n  SL201: error\n", "rules:\n  SL201: { enabled: False }\n", 2, "rules.SL201", "SL201 is switched off (it was error): it no longer reports anything.")]
    [InlineData("rules:\n  SL201: error\n", "rules:\n  SL201: { enabled: FALSE }\n", 2, "rules.SL201", "SL201 is switched off (it was error): it no longer reports anything.")]
    [InlineData("rules:\n  SL201: note\n", "rules:\n  SL201: { severity: none }\n", 2, "rules.SL201", "SL201 is switched off (it was note): it no longer reports anything.")]
    // A removed override is reported at the `rules:` key of the new file, where the reader looks for it.
    [InlineData("rules:\n  SL302: error\n", "fail_on: error\n\nrules:\n  SL201: error\n", 3, "rules.SL302", "The severity of SL302 is lowered from error to warning.")]
    // include: a first include narrows the check to its globs; a glob dropped from it narrows it too.
    [InlineData("fail_on: error\n", "fail_on: error\ninclude:\n  - \"site-a/**\"\n  - \"site-b/**\"\n", 3, "include", "Only files matching site-a/**, site-b/** are checked now (every YAML file was before).")]
    [InlineData("include: [\"a/**\", \"b/**\"]\n", "# narrower\ninclude: [\"a/**\"]\n", 2, "include", "Files matching b/** are no longer included: they are not checked.")]
    [InlineData("exclude: [\"a/**\"]\n", "exclude:\n  - \"a/**\"\n  - \"drafts/**\"\n", 3, "exclude", "Files matching drafts/** are now excluded: they are no longer checked.")]
    // packs: a pack dropped, with or without a `packs:` key left.
    [InlineData("packs: [builtin, company]\n", "fail_on: error\n", 1, "packs", "The rule pack company is no longer used: its rules do not run.")]
    [InlineData("packs: [company]\n", "fail_on: error\npacks: []\n", 1, "packs", "The rule pack company is no longer used: its rules do not run.")]
    [InlineData("packs: [company, builtin]\n", "fail_on: error\npacks:\n  - company\n", 3, "packs", "The rule pack builtin is no longer used: its rules do not run.")]
    // electrical_code: away from NFPA 70, declared or not, is a warning at the new value's line.
    [InlineData("electrical_code: NFPA 70\n", "fail_on: error\n\nelectrical_code: IEC 60364\n", 3, "electrical_code", "electrical_code is now IEC 60364 (it was NFPA 70): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs.")]
    [InlineData("electrical_code: NFPA 70\n", "fail_on: error\n", 1, "electrical_code", "electrical_code is now not declared (it was NFPA 70): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs.")]
    public void A_loosening_of_the_root_configuration_is_a_warning_at_its_line(string old, string now, int line, string keyPath, string message)
    {
        Assert.Equal((Root, line, keyPath, Level.Warning, message), Row(Assert.Single(One(Root, old, now))));
    }

    [Theory]
    // A parameter given, changed or taken back to the rule's default: a note, since its direction is not known.
    [InlineData("rules:\n  SL302: warning\n", "rules:\n  SL302:\n    parameters:\n      max_share: 25 %\n", 4, "rules.SL302.parameters.max_share", "The parameter max_share of SL302 changed from the rule's default to 25 %; check that the change does not loosen the rule.")]
    [InlineData("rules:\n  SL302: { parameters: { max_share: 20 % } }\n", "# x\nrules:\n  SL302: { severity: warning }\n", 3, "rules.SL302.parameters.max_share", "The parameter max_share of SL302 changed from 20 % to the rule's default; check that the change does not loosen the rule.")]
    // Any change of the governing code other than away from NFPA 70: a note.
    [InlineData("electrical_code: IEC 60364\n", "fail_on: error\n", 1, "electrical_code", "electrical_code is now not declared (it was IEC 60364): check which rules of the packs in use stop or start running.")]
    [InlineData("electrical_code: IEC 60364\n", "# x\nelectrical_code: CSA C22.1\n", 2, "electrical_code", "electrical_code is now CSA C22.1 (it was IEC 60364): check which rules of the packs in use stop or start running.")]
    public void A_change_whose_direction_is_not_known_is_a_note_at_its_line(string old, string now, int line, string keyPath, string message)
    {
        Assert.Equal((Root, line, keyPath, Level.Note, message), Row(Assert.Single(One(Root, old, now))));
    }

    [Theory]
    [InlineData("fail_on: error\n", "fail_on: note\n")]
    [InlineData("fail_on: never\n", "fail_on: error\n")]
    [InlineData("fail_on: warning\n", "# the same\nfail_on: warning\n")]
    [InlineData("rules:\n  SL201: warning\n", "rules:\n  SL201: error\n")]
    [InlineData("rules:\n  SL201: off\n", "rules:\n  SL201: note\n")]
    [InlineData("rules:\n  SL201: note\n", "rules:\n  SL201: { severity: note }\n")]
    [InlineData("rules:\n  SL201: { enabled: False }\n", "rules:\n  SL201: off\n")]
    [InlineData("rules:\n  SL201: { enabled: FALSE }\n", "rules:\n  SL201: off\n")]
    [InlineData("rules:\n  SL201: off\n", "rules:\n  SL201: { enabled: false, severity: note }\n")]
    [InlineData("rules:\n  SL302: warning\n", "rules: {}\n")]
    [InlineData("rules:\n  SL302: { parameters: { max_share: 20 % } }\n", "rules:\n  SL302:\n    parameters:\n      max_share: 20 %\n")]
    [InlineData("exclude: [\"a/**\", \"b/**\"]\n", "exclude: [\"b/**\"]\n")]
    [InlineData("exclude: [\"a/**\"]\n", "fail_on: error\n")]
    [InlineData("include: [\"a/**\"]\n", "fail_on: error\n")]
    [InlineData("include: [\"a/**\"]\n", "include: [\"b/**\", \"a/**\"]\n")]
    [InlineData("packs: [builtin]\n", "packs: [company, builtin]\n")]
    [InlineData("fail_on: error\n", "packs: [builtin]\n")]
    [InlineData("electrical_code: IEC 60364\n", "# the same\nelectrical_code: IEC 60364\n")]
    public void A_configuration_that_tightens_or_says_the_same_again_is_not_reported(string old, string now)
    {
        Assert.Empty(One(Root, old, now));
    }

    [Fact]
    public void A_gate_change_carries_its_message_id_and_named_values()
    {
        var f = Assert.Single(One(Root, "rules:\n  SL201: error\n", "rules:\n  SL201: note\n"));
        Assert.Equal("severityLoweredFrom", f.MessageId);
        Assert.Equal(["id=SL201", "new=note", "old=error"], f.Values.Select(v => v.Key + "=" + v.Value.Text));
    }

    [Fact]
    public void The_second_spelling_of_the_configuration_file_is_compared_too()
    {
        Assert.Equal(("site-a/.settinglint.yml", 2, "rules.SL201", Level.Warning, "SL201 is switched off (it was error): it no longer reports anything."),
            Row(Assert.Single(One("site-a/.settinglint.yml", null, "rules:\n  SL201: off\n"))));
    }

    [Fact]
    public void A_configuration_deleted_from_the_change_is_judged_as_gone_even_where_the_new_side_still_holds_it()
    {
        // `git rm --cached`: deleted in the index while the working tree keeps the file.
        var found = Find([(Root, "fail_on: note\n", null)], readNew: _ => Encoding.UTF8.GetBytes("fail_on: note\n"));
        Assert.Equal("fail_on is now error (it was note): fewer findings fail the run.", Assert.Single(found).Message);
    }

    // ---- a folder's configuration: judged against what the files above it give

    [Theory]
    [InlineData("SL201: on")]
    [InlineData("SL201: { enabled: true }")]
    [InlineData("SL201: { enabled: True }")]
    [InlineData("SL201: { enabled: TRUE }")]
    public void Removing_a_folders_on_where_the_root_is_off_switches_the_rule_off_there(string entry)
    {
        Assert.Equal((Site, 1, "rules.SL201", Level.Warning, "SL201 is switched off (it was error): it no longer reports anything."),
            Row(Assert.Single(One(Site, "rules:\n  " + entry + "\n", "rules: {}\n", (Root, "rules:\n  SL201: off\n")))));
    }

    [Theory]
    // Parameters alone do not switch a rule on where the root switched it off (README: key by key).
    [InlineData("SL201: { parameters: { limit: 5 s } }")]
    // Nor does a severity alone: `enabled` comes from the root, still false.
    [InlineData("SL201: { severity: warning }")]
    public void Removing_a_folders_entry_that_did_not_switch_the_rule_on_changes_nothing(string entry)
    {
        var found = One(Site, "rules:\n  " + entry + "\n", "rules: {}\n", (Root, "rules:\n  SL201: off\n"));
        Assert.DoesNotContain(found, f => f.KeyPath == "rules.SL201");
    }

    [Fact]
    public void The_files_above_are_found_under_either_name_and_at_every_depth()
    {
        // The root's file is spelt .settinglint.yml; site-a switches SL201 on; site-a/hall/ takes its own `on` out:
        // SL201 still runs there through site-a's, so nothing is reported. Without site-a's, it would be off.
        (string, string)[] above = [(".settinglint.yml", "rules:\n  SL201: off\n"), (Site, "rules:\n  SL201: on\n")];
        Assert.Empty(One("site-a/hall/.settinglint.yaml", "rules:\n  SL201: on\n", "rules: {}\n", above));
        var off = Assert.Single(One("site-a/hall/.settinglint.yaml", "rules:\n  SL201: on\n", "rules: {}\n", above[0]));
        Assert.Equal(("site-a/hall/.settinglint.yaml", "SL201 is switched off (it was error): it no longer reports anything."), (off.File, off.Message));
    }

    [Fact]
    public void A_folders_on_brings_back_the_severity_the_root_gave_with_its_off()
    {
        // The root keeps severity warning beside `enabled: false`; a folder's `on` runs the rule at warning there.
        Assert.Equal((Site, 1, "rules.SL201", Level.Warning, "SL201 is switched off (it was warning): it no longer reports anything."),
            Row(Assert.Single(One(Site, "rules:\n  SL201: on\n", "rules: {}\n", (Root, "rules:\n  SL201: { enabled: false, severity: warning }\n")))));
    }

    [Fact]
    public void A_folders_file_is_judged_against_the_roots_old_side_and_new_side_when_both_change()
    {
        // The root lowers SL201 to warning (reported there); the folder drops its own `error`, so its files fall to the
        // root's new warning: reported at the folder too.
        var lowered = Find([(Root, "rules:\n  SL201: error\n", "rules:\n  SL201: warning\n"), (Site, "rules:\n  SL201: error\n", "rules: {}\n")]);
        Assert.Equal(
            [(Root, 2, "rules.SL201", Level.Warning, "The severity of SL201 is lowered from error to warning."),
             (Site, 1, "rules.SL201", Level.Warning, "The severity of SL201 is lowered from error to warning.")],
            lowered.Select(Row));

        // The root turns SL201 back on at error; the folder newly names it at warning. Before, its files ran none of
        // SL201, so warning is a raise there: nothing to report (judged against the new root, it would look lowered).
        Assert.Empty(Find([(Root, "rules:\n  SL201: off\n", "rules:\n  SL201: error\n"), (Site, "fail_on: error\n", "rules:\n  SL201: warning\n")]));
    }

    [Theory]
    // fail_on and packs hold for the whole run and are read from the root only; a folder's file may repeat the root's
    // value and nothing else (any other value stops the run), so taking the repeat out changes nothing.
    [InlineData("fail_on: warning\n", "fail_on: warning\n")]
    [InlineData("fail_on: never\n", "fail_on: never\n")]
    [InlineData("packs: [builtin, company]\n", "packs: [../company, builtin]\n")]
    public void Removing_a_folders_repeat_of_the_roots_fail_on_or_packs_is_not_reported(string root, string folder)
    {
        Assert.Empty(One(Site, folder, "rules: {}\n", (Root, root)));
    }

    [Fact]
    public void An_empty_include_checks_no_file_and_is_reported_at_its_key()
    {
        // EffectiveConfig.Includes: a file passes an include only when one of its globs matches, so [] passes none.
        Assert.Equal((Root, 2, "include", Level.Warning, "Only files matching (none) are checked now (every YAML file was before)."),
            Row(Assert.Single(One(Root, "fail_on: error\n", "fail_on: error\ninclude: []\n"))));
    }

    [Fact]
    public void A_folders_include_taken_out_hands_its_folder_to_the_include_above_which_may_be_narrower()
    {
        // With an include above, the folder's files are now chosen by other globs: each of its own is reported.
        Assert.Equal([(Site, 1, "include", Level.Warning, "Files matching **/*.yaml are no longer included: they are not checked.")],
            One(Site, "include: [\"**/*.yaml\"]\n", "rules: {}\n", (Root, "include: [\"site-b/**\"]\n")).Select(Row));
        // With none above, every YAML file of the folder is checked again: nothing narrows.
        Assert.Empty(One(Site, "include: [\"**/*.yaml\"]\n", "rules: {}\n", (Root, "fail_on: error\n")));
    }

    // ---- rule files of a company pack

    private const string Rule = """
        id: SL950
        title: Acceleration time within a limit
        severity: error
        applies_to: motor-protection
        parameters:
          limit:
            default: 10 s
            meaning: The longest acceptable start.
          margin:
            default: 2 s
            meaning: Allowance.
        let:
          t: protection.acceleration.time
        when: motor.service == 'pump'
        for_each: [a, b]
        check: t <= param.limit
        message: Start {actual} above {limit}.

        """;

    private static ImmutableArray<Finding> RuleChange(string old, string? now) =>
        Find([("pack/SL950/rule.yaml", old, now)], packs: ["/r/pack"]);

    private static string Edit(string from, string to) => Rule.Replace(from, to, StringComparison.Ordinal);

    [Theory]
    [InlineData("check: t <= param.limit", "check: t < param.limit", 16, "check")]
    [InlineData("when: motor.service == 'pump'", "when: motor.service == 'fan'", 14, "when")]
    [InlineData("applies_to: motor-protection", "applies_to: bus", 4, "applies_to")]
    [InlineData("for_each: [a, b]", "for_each: [a, c]", 15, "for_each")]
    [InlineData("for_each: [a, b]", "for_each: [a]", 15, "for_each")]
    [InlineData("  t: protection.acceleration.time", "  t: protection.acceleration.limit", 12, "let")]
    [InlineData("  t: protection.acceleration.time", "  u: protection.acceleration.time", 12, "let")]
    [InlineData("  t: protection.acceleration.time", "  t: protection.acceleration.time\n  u: 1 s", 12, "let")]
    [InlineData("when: motor.service == 'pump'\n", "", 1, "when")]
    public void A_changed_check_is_a_note_at_its_key(string from, string to, int line, string key)
    {
        Assert.Equal(("pack/SL950/rule.yaml", line, key, Level.Note, $"The {key} of SL950 changed; check that the rule still fires where it should."),
            Row(Assert.Single(RuleChange(Rule, Edit(from, to)))));
    }

    [Fact]
    public void A_rule_rewritten_in_another_layout_with_the_same_content_is_not_reported()
    {
        var flow = Edit("let:\n  t: protection.acceleration.time", "let: { t: protection.acceleration.time }")
            .Replace("for_each: [a, b]", "for_each:\n  - a\n  - \"b\"", StringComparison.Ordinal)
            .Replace("title: Acceleration time within a limit", "# reworded\ntitle: Start time within a limit", StringComparison.Ordinal);
        Assert.Empty(RuleChange(Rule, flow));
    }

    [Fact]
    public void A_lowered_rule_severity_is_a_warning_with_the_old_and_new_levels()
    {
        var f = Assert.Single(RuleChange(Rule, Edit("severity: error", "severity: warning")));
        Assert.Equal(("pack/SL950/rule.yaml", 3, "severity", Level.Warning, "The severity of SL950 is lowered from error to warning."), Row(f));
        Assert.Equal(["id", "new", "old"], f.Values.Keys);
        Assert.Empty(RuleChange(Edit("severity: error", "severity: note"), Rule));
        Assert.Empty(RuleChange(Rule, Edit("title: Acceleration time within a limit", "title: Start time")));
    }

    [Fact]
    public void A_changed_parameter_default_is_a_note_and_a_new_or_unchanged_one_is_not()
    {
        var f = Assert.Single(RuleChange(Rule, Edit("default: 10 s", "default: 12 s")));
        Assert.Equal(("pack/SL950/rule.yaml", 7, "parameters.limit.default", Level.Note,
            "The default of limit in SL950 changed from 10 s to 12 s; check that the change does not loosen the rule."), Row(f));
        Assert.Equal(["id", "new", "old", "parameter"], f.Values.Keys);

        // A default taken away: at the parameter's key, with "(none)".
        var gone = Assert.Single(RuleChange(Rule, Edit("    default: 2 s\n", "")));
        Assert.Equal(("pack/SL950/rule.yaml", 9, "parameters.margin.default", Level.Note,
            "The default of margin in SL950 changed from 2 s to (none); check that the change does not loosen the rule."), Row(gone));

        // A new parameter, or the same defaults written again, loosens nothing that was there.
        Assert.Empty(RuleChange(Rule, Edit("  margin:\n", "  extra:\n    default: 1 s\n    meaning: New.\n  margin:\n")));
        Assert.Empty(RuleChange(Rule, Edit("    default: 10 s\n    meaning: The longest acceptable start.", "    meaning: The longest start.\n    default: 10 s")));
    }

    [Fact]
    public void A_deleted_or_broken_rule_file_is_a_warning_on_the_whole_file()
    {
        var deleted = Assert.Single(RuleChange(Rule, null));
        Assert.Equal(("pack/SL950/rule.yaml", 1, "", Level.Warning, "The rule SL950 was deleted from its pack: it no longer runs."), Row(deleted));
        Assert.Equal("ruleDeleted", deleted.MessageId);
        var broken = Assert.Single(RuleChange(Rule, "id: [\n"));
        Assert.Equal(("pack/SL950/rule.yaml", 1, "", Level.Warning, "The rule file of SL950 no longer loads: its rule does not run."), Row(broken));
    }

    [Fact]
    public void A_file_of_a_pack_that_is_not_YAML_is_not_judged()
    {
        Assert.Empty(Find([("pack/SL950/notes.txt", "id: SL950\nseverity: error\n", "id: SL950\nseverity: note\n")], packs: ["/r/pack"]));
    }

    [Fact]
    public void A_folder_whose_name_begins_with_a_packs_name_holds_setting_files_not_rules()
    {
        // pack-notes/ is not inside pack/: its new acceptance of a finding is judged as a setting file's.
        const string file = "pack-notes/b.yaml";
        const string now = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\n";
        var accepted = new Finding("SL201", Level.Error, file, SourceSpan.At(2, 6), "tag", "m", ImmutableSortedDictionary<string, FindingValue>.Empty)
        {
            Suppression = new Suppression("reviewed", file, new SourceSpan(2, 10, 2, 46)),
        };
        var found = Find([(file, "kind: bus\ntag: B-1\n", now)], packs: ["/r/pack"], findings: [accepted]);
        Assert.Equal((file, 2, Level.Warning), (Assert.Single(found).File, found[0].Span.StartLine, found[0].Level));
    }

    // ---- the baseline and acceptance comments

    [Fact]
    public void A_new_baseline_is_a_warning_on_the_whole_baseline_with_a_plain_count()
    {
        static Finding F(string key) => new("SL201", Level.Error, "m.yaml", SourceSpan.At(1, 1), key, "m", ImmutableSortedDictionary<string, FindingValue>.Empty);
        var f = Assert.Single(Find([("settinglint.baseline", null, Baseline.Write([F("a"), F("b"), F("c")]))], baseline: "settinglint.baseline"));
        Assert.Equal(("", "3", 3.0, ""), (f.KeyPath, f.Values["count"].Text, f.Values["count"].Number, f.Values["count"].Unit));
        Assert.Equal("A new baseline accepts 3 findings: they no longer fail the run.", f.Message);
    }

    [Fact]
    public void A_baseline_entry_on_a_whole_file_is_named_as_the_file()
    {
        static Finding F(string key) => new("SL001", Level.Error, "m.yaml", SourceSpan.At(1, 1), key, "m", ImmutableSortedDictionary<string, FindingValue>.Empty);
        var f = Assert.Single(Find([("settinglint.baseline", Baseline.Write([F("a")]), Baseline.Write([F("a"), F("")]))], baseline: "settinglint.baseline"));
        Assert.Equal("The baseline now accepts SL001 at m.yaml (the file): that finding no longer fails the run.", f.Message);
        Assert.Equal("m.yaml##SL001", f.KeyPath);
    }

    [Fact]
    public void An_acceptance_in_a_new_file_is_new_and_one_in_a_deleted_file_is_gone()
    {
        const string file = "buses/b.yaml";
        const string text = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\n";
        var accepted = new Finding("SL201", Level.Error, file, SourceSpan.At(2, 6), "tag", "m", ImmutableSortedDictionary<string, FindingValue>.Empty)
        {
            Suppression = new Suppression("reviewed", file, new SourceSpan(2, 10, 2, 46)),
        };
        var added = Assert.Single(Find([(file, null, text)], findings: [accepted]));
        Assert.Equal((file, 2, "tag", Level.Warning, "A new acceptance of SL201 on line 2: 'reviewed'. A finding it covers no longer fails the run."), Row(added));
        Assert.Empty(Find([(file, text, null)], findings: [accepted]));
    }
}
