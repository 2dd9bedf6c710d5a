using System.Text.RegularExpressions;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>Engine diagnostics are data: each names its message by id and carries its variable parts as named values.</summary>
public sealed partial class EngineMessagesTests
{
    [Fact]
    public void Every_engine_message_has_an_id_unique_within_its_rule_and_named_holes()
    {
        Assert.True(EngineMessages.All.Length >= 80, "engine messages: " + EngineMessages.All.Length);
        var ids = EngineRules.All.Select(r => r.Id).ToHashSet(StringComparer.Ordinal);
        foreach (var m in EngineMessages.All)
        {
            Assert.Contains(m.RuleId, ids);
            Assert.Matches("^[a-z][A-Za-z0-9]*$", m.Id);
            Assert.All(MessageTemplate.Holes(m.Template), h => Assert.Matches("^[a-z][A-Za-z_]*$", h));
        }
        Assert.Empty(EngineMessages.All.GroupBy(m => (m.RuleId, m.Id)).Where(g => g.Count() > 1).Select(g => g.Key));
        // One wording, one id: the same template is not listed twice under one rule.
        Assert.Empty(EngineMessages.All.GroupBy(m => (m.RuleId, m.Template)).Where(g => g.Count() > 1).Select(g => g.Key));
        // Every engine rule that reports findings has its messages here (SL009 and SL011 included).
        foreach (var rule in new[] { EngineRules.Syntax, EngineRules.DuplicateKey, EngineRules.UnknownKey, EngineRules.MissingKey, EngineRules.WrongType, EngineRules.Unit,
            EngineRules.Reference, EngineRules.Limit, EngineRules.KindOrFormat, EngineRules.Suppression, EngineRules.GateChange, EngineRules.DuplicateTag,
            EngineRules.SecondDocument, EngineRules.KeyNotPlain, EngineRules.NotAMapping, EngineRules.NoCompliantValue })
        {
            Assert.Contains(EngineMessages.All, m => m.RuleId == rule);
        }
    }

    [Fact]
    public void A_finding_of_an_engine_rule_carries_its_message_id_and_values_and_a_rule_finding_the_default_id()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("motors/m-1.yaml", Samples.MotorWith("full_load_current: 58 A", "full_load_current: -58 A"));
        var result = Linter.Check(new CheckRequest(repo.Root, []));
        var negative = Assert.Single(result.Findings, f => f.RuleId == EngineRules.WrongType && f.KeyPath == "motor.full_load_current");
        Assert.Equal("negativeHereCannot", negative.MessageId);
        Assert.Equal(EngineMessages.NegativeHereCannot.Template, negative.Template);
        Assert.Equal("-58 A", negative.Values["value"].Text);
        Assert.Equal("'-58 A' is negative; a current here cannot be.", negative.Message);
        Assert.All(result.Findings.Where(f => !f.RuleId.StartsWith("SL0", StringComparison.Ordinal)), f => Assert.Equal(Finding.DefaultMessageId, f.MessageId));
    }

    // An engine finding made with a template written at its call site, not from EngineMessages.
    [GeneratedRegex(@"\.Add\(EngineRules\.\w+,|new Finding\(EngineRules\.")]
    private static partial Regex TemplateAtCallSite();

    [Fact]
    public void No_engine_finding_is_made_with_a_template_outside_EngineMessages()
    {
        var root = RepositoryPaths.Root();
        var sep = Path.DirectorySeparatorChar;
        var files = Directory.GetFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
            .Where(f => !f.Contains($"{sep}obj{sep}", StringComparison.Ordinal) && !f.Contains($"{sep}bin{sep}", StringComparison.Ordinal)).ToList();
        Assert.True(files.Count > 100);
        var offenders = files.SelectMany(f => File.ReadAllLines(f).Select((line, i) => (f, line, i)))
            .Where(x => TemplateAtCallSite().IsMatch(x.line))
            .Select(x => $"{Path.GetRelativePath(root, x.f)}:{x.i + 1}");
        Assert.Empty(offenders);
    }
}
