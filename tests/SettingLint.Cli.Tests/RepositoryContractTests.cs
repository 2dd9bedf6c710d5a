using SettingLint.Core.Findings;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>What the format says of a repository as a whole: unique tags, no silently skipped setting files, one root.</summary>
public sealed class RepositoryContractTests
{
    [Fact]
    public void A_reused_tag_is_SL012_on_the_later_file()
    {
        using var repo = Cli.Repo();
        repo.Write("motors/m-2.yaml", Samples.Motor);
        var run = Cli.CheckJson(repo);
        var (line, column) = Samples.Pos(Samples.Motor, "tag:");
        // Placed on the value of the later file's tag; the first file keeps its tag silently.
        Assert.Contains(("SL012", "motors/m-2.yaml", line, column + "tag: ".Length), run.Findings);
        Assert.DoesNotContain(run.Findings, f => f.Rule == "SL012" && f.File == "motors/m-1.yaml");
        Assert.Equal(ExitCodes.Findings, run.Exit);
    }

    [Fact]
    public void A_misspelt_kind_is_reported_not_skipped()
    {
        using var repo = Cli.Repo();
        repo.Write("motors/m-1.yaml", Samples.Motor.Replace("kind: motor-protection", "kidn: motor-protection", StringComparison.Ordinal));
        var run = Cli.CheckJson(repo);
        Assert.Contains(run.Findings, f => f is { Rule: "SL004", File: "motors/m-1.yaml", Line: 1, Column: 1 });
        Assert.Equal(ExitCodes.Findings, run.Exit);
    }

    [Fact]
    public void A_yaml_file_without_kind_or_format_is_still_skipped()
    {
        using var repo = Cli.Repo();
        repo.Write("notes/ci.yaml", "jobs:\n  build: { runs-on: linux }\n");
        var run = Cli.CheckJson(repo);
        Assert.DoesNotContain(run.Findings, f => f.File == "notes/ci.yaml");
        Assert.Equal(ExitCodes.Clean, run.Exit);
    }

    [Fact]
    public void A_file_named_outside_the_root_is_a_usage_error_not_a_silent_pass()
    {
        using var repo = Cli.Repo();
        using var other = new TempRepo();
        var stray = other.Write("motors/x.yaml", "kind: pump\nformat: 1\n");
        var run = Cli.Run("check", repo.Root, stray);
        Assert.Equal(ExitCodes.Usage, run.Exit);
        Assert.Contains("outside the repository root", run.Stdout + run.Stderr, StringComparison.Ordinal);
    }
}

/// <summary>Outside a git work tree, one file checked alone still reaches the files beside its folder.</summary>
public sealed class RootOutsideGitTests
{
    [Fact]
    public void A_motor_checked_alone_outside_git_reaches_its_bus_under_the_configuration_folder()
    {
        using var repo = new TempRepo(git: false);
        Samples.WriteMinimal(repo);
        repo.Write(".settinglint.yaml", Cli.EngineOnlyConfig);
        var run = Cli.Run(["check", repo.PathOf("motors/m-1.yaml"), "--format", "json"]);
        Assert.True(run.Exit == 0, run.ToString());
        Assert.DoesNotContain(run.Findings, f => f.Rule == "SL007");
        Assert.Equal(".", run.Json.GetProperty("root").GetString() is { } r ? System.IO.Path.GetRelativePath(repo.Root, System.IO.Path.GetFullPath(r)) : null);
    }
}

/// <summary>A configuration mistake is reported once, for what it is.</summary>
public sealed class ConfigurationMessageTests
{
    [Fact]
    public void A_parameter_in_the_wrong_unit_is_not_also_a_rule_missing_from_the_packs()
    {
        using var repo = Cli.Repo(engineOnly: false);
        repo.Write(".settinglint.yaml", "rules:\n  SL302:\n    parameters: { max_share: 15 A }\n");
        var run = Cli.CheckJson(repo);
        Assert.Equal(2, run.Exit);
        var notification = Assert.Single(run.Json.GetProperty("notifications").EnumerateArray());
        Assert.Contains("max_share", notification.GetProperty("message").GetString(), StringComparison.Ordinal);
        // A rule that no pack has is still reported as such.
        repo.Write(".settinglint.yaml", "rules:\n  SL998: off\n");
        var missing = Cli.CheckJson(repo);
        Assert.Contains("SL998 is not in any loaded pack", Assert.Single(missing.Json.GetProperty("notifications").EnumerateArray()).GetProperty("message").GetString(), StringComparison.Ordinal);
    }
}
