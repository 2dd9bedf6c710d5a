using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>
/// The gate's edges: duplicate baseline entries and acceptances, the quoting of baseline values, and the orders a
/// baseline and the SL011 findings are written in (a reordering would make every rewritten baseline a large diff).
/// </summary>
public sealed class GateEdgeTests
{
    private const string BaselineFile = "settinglint.baseline";

    private static Finding F(string rule, string file, string keyPath, int line = 3, string message = "m", Level level = Level.Error) =>
        new(rule, level, file, SourceSpan.At(line, 5), keyPath, message, ImmutableSortedDictionary<string, FindingValue>.Empty);

    private static CheckResult Result(params Finding[] findings) =>
        new("/r", [.. findings], [], [], 1, Level.Error) { Files = RunFiles.Of(["motors/m-1.yaml"], [("motors/m-1.yaml", "M-1", null)]) };

    private static Baseline Read(string text)
    {
        var (baseline, problems) = Baseline.Parse(text);
        Assert.Empty(problems.Select(p => p.Line + ": " + p.Message));
        return baseline!;
    }

    private static string Entry(string rule, string file, string keyPath) =>
        $"{rule} {file} {keyPath} {Fingerprints.Of(file, rule, keyPath)}";

    // ---- duplicates

    [Fact]
    public void A_duplicated_entry_accepts_one_more_finding_and_when_there_is_none_it_is_absent_at_its_own_line()
    {
        // Two entries of one fingerprint are what 'baseline' writes for two findings of one rule on one key path
        // (a rule over relay ranges), so they are not refused; each accepts one finding, and a surplus one is absent.
        var entry = Entry("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup");
        var b = Read($"settinglint-baseline 1\n{entry}\n\n{entry}\n");
        Assert.Equal([2, 4], b.Entries.Select(e => e.Line));

        var one = b.Apply(Result(F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup")), BaselineFile, _ => true);
        Assert.Equal(BaselineState.Unchanged, Assert.Single(one.Findings).BaselineState);
        var absent = Assert.Single(one.Absent);
        Assert.Equal((4, "SL201", "motors/m-1.yaml"), (absent.BaselineLine, absent.RuleId, absent.File));

        var three = b.Apply(Result(
            F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup", line: 3),
            F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup", line: 9),
            F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup", line: 12)), BaselineFile, _ => true);
        Assert.Equal([BaselineState.Unchanged, BaselineState.Unchanged, BaselineState.New], three.Findings.Select(f => f.BaselineState!.Value));
        Assert.Empty(three.Absent);
    }

    [Fact]
    public void Duplicating_an_entry_in_the_baseline_is_a_change_to_the_gate_at_the_copy()
    {
        var entry = Entry("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup");
        var old = $"settinglint-baseline 1\n{entry}\n";
        var now = $"settinglint-baseline 1\n{entry}\n{entry}\n";
        var found = Compare(BaselineFile, old, now, baseline: BaselineFile);
        var f = Assert.Single(found);
        Assert.Equal((Level.Warning, 3), (f.Level, f.Span.StartLine));
        Assert.Equal("motors/m-1.yaml#protection.short_circuit.pickup#SL201", f.KeyPath);
        // Removing the copy again loosens nothing.
        Assert.Empty(Compare(BaselineFile, now, old, baseline: BaselineFile));
    }

    [Fact]
    public void A_baseline_unchanged_but_for_its_comments_is_no_change_to_the_gate()
    {
        var entry = Entry("SL201", "motors/m-1.yaml", "p");
        Assert.Empty(Compare(BaselineFile, $"settinglint-baseline 1\n# error: old words\n{entry}\n", $"# new header\nsettinglint-baseline 1\n\n# error: new words\n{entry}\n", baseline: BaselineFile));
        // Emptied or deleted, or broken (a broken one stops the run on its own): nothing to report here.
        Assert.Empty(Compare(BaselineFile, $"settinglint-baseline 1\n{entry}\n", "settinglint-baseline 1\n", baseline: BaselineFile));
        Assert.Empty(Compare(BaselineFile, $"settinglint-baseline 1\n{entry}\n", null, baseline: BaselineFile));
        Assert.Empty(Compare(BaselineFile, null, "settinglint-baseline 1\nSL201 x\n", baseline: BaselineFile));
    }

    [Fact]
    public void A_new_baseline_is_one_warning_at_its_first_entry_with_the_count()
    {
        var now = $"# header\nsettinglint-baseline 1\n\n{Entry("SL201", "a.yaml", "p")}\n{Entry("SL203", "a.yaml", "q")}\n";
        var f = Assert.Single(Compare(BaselineFile, "this was no baseline\n", now, baseline: BaselineFile));
        Assert.Equal((4, "A new baseline accepts 2 findings: they no longer fail the run."), (f.Span.StartLine, f.Message));
        Assert.Equal(2.0, f.Values["count"].Number);
    }

    [Fact]
    public void A_duplicate_acceptance_is_reported_once_per_new_copy_and_an_id_named_twice_once()
    {
        const string old = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\n";
        // The old acceptance stays; the same words are copied to a second line; a third names SL203 twice.
        const string now = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\ntitle: x # settinglint-accept SL201: reviewed\nformat: 1 # settinglint-accept SL203 SL203: twice\n";
        Finding Accepted(string rule, int line, int start, int end, string reason) =>
            F(rule, "buses/b.yaml", "k", line: line) with { Suppression = new Suppression(reason, "buses/b.yaml", new SourceSpan(line, start, line, end)) };
        var lines = now.Split('\n');
        int Col(int line) => lines[line - 1].IndexOf('#', StringComparison.Ordinal) + 1;
        int End(int line) => lines[line - 1].Length + 1;
        var findings = new[]
        {
            Accepted("SL201", 2, Col(2), End(2), "reviewed"),
            Accepted("SL201", 3, Col(3), End(3), "reviewed"),
            Accepted("SL203", 4, Col(4), End(4), "twice"),
        };
        var found = Compare("buses/b.yaml", old, now, findings);
        Assert.Equal(
            [(3, "A new acceptance of SL201 on line 3: 'reviewed'. A finding it covers no longer fails the run."),
             (4, "A new acceptance of SL203 on line 4: 'twice'. A finding it covers no longer fails the run.")],
            found.Select(f => (f.Span.StartLine, f.Message)));
    }

    [Fact]
    public void An_acceptance_that_accepts_nothing_of_this_run_is_no_change_to_the_gate()
    {
        const string now = "kind: bus\ntag: B-1 # settinglint-accept SL201: reviewed\n";
        Assert.Empty(Compare("buses/b.yaml", "kind: bus\ntag: B-1\n", now, [F("SL201", "buses/b.yaml", "tag", line: 2)]));
        // Accepting a finding of another file does not count either.
        var elsewhere = F("SL201", "buses/other.yaml", "tag", line: 2) with { Suppression = new Suppression("reviewed", "buses/other.yaml", new SourceSpan(2, 10, 2, 46)) };
        Assert.Empty(Compare("buses/b.yaml", "kind: bus\ntag: B-1\n", now, [elsewhere]));
    }

    // ---- quoting and escaping

    [Theory]
    [InlineData("motors/plain.yaml", "a.b")]
    [InlineData("motors/with space.yaml", "a b")]
    [InlineData("motors/tab\there.yaml", "x")]
    [InlineData("motors/quote\"in.yaml", "\"")]
    [InlineData("motors/back\\slash.yaml", "\\")]
    [InlineData("motors/trailing\\", "ends\\")]
    [InlineData("#hash.yaml", "#")]
    [InlineData("motors/m.yaml", "")]
    [InlineData("motors/é ü.yaml", "протекция.x")]
    public void Every_value_is_written_so_that_it_reads_back_exactly(string file, string keyPath)
    {
        var text = Baseline.Write([F("SL201", file, keyPath)]);
        var e = Assert.Single(Read(text).Entries);
        Assert.Equal((file, keyPath, "SL201"), (e.File, e.KeyPath, e.RuleId));
        Assert.Equal(Fingerprints.Of(file, "SL201", keyPath), e.Fingerprint);
    }

    [Theory]
    [InlineData("a.b", "a.b")]
    [InlineData("a b", "\"a b\"")]
    [InlineData("", "\"\"")]
    [InlineData("q\"", "\"q\\\"\"")]
    [InlineData("b\\", "\"b\\\\\"")]
    [InlineData("#x", "\"#x\"")]
    [InlineData("x#", "x#")]
    public void A_value_is_quoted_only_when_it_must_be(string keyPath, string written)
    {
        var text = Baseline.Write([F("SL201", "m.yaml", keyPath)]);
        Assert.EndsWith($"\nSL201 m.yaml {written} {Fingerprints.Of("m.yaml", "SL201", keyPath)}\n", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Quoted_values_read_escapes_and_plain_values_keep_their_characters()
    {
        var fp = Fingerprints.Of("a b.yaml", "SL201", "x\"y");
        var e = Assert.Single(Read($"settinglint-baseline 1\n  SL201\t\"a b.yaml\"  \"x\\\"y\"   {fp}  \n").Entries);
        Assert.Equal(("a b.yaml", "x\"y"), (e.File, e.KeyPath));
        // An escaped ordinary character stands for itself; a plain value may hold a quote after its first character.
        var fp2 = Fingerprints.Of("ab.yaml", "SL201", "k\"v");
        Assert.Equal("ab.yaml", Assert.Single(Read($"settinglint-baseline 1\nSL201 \"a\\b.yaml\" k\"v {fp2}\n").Entries).File);
    }

    [Theory]
    [InlineData("SL201 \"open m.yaml a 0")]
    [InlineData("SL201 m.yaml \"a\\")]
    [InlineData("SL201 m.yaml a")]
    [InlineData("SL201 m.yaml a b c")]
    public void A_broken_entry_is_refused_at_its_own_line(string entry)
    {
        var (baseline, problems) = Baseline.Parse($"# c\nsettinglint-baseline 1\n\n{entry}\n");
        Assert.Null(baseline);
        var p = Assert.Single(problems);
        Assert.Equal(4, p.Line);
        Assert.StartsWith("A baseline entry is four values", p.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Every_broken_entry_is_reported_not_only_the_first()
    {
        var good = Entry("SL201", "m.yaml", "a");
        var (_, problems) = Baseline.Parse($"settinglint-baseline 1\nSL201 m.yaml\n{good}\nsl201 m.yaml a {Fingerprints.Of("m.yaml", "sl201", "a")}\n");
        Assert.Equal([2, 4], problems.Select(p => p.Line));
        Assert.Equal("'sl201' is not a rule id (SLnnn, or a pack's prefix and three digits).", problems[1].Message);
    }

    [Fact]
    public void A_company_rule_id_is_a_rule_id_of_a_baseline()
    {
        var e = Assert.Single(Read($"settinglint-baseline 1\n{Entry("ACME101", "m.yaml", "a")}\n").Entries);
        Assert.Equal("ACME101", e.RuleId);
    }

    [Fact]
    public void Line_ends_comments_and_levels_are_read_as_written()
    {
        var entry = Entry("SL201", "m.yaml", "a");
        var text = $"# header\r\nsettinglint-baseline 1\r\n\r\n# warning: the pickup is low\r\n{entry}\r\n# a note without its entry\r\n\r\n{Entry("SL203", "m.yaml", "b")}\r\n# note: x: y\r\n{Entry("SL204", "m.yaml", "c")}\r\n";
        var b = Read(text);
        Assert.Equal([("the pickup is low", 5), ("", 8), ("x: y", 10)], b.Entries.Select(e => (e.Message, e.Line)));
        // The header may follow comments and blank lines, never an entry.
        var (none, problems) = Baseline.Parse($"\n# c\n{entry}\nsettinglint-baseline 1\n");
        Assert.Null(none);
        Assert.Equal(3, Assert.Single(problems).Line);
        Assert.Equal("settinglint-baseline 1\n", Baseline.Write([])[^23..]);
    }

    // ---- orders

    [Fact]
    public void A_baseline_is_written_by_file_then_key_path_then_rule_then_message_whatever_the_input_order()
    {
        Finding[] findings =
        [
            F("SL301", "motors/b.yaml", "a", message: "z"),
            F("SL201", "motors/b.yaml", "b"),
            F("SL301", "motors/b.yaml", "a", message: "y"),
            F("SL201", "motors/a.yaml", "z"),
            F("SL101", "motors/b.yaml", "a"),
            F("SL201", "motors/B.yaml", "a"),
        ];
        var expected = new[] { "SL201 motors/B.yaml a", "SL201 motors/a.yaml z", "SL101 motors/b.yaml a", "SL301 motors/b.yaml a", "SL301 motors/b.yaml a", "SL201 motors/b.yaml b" };
        foreach (var order in (int[][])[[0, 1, 2, 3, 4, 5], [5, 4, 3, 2, 1, 0], [2, 0, 5, 1, 3, 4]])
        {
            var text = Baseline.Write(order.Select(i => findings[i]));
            var entries = text.Split('\n').Where(l => l.StartsWith("SL", StringComparison.Ordinal)).Select(l => string.Join(' ', l.Split(' ')[..3])).ToArray();
            Assert.Equal(expected, entries);
            var comments = text.Split('\n').Where(l => l.StartsWith("# error: ", StringComparison.Ordinal)).ToArray();
            Assert.Equal(["# error: m", "# error: m", "# error: m", "# error: y", "# error: z", "# error: m"], comments);
        }
    }

    [Fact]
    public void Absent_entries_are_listed_in_the_order_of_their_lines()
    {
        var text = $"settinglint-baseline 1\n{Entry("SL301", "motors/m-1.yaml", "b")}\n{Entry("SL101", "motors/m-1.yaml", "z")}\n{Entry("SL201", "motors/gone.yaml", "a")}\n{Entry("SL101", "motors/m-1.yaml", "a")}\n";
        var r = Read(text).Apply(Result(), BaselineFile, f => f != "motors/gone.yaml");
        Assert.Equal([2, 3, 4, 5], r.Absent.Select(a => a.BaselineLine));
        Assert.Equal(["SL301", "SL101", "SL201", "SL101"], r.Absent.Select(a => a.RuleId));
    }

    [Fact]
    public void Changes_to_the_gate_come_in_file_then_line_order()
    {
        var changes = new ChangeSet("HEAD", "0123", false,
            ImmutableSortedSet.Create(StringComparer.Ordinal, "z/.settinglint.yaml", ".settinglint.yaml"),
            ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal), null,
            ImmutableDictionary<string, byte[]>.Empty
                .Add(".settinglint.yaml", Encoding.UTF8.GetBytes("rules:\n  SL302: error\n  SL201: error\n  SL1001: error\n"))
                .Add("z/.settinglint.yaml", Encoding.UTF8.GetBytes("rules:\n  SL201: error\n")));
        var now = new Dictionary<string, string>
        {
            [".settinglint.yaml"] = "rules:\n  SL1001: off\n  SL302: note\n  SL201: warning\n",
            ["z/.settinglint.yaml"] = "rules:\n  SL201: off\n",
        };
        var found = GateChanges.Find("/r", changes, rel => Encoding.UTF8.GetBytes(now[rel]), ["builtin"], null, _ => Level.Error, []);
        Assert.Equal(
            [(".settinglint.yaml", 2, "rules.SL1001"), (".settinglint.yaml", 3, "rules.SL302"), (".settinglint.yaml", 4, "rules.SL201"), ("z/.settinglint.yaml", 2, "rules.SL201")],
            found.Select(f => (f.File, f.Span.StartLine, f.KeyPath)));
    }

    [Fact]
    public void A_changed_pack_manifest_or_other_file_of_a_pack_is_judged_as_a_rule_file_not_a_setting_file()
    {
        // pack.yaml holds no rule: nothing in it loosens a rule, and it is not searched for acceptances.
        Assert.Empty(Compare("pack/pack.yaml", "prefix: ACME\n", "prefix: ACME\ntitle: x # settinglint-accept SL201: r\n", packs: ["/r/pack"]));
        // A new rule only adds checks.
        Assert.Empty(Compare("pack/ACME101/rule.yaml", null, "id: ACME101\nseverity: note\n", packs: ["/r/pack"]));
        var broken = Compare("pack/ACME101/rule.yaml", "id: ACME101\nseverity: error\n", "id: [\n", packs: ["/r/pack"]);
        Assert.Equal("The rule file of ACME101 no longer loads: its rule does not run.", Assert.Single(broken).Message);
    }

    private static ImmutableArray<Finding> Compare(string file, string? old, string? now, IReadOnlyList<Finding>? findings = null, string? baseline = null, IEnumerable<string>? packs = null)
    {
        var changed = now is null ? ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal) : ImmutableSortedSet.Create(StringComparer.Ordinal, file);
        var deleted = now is null ? ImmutableSortedSet.Create(StringComparer.Ordinal, file) : ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal);
        var oldContents = old is null
            ? ImmutableDictionary<string, byte[]>.Empty
            : ImmutableDictionary<string, byte[]>.Empty.Add(file, Encoding.UTF8.GetBytes(old));
        var changes = new ChangeSet("HEAD", "0123", false, changed, deleted, null, oldContents);
        return GateChanges.Find("/r", changes, rel => rel == file && now is not null ? Encoding.UTF8.GetBytes(now) : null,
            packs ?? ["builtin"], baseline, _ => Level.Error, findings ?? []);
    }
}
