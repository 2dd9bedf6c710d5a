using System.Text.Json;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

public sealed class SarifReporterTests
{
    private static string Sarif(CheckResult result, ReportContext? context = null) =>
        Samples.Render(new SarifReporter(), result, context ?? Samples.Context());

    private static JsonElement Run(JsonDocument doc) => doc.RootElement.GetProperty("runs")[0];

    private static JsonDocument Parse(CheckResult result, ReportContext? context = null) => JsonDocument.Parse(Sarif(result, context));

    [Fact]
    public void The_log_names_the_schema_and_version_and_has_one_run()
    {
        using var doc = Parse(Samples.Result());
        Assert.Equal("https://json.schemastore.org/sarif-2.1.0.json", doc.RootElement.GetProperty("$schema").GetString());
        Assert.Equal("2.1.0", doc.RootElement.GetProperty("version").GetString());
        Assert.Equal(1, doc.RootElement.GetProperty("runs").GetArrayLength());
        Assert.Equal("utf16CodeUnits", Run(doc).GetProperty("columnKind").GetString());
    }

    [Fact]
    public void The_driver_describes_the_tool_and_every_rule()
    {
        using var doc = Parse(Samples.Clean());
        var driver = Run(doc).GetProperty("tool").GetProperty("driver");
        Assert.Equal("SettingLint", driver.GetProperty("name").GetString());
        Assert.Equal("0.1.0", driver.GetProperty("version").GetString());
        Assert.Equal("0.1.0", driver.GetProperty("semanticVersion").GetString());
        Assert.Equal(ToolInfo.PlaceholderInformationUri, driver.GetProperty("informationUri").GetString());

        var rules = driver.GetProperty("rules");
        Assert.Equal(["SL112", "SL201", "SL305"], rules.EnumerateArray().Select(static r => r.GetProperty("id").GetString()));
        var rule = rules[1];
        Assert.Equal("InstantaneousPickupBelowLockedRotor", rule.GetProperty("name").GetString());
        Assert.Equal(Samples.Instantaneous.Title, rule.GetProperty("shortDescription").GetProperty("text").GetString());
        Assert.Equal(Samples.Instantaneous.Summary, rule.GetProperty("fullDescription").GetProperty("text").GetString());
        Assert.Equal("The 50 element must not trip on the asymmetrical inrush.", rule.GetProperty("help").GetProperty("text").GetString());
        Assert.Equal(Samples.Instantaneous.HelpMarkdown, rule.GetProperty("help").GetProperty("markdown").GetString());
        Assert.Equal("https://settinglint.invalid/rules/README.md#sl201", rule.GetProperty("helpUri").GetString());
        Assert.Equal(["50", "overcurrent"], rule.GetProperty("properties").GetProperty("tags").EnumerateArray().Select(static t => t.GetString()));

        // SARIF's default level is warning; the SDK leaves it out, we write it anyway.
        Assert.Equal(
            ["warning", "error", "note"],
            rules.EnumerateArray().Select(static r => r.GetProperty("defaultConfiguration").GetProperty("level").GetString()));
    }

    [Fact]
    public void Results_carry_rule_level_message_and_a_relative_location()
    {
        using var doc = Parse(Samples.Result());
        var results = Run(doc).GetProperty("results");
        Assert.Equal(["SL201", "SL112", "SL305"], results.EnumerateArray().Select(static r => r.GetProperty("ruleId").GetString()));
        Assert.Equal([1, 0, 2], results.EnumerateArray().Select(static r => r.GetProperty("ruleIndex").GetInt32()));
        Assert.Equal(["error", "warning", "note"], results.EnumerateArray().Select(static r => r.GetProperty("level").GetString()));

        var first = results[0];
        Assert.Equal(Samples.Pickup.Message, first.GetProperty("message").GetProperty("text").GetString());
        var locations = first.GetProperty("locations");
        Assert.Equal(1, locations.GetArrayLength());
        var physical = locations[0].GetProperty("physicalLocation");
        Assert.Equal("motors/P-101A.yaml", physical.GetProperty("artifactLocation").GetProperty("uri").GetString());
        Assert.Equal("%SRCROOT%", physical.GetProperty("artifactLocation").GetProperty("uriBaseId").GetString());
        var region = physical.GetProperty("region");
        Assert.Equal(4, region.GetProperty("startLine").GetInt32());
        Assert.Equal(3, region.GetProperty("startColumn").GetInt32());
        Assert.Equal(4, region.GetProperty("endLine").GetInt32());
        Assert.Equal(18, region.GetProperty("endColumn").GetInt32());
    }

    [Theory]
    [InlineData("motors/P-102 spare.yaml", "motors/P-102%20spare.yaml")]
    [InlineData("motors/#7 feed.yaml", "motors/%237%20feed.yaml")]
    [InlineData("c:odd/100%.yaml", "c%3Aodd/100%25.yaml")]
    [InlineData("motors/Pümpe-3.yaml", "motors/P%C3%BCmpe-3.yaml")]
    public void Artifact_uris_are_percent_encoded_relative_references(string file, string expected)
    {
        var result = Samples.Result() with { Findings = [Samples.Pickup with { File = file }] };
        using var doc = Parse(result);
        var uri = Run(doc).GetProperty("results")[0].GetProperty("locations")[0]
            .GetProperty("physicalLocation").GetProperty("artifactLocation").GetProperty("uri").GetString();
        Assert.Equal(expected, uri);
        Assert.True(Uri.IsWellFormedUriString(uri, UriKind.Relative));
    }

    [Theory]
    [InlineData("/r", "file:///r/")]
    [InlineData("/r/", "file:///r/")]
    [InlineData("/srv/plant settings", "file:///srv/plant%20settings/")]
    public void The_source_root_is_a_file_uri_with_a_trailing_slash(string root, string expected)
    {
        using var doc = Parse(Samples.Result() with { RepositoryRoot = root });
        Assert.Equal(expected, Run(doc).GetProperty("originalUriBaseIds").GetProperty("%SRCROOT%").GetProperty("uri").GetString());
    }

    [Fact]
    public void Results_have_the_stable_fingerprint_and_their_values_as_numbers()
    {
        using var doc = Parse(Samples.Result());
        var results = Run(doc).GetProperty("results");
        var first = results[0];
        Assert.Equal(
            Samples.Pickup.Fingerprint,
            first.GetProperty("partialFingerprints").GetProperty(Fingerprints.Key).GetString());

        var properties = first.GetProperty("properties");
        Assert.Equal("protection.50.pickup", properties.GetProperty("keyPath").GetString());
        Assert.Equal(JsonValueKind.Number, properties.GetProperty("pickup").ValueKind);
        Assert.Equal(2400, properties.GetProperty("pickup").GetDouble());
        Assert.Equal(1.6, properties.GetProperty("factor").GetDouble());
        Assert.Equal(1620, properties.GetProperty("lockedRotor").GetDouble());
        Assert.Equal("A", properties.GetProperty("units").GetProperty("pickup").GetString());

        var third = results[2].GetProperty("properties");
        Assert.Equal(0.2, third.GetProperty("delay").GetDouble());
        Assert.Equal("bus B-1 transfer", third.GetProperty("transfer").GetString());
        Assert.False(third.GetProperty("units").TryGetProperty("transfer", out _));
    }

    [Fact]
    public void A_value_named_like_our_own_properties_does_not_replace_them()
    {
        var finding = Samples.Pickup with
        {
            Values = Samples.Pickup.Values.SetItem("tags", new FindingValue("3", 3)).SetItem("keyPath", "other"),
        };
        using var doc = Parse(Samples.Result() with { Findings = [finding] });
        var properties = Run(doc).GetProperty("results")[0].GetProperty("properties");
        Assert.Equal("protection.50.pickup", properties.GetProperty("keyPath").GetString());
        Assert.Equal("other", properties.GetProperty("value.keyPath").GetString());
        Assert.Equal(3, properties.GetProperty("value.tags").GetDouble());
        Assert.False(properties.TryGetProperty("tags", out _));
    }

    [Fact]
    public void Suppressed_findings_are_in_source_suppressions_or_left_out()
    {
        using (var doc = Parse(Samples.Result()))
        {
            var results = Run(doc).GetProperty("results");
            Assert.False(results[0].TryGetProperty("suppressions", out _));
            var suppression = Assert.Single(results[1].GetProperty("suppressions").EnumerateArray());
            Assert.Equal("inSource", suppression.GetProperty("kind").GetString());
            Assert.Equal("accepted for the 2024 outage, see MOC-17", suppression.GetProperty("justification").GetString());
            Assert.Equal(8, suppression.GetProperty("location").GetProperty("physicalLocation").GetProperty("region").GetProperty("startLine").GetInt32());
        }
        using (var doc = Parse(Samples.Result(), Samples.Context(omitSuppressed: true)))
        {
            var results = Run(doc).GetProperty("results");
            Assert.Equal(["SL201", "SL305"], results.EnumerateArray().Select(static r => r.GetProperty("ruleId").GetString()));
            Assert.DoesNotContain("suppressions", doc.RootElement.GetRawText(), StringComparison.Ordinal);
        }
    }

    [Theory]
    [InlineData(false, ExitCodes.Clean)]
    [InlineData(true, ExitCodes.Findings)]
    public void The_invocation_has_the_exit_code_even_when_it_is_zero(bool withFindings, int exitCode)
    {
        using var doc = Parse(withFindings ? Samples.Result() : Samples.Clean());
        var invocation = Assert.Single(Run(doc).GetProperty("invocations").EnumerateArray());
        Assert.Equal(exitCode, invocation.GetProperty("exitCode").GetInt32());
        Assert.True(invocation.GetProperty("executionSuccessful").GetBoolean());
        Assert.False(invocation.TryGetProperty("toolExecutionNotifications", out _));
        Assert.False(invocation.TryGetProperty("toolConfigurationNotifications", out _));
    }

    [Fact]
    public void Configuration_problems_are_located_configuration_notifications()
    {
        using var doc = Parse(Samples.Result(Samples.BadConfig));
        var invocation = Run(doc).GetProperty("invocations")[0];
        Assert.Equal(ExitCodes.Usage, invocation.GetProperty("exitCode").GetInt32());
        Assert.True(invocation.GetProperty("executionSuccessful").GetBoolean());
        var n = Assert.Single(invocation.GetProperty("toolConfigurationNotifications").EnumerateArray());
        Assert.Equal("error", n.GetProperty("level").GetString());
        Assert.Equal(Samples.BadConfig.Message, n.GetProperty("message").GetProperty("text").GetString());
        var physical = n.GetProperty("locations")[0].GetProperty("physicalLocation");
        Assert.Equal(".settinglint.yaml", physical.GetProperty("artifactLocation").GetProperty("uri").GetString());
        Assert.Equal(3, physical.GetProperty("region").GetProperty("startLine").GetInt32());
        Assert.Equal(5, physical.GetProperty("region").GetProperty("startColumn").GetInt32());
    }

    [Fact]
    public void Internal_errors_are_execution_notifications_with_the_exception()
    {
        using var doc = Parse(Samples.Result(Samples.BadConfig, Samples.Crash));
        var invocation = Run(doc).GetProperty("invocations")[0];
        Assert.Equal(ExitCodes.Internal, invocation.GetProperty("exitCode").GetInt32());
        Assert.False(invocation.GetProperty("executionSuccessful").GetBoolean());
        var n = Assert.Single(invocation.GetProperty("toolExecutionNotifications").EnumerateArray());
        Assert.Equal("error", n.GetProperty("level").GetString());
        Assert.Equal(Samples.Crash.Message, n.GetProperty("message").GetProperty("text").GetString());
        Assert.False(n.TryGetProperty("locations", out _));
        Assert.Equal("System.InvalidOperationException", n.GetProperty("exception").GetProperty("kind").GetString());
        Assert.Equal(Samples.Crash.Exception, n.GetProperty("exception").GetProperty("message").GetString());
    }

    [Fact]
    public void Checks_not_run_are_execution_notes_with_their_rule_and_missing_paths_not_results()
    {
        var result = Samples.Clean() with
        {
            NotRun = [new CheckNotRun(Samples.Clean().Rules[1].Id, Level.Warning, "motors/K-201.yaml", "K-201", ["bus.fault_current_min"])],
        };
        using var doc = Parse(result);
        var run = Run(doc);
        Assert.Empty(run.GetProperty("results").EnumerateArray());
        var invocation = run.GetProperty("invocations")[0];
        Assert.True(invocation.GetProperty("executionSuccessful").GetBoolean());
        Assert.Equal(ExitCodes.Clean, invocation.GetProperty("exitCode").GetInt32());
        var n = Assert.Single(invocation.GetProperty("toolExecutionNotifications").EnumerateArray());
        Assert.Equal("note", n.GetProperty("level").GetString());
        Assert.Equal(Samples.Clean().Rules[1].Id, n.GetProperty("associatedRule").GetProperty("id").GetString());
        Assert.Equal(1, n.GetProperty("associatedRule").GetProperty("index").GetInt32());
        Assert.Equal("motors/K-201.yaml", n.GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("artifactLocation").GetProperty("uri").GetString());
        Assert.Equal(["bus.fault_current_min"], n.GetProperty("properties").GetProperty("missingKeyPaths").EnumerateArray().Select(static p => p.GetString()));
    }

    [Fact]
    public void Timestamps_are_written_only_when_asked_for()
    {
        var start = new DateTimeOffset(2025, 3, 1, 8, 30, 0, TimeSpan.Zero);
        var context = Samples.Context() with { StartTimeUtc = start, EndTimeUtc = start.AddMilliseconds(1250) };
        Assert.DoesNotContain("TimeUtc", Sarif(Samples.Result(), context), StringComparison.Ordinal);

        using var doc = Parse(Samples.Result(), context with { Timestamps = true });
        var invocation = Run(doc).GetProperty("invocations")[0];
        Assert.Equal("2025-03-01T08:30:00.000Z", invocation.GetProperty("startTimeUtc").GetString());
        Assert.Equal("2025-03-01T08:30:01.250Z", invocation.GetProperty("endTimeUtc").GetString());
    }

    [Fact]
    public void A_region_never_ends_before_it_starts()
    {
        var odd = Samples.Pickup with { Span = new Core.Documents.SourceSpan(0, 0, 0, 0) };
        using var doc = Parse(Samples.Result() with { Findings = [odd] });
        var region = Run(doc).GetProperty("results")[0].GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("region");
        Assert.Equal([1, 1, 1, 1], new[] { "startLine", "startColumn", "endLine", "endColumn" }.Select(p => region.GetProperty(p).GetInt32()));
    }

    [Fact]
    public void Output_is_byte_identical_twice_indented_with_one_final_newline()
    {
        var result = Samples.Result(Samples.BadConfig, Samples.Crash);
        var first = Sarif(result);
        var second = Samples.Render(Reporters.For("sarif"), result, Samples.Context());
        Assert.Equal(first, second);
        Assert.StartsWith("{\n  \"$schema\": \"https://json.schemastore.org/sarif-2.1.0.json\",\n  \"version\": \"2.1.0\",", first, StringComparison.Ordinal);
        Assert.EndsWith("}\n", first, StringComparison.Ordinal);
        Assert.False(first.EndsWith("\n\n", StringComparison.Ordinal));
        Assert.DoesNotContain('\r', first);
        Assert.NotEqual(0xFEFF, first[0]);
    }
}
