using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Tests;

/// <summary>The rule language is checked when rules load: each mistake stops the load with the rule file's line and column.</summary>
public sealed class RuleLanguageTests
{
    private static string Rule(string check, string extra = "") => $"""
        id: SL950
        title: Test rule
        summary: A rule for the loader's tests.
        rationale: Tests only.
        basis: [common practice]
        severity: warning
        tags: [50P]
        applies_to: motor-protection
        parameters:
          factor: {"{"} default: 1.7, meaning: a factor {"}"}
          margin: {"{"} default: 0.3 s, meaning: a time {"}"}
        {extra}check: {check}
        subject: protection.short_circuit.pickup
        message: "{"{"}actual{"}"} against {"{"}limit{"}"}"

        """;

    private static RuleLoadResult Load(string text) =>
        new RuleLoader(SchemaSet.Shared).Load([new RuleSource("test/rule.yaml", Encoding.UTF8.GetBytes(text))]);

    [Theory]
    [InlineData("protection.short_circuit.pikup >= 1 A", "Unknown path", 12, 8)]
    [InlineData("protection.short_circuit.pickup >= 10 s", "compares", 12, 8)]
    [InlineData("protection.short_circuit.pickup >= lrc_at(motor.locked_rotor_current, motor.rated_voltage)", "takes 3 arguments", 12, 43)]
    [InlineData("protection.short_circuit.pickup >= param.factr * motor.full_load_current", "Unknown parameter", 12, 43)]
    [InlineData("protection.short_circuit.pickup >= sqrt(motor.full_load_current)", "plain number", 12, 43)]
    [InlineData("protection.short_circuit.pickup + param.margin > 1 A", "one dimension", 12, 8)]
    [InlineData("frobnicate(motor.full_load_current) > 1 A", "Unknown function", 12, 8)]
    public void A_mistake_fails_the_load_at_its_position(string check, string expected, int line, int column)
    {
        var result = Load(Rule(check));
        Assert.Empty(result.Rules);
        var problem = Assert.Single(result.Problems);
        Assert.Equal(NotificationKind.Configuration, problem.Kind);
        Assert.Contains(expected, problem.Message, StringComparison.Ordinal);
        Assert.Equal(line, problem.Span!.Value.StartLine);
        Assert.Equal(column, problem.Span!.Value.StartColumn);
    }

    // A frequency is per second: cycles over the bus frequency are a time, comparable with a delay.
    [Fact]
    public void Cycles_over_a_frequency_are_a_time()
    {
        var result = Load(Rule("protection.short_circuit.delay >= 5 / coalesce(bus.frequency, 60 Hz)"));
        Assert.Empty(result.Problems.Select(p => p.Message));
        Assert.Single(result.Rules);
    }

    [Theory]
    [InlineData("protection.short_circuit.delay >= bus.frequency", "compares")]
    [InlineData("choose(true, 1 A, 2 s) > 0 A", "one type")]
    [InlineData("asym_factor_at(bus.x_over_r, 0.05 s, bus.frequency) > 1", "argument 2")]
    public void Frequencies_and_choices_are_type_checked(string check, string expected)
    {
        var result = Load(Rule(check));
        Assert.Empty(result.Rules);
        Assert.Contains(expected, Assert.Single(result.Problems).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_well_typed_rule_compiles_with_its_parameters()
    {
        var result = Load(Rule("protection.short_circuit.pickup >= param.factor * motor.locked_rotor_current and protection.short_circuit.delay <= param.margin"));
        Assert.Empty(result.Problems);
        var rule = Assert.Single(result.Rules);
        Assert.Equal(1.7, rule.ParameterValues[0]);
        Assert.Equal(0.3, rule.ParameterValues[1]); // 0.3 s in SI seconds
    }

    [Fact]
    public void An_unknown_key_in_a_rule_file_is_an_error()
    {
        var result = Load(Rule("true", "colour: red\n"));
        Assert.Contains(result.Problems, p => p.Message.Contains("colour", StringComparison.Ordinal));
    }

    [Fact]
    public void Nesting_beyond_the_bound_is_refused()
    {
        var deep = new string('(', 40) + "1" + new string(')', 40) + " > 0";
        Assert.Throws<RuleSyntaxException>(() => ExpressionParser.Parse(deep));
    }
}
