using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Tests;

/// <summary>The acceptance comment: where it is recognised, which lines it covers, and the SL010 findings of faulty ones.</summary>
public sealed class GateAcceptCommentTests
{
    private const string Motor = """
        kind: motor-protection
        format: 1
        tag: M-7
        protection:
          short_circuit:
            enabled: true
            pickup: 7.2 A sec
            delay: 0 s
          thermal:
            enabled: true

        """;

    private static LoadedFile Load(string text) => YamlLoader.Load(Encoding.UTF8.GetBytes(text), "/r/m.yaml", "m.yaml", LoadLimits.Default);

    private static ImmutableArray<AcceptComment> Find(string text) => AcceptComments.Find(Load(text));

    private static Finding At(string rule, int line, int column = 5) => new(rule, Level.Error, "m.yaml", SourceSpan.At(line, column), "k", "t", ImmutableSortedDictionary<string, FindingValue>.Empty);

    private static readonly IReadOnlySet<string> Known = new HashSet<string>(["SL006", "SL010", "SL011", "SL201", "SL203", "SL801"]);

    // Most files have no acceptance: the whole text is searched for the marker (in any case) before any line is split.
    [Fact]
    public void A_file_without_the_marker_is_not_split_into_lines()
    {
        var plain = Load(Motor);
        Assert.Empty(Find(Motor));
        Assert.Empty(AcceptComments.Find(plain));
        Assert.False(Assert.IsType<LazyLines>(plain.Lines).IsSplit);
        var marked = Load(Motor.Replace("tag: M-7", "tag: M-7   # Settinglint-Accept SL201: judged acceptable", StringComparison.Ordinal));
        Assert.Equal("SL201", Assert.Single(Assert.Single(AcceptComments.Find(marked)).RuleIds));
        Assert.True(Assert.IsType<LazyLines>(marked.Lines).IsSplit);
    }

    [Fact]
    public void A_trailing_comment_covers_its_own_line()
    {
        const string line = "    pickup: 7.2 A sec   # settinglint-accept SL201: reviewed in the study";
        var c = Assert.Single(Find(Motor.Replace("    pickup: 7.2 A sec", line, StringComparison.Ordinal)));
        Assert.Equal(["SL201"], c.RuleIds.ToArray());
        Assert.Equal("reviewed in the study", c.Reason);
        Assert.Equal((7, 7), (c.FirstLine, c.LastLine));
        Assert.Equal("protection.short_circuit.pickup", c.KeyPath);
        Assert.Equal(new SourceSpan(7, line.IndexOf('#', StringComparison.Ordinal) + 1, 7, line.Length + 1), c.Span);
    }

    [Fact]
    public void A_comment_on_its_own_line_covers_the_next_line_with_yaml_skipping_blank_lines_and_other_comments()
    {
        var text = Motor.Replace("    delay: 0 s", "    # settinglint-accept SL201, SL203: the fuses clear it\n\n    # expect: SL203\n    delay: 0 s", StringComparison.Ordinal);
        var c = Assert.Single(Find(text));
        Assert.Equal(["SL201", "SL203"], c.RuleIds.ToArray());
        Assert.Equal((11, 11), (c.FirstLine, c.LastLine));
        Assert.Equal("protection.short_circuit.delay", c.KeyPath);
    }

    [Fact]
    public void A_comment_on_or_before_an_element_key_covers_the_whole_block()
    {
        var trailing = Assert.Single(Find(Motor.Replace("  short_circuit:", "  short_circuit:   # settinglint-accept SL201: x", StringComparison.Ordinal)));
        Assert.Equal((5, 8), (trailing.FirstLine, trailing.LastLine));
        Assert.Equal("protection.short_circuit", trailing.KeyPath);
        var before = Assert.Single(Find(Motor.Replace("  short_circuit:", "  # settinglint-accept SL201: x\n  short_circuit:", StringComparison.Ordinal)));
        Assert.Equal((6, 9), (before.FirstLine, before.LastLine));
        var all = Assert.Single(Find(Motor.Replace("protection:", "protection: # settinglint-accept SL201: x", StringComparison.Ordinal)));
        Assert.Equal((4, 10), (all.FirstLine, all.LastLine));
    }

    [Fact]
    public void The_marker_may_follow_another_comment_and_is_read_in_any_case()
    {
        var c = Assert.Single(Find(Motor.Replace("  short_circuit:", "  short_circuit:  # 50P  # SettingLint-Accept sl201: x", StringComparison.Ordinal)));
        Assert.Equal(["SL201"], c.RuleIds.ToArray());
        Assert.Equal(26, c.Span.StartColumn);
    }

    [Theory]
    [InlineData("title: \"# settinglint-accept SL201: inside a quoted value\"")]
    [InlineData("title: a#settinglint-accept SL201: no space before the hash, so no comment")]
    [InlineData("title: a # settinglint-accepted SL201: another word")]
    [InlineData("title: a # expect: SL201")]
    [InlineData("notes: |\n  # settinglint-accept SL201: inside a block scalar\n  more text")]
    public void Text_that_is_not_an_acceptance_comment_is_ignored(string line)
    {
        Assert.Empty(Find(Motor.Replace("tag: M-7", "tag: M-7\n" + line, StringComparison.Ordinal)));
    }

    [Fact]
    public void A_file_without_the_marker_costs_nothing_and_has_none() => Assert.Empty(Find(Motor));

    [Fact]
    public void An_acceptance_with_a_reason_suppresses_the_covered_findings_of_its_rules_only()
    {
        const string line = "  short_circuit: # settinglint-accept SL201: reviewed";
        var file = Load(Motor.Replace("  short_circuit:", line, StringComparison.Ordinal));
        var result = Acceptances.Apply(file, [At("SL201", 7), At("SL203", 6), At("SL201", 10)], Known);
        Assert.Equal("reviewed", result[0].Suppression?.Justification);
        Assert.Equal(new SourceSpan(5, 18, 5, line.Length + 1), result[0].Suppression?.Span);
        Assert.Null(result[1].Suppression); // another rule
        Assert.Null(result[2].Suppression); // outside the block
        Assert.Equal(3, result.Count);
    }

    [Theory]
    [InlineData("# settinglint-accept SL201", "gives no reason")]
    [InlineData("# settinglint-accept SL201:   ", "gives no reason")]
    [InlineData("# settinglint-accept SL201: --", "gives no reason")]
    [InlineData("# settinglint-accept SL201 because I say so", "gives no reason")]
    [InlineData("# settinglint-accept: a reason", "names no rule")]
    [InlineData("# settinglint-accept SL999: a reason", "SL999, which is not a rule")]
    [InlineData("# settinglint-accept SL2O1: a reason", "SL2O1, which is not a rule")]
    [InlineData("# settinglint-accept SL010: a reason", "SL010 cannot be accepted")]
    [InlineData("# settinglint-accept SL011: a reason", "SL011 cannot be accepted")]
    [InlineData("# settinglint-accept SL203: a reason", "No SL203 finding lies on line 8")]
    public void A_faulty_or_stale_acceptance_is_SL010_and_accepts_nothing(string comment, string message)
    {
        var file = Load(Motor.Replace("    pickup: 7.2 A sec", "    " + comment + "\n    pickup: 7.2 A sec", StringComparison.Ordinal));
        var result = Acceptances.Apply(file, [At("SL201", 8)], Known);
        var problem = Assert.Single(result, f => f.RuleId == EngineRules.Suppression);
        Assert.Contains(message, problem.Message, StringComparison.Ordinal);
        Assert.Equal(7, problem.Span.StartLine);
        Assert.Equal(Level.Error, problem.Level);
        if (!comment.Contains("SL201:", StringComparison.Ordinal)) Assert.Null(result[0].Suppression);
    }

    [Fact]
    public void A_stale_id_beside_a_used_one_is_reported_alone()
    {
        var file = Load(Motor.Replace("pickup: 7.2 A sec", "pickup: 7.2 A sec # settinglint-accept SL201 SL801: reviewed", StringComparison.Ordinal));
        var result = Acceptances.Apply(file, [At("SL201", 7)], Known);
        Assert.NotNull(result[0].Suppression);
        var stale = Assert.Single(result, f => f.RuleId == EngineRules.Suppression);
        Assert.Contains("No SL801 finding", stale.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_acceptance_before_nothing_is_SL010()
    {
        var file = Load(Motor + "# settinglint-accept SL201: at the end\n");
        var problem = Assert.Single(Acceptances.Apply(file, [], Known));
        Assert.Contains("stands before nothing", problem.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_narrower_of_two_acceptances_gives_the_reason_and_neither_is_stale()
    {
        var file = Load(Motor.Replace("  short_circuit:", "  short_circuit: # settinglint-accept SL201: block reason", StringComparison.Ordinal)
            .Replace("pickup: 7.2 A sec", "pickup: 7.2 A sec # settinglint-accept SL201: line reason", StringComparison.Ordinal));
        var result = Acceptances.Apply(file, [At("SL201", 7)], Known);
        Assert.Equal("line reason", Assert.Single(result).Suppression?.Justification);
    }

    [Fact]
    public void An_acceptance_is_not_called_stale_where_an_error_in_the_data_explains_the_file()
    {
        // An empty `bus:` (SL005) keeps the bus rules from running: their acceptance matching nothing is a knock-on.
        var file = Load(Motor.Replace("pickup: 7.2 A sec", "pickup: 7.2 A sec # settinglint-accept SL203: breaker replacement ordered", StringComparison.Ordinal));
        var result = Acceptances.Apply(file, [At("SL005", 3)], Known);
        Assert.DoesNotContain(result, f => f.RuleId == EngineRules.Suppression);
        // Without that error the same acceptance is stale; and an acceptance of a data check is judged as before.
        Assert.Contains(Acceptances.Apply(file, [], Known), f => f.RuleId == EngineRules.Suppression);
        var engine = Load(Motor.Replace("pickup: 7.2 A sec", "pickup: 7.2 A sec # settinglint-accept SL006: reviewed", StringComparison.Ordinal));
        Assert.Contains(Acceptances.Apply(engine, [At("SL005", 3)], Known), f => f.RuleId == EngineRules.Suppression);
    }
}
