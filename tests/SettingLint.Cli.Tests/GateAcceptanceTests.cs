using System.Text.Json;
using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>`# settinglint-accept` end to end: what it accepts, SL010 for faulty ones, SARIF suppressions, --no-suppress.</summary>
public sealed class GateAcceptanceTests
{
    private const string MotorFile = "motors/m-1.yaml";

    // The sample motor with a bare number for the full-load current: SL006 at line 9, column 22.
    private static TempRepo Repo(string line) =>
        Cli.Repo(Samples.MotorWith("  full_load_current: 58 A\n", line));

    private static JsonElement SarifResults(CliRun run) => JsonDocument.Parse(run.Stdout).RootElement.GetProperty("runs")[0].GetProperty("results");

    [Fact]
    public void A_trailing_acceptance_with_a_reason_accepts_the_finding_and_the_run_passes()
    {
        using var repo = Repo("  full_load_current: 58   # settinglint-accept SL006: the nameplate is lost; 58 A from the purchase order (invented)\n");
        var run = Cli.CheckJson(repo);
        Assert.True(run.Exit == 0, run.ToString());
        var f = Assert.Single(run.Json.GetProperty("findings").EnumerateArray());
        Assert.Equal("SL006", f.GetProperty("ruleId").GetString());
        var suppressed = f.GetProperty("suppressed");
        Assert.Equal("the nameplate is lost; 58 A from the purchase order (invented)", suppressed.GetProperty("justification").GetString());
        Assert.Equal(9, suppressed.GetProperty("line").GetInt32());
        Assert.Equal(1, run.Json.GetProperty("summary").GetProperty("suppressed").GetInt32());
    }

    [Fact]
    public void An_acceptance_on_the_line_before_works_the_same()
    {
        using var repo = Repo("  # settinglint-accept SL006: the nameplate is lost (invented)\n  full_load_current: 58\n");
        Assert.Equal(0, Cli.CheckJson(repo).Exit);
    }

    [Fact]
    public void Suppressed_findings_stay_in_SARIF_with_an_in_source_suppression_and_the_reason()
    {
        using var repo = Repo("  full_load_current: 58   # settinglint-accept SL006: from the purchase order (invented)\n");
        var run = Cli.Run(["check", repo.Root, "--format", "sarif"]);
        Assert.Equal(0, run.Exit);
        Assert.Empty(SarifValidation.SchemaErrors(run.Stdout));
        var s = Assert.Single(SarifResults(run).EnumerateArray()).GetProperty("suppressions")[0];
        Assert.Equal("inSource", s.GetProperty("kind").GetString());
        Assert.Equal("from the purchase order (invented)", s.GetProperty("justification").GetString());
        Assert.Equal(9, s.GetProperty("location").GetProperty("physicalLocation").GetProperty("region").GetProperty("startLine").GetInt32());

        // For hosted code scanning, which ignores suppressions: left out, and the run still passes.
        var omitted = Cli.Run(["check", repo.Root, "--format", "sarif", "--sarif-omit-suppressed"]);
        Assert.Equal(0, omitted.Exit);
        Assert.Equal(0, SarifResults(omitted).GetArrayLength());
        Assert.DoesNotContain("SL006", Cli.Run(["check", repo.Root, "--sarif-omit-suppressed"]).Stdout.Split('\n')[0], StringComparison.Ordinal);
    }

    [Fact]
    public void No_suppress_ignores_every_acceptance_for_an_audit()
    {
        using var repo = Repo("  full_load_current: 58   # settinglint-accept SL006: from the purchase order (invented)\n");
        var run = Cli.CheckJson(repo, "--no-suppress");
        Assert.Equal(1, run.Exit);
        Assert.Equal([("SL006", MotorFile, 9, 22)], run.Findings);
        Assert.False(run.Json.GetProperty("findings")[0].TryGetProperty("suppressed", out _));
    }

    [Fact]
    public void An_acceptance_without_a_reason_is_SL010_and_accepts_nothing()
    {
        using var repo = Repo("  full_load_current: 58   # settinglint-accept SL006\n");
        var run = Cli.CheckJson(repo);
        Assert.Equal(1, run.Exit);
        Assert.Equal([("SL006", MotorFile, 9, 22), ("SL010", MotorFile, 9, 27)], run.Findings);
        Assert.Contains("gives no reason", run.Json.GetProperty("findings")[1].GetProperty("message").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void A_stale_acceptance_is_SL010()
    {
        using var repo = Cli.Repo(Samples.MotorWith("  rated_output: 450 hp\n", "  rated_output: 450 hp   # settinglint-accept SL006: was written in kW once (invented)\n"));
        var run = Cli.CheckJson(repo);
        Assert.Equal(1, run.Exit);
        Assert.Equal([("SL010", MotorFile, 7, 26)], run.Findings);
        Assert.Contains("stale", run.Json.GetProperty("findings")[0].GetProperty("message").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void An_acceptance_of_an_unknown_rule_is_SL010()
    {
        using var repo = Repo("  full_load_current: 58   # settinglint-accept SL006 SL999: from the purchase order (invented)\n");
        var run = Cli.CheckJson(repo);
        Assert.Equal(1, run.Exit);
        Assert.Equal([("SL006", MotorFile, 9, 22), ("SL010", MotorFile, 9, 27)], run.Findings);
        Assert.True(run.Json.GetProperty("findings")[0].TryGetProperty("suppressed", out _)); // the known id still accepts
        Assert.Contains("SL999, which is not a rule", run.Json.GetProperty("findings")[1].GetProperty("message").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void A_block_acceptance_on_an_element_key_covers_every_finding_inside_it()
    {
        using var git = new GateGitRepo();
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");
        var found = git.CheckJson();
        Assert.Contains(found.Findings, f => f is { Rule: "SL203", File: GateGitRepo.Breaker });
        Assert.Contains(found.Findings, f => f is { Rule: "SL205", File: GateGitRepo.Breaker });
        git.Edit(GateGitRepo.Breaker, "  short_circuit:                     # 50P",
            "  # settinglint-accept SL203 SL205: breaker replacement ordered, work order 7 (invented)\n  short_circuit:                     # 50P");
        var run = git.CheckJson();
        var breaker = run.Json.GetProperty("findings").EnumerateArray().Where(f => f.GetProperty("file").GetString() == GateGitRepo.Breaker).ToList();
        Assert.Equal(["SL203", "SL205"], breaker.Select(f => f.GetProperty("ruleId").GetString()));
        Assert.All(breaker, f => Assert.True(f.TryGetProperty("suppressed", out _)));
        Assert.Equal(0, Cli.Run(["check", git.Root, "--fail-on", "error"]).Exit);
    }
}
