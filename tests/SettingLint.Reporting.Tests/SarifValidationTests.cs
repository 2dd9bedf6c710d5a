using SettingLint.Core.Findings;
using SettingLint.Tests.Shared;
using Xunit.Abstractions;

namespace SettingLint.Reporting.Tests;

/// <summary>The SARIF output against the schema shipped in the Sarif.Sdk package and against the SDK's own validator.</summary>
public sealed class SarifValidationTests(ITestOutputHelper output)
{
    public static TheoryData<string> Cases => ["findings", "clean", "notifications", "omit-suppressed", "not-run"];

    internal static (CheckResult Result, ReportContext Context) Case(string name) => name switch
    {
        "findings" => (Samples.Result(), Samples.Context("/r/motors")),
        "clean" => (Samples.Clean(), Samples.Context()),
        // Rules not evaluated for missing data: notes among the execution notifications, with their rule.
        "not-run" => (Samples.Clean() with
        {
            NotRun = [new CheckNotRun(Samples.Clean().Rules[0].Id, Level.Warning, "motors/p-101a.yaml", "P-101A", ["bus.fault_current_min", "bus.upstream"])],
        }, Samples.Context()),
        "notifications" => (Samples.Result(Samples.BadConfig, Samples.Crash,
            new Notification(NotificationKind.Configuration, "rule file is empty", "rules/SL900.yaml")),
            Samples.Context() with { Timestamps = true, StartTimeUtc = DateTimeOffset.UnixEpoch, EndTimeUtc = DateTimeOffset.UnixEpoch.AddSeconds(1) }),
        "omit-suppressed" => (Samples.Result(), Samples.Context(omitSuppressed: true)),
        _ => throw new ArgumentOutOfRangeException(nameof(name)),
    };

    private static string Sarif(string name)
    {
        var (result, context) = Case(name);
        return Samples.Render(new SarifReporter(), result, context);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Output_validates_against_the_schema_in_the_Sarif_Sdk_package(string name)
    {
        output.WriteLine("schema: " + SarifValidation.SchemaPath());
        Assert.Empty(SarifValidation.SchemaErrors(Sarif(name)));
    }

    [Fact]
    public void The_schema_check_does_catch_an_invalid_log()
    {
        var broken = Sarif("findings").Replace("\"startLine\": 4", "\"startLine\": 0", StringComparison.Ordinal)
            .Replace("\"kind\": \"inSource\"", "\"kind\": \"hidden\"", StringComparison.Ordinal);
        var errors = SarifValidation.SchemaErrors(broken);
        output.WriteLine(string.Join("\n", errors));
        Assert.NotEmpty(errors);
    }

    [MultitoolFact]
    public void The_multitool_check_does_catch_a_log_code_scanning_rejects()
    {
        // Code scanning requires the driver's rules array (GH1018): without it the count must not be zero.
        var withoutRules = Sarif("findings").Replace("\"rules\": [", "\"taxa\": [", StringComparison.Ordinal);
        Assert.True(Multitool("no-rules", withoutRules) > 0, "the multitool found no error in a log without rules");
    }

    [MultitoolTheory]
    [MemberData(nameof(Cases))]
    public void Output_passes_the_sarif_multitool_with_code_scanning_rules(string name)
    {
        Assert.Equal(0, Multitool(name, Sarif(name)));
    }

    // The error count; the tests that call it are skipped when the tool is absent outside CI, and fail without it on CI.
    private int Multitool(string name, string sarif)
    {
        ToolFacts.RequireMultitool();

        var path = Path.Combine(Path.GetTempPath(), "settinglint-" + name + "-" + Guid.NewGuid().ToString("N") + ".sarif");
        File.WriteAllText(path, sarif);
        try
        {
            var (errors, text) = SarifValidation.RunMultitool(path);
            output.WriteLine(errors + " error(s)\n" + text);
            return errors;
        }
        finally
        {
            File.Delete(path);
        }
    }
}
