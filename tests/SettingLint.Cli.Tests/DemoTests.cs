using System.Text.Json;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Reporting;
using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>The demo plant: its planted mistakes are found, its clean motors stay clean, and its SARIF is accepted as is.</summary>
public sealed class DemoTests
{
    private static CheckResult Check()
    {
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        return Session.Open([examples]).Check([examples], null);
    }

    [Fact]
    public void Planted_mistakes_are_found_on_their_lines()
    {
        // The demo is the whole repository here, so paths are relative to the project root.
        var found = Check().Findings.Select(f => (f.File, f.Span.StartLine, f.RuleId)).ToHashSet();
        Assert.Contains(("examples/motors/p-202.yaml", 20, "SL102"), found); // hot stall time typed for the cold one
        Assert.Contains(("examples/motors/p-202.yaml", 46, "SL201"), found); // secondary pickup keyed in as primary
        Assert.Contains(("examples/motors/p-202.yaml", 46, "SL108"), found); // and so outside the relay's range
        Assert.Contains(("examples/motors/b-401.yaml", 45, "SL302"), found); // ground CT changed, pickup not recalculated
        Assert.Contains(("examples/motors/p-503.yaml", 65, "SL701"), found); // acceleration timer shorter than the soft start
    }

    [Fact]
    public void A_setting_outside_the_relay_range_is_said_in_words()
    {
        // Reads as a sentence for the engineer, not as the rule's intermediate flags.
        var finding = Check().Findings.Single(f => f.RuleId == "SL108" && f.File == "examples/motors/p-202.yaml");
        Assert.Contains("it lies outside the range (200 A pri (5 A sec) to 4 kA pri (100 A sec)", finding.Message, StringComparison.Ordinal);
        Assert.DoesNotContain("in range:", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Clean_motors_have_no_finding_at_any_level_and_no_check_left_unrun()
    {
        // Notes count too: a note that comes back on a correctly chosen CT (SL110) is noise a reviewer learns to skip.
        var result = Check();
        foreach (var clean in (string[])["motors/p-201", "motors/p-301", "motors/p-302", "motors/p-501", "motors/p-502", "intake/motors/hp-101", "intake/motors/hp-102", "intake/motors/sw-201"])
        {
            var bad = result.Findings.Where(f => f.File == $"examples/{clean}.yaml").Select(f => $"{f.RuleId} {f.Level} {f.Span}: {f.Message}");
            Assert.Empty(bad);
            Assert.Empty(result.NotRun.Where(n => n.File == $"examples/{clean}.yaml"));
            Assert.Empty(bad);
        }
        Assert.Equal(11, result.Motors.Length);
        Assert.Equal(ExitCodes.Findings, result.ExitCode);
    }

    [Fact]
    public void The_intake_site_is_governed_by_IEC_60364_from_its_own_folder_and_the_main_site_by_NFPA_70()
    {
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        var intake = Cli.Run("config", "show", Path.Combine(examples, "intake", "motors", "sw-201.yaml"));
        Assert.Equal(0, intake.Exit);
        Assert.Contains("electrical_code: IEC 60364  (examples/intake/.settinglint.yaml:", intake.Stdout, StringComparison.Ordinal);
        var main = Cli.Run("config", "show", Path.Combine(examples, "motors", "p-201.yaml"));
        Assert.Contains("electrical_code: NFPA 70  (examples/.settinglint.yaml:", main.Stdout, StringComparison.Ordinal);

        // NFPA 70 430.32(A)(1) caps an overload pickup at 125 % of FLC for a service factor of 1.15 or more, 115 %
        // otherwise. Raise one motor of each site to 1.30 x FLC: SL801 fires on the main site's P-201 (service factor
        // 1.15), and does not run on the intake site's SW-201, where IEC 60364 governs.
        using var repo = Server.ServerSession.DemoRepo();
        Raise(repo, "motors/p-201.yaml", "pickup: 1.15 xFLC");
        Raise(repo, "intake/motors/sw-201.yaml", "pickup: 1.05 xFLC");
        var found = Session.Open([repo.Root]).Check([repo.Root], null).Findings.Where(f => f.RuleId == "SL801").Select(f => f.File).ToList();
        Assert.Equal(["motors/p-201.yaml"], found);
    }

    private static void Raise(TempRepo repo, string file, string pickup)
    {
        var text = File.ReadAllText(repo.PathOf(file));
        Assert.Contains(pickup, text, StringComparison.Ordinal);
        repo.Write(file, text.Replace(pickup, "pickup: 1.30 xFLC", StringComparison.Ordinal));
    }

    [Fact]
    public void Demo_sarif_validates_against_the_sdk_schema()
    {
        var sarif = DemoSarif();
        // Schema: Schemata/sarif-2.1.0.json shipped in the Sarif.Sdk 5.8.0 package (OASIS SARIF 2.1.0).
        Assert.Empty(SarifValidation.SchemaErrors(sarif));
        using var doc = JsonDocument.Parse(sarif);
        foreach (var r in doc.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray())
        {
            var uri = r.GetProperty("locations")[0].GetProperty("physicalLocation").GetProperty("artifactLocation").GetProperty("uri").GetString()!;
            Assert.False(Path.IsPathRooted(uri) || uri.Contains(':', StringComparison.Ordinal), "uri must be relative: " + uri);
        }
    }

    private static string DemoSarif()
    {
        var writer = new StringWriter();
        new SarifReporter().Write(Check(), new ReportContext(RepositoryPaths.Root(), false, false, ToolInfo.ForVersion("0.1.0")), writer);
        return writer.ToString();
    }

    [MultitoolFact]
    public void Demo_sarif_passes_the_sdk_validator() => PassesValidator(DemoSarif());

    // The demo's SARIF as `check` writes it, with the checked fixes of its findings.
    private static string DemoSarifWithFixes() => Cli.Run("check", Path.Combine(RepositoryPaths.Root(), "examples"), "--format", "sarif").Stdout;

    [MultitoolFact]
    public void Demo_sarif_with_fixes_passes_the_sdk_validator() => PassesValidator(DemoSarifWithFixes());

    // The SARIF SDK's own validator with hosted code scanning's rules (npm @microsoft/sarif-multitool).
    private static void PassesValidator(string sarif)
    {
        ToolFacts.RequireMultitool();
        var file = Path.Combine(Path.GetTempPath(), "settinglint-demo-" + Guid.NewGuid().ToString("N") + ".sarif");
        File.WriteAllText(file, sarif);
        try
        {
            var (errors, output) = SarifValidation.RunMultitool(file);
            Assert.True(errors == 0, output);
        }
        finally
        {
            File.Delete(file);
        }
    }

    [Fact]
    public void Demo_sarif_carries_checked_fixes_on_the_values_regions()
    {
        var sarif = DemoSarifWithFixes();
        Assert.Empty(SarifValidation.SchemaErrors(sarif));
        using var doc = JsonDocument.Parse(sarif);
        var fixes = doc.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray()
            .Where(r => r.TryGetProperty("fixes", out _))
            .Select(r => (Rule: r.GetProperty("ruleId").GetString(), Fix: r.GetProperty("fixes")[0])).ToList();
        // P-202's pickup "46 A pri" (line 46, columns 13-21): SL201 needs 1.7 x the 1.04 kA start at the bus's maximum
        // voltage = 1.76 kA pri (common practice), and the relay model's 2 A pri step from 200 A gives 1762 A pri.
        var sl201 = Assert.Single(fixes, f => f.Rule == "SL201").Fix;
        var change = sl201.GetProperty("artifactChanges")[0];
        Assert.Equal("examples/motors/p-202.yaml", change.GetProperty("artifactLocation").GetProperty("uri").GetString());
        var replacement = change.GetProperty("replacements")[0];
        var region = replacement.GetProperty("deletedRegion");
        Assert.Equal((46, 13, 46, 21), (region.GetProperty("startLine").GetInt32(), region.GetProperty("startColumn").GetInt32(),
            region.GetProperty("endLine").GetInt32(), region.GetProperty("endColumn").GetInt32()));
        Assert.Equal("1762 A pri", replacement.GetProperty("insertedContent").GetProperty("text").GetString());
    }
}
