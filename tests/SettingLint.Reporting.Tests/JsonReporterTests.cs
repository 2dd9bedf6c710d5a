using System.Text.Json;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

public sealed class JsonReporterTests
{
    private static JsonDocument Parse(CheckResult result, ReportContext context) =>
        JsonDocument.Parse(Samples.Render(new JsonReporter(), result, context));

    [Fact]
    public void Top_level_keys_come_in_a_fixed_order()
    {
        using var doc = Parse(Samples.Result(), Samples.Context());
        Assert.Equal(
            ["tool", "root", "summary", "findings", "notifications", "motors", "notRun"],
            doc.RootElement.EnumerateObject().Select(static p => p.Name));
        Assert.Equal("SettingLint", doc.RootElement.GetProperty("tool").GetProperty("name").GetString());
        Assert.Equal("0.1.0", doc.RootElement.GetProperty("tool").GetProperty("version").GetString());
        Assert.Equal(["K-201", "P-101A", "P-102"], doc.RootElement.GetProperty("motors").EnumerateArray().Select(static m => m.GetString()));
    }

    [Fact]
    public void Checks_not_run_are_listed_with_their_missing_paths_and_counted()
    {
        var result = Samples.Result() with
        {
            NotRun =
            [
                new CheckNotRun("SL202", Level.Warning, "motors/P-101A.yaml", "P-101A", ["bus.fault_current_min"]),
                new CheckNotRun("SL205", Level.Warning, "motors/P-101A.yaml", "P-101A", ["bus.upstream", "protection.short_circuit.delay"]),
            ],
        };
        using var doc = Parse(result, Samples.Context());
        Assert.Equal(2, doc.RootElement.GetProperty("summary").GetProperty("notRun").GetInt32());
        var entries = doc.RootElement.GetProperty("notRun").EnumerateArray().ToList();
        Assert.Equal(["ruleId", "level", "file", "motor", "missing"], entries[0].EnumerateObject().Select(static p => p.Name));
        Assert.Equal(["SL202", "SL205"], entries.Select(static e => e.GetProperty("ruleId").GetString()));
        Assert.Equal(["bus.upstream", "protection.short_circuit.delay"], entries[1].GetProperty("missing").EnumerateArray().Select(static p => p.GetString()));
        Assert.Equal("P-101A", entries[0].GetProperty("motor").GetString());
        Assert.Equal("warning", entries[0].GetProperty("level").GetString());

        using var clean = Parse(Samples.Clean(), Samples.Context());
        Assert.Equal(0, clean.RootElement.GetProperty("summary").GetProperty("notRun").GetInt32());
        Assert.Empty(clean.RootElement.GetProperty("notRun").EnumerateArray());
    }

    [Theory]
    [InlineData("/r", ".")]
    [InlineData("/r/motors", "..")]
    [InlineData("/elsewhere", "../r")]
    public void Root_is_relative_to_the_current_directory(string cwd, string expected)
    {
        using var doc = Parse(Samples.Result(), Samples.Context(cwd));
        Assert.Equal(expected, doc.RootElement.GetProperty("root").GetString());
    }

    [Fact]
    public void Summary_has_the_counts_and_the_gate()
    {
        using var doc = Parse(Samples.Result(Samples.BadConfig), Samples.Context());
        var s = doc.RootElement.GetProperty("summary");
        Assert.Equal(1, s.GetProperty("errors").GetInt32());
        Assert.Equal(0, s.GetProperty("warnings").GetInt32());
        Assert.Equal(1, s.GetProperty("notes").GetInt32());
        Assert.Equal(1, s.GetProperty("suppressed").GetInt32());
        Assert.Equal(3, s.GetProperty("files").GetInt32());
        Assert.Equal(3, s.GetProperty("motors").GetInt32());
        Assert.Equal(1, s.GetProperty("configurationErrors").GetInt32());
        Assert.Equal(0, s.GetProperty("internalErrors").GetInt32());
        Assert.Equal("warning", s.GetProperty("failOn").GetString());
        Assert.Equal(ExitCodes.Usage, s.GetProperty("exitCode").GetInt32());
    }

    [Fact]
    public void A_finding_has_its_place_message_fingerprint_and_values()
    {
        using var doc = Parse(Samples.Result(), Samples.Context("/r/motors"));
        var f = doc.RootElement.GetProperty("findings")[0];
        Assert.Equal(
            ["ruleId", "level", "file", "line", "column", "endLine", "endColumn", "keyPath", "message", "messageId", "fingerprint", "values"],
            f.EnumerateObject().Select(static p => p.Name));
        Assert.Equal("SL201", f.GetProperty("ruleId").GetString());
        Assert.Equal("error", f.GetProperty("level").GetString());
        Assert.Equal("motors/P-101A.yaml", f.GetProperty("file").GetString());
        Assert.Equal(4, f.GetProperty("line").GetInt32());
        Assert.Equal(3, f.GetProperty("column").GetInt32());
        Assert.Equal(4, f.GetProperty("endLine").GetInt32());
        Assert.Equal(18, f.GetProperty("endColumn").GetInt32());
        Assert.Equal("protection.50.pickup", f.GetProperty("keyPath").GetString());
        Assert.Equal(Samples.Pickup.Message, f.GetProperty("message").GetString());
        Assert.Equal(Samples.Pickup.Fingerprint, f.GetProperty("fingerprint").GetString());

        var values = f.GetProperty("values");
        Assert.Equal(["factor", "lockedRotor", "pickup"], values.EnumerateObject().Select(static p => p.Name));
        Assert.Equal("2400 A", values.GetProperty("pickup").GetProperty("text").GetString());
        Assert.Equal(2400, values.GetProperty("pickup").GetProperty("number").GetDouble());
        Assert.Equal("A", values.GetProperty("pickup").GetProperty("unit").GetString());
        Assert.Equal(1.6, values.GetProperty("factor").GetProperty("number").GetDouble());
        Assert.False(values.GetProperty("factor").TryGetProperty("unit", out _));
    }

    [Fact]
    public void A_value_without_a_number_has_only_its_text()
    {
        using var doc = Parse(Samples.Result(), Samples.Context());
        var transfer = doc.RootElement.GetProperty("findings")[2].GetProperty("values").GetProperty("transfer");
        Assert.Equal(["text"], transfer.EnumerateObject().Select(static p => p.Name));
    }

    [Fact]
    public void A_suppressed_finding_carries_its_justification_or_is_left_out()
    {
        using (var doc = Parse(Samples.Result(), Samples.Context()))
        {
            var findings = doc.RootElement.GetProperty("findings");
            Assert.Equal(3, findings.GetArrayLength());
            Assert.False(findings[0].TryGetProperty("suppressed", out _));
            var suppressed = findings[1].GetProperty("suppressed");
            Assert.Equal("accepted for the 2024 outage, see MOC-17", suppressed.GetProperty("justification").GetString());
        }
        using (var doc = Parse(Samples.Result(), Samples.Context(omitSuppressed: true)))
        {
            var findings = doc.RootElement.GetProperty("findings");
            Assert.Equal(2, findings.GetArrayLength());
            Assert.Equal(1, doc.RootElement.GetProperty("summary").GetProperty("suppressed").GetInt32());
        }
    }

    [Fact]
    public void Notifications_have_kind_place_and_exception()
    {
        using var doc = Parse(Samples.Result(Samples.BadConfig, Samples.Crash), Samples.Context());
        var n = doc.RootElement.GetProperty("notifications");
        Assert.Equal("configuration", n[0].GetProperty("kind").GetString());
        Assert.Equal(".settinglint.yaml", n[0].GetProperty("file").GetString());
        Assert.Equal(3, n[0].GetProperty("line").GetInt32());
        Assert.Equal(5, n[0].GetProperty("column").GetInt32());
        Assert.Equal("internal", n[1].GetProperty("kind").GetString());
        Assert.False(n[1].TryGetProperty("file", out _));
        Assert.StartsWith("System.InvalidOperationException: boom", n[1].GetProperty("exception").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Numbers_that_JSON_cannot_hold_are_left_to_their_text()
    {
        var finding = Samples.Pickup with
        {
            Values = Samples.Pickup.Values.SetItem("pickup", new FindingValue("infinite", double.PositiveInfinity, "A")),
        };
        using var doc = Parse(Samples.Result() with { Findings = [finding] }, Samples.Context());
        var pickup = doc.RootElement.GetProperty("findings")[0].GetProperty("values").GetProperty("pickup");
        Assert.False(pickup.TryGetProperty("number", out _));
        Assert.Equal("infinite", pickup.GetProperty("text").GetString());
    }

    [Fact]
    public void Timestamps_appear_only_when_asked_for()
    {
        var start = new DateTimeOffset(2025, 3, 1, 8, 30, 0, TimeSpan.FromHours(1));
        var context = Samples.Context() with { StartTimeUtc = start, EndTimeUtc = start.AddSeconds(2) };
        using (var doc = Parse(Samples.Result(), context))
        {
            Assert.False(doc.RootElement.TryGetProperty("startTimeUtc", out _));
        }
        using (var doc = Parse(Samples.Result(), context with { Timestamps = true }))
        {
            Assert.Equal("2025-03-01T07:30:00+00:00", doc.RootElement.GetProperty("startTimeUtc").GetString());
        }
    }

    [Fact]
    public void Output_is_byte_identical_twice_indented_with_a_final_newline()
    {
        var result = Samples.Result(Samples.BadConfig, Samples.Crash);
        var first = Samples.Render(new JsonReporter(), result, Samples.Context());
        var second = Samples.Render(new JsonReporter(), result, Samples.Context());
        Assert.Equal(first, second);
        Assert.StartsWith("{\n  \"tool\": {\n    \"name\": \"SettingLint\",", first, StringComparison.Ordinal);
        Assert.EndsWith("}\n", first, StringComparison.Ordinal);
        Assert.DoesNotContain('\r', first);
    }
}
