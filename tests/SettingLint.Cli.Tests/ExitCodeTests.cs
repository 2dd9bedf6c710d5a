using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>The gate: exit 0 clean, 1 findings at or above --fail-on, 2 usage or configuration (common practice for linters in CI).</summary>
public sealed class ExitCodeTests
{
    private static TempRepo WithError() => Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));

    [Fact]
    public void Errors_exit_1_by_default()
    {
        using var repo = WithError();
        var run = Cli.CheckJson(repo);
        Assert.Equal(1, run.Exit);
        Assert.Equal("error", run.Json.GetProperty("summary").GetProperty("failOn").GetString());
        Assert.Equal(1, run.Json.GetProperty("summary").GetProperty("exitCode").GetInt32());
    }

    [Theory]
    [InlineData("never", 0)]
    [InlineData("error", 1)]
    [InlineData("warning", 1)]
    [InlineData("note", 1)]
    public void Fail_on_sets_the_threshold_for_errors(string failOn, int exit)
    {
        using var repo = WithError();
        Assert.Equal(exit, Cli.CheckJson(repo, "--fail-on", failOn).Exit);
    }

    [Theory]
    [InlineData("never")]
    [InlineData("error")]
    [InlineData("warning")]
    [InlineData("note")]
    public void A_clean_repository_passes_at_every_threshold(string failOn)
    {
        using var repo = Cli.Repo();
        Assert.Equal(0, Cli.CheckJson(repo, "--fail-on", failOn).Exit);
    }

    [Fact]
    public void The_configuration_fail_on_applies_and_the_option_overrides_it()
    {
        using var repo = WithError();
        repo.Write(".settinglint.yaml", Cli.EngineOnlyConfig + "fail_on: never\n");
        Assert.Equal(0, Cli.CheckJson(repo).Exit);
        Assert.Equal(1, Cli.CheckJson(repo, "--fail-on", "error").Exit);
    }

    // With the built-in pack: a warning (SL107, service factor outside 1.0-1.5, common practice) passes by default
    // and fails with --fail-on warning.
    [Fact]
    public void Fail_on_warning_fails_on_a_warning()
    {
        using var repo = Cli.Repo(Samples.MotorWith("service_factor: 1.15", "service_factor: 1.6").Replace("pickup: 7.2 A sec", "pickup: 700 A pri", StringComparison.Ordinal), engineOnly: false);
        var byDefault = Cli.CheckJson(repo);
        Assert.Contains(("SL107", "warning"), byDefault.Levels);
        Assert.DoesNotContain(byDefault.Levels, l => l.Level == "error");
        Assert.Equal(0, byDefault.Exit);
        Assert.Equal(1, Cli.CheckJson(repo, "--fail-on", "warning").Exit);
        Assert.Equal(0, Cli.CheckJson(repo, "--fail-on", "never").Exit);
    }

    // With the built-in pack, a sensible motor (short-circuit pickup 700 A, about 1.9 x its 359.6 A start) has no error.
    [Fact]
    public void A_sensible_motor_passes_the_built_in_pack()
    {
        using var repo = Cli.Repo(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 700 A pri"), engineOnly: false);
        var run = Cli.CheckJson(repo);
        Assert.True(run.Exit == 0, run.ToString());
        Assert.DoesNotContain(run.Levels, l => l.Level == "error");
        Assert.DoesNotContain(run.Findings, f => string.CompareOrdinal(f.Rule, "SL100") < 0);
    }

    [Fact]
    public void An_unknown_option_exits_2()
    {
        using var repo = Cli.Repo();
        var run = Cli.Run("check", repo.Root, "--no-such-option");
        Assert.Equal(2, run.Exit);
        Assert.Contains("--no-such-option", run.Stderr, StringComparison.Ordinal);
        Assert.Empty(run.Stdout);
    }

    [Theory]
    [InlineData("--fail-on", "sometimes")]
    [InlineData("--format", "xml")]
    public void A_bad_option_value_exits_2(string option, string value)
    {
        using var repo = Cli.Repo();
        var run = Cli.Run("check", repo.Root, option, value);
        Assert.Equal(2, run.Exit);
        Assert.NotEmpty(run.Stderr);
    }

    [Fact]
    public void An_unknown_command_exits_2() =>
        Assert.Equal(2, Cli.Run("chek").Exit);

    [Fact]
    public void A_nonexistent_path_exits_2_with_a_notification()
    {
        using var repo = Cli.Repo();
        var missing = repo.PathOf("no/such/folder");
        var run = Cli.Run("check", repo.Root, missing, "--format", "json");
        Assert.Equal(2, run.Exit);
        var notification = Assert.Single(run.Json.GetProperty("notifications").EnumerateArray());
        Assert.Equal("configuration", notification.GetProperty("kind").GetString());
        Assert.Contains("does not exist", notification.GetProperty("message").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public void A_nonexistent_path_alone_exits_2()
    {
        using var repo = new TempRepo();
        Assert.Equal(2, Cli.Run("check", repo.PathOf("nothing-here.yaml")).Exit);
    }

    [Fact]
    public void Help_exits_0()
    {
        var run = Cli.Run("check", "--help");
        Assert.Equal(0, run.Exit);
        Assert.Contains("--fail-on", run.Stdout, StringComparison.Ordinal);
    }
}
