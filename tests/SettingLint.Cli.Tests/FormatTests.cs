using System.Text.Json;
using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>The report formats end to end: JSON parses, SARIF is valid and relative, output is reproducible.</summary>
public sealed class FormatTests
{
    private static TempRepo WithFindings()
    {
        var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));
        repo.Write("notes/bad.yaml", "kind: bus\ntag: a: b\n");
        repo.Write("dir with space/p#1.yaml", "kind: pump\n");
        return repo;
    }

    private static string Sarif(TempRepo repo, string name, params string[] more)
    {
        var output = Path.Combine(repo.Outer, "out", name);
        var run = Cli.Run(["check", repo.Root, "--format", "sarif", "--output", output, .. more]);
        Assert.True(run.Exit == 1, run.ToString());
        Assert.Empty(run.Stdout); // the report went to the file
        Assert.True(File.Exists(output));
        return File.ReadAllText(output);
    }

    // Engine diagnostics are data: JSON and SARIF name which of its rule's messages a finding is, as the engine's
    // EngineMessages list has it; a data rule's one message is "default".
    [Fact]
    public void Json_and_sarif_carry_each_finding_s_message_id()
    {
        using var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: -58 A"));
        using var json = JsonDocument.Parse(Cli.CheckJson(repo).Stdout);
        var findings = json.RootElement.GetProperty("findings").EnumerateArray().ToList();
        var negative = findings.Single(f => f.GetProperty("ruleId").GetString() == "SL005" && f.GetProperty("keyPath").GetString() == "motor.full_load_current");
        Assert.Equal("negativeHereCannot", negative.GetProperty("messageId").GetString());
        Assert.All(findings.Where(f => !f.GetProperty("ruleId").GetString()!.StartsWith("SL0", StringComparison.Ordinal)),
            f => Assert.Equal("default", f.GetProperty("messageId").GetString()));

        using var sarif = JsonDocument.Parse(Sarif(repo, "ids.sarif"));
        var result = sarif.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray()
            .Single(r => r.GetProperty("ruleId").GetString() == "SL005" && r.GetProperty("properties").GetProperty("keyPath").GetString() == "motor.full_load_current");
        Assert.Equal("negativeHereCannot", result.GetProperty("properties").GetProperty("messageId").GetString());
    }

    [Fact]
    public void Json_parses_and_carries_the_findings()
    {
        using var repo = WithFindings();
        var run = Cli.CheckJson(repo);
        Assert.Equal(1, run.Exit);
        var json = run.Json;
        Assert.Equal("SettingLint", json.GetProperty("tool").GetProperty("name").GetString());
        Assert.Equal(
            [("SL009", "dir with space/p#1.yaml", 1, 7), ("SL006", "motors/m-1.yaml", 9, 22), ("SL001", "notes/bad.yaml", 2, 7)],
            run.Findings);
        foreach (var f in json.GetProperty("findings").EnumerateArray())
        {
            Assert.False(Path.IsPathRooted(f.GetProperty("file").GetString()));
            Assert.Equal(32, f.GetProperty("fingerprint").GetString()!.Length);
            Assert.False(string.IsNullOrEmpty(f.GetProperty("message").GetString()));
        }
        Assert.Equal(3, json.GetProperty("summary").GetProperty("errors").GetInt32());
    }

    // SARIF 2.1.0 §3.4.3/§3.4.4: artifact locations relative to a uriBaseId, resolved by run.originalUriBaseIds.
    [Fact]
    public void Sarif_to_a_file_has_relative_uris_and_validates()
    {
        using var repo = WithFindings();
        var sarif = Sarif(repo, "x.sarif");
        Assert.Empty(SarifValidation.SchemaErrors(sarif));

        using var doc = JsonDocument.Parse(sarif);
        var run = doc.RootElement.GetProperty("runs")[0];
        var uris = ArtifactUris(run).ToList();
        Assert.NotEmpty(uris);
        foreach (var (uri, baseId) in uris)
        {
            Assert.DoesNotContain("file:", uri, StringComparison.Ordinal);
            Assert.False(uri.StartsWith('/'), uri);
            Assert.DoesNotContain(repo.Root, uri, StringComparison.Ordinal);
            Assert.NotNull(baseId);
            Assert.True(Uri.TryCreate(uri, UriKind.Relative, out _), uri);
        }
        Assert.Contains(uris, u => u.Uri == "motors/m-1.yaml");
        Assert.Contains(uris, u => u.Uri == "dir%20with%20space/p%231.yaml"); // RFC 3986 percent-encoding
        // The base the relative uris resolve against is the repository root, as a file URI ending in '/'.
        var baseUri = run.GetProperty("originalUriBaseIds").EnumerateObject().Single().Value.GetProperty("uri").GetString()!;
        Assert.StartsWith("file:///", baseUri, StringComparison.Ordinal);
        Assert.EndsWith("/", baseUri, StringComparison.Ordinal);

        var results = run.GetProperty("results").EnumerateArray().Select(r => (
            r.GetProperty("ruleId").GetString(),
            r.GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("region").GetProperty("startLine").GetInt32(),
            r.GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("region").GetProperty("startColumn").GetInt32())).ToList();
        Assert.Contains(("SL006", 9, 22), results);
        Assert.Contains(("SL001", 2, 7), results);
    }

    private static IEnumerable<(string Uri, string? BaseId)> ArtifactUris(JsonElement run)
    {
        foreach (var result in run.GetProperty("results").EnumerateArray())
        {
            foreach (var location in result.GetProperty("locations").EnumerateArray())
            {
                var artifact = location.GetProperty("physicalLocation").GetProperty("artifactLocation");
                yield return (artifact.GetProperty("uri").GetString()!, artifact.TryGetProperty("uriBaseId", out var b) ? b.GetString() : null);
            }
        }
        if (run.TryGetProperty("artifacts", out var artifacts))
        {
            foreach (var a in artifacts.EnumerateArray())
            {
                var location = a.GetProperty("location");
                yield return (location.GetProperty("uri").GetString()!, location.TryGetProperty("uriBaseId", out var b) ? b.GetString() : null);
            }
        }
    }

    [Fact]
    public void A_clean_run_writes_valid_sarif_too()
    {
        using var repo = Cli.Repo();
        var output = Path.Combine(repo.Outer, "clean.sarif");
        Assert.Equal(0, Cli.Run("check", repo.Root, "--format", "sarif", "-o", output).Exit);
        Assert.Empty(SarifValidation.SchemaErrors(File.ReadAllText(output)));
    }

    // Common practice for CI artefacts: the same input gives the same bytes (no timestamps unless asked).
    [Fact]
    public void Two_sarif_runs_are_byte_identical()
    {
        using var repo = WithFindings();
        Sarif(repo, "a.sarif");
        Sarif(repo, "b.sarif");
        Assert.Equal(File.ReadAllBytes(Path.Combine(repo.Outer, "out", "a.sarif")), File.ReadAllBytes(Path.Combine(repo.Outer, "out", "b.sarif")));
    }

    [Fact]
    public void Two_json_and_text_runs_are_identical()
    {
        using var repo = WithFindings();
        Assert.Equal(Cli.CheckJson(repo).Stdout, Cli.CheckJson(repo).Stdout);
        Assert.Equal(Cli.Run("check", repo.Root).Stdout, Cli.Run("check", repo.Root).Stdout);
    }

    [Fact]
    public void Timestamps_are_written_only_when_asked()
    {
        using var repo = WithFindings();
        Assert.DoesNotContain("startTimeUtc", Sarif(repo, "plain.sarif"), StringComparison.Ordinal);
        Assert.Contains("startTimeUtc", Sarif(repo, "stamped.sarif", "--timestamps"), StringComparison.Ordinal);
    }

    [Fact]
    public void The_output_folder_is_created()
    {
        using var repo = Cli.Repo();
        var output = Path.Combine(repo.Outer, "new", "deeper", "r.json");
        Assert.Equal(0, Cli.Run("check", repo.Root, "--format", "json", "--output", output).Exit);
        using var doc = JsonDocument.Parse(File.ReadAllText(output));
        Assert.Equal(0, doc.RootElement.GetProperty("summary").GetProperty("exitCode").GetInt32());
    }
}

/// <summary>The GitLab code-quality and JUnit formats end to end, on a repository with a motor, a broken file and a run from a sub-folder.</summary>
public sealed class ReviewFormatTests
{
    [Fact]
    public void Code_quality_paths_are_from_the_repository_root_whatever_the_current_folder()
    {
        using var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));
        repo.Write("notes/bad.yaml", "kind: bus\ntag: a: b\n");
        var run = Cli.Run(["check", Path.Combine(repo.Root, "motors"), Path.Combine(repo.Root, "notes"), "--format", "code-quality"]);
        Assert.Equal(1, run.Exit);
        using var doc = JsonDocument.Parse(run.Stdout);
        var issues = doc.RootElement.EnumerateArray().Select(i => (
            i.GetProperty("check_name").GetString(), i.GetProperty("location").GetProperty("path").GetString(),
            i.GetProperty("location").GetProperty("lines").GetProperty("begin").GetInt32(), i.GetProperty("severity").GetString())).ToList();
        // GitLab (doc/ci/testing/code_quality.md) places an issue by path from the repository and line.
        Assert.Equal([("SL006", "motors/m-1.yaml", 9, "critical"), ("SL001", "notes/bad.yaml", 2, "critical")], issues);
    }

    [Fact]
    public void Junit_has_a_suite_per_motor_with_a_case_per_rule()
    {
        using var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));
        var run = Cli.Run(["check", repo.Root, "--format", "junit"]);
        Assert.Equal(1, run.Exit);
        var doc = System.Xml.Linq.XDocument.Parse(run.Stdout);
        var suite = Assert.Single(doc.Root!.Elements("testsuite"));
        Assert.Equal("motors/m-1.yaml", (string)suite.Attribute("file")!);
        var cases = suite.Elements("testcase").ToList();
        Assert.True(cases.Count >= 11, cases.Count + " cases"); // the engine rules SL001-SL011 at least
        var failed = Assert.Single(cases, c => c.Element("failure") is not null);
        Assert.StartsWith("SL006 ", (string)failed.Attribute("name")!, StringComparison.Ordinal);
        Assert.Equal(1, (int)suite.Attribute("failures")!);
    }
}
