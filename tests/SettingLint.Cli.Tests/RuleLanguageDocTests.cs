using System.Text.RegularExpressions;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>The worked example of docs/rule-language.md, "Scoping a rule by bus", loads and fires on its bus only.</summary>
public sealed class RuleLanguageDocTests
{
    [Fact]
    public void The_rule_scoped_by_bus_fires_only_on_the_motors_of_that_bus()
    {
        var doc = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "docs", "rule-language.md"));
        var block = Regex.Match(doc, "## Scoping a rule by bus.*?```yaml\n(id: SL990.*?)```", RegexOptions.Singleline);
        Assert.True(block.Success, "docs/rule-language.md has the example rule under 'Scoping a rule by bus'");
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", "packs: [builtin, company-rules]\n");
        repo.Write("company-rules/SL990/rule.yaml", block.Groups[1].Value);
        // Two buses alike but for the tag, and the sample motor on each: its 50P pickup is 7.2 A sec through a
        // 75/5 A CT, 108 A primary, above the example's 100 A.
        repo.Write("buses/hw-swb-1.yaml", Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: HW-SWB-1"));
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("motors/on-board.yaml", Samples.Replace(Samples.Replace(Samples.Motor, "tag: M-1", "tag: M-HW"), "../buses/bus-1.yaml", "../buses/hw-swb-1.yaml"));
        repo.Write("motors/elsewhere.yaml", Samples.Motor);

        var run = Cli.CheckJson(repo);
        Assert.True(run.Exit is 0 or 1, run.ToString());
        var found = run.Findings.Where(f => f.Rule == "SL990").ToList();
        var (pickupLine, _) = Samples.Pos(Samples.Motor, "pickup: 7.2 A sec");
        Assert.Equal([("SL990", "motors/on-board.yaml", pickupLine)], found.Select(f => (f.Rule, f.File, f.Line)));
        // The other bus makes the guard false: not a check not run either.
        Assert.DoesNotContain(run.Json.GetProperty("notRun").EnumerateArray(), n => n.GetProperty("ruleId").GetString() == "SL990");
    }
}
