using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// What rule evaluation keeps between rules, ranges and motors (path values per motor, aggregates per bus per run, lets
/// that do not read the range, chains of 'and' and 'or') gives the values a fresh evaluation of each expression gives.
/// </summary>
public sealed class RuleEvaluationTests
{
    private static string Rule(string id, string body) => $"""
        id: {id}
        title: Test rule
        summary: A rule for the evaluation tests.
        rationale: Tests only.
        basis: [common practice]
        severity: warning
        tags: [27]
        applies_to: motor-protection
        {body}
        """;

    private static ImmutableArray<CompiledRule> Load(params string[] rules)
    {
        var result = new RuleLoader(SchemaSet.Shared).Load(
            [.. rules.Select((r, i) => new RuleSource($"test/{i}/rule.yaml", Encoding.UTF8.GetBytes(r)))]);
        Assert.Empty(result.Problems);
        return result.Rules;
    }

    private static ImmutableArray<Finding> Check(TempRepo repo, RuleSet rules, bool parallel = false) =>
        [.. new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: parallel)).Findings.Where(f => f.RuleId.StartsWith("SL95", StringComparison.Ordinal))];

    private static string Motor(string tag, string bus, string acceleration) =>
        Samples.Replace(Samples.Replace(Samples.Replace(Samples.Motor, "tag: M-1", "tag: " + tag), "bus: ../buses/bus-1.yaml", "bus: ../buses/" + bus + ".yaml"),
            "acceleration_time: 4.5 s", "acceleration_time: " + acceleration);

    private const string OthersRule = """
        let:
          longest_other: others_max(motor.acceleration_time)
          shortest_other: others_min(motor.acceleration_time)
          other_count: others_count()
        check: motor.acceleration_time < 0 s
        subject: motor.acceleration_time
        message: "{longest_other} {shortest_other} {other_count}"
        """;

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Aggregates_see_the_other_motors_of_each_motors_own_bus(bool parallel)
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-a.yaml", Samples.Bus);
        repo.Write("buses/bus-b.yaml", Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: BUS-2"));
        repo.Write("motors/a1.yaml", Motor("A1", "bus-a", "3 s"));
        repo.Write("motors/a2.yaml", Motor("A2", "bus-a", "5 s"));
        repo.Write("motors/a3.yaml", Motor("A3", "bus-a", "4 s"));
        repo.Write("motors/b1.yaml", Motor("B1", "bus-b", "10 s"));
        repo.Write("motors/b2.yaml", Motor("B2", "bus-b", "2 s"));
        var rules = new RuleSet(Load(Rule("SL951", OthersRule)));

        // Twice with one rule set: the second run has its own index, and so its own bus values.
        for (var run = 0; run < 2; run++)
        {
            var byFile = Check(repo, rules, parallel).ToDictionary(f => f.File, f => f.Values);
            Assert.Equal(5, byFile.Count);
            (double Longest, double Shortest, double Count) Seen(string file) =>
                (byFile[file]["longest_other"].Number!.Value, byFile[file]["shortest_other"].Number!.Value, byFile[file]["other_count"].Number!.Value);
            Assert.Equal((5, 4, 2), Seen("motors/a1.yaml"));
            Assert.Equal((4, 3, 2), Seen("motors/a2.yaml"));
            Assert.Equal((5, 3, 2), Seen("motors/a3.yaml"));
            Assert.Equal((2, 2, 1), Seen("motors/b1.yaml"));
            Assert.Equal((10, 10, 1), Seen("motors/b2.yaml"));
        }

        // A later run sees changed data, not what an earlier run kept.
        repo.Write("motors/a2.yaml", Motor("A2", "bus-a", "9 s"));
        var after = Check(repo, rules).ToDictionary(f => f.File, f => f.Values);
        Assert.Equal(9, after["motors/a1.yaml"]["longest_other"].Number);
        Assert.Equal(4, after["motors/a2.yaml"]["longest_other"].Number);
    }

    [Fact]
    public void An_aggregate_keeps_values_per_parameter_value_of_the_same_compiled_rule()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-a.yaml", Samples.Bus);
        repo.Write("motors/a1.yaml", Motor("A1", "bus-a", "3 s"));
        repo.Write("motors/a2.yaml", Motor("A2", "bus-a", "5 s"));
        var rule = Assert.Single(Load(Rule("SL952", """
            parameters:
              factor: { default: 1, meaning: a factor }
            let:
              scaled_longest: others_max(param.factor * motor.acceleration_time)
            check: motor.acceleration_time < 0 s
            subject: motor.acceleration_time
            message: "{scaled_longest}"
            """)));
        // One compiled expression, two parameter values in one rule set (as a repository's override makes): each its own values.
        var doubled = rule with { ParameterValues = [2.0] };
        var findings = Check(repo, new RuleSet([rule, doubled]));
        var a1 = findings.Where(f => f.File == "motors/a1.yaml").Select(f => f.Values["scaled_longest"].Number).Order().ToList();
        Assert.Equal([5.0, 10.0], a1);
    }

    [Fact]
    public void A_for_each_rule_gives_each_range_its_own_values_and_every_range_the_motors_values()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("models/relay.yaml", """
            kind: relay-model
            format: 1
            tag: RELAY-A
            ranges:
              short_circuit.pickup: { min: 20 xCT, max: 30 xCT, step: 0.1 xCT }
              short_circuit.delay: { min: 1 s, max: 2 s, step: 0.01 s }

            """);
        repo.Write("motors/m-1.yaml", Samples.Replace(
            Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay.yaml"),
            "    pickup: 7.2 A sec", "    pickup: 7.2 A sec\n    delay: 0.05 s"));
        var rules = new RuleSet(Load(Rule("SL953", """
            for_each: relay_model.ranges
            let:
              flc: motor.full_load_current
              low: item.min
              low_again: low
              flc_again: flc
              is_pickup: item.setting == 'short_circuit.pickup'
            check: item.value >= item.min and item.value <= item.max
            subject: protection.{item.setting}
            message: "{low} {low_again} {flc} {flc_again} {is_pickup}"
            """)));
        var findings = Check(repo, rules).OrderBy(f => f.KeyPath, StringComparer.Ordinal).ToList();
        Assert.Equal(["protection.short_circuit.delay", "protection.short_circuit.pickup"], findings.Select(f => f.KeyPath));
        var delay = findings[0].Values;
        var pickup = findings[1].Values;
        Assert.Equal(1, delay["low"].Number);
        Assert.Equal(1, delay["low_again"].Number);
        Assert.Equal("false", delay["is_pickup"].Text);
        Assert.Equal(20 * 75, pickup["low"].Number!.Value, 9); // 20 xCT of a 75 A CT
        Assert.Equal(pickup["low"].Number, pickup["low_again"].Number);
        Assert.Equal("true", pickup["is_pickup"].Text);
        foreach (var v in new[] { delay, pickup })
        {
            Assert.Equal(58, v["flc"].Number);
            Assert.Equal(58, v["flc_again"].Number);
        }
    }

    [Fact]
    public void A_let_that_fails_fails_its_rule_even_when_only_the_message_names_it()
    {
        // A range value read for another motor (inside an aggregate) is not there: the rule fails on each motor with others
        // on its bus, as it did when every let was evaluated before the check, though here the check passes.
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("models/relay.yaml", Samples.RelayModel);
        foreach (var tag in new[] { "A1", "A2" })
        {
            repo.Write($"motors/{tag}.yaml", Samples.MotorWith("tag: M-1", $"tag: {tag}\nrelay_model: ../models/relay.yaml"));
        }
        var rules = new RuleSet(Load(Rule("SL957", """
            for_each: relay_model.ranges
            let:
              odd: others_max(item.value)
            check: item.value >= item.min or item.value < item.min
            subject: protection.{item.setting}
            message: "{odd}"
            """)));
        var result = new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: false));
        Assert.Empty(result.Findings.Where(f => f.RuleId == "SL957"));
        var failed = result.Notifications.Where(n => n.Kind == NotificationKind.Internal && n.Message.Contains("SL957 failed", StringComparison.Ordinal)).ToList();
        Assert.Equal(2, failed.Count);
    }

    // Three flags, each true, false or absent (its element left out): every combination is one motor.
    private static readonly string[] Elements = ["acceleration", "starts", "undercurrent"];

    private static bool?[] Flags(int combination) => [.. Enumerable.Range(0, 3).Select(i => (combination / (int)Math.Pow(3, i) % 3) switch { 0 => true, 1 => false, _ => (bool?)null })];

    // Kleene's three-valued logic, one pair at a time, as the language defines 'and', 'or' and 'not'.
    private static bool? And(bool? a, bool? b) => a == false || b == false ? false : a is null || b is null ? null : true;

    private static bool? Or(bool? a, bool? b) => a == true || b == true ? true : a is null || b is null ? null : false;

    public static TheoryData<string> Junctions => new()
    {
        "A or B or C",
        "A and B and C",
        "A or (B and C)",
        "(A or B) and C",
        "A and (B or C) and not C",
        "not (A or B) or (B and C) or A",
    };

    [Theory]
    [MemberData(nameof(Junctions))]
    public void Chains_of_and_and_or_keep_three_valued_logic(string expression)
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        var expected = new Dictionary<string, bool?>();
        for (var c = 0; c < 27; c++)
        {
            var flags = Flags(c);
            var blocks = string.Concat(Enumerable.Range(0, 3).Where(i => flags[i] is not null)
                .Select(i => $"  {Elements[i]}:\n    enabled: {(flags[i] == true ? "true" : "false")}\n"));
            repo.Write($"motors/m-{c:D2}.yaml", Samples.Replace(Samples.MotorWith("tag: M-1", $"tag: M-{c:D2}"), "    pickup: 7.2 A sec\n", "    pickup: 7.2 A sec\n" + blocks));
            expected[$"motors/m-{c:D2}.yaml"] = Reference(expression, flags[0], flags[1], flags[2]);
        }
        var text = expression.Replace("A", "protection.acceleration.enabled", StringComparison.Ordinal)
            .Replace("B", "protection.starts.enabled", StringComparison.Ordinal)
            .Replace("C", "protection.undercurrent.enabled", StringComparison.Ordinal);
        string Body(string check) => $"check: {check}\nsubject: protection.short_circuit.enabled\nmessage: \"x\"\n";
        // SL954 fires when the expression is false, SL955 when it is true; neither when it is absent.
        // SL956 is the expression as the check itself, where 'and' and 'or' are the check's own nodes.
        var rules = new RuleSet(Load(Rule("SL954", Body($"({text}) == true")), Rule("SL955", Body($"({text}) == false")), Rule("SL956", Body(text))));
        var fired = Check(repo, rules).GroupBy(f => f.File).ToDictionary(g => g.Key, g => g.Select(f => f.RuleId).Order(StringComparer.Ordinal).ToList());
        foreach (var (file, value) in expected)
        {
            var ids = fired.GetValueOrDefault(file, []);
            List<string> want = value switch { false => ["SL954", "SL956"], true => ["SL955"], null => [] };
            Assert.True(want.SequenceEqual(ids), $"{file}: {expression} should be {value?.ToString() ?? "absent"}, fired {string.Join(" ", ids)}");
        }
    }

    private static bool? Reference(string expression, bool? a, bool? b, bool? c) => expression switch
    {
        "A or B or C" => Or(Or(a, b), c),
        "A and B and C" => And(And(a, b), c),
        "A or (B and C)" => Or(a, And(b, c)),
        "(A or B) and C" => And(Or(a, b), c),
        "A and (B or C) and not C" => And(And(a, Or(b, c)), c is null ? null : !c),
        "not (A or B) or (B and C) or A" => Or(Or(Or(a, b) is { } ab ? !ab : null, And(b, c)), a),
        _ => throw new ArgumentException(expression),
    };

    [Fact]
    public void Min_and_max_treat_nan_and_signed_zeros_as_linq_does()
    {
        double[][] cases =
        [
            [1, 2, 3], [3, double.NaN, 1], [double.NaN, 2], [double.NaN, double.NaN], [2, double.NaN],
            [0.0, -0.0], [-0.0, 0.0], [double.NegativeInfinity, double.PositiveInfinity, 5], [7],
        ];
        foreach (var values in cases)
        {
            ReadOnlySpan<Val> args = [.. values.Select(Val.Of)];
            Assert.Equal(BitConverter.DoubleToInt64Bits(values.Min()), BitConverter.DoubleToInt64Bits(Functions.All["min"].Body(args).Number));
            Assert.Equal(BitConverter.DoubleToInt64Bits(values.Max()), BitConverter.DoubleToInt64Bits(Functions.All["max"].Body(args).Number));
        }
    }

    [Fact]
    public void A_value_keeps_its_kind()
    {
        Assert.Equal(ValKind.Absent, default(Val).Kind);
        Assert.True(Val.Absent.IsAbsent);
        Assert.Equal((ValKind.Number, 2.5), (Val.Of(2.5).Kind, Val.Of(2.5).Number));
        Assert.Equal((ValKind.Bool, true), (Val.Of(true).Kind, Val.Of(true).Flag));
        Assert.Equal((ValKind.Bool, false), (Val.Of(false).Kind, Val.Of(false).Flag));
        Assert.Equal((ValKind.Text, "x"), (Val.Of("x").Kind, Val.Of("x").Text));
        Assert.Equal((ValKind.Text, (string?)null), (Val.Of((string)null!).Kind, Val.Of((string)null!).Text));
        Assert.Equal(0, Val.Of(true).Number);
        Assert.False(Val.Of(1.0).Flag);
        Assert.Null(Val.Of(1.0).Text);
        Assert.Equal(Val.Of(1.0), Val.Of(1.0));
        Assert.NotEqual(Val.Of(1.0), Val.Of(true));
    }
}
