using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>SL011: each change that loosens the gate is found at its line on the new side.</summary>
public sealed class GateChangesTests
{
    private const string Config = ".settinglint.yaml";

    // SL302 is a warning by default; every other rule an error.
    private static Level? DefaultLevel(string id) => id == "SL302" ? Level.Warning : Level.Error;

    private static ImmutableArray<Finding> Compare(string file, string? old, string? now, IReadOnlyList<Finding>? findings = null, string? baseline = null, IEnumerable<string>? packs = null)
    {
        var changed = now is null ? ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal) : ImmutableSortedSet.Create(StringComparer.Ordinal, file);
        var deleted = now is null ? ImmutableSortedSet.Create(StringComparer.Ordinal, file) : ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal);
        var oldContents = old is null
            ? ImmutableDictionary<string, byte[]>.Empty
            : ImmutableDictionary<string, byte[]>.Empty.Add(file, Encoding.UTF8.GetBytes(old));
        var changes = new ChangeSet("HEAD", "0123", false, changed, deleted, null, oldContents);
        return GateChanges.Find("/r", changes, rel => rel == file && now is not null ? Encoding.UTF8.GetBytes(now) : null,
            packs ?? ["builtin"], baseline, DefaultLevel, findings ?? []);
    }

    private static (string Message, Level Level, int Line) Only(ImmutableArray<Finding> found)
    {
        var f = Assert.Single(found);
        Assert.Equal(EngineRules.GateChange, f.RuleId);
        return (f.Message, f.Level, f.Span.StartLine);
    }

    [Fact]
    public void Switching_a_rule_off_is_a_warning_at_its_line()
    {
        var (message, level, line) = Only(Compare(Config, "rules:\n  SL201: error\n", "fail_on: error\nrules:\n  SL201: off\n"));
        Assert.Equal("SL201 is switched off (it was error): it no longer reports anything.", message);
        Assert.Equal((Level.Warning, 3), (level, line));
    }

    [Theory]
    [InlineData("rules:\n  SL201: warning\n", "The severity of SL201 is lowered from error to warning.")]
    [InlineData("rules:\n  SL201: { severity: note }\n", "The severity of SL201 is lowered from error to note.")]
    [InlineData("rules:\n  SL201: { enabled: false }\n", "SL201 is switched off (it was error): it no longer reports anything.")]
    public void Lowering_a_severity_or_disabling_is_found_in_either_spelling(string now, string message)
    {
        Assert.Equal(message, Only(Compare(Config, "packs: [builtin]\n", now)).Message);
    }

    [Fact]
    public void Removing_an_override_that_raised_a_rule_lowers_it_to_its_default()
    {
        Assert.Equal("The severity of SL302 is lowered from error to warning.", Only(Compare(Config, "rules:\n  SL302: error\n", "rules: {}\n")).Message);
    }

    [Fact]
    public void Raising_a_severity_or_turning_a_rule_on_is_not_reported()
    {
        Assert.Empty(Compare(Config, "rules:\n  SL302: off\n", "rules:\n  SL302: error\n"));
    }

    [Fact]
    public void Any_parameter_change_is_a_note_since_its_direction_is_not_known()
    {
        var (message, level, line) = Only(Compare(Config,
            "rules:\n  SL302:\n    parameters: { max_share: 20 % }\n",
            "rules:\n  SL302:\n    parameters:\n      max_share: 25 %\n"));
        Assert.Equal("The parameter max_share of SL302 changed from 20 % to 25 %; check that the change does not loosen the rule.", message);
        Assert.Equal((Level.Note, 4), (level, line));
    }

    [Theory]
    [InlineData("fail_on: warning\n", "fail_on: error\n", "fail_on is now error (it was warning): fewer findings fail the run.")]
    [InlineData("fail_on: note\n", "fail_on: never\n", "fail_on is now never (it was note): fewer findings fail the run.")]
    [InlineData("fail_on: warning\n", "packs: [builtin]\n", "fail_on is now error (it was warning): fewer findings fail the run.")]
    public void A_less_strict_fail_on_is_a_warning(string old, string now, string message)
    {
        var (m, level, _) = Only(Compare(Config, old, now));
        Assert.Equal((message, Level.Warning), (m, level));
    }

    [Fact]
    public void A_stricter_fail_on_is_not_reported() => Assert.Empty(Compare(Config, "fail_on: error\n", "fail_on: warning\n"));

    [Fact]
    public void Dropping_a_pack_and_excluding_files_are_warnings()
    {
        var found = Compare(Config, "packs: [builtin, company]\n", "packs: [company]\nexclude: [\"drafts/**\"]\n");
        Assert.Equal(
            ["The rule pack builtin is no longer used: its rules do not run.", "Files matching drafts/** are now excluded: they are no longer checked."],
            found.Select(f => f.Message).Order(StringComparer.Ordinal).Reverse());
    }

    [Fact]
    public void A_new_configuration_is_compared_with_the_defaults_and_a_deleted_one_too()
    {
        Assert.Equal("SL201 is switched off (it was error): it no longer reports anything.", Only(Compare(Config, null, "rules:\n  SL201: off\n")).Message);
        Assert.Equal("fail_on is now error (it was note): fewer findings fail the run.", Only(Compare(Config, "fail_on: note\n", null)).Message);
    }

    [Fact]
    public void A_grown_baseline_is_a_warning_at_each_new_entry_and_a_new_one_at_its_first()
    {
        static Finding F(string rule, string key) => new(rule, Level.Error, "motors/m-1.yaml", SourceSpan.At(1, 1), key, "m", ImmutableSortedDictionary<string, FindingValue>.Empty);
        var old = Baseline.Write([F("SL201", "a")]);
        var now = Baseline.Write([F("SL201", "a"), F("SL203", "b")]);
        var (message, level, line) = Only(Compare("settinglint.baseline", old, now, baseline: "settinglint.baseline"));
        Assert.Equal("The baseline now accepts SL203 at motors/m-1.yaml b: that finding no longer fails the run.", message);
        Assert.Equal(Level.Warning, level);
        Assert.StartsWith("SL203 ", now.Split('\n')[line - 1], StringComparison.Ordinal);
        Assert.Empty(Compare("settinglint.baseline", now, old, baseline: "settinglint.baseline")); // pruning is fine
        Assert.Equal("A new baseline accepts 2 findings: they no longer fail the run.", Only(Compare("settinglint.baseline", null, now, baseline: "settinglint.baseline")).Message);
    }

    [Fact]
    public void A_new_acceptance_that_accepts_a_finding_is_a_warning_and_an_old_one_is_not()
    {
        const string old = "kind: bus\ntag: B-1\n";
        const string now = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\ntitle: x # settinglint-accept SL203: also reviewed\n";
        var accepted = new Finding("SL201", Level.Error, "buses/b.yaml", SourceSpan.At(2, 6), "tag", "m", ImmutableSortedDictionary<string, FindingValue>.Empty)
        {
            Suppression = new Suppression("reviewed", "buses/b.yaml", new SourceSpan(2, 10, 2, 46)),
        };
        var (message, level, line) = Only(Compare("buses/b.yaml", old, now, [accepted]));
        Assert.Equal("A new acceptance of SL201 on line 2: 'reviewed'. A finding it covers no longer fails the run.", message);
        Assert.Equal((Level.Warning, 2), (level, line));
        Assert.Empty(Compare("buses/b.yaml", now, now, [accepted]));
    }

    [Fact]
    public void Rule_files_of_a_company_pack_are_compared_too()
    {
        const string rule = "id: SL950\nseverity: error\nparameters:\n  limit:\n    default: 10 s\n    meaning: m\ncheck: protection.acceleration.time <= param.limit\n";
        var looser = rule.Replace("severity: error", "severity: note", StringComparison.Ordinal).Replace("default: 10 s", "default: 20 s", StringComparison.Ordinal);
        var found = Compare("pack/SL950/rule.yaml", rule, looser, packs: ["/r/pack"]);
        Assert.Equal([(Level.Warning, 2), (Level.Note, 5)], found.Select(f => (f.Level, f.Span.StartLine)));
        Assert.Equal("The rule SL950 was deleted from its pack: it no longer runs.", Only(Compare("pack/SL950/rule.yaml", rule, null, packs: ["/r/pack"])).Message);
    }
}
