using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>Engine diagnostics carry their own ids (SL005 no longer stands for unrelated faults), and the caution has one wording.</summary>
public sealed class EngineDiagnosticsTests
{
    [Fact]
    public void Engine_rule_ids_are_unique_sorted_and_the_split_ones_are_documented()
    {
        var ids = EngineRules.All.Select(r => r.Id).ToList();
        Assert.Equal(ids.Order(StringComparer.Ordinal), ids);
        Assert.Equal(ids.Count, ids.Distinct(StringComparer.Ordinal).Count());
        Assert.Equal(["SL012", "SL013", "SL014", "SL015"], new[] { EngineRules.DuplicateTag, EngineRules.SecondDocument, EngineRules.KeyNotPlain, EngineRules.NotAMapping });
        // The retired meanings of SL005 stay documented with it.
        var help = EngineRules.Get(EngineRules.WrongType).HelpMarkdown;
        foreach (var moved in (string[])["SL012", "SL013", "SL014", "SL015"]) Assert.Contains(moved, help, StringComparison.Ordinal);
    }

    [Fact]
    public void A_reused_tag_is_SL012_with_the_tag_and_the_first_file_as_values()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("motors/m-1.yaml", Samples.Motor);
        repo.Write("motors/m-2.yaml", Samples.Motor);
        var result = Linter.Check(new CheckRequest(repo.Root, []));
        var reused = Assert.Single(result.Findings, f => f.RuleId == EngineRules.DuplicateTag);
        Assert.Equal("motors/m-2.yaml", reused.File);
        Assert.Equal("M-1", reused.Values["tag"].Text);
        Assert.Equal("motors/m-1.yaml", reused.Values["other"].Text);
        Assert.DoesNotContain(result.Findings, f => f.RuleId == EngineRules.WrongType);
    }

    [Fact]
    public void A_configuration_that_is_not_a_mapping_is_SL015_and_exit_2()
    {
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", "- builtin\n");
        var result = Linter.Check(new CheckRequest(repo.Root, []));
        var problem = Assert.Single(result.Notifications);
        Assert.Equal(EngineRules.NotAMapping, problem.RuleId);
        Assert.Equal(".settinglint.yaml", problem.File);
        Assert.Equal(ExitCodes.Usage, result.ExitCode);
    }

    [Fact]
    public void The_caution_is_worded_in_one_place_of_the_source()
    {
        var root = RepositoryPaths.Root();
        var holders = Directory.GetFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
            .Where(f => !f.Contains(Path.DirectorySeparatorChar + "obj" + Path.DirectorySeparatorChar, StringComparison.Ordinal))
            .Where(f => File.ReadAllText(f).Contains("do not replace a protection study", StringComparison.Ordinal))
            .Select(f => Path.GetRelativePath(root, f).Replace('\\', '/'));
        Assert.Equal(["src/SettingLint.Core/Findings/Caution.cs"], holders);
    }
}
