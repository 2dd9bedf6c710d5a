using System.Collections.Immutable;
using System.Text.Json;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

/// <summary>
/// The code-quality report against GitLab's documented format ("Code Quality", section "Implement a custom tool",
/// doc/ci/testing/code_quality.md of the GitLab documentation): a JSON array of objects with `description`,
/// `check_name`, `fingerprint` (unique: GitLab keeps one issue per fingerprint), `severity` (one of info, minor,
/// major, critical, blocker), `location.path` (relative to the repository) and `location.lines.begin` (the line);
/// no byte order mark at the start of the file. GitLab publishes no JSON Schema for it, so those fields are checked.
/// </summary>
public sealed class CodeQualityReporterTests
{
    private static readonly string[] Severities = ["info", "minor", "major", "critical", "blocker"];

    /// <summary>What the documented format requires of a report; empty when it conforms.</summary>
    internal static List<string> Problems(string report)
    {
        var problems = new List<string>();
        if (report.StartsWith('\uFEFF')) problems.Add("byte order mark");
        using var doc = JsonDocument.Parse(report);
        if (doc.RootElement.ValueKind != JsonValueKind.Array) return ["not an array"];
        var fingerprints = new HashSet<string>(StringComparer.Ordinal);
        var i = 0;
        foreach (var issue in doc.RootElement.EnumerateArray())
        {
            var at = "issue " + i++ + ": ";
            string? Text(JsonElement e, string name) =>
                e.ValueKind == JsonValueKind.Object && e.TryGetProperty(name, out var v) && v.ValueKind == JsonValueKind.String && v.GetString()!.Length > 0 ? v.GetString() : null;
            if (Text(issue, "description") is null) problems.Add(at + "description");
            if (Text(issue, "check_name") is null) problems.Add(at + "check_name");
            if (Text(issue, "fingerprint") is not { } fp) problems.Add(at + "fingerprint");
            else if (!fingerprints.Add(fp)) problems.Add(at + "fingerprint not unique");
            if (Text(issue, "severity") is not { } severity || !Severities.Contains(severity)) problems.Add(at + "severity");
            if (!issue.TryGetProperty("location", out var location)) { problems.Add(at + "location"); continue; }
            if (Text(location, "path") is not { } path || path.StartsWith('/') || path.Contains('\\', StringComparison.Ordinal) || path.StartsWith("./", StringComparison.Ordinal)) problems.Add(at + "location.path");
            if (!location.TryGetProperty("lines", out var lines) || !lines.TryGetProperty("begin", out var begin) || begin.ValueKind != JsonValueKind.Number || !begin.TryGetInt32(out var line) || line < 1)
            {
                problems.Add(at + "location.lines.begin");
            }
        }
        return problems;
    }

    private static string Render(CheckResult result) => Samples.Render(new CodeQualityReporter(), result, Samples.Context());

    [Fact]
    public void The_checker_of_the_documented_fields_refuses_what_GitLab_would_not_read()
    {
        Assert.NotEmpty(Problems("""[{"description":"d","check_name":"c","fingerprint":"f","severity":"error","location":{"path":"a.yaml","lines":{"begin":1}}}]"""));
        Assert.NotEmpty(Problems("""[{"description":"d","check_name":"c","fingerprint":"f","severity":"minor","location":{"path":"/abs/a.yaml","lines":{"begin":1}}}]"""));
        Assert.NotEmpty(Problems("""[{"description":"d","check_name":"c","fingerprint":"f","severity":"minor","location":{"path":"a.yaml","lines":{"begin":0}}}]"""));
        Assert.NotEmpty(Problems("""[{"description":"d","check_name":"c","fingerprint":"f","severity":"minor","location":{"path":"a.yaml","lines":{"begin":1}}},{"description":"d","check_name":"c","fingerprint":"f","severity":"minor","location":{"path":"b.yaml","lines":{"begin":1}}}]"""));
        Assert.Empty(Problems("""[{"description":"d","check_name":"c","fingerprint":"f","severity":"minor","location":{"path":"a.yaml","lines":{"begin":1}}}]"""));
    }

    [Fact]
    public void Each_open_finding_is_an_issue_on_its_line_and_accepted_ones_are_left_out()
    {
        var report = Render(Samples.Result());
        Assert.Empty(Problems(report));
        using var doc = JsonDocument.Parse(report);
        var issues = doc.RootElement.EnumerateArray().ToList();
        Assert.Equal(2, issues.Count); // SL112 is accepted in the source
        var pickup = issues.Single(i => i.GetProperty("check_name").GetString() == "SL201");
        Assert.Equal("critical", pickup.GetProperty("severity").GetString());
        Assert.Equal("motors/P-101A.yaml", pickup.GetProperty("location").GetProperty("path").GetString());
        Assert.Equal(4, pickup.GetProperty("location").GetProperty("lines").GetProperty("begin").GetInt32());
        Assert.Equal(Samples.Pickup.Fingerprint, pickup.GetProperty("fingerprint").GetString());
        Assert.StartsWith("SL201: pickup 2400 A is below 1.6", pickup.GetProperty("description").GetString(), StringComparison.Ordinal);
        var delay = issues.Single(i => i.GetProperty("check_name").GetString() == "SL305");
        Assert.Equal("info", delay.GetProperty("severity").GetString());
        Assert.Equal("motors/P-102 spare.yaml", delay.GetProperty("location").GetProperty("path").GetString());
    }

    [Fact]
    public void Severity_follows_the_level_and_a_run_that_could_not_judge_is_a_blocker()
    {
        Assert.Equal(["critical", "minor", "info"], new[] { Level.Error, Level.Warning, Level.Note }.Select(CodeQualityReporter.Severity));
        var report = Render(Samples.Result(Samples.BadConfig, Samples.Crash));
        Assert.Empty(Problems(report));
        using var doc = JsonDocument.Parse(report);
        var blockers = doc.RootElement.EnumerateArray().Where(i => i.GetProperty("severity").GetString() == "blocker").ToList();
        Assert.Equal(2, blockers.Count);
        var config = blockers.Single(b => b.GetProperty("check_name").GetString() == "configuration-error");
        Assert.Equal(".settinglint.yaml", config.GetProperty("location").GetProperty("path").GetString());
        Assert.Equal(3, config.GetProperty("location").GetProperty("lines").GetProperty("begin").GetInt32());
    }

    [Fact]
    public void Two_findings_of_one_rule_at_one_key_path_keep_two_fingerprints()
    {
        var second = Samples.Pickup with { Span = new SourceSpan(7, 3, 7, 10), Template = "another {pickup}" };
        var result = Samples.Result() with { Findings = [Samples.Pickup, second] };
        Assert.Equal(Samples.Pickup.Fingerprint, second.Fingerprint);
        var report = Render(result);
        Assert.Empty(Problems(report));
        using var doc = JsonDocument.Parse(report);
        Assert.Equal(2, doc.RootElement.GetArrayLength());
    }

    [Fact]
    public void A_clean_run_is_an_empty_array() => Assert.Equal("[]\n", Render(Samples.Clean()));
}
