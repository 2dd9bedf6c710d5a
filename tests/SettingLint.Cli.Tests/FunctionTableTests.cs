using System.Collections.Frozen;
using System.Text;
using System.Text.Json;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Reporting;

namespace SettingLint.Cli.Tests;

/// <summary>
/// The function table is closed and described by its definitions: the reference table in docs/rule-language.md is the
/// one the definitions print, and a function that throws is a defect the run reports (exit 3), never an absent value.
/// </summary>
public sealed class FunctionTableTests
{
    [Fact]
    public void The_reference_table_in_the_docs_is_the_one_the_definitions_print()
    {
        var doc = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "docs", "rule-language.md")).ReplaceLineEndings("\n");
        var start = doc.IndexOf("| function | result | meaning | defined for |", StringComparison.Ordinal);
        Assert.True(start >= 0, "docs/rule-language.md has no function table; print it with `settinglint rules functions`.");
        var end = doc.IndexOf("\n\n", start, StringComparison.Ordinal);
        Assert.Equal(FunctionTable.Render(), doc[start..(end + 1)]);
    }

    [Fact]
    public void The_printed_table_has_a_row_per_function_and_states_the_domains()
    {
        var table = FunctionTable.Render();
        Assert.Equal(Functions.All.Count + 2, table.Split('\n', StringSplitOptions.RemoveEmptyEntries).Length);
        // thermal_trip(current, pickup, tau, start_level): the IEC 60255-149 model needs k IB > 0 and tau > 0.
        Assert.Contains("| `thermal_trip(current, pickup, tau, start_level)` | time | IEC 60255-149 trip time; infinite when it never trips | `current` >= 0, `pickup` > 0, `tau` > 0, `start_level` >= 0 |", table, StringComparison.Ordinal);
        Assert.Contains("(reads the other motors on the bus)", table, StringComparison.Ordinal);
    }

    [Fact]
    public void The_rules_functions_command_prints_the_table()
    {
        var run = Cli.Run("rules", "functions");
        Assert.Equal(0, run.Exit);
        Assert.Equal(FunctionTable.Render(), run.Stdout.ReplaceLineEndings("\n"));
    }

    private const string Motor = "examples/motors/p-201.yaml";

    // A table with one more function, whose body throws as a defect in a function would.
    private static FrozenDictionary<string, FunctionDef> WithBrokenFunction() =>
        Functions.All.Values.Append(new FunctionDef("broken", 1, 1, t => t[0], _ => throw new InvalidOperationException("a defect planted by the test")))
            .ToFrozenDictionary(f => f.Name, StringComparer.Ordinal);

    private static CheckResult CheckWithBrokenRule()
    {
        const string rule = """
            id: SL990
            title: Calls a function that fails
            summary: A rule for the function-failure test.
            rationale: Tests only.
            basis: [common practice]
            severity: warning
            tags: [49]
            applies_to: motor-protection
            check: broken(motor.full_load_current) > 0 A
            subject: motor.full_load_current
            message: "never"
            """;
        var loaded = new RuleLoader(SchemaSet.Shared, WithBrokenFunction()).Load([new RuleSource("test/SL990/rule.yaml", Encoding.UTF8.GetBytes(rule))]);
        Assert.Empty(loaded.Problems);
        var root = RepositoryPaths.Root();
        return Linter.Check(new CheckRequest(root, [Motor]) { Root = root, Rules = new RuleSet(loaded.Rules), Parallel = false });
    }

    [Fact]
    public void A_function_that_throws_is_an_internal_error_naming_the_rule_the_motor_and_the_function_and_the_run_exits_3()
    {
        var result = CheckWithBrokenRule();
        var n = Assert.Single(result.Notifications);
        Assert.Equal(NotificationKind.Internal, n.Kind);
        Assert.Equal(Motor, n.File);
        Assert.Equal("The rule SL990 failed on P-201: the function broken failed: a defect planted by the test", n.Message);
        Assert.Contains("InvalidOperationException", n.Exception, StringComparison.Ordinal);
        Assert.DoesNotContain(result.NotRun, x => x.RuleId == "SL990");
        Assert.Equal(3, result.ExitCode);
    }

    [Fact]
    public void The_failure_is_a_sarif_tool_execution_notification_and_a_text_line()
    {
        var result = CheckWithBrokenRule();
        var context = new ReportContext(RepositoryPaths.Root(), false, false, ToolInfo.ForVersion("0.1.0"));
        var sarif = new StringWriter();
        new SarifReporter().Write(result, context, sarif);
        var invocation = JsonDocument.Parse(sarif.ToString()).RootElement.GetProperty("runs")[0].GetProperty("invocations")[0];
        // SARIF 2.1.0 3.20.21: a failure of the tool is a toolExecutionNotification, and executionSuccessful is false.
        Assert.False(invocation.GetProperty("executionSuccessful").GetBoolean());
        var note = Assert.Single(invocation.GetProperty("toolExecutionNotifications").EnumerateArray());
        Assert.Equal("The rule SL990 failed on P-201: the function broken failed: a defect planted by the test", note.GetProperty("message").GetProperty("text").GetString());
        var text = new StringWriter();
        new TextReporter().Write(result, context, text);
        Assert.Contains("examples/motors/p-201.yaml: internal error: The rule SL990 failed on P-201: the function broken failed: a defect planted by the test",
            text.ToString().ReplaceLineEndings("\n"), StringComparison.Ordinal);
    }
}
