using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// Company rule ids: a pack's prefix from its pack.yaml, SL reserved, one prefix per pack, packs without pack.yaml on
/// SLnnn as before, and fixture folders of configured packs kept out of the plant.
/// </summary>
public sealed class RulePackPrefixTests
{
    private const string Motor = "motors/m-1.yaml";

    // The sample motor's 50P pickup is 7.2 A sec on a 75:5 CT, 108 A primary: above a 1 A ceiling, so the rule fires.
    private static string Rule(string id) => $"""
        id: {id}
        title: Short-circuit pickup above the firm's test ceiling
        summary: A rule that fires on the sample motor.
        rationale: Test rule.
        basis: [common practice]
        severity: error
        tags: [50P]
        applies_to: motor-protection
        check: protection.short_circuit.pickup <= 1 A
        subject: protection.short_circuit.pickup
        message: Pickup {"{actual}"} above {"{limit}"}.

        """;

    private static TempRepo Repo(string config)
    {
        var repo = new TempRepo();
        Samples.WriteMinimal(repo);
        repo.Write(".settinglint.yaml", config);
        return repo;
    }

    private static CheckResult Check(TempRepo repo) => Linter.Check(new CheckRequest(repo.Root, [repo.Root]));

    private static (string? File, int Line, string Message) Only(CheckResult result)
    {
        Assert.Equal(ExitCodes.Usage, result.ExitCode);
        var n = Assert.Single(result.Notifications);
        Assert.Equal(NotificationKind.Configuration, n.Kind);
        return (n.File, n.Span?.StartLine ?? 0, n.Message);
    }

    [Fact]
    public void A_declared_prefix_gives_the_pack_its_own_ids_which_config_and_acceptances_name()
    {
        using var repo = Repo("packs: [acme]\nrules:\n  ACME101: warning\n");
        repo.Write("acme/pack.yaml", "prefix: ACME\ntitle: Acme test pack\n");
        repo.Write("acme/ACME101/rule.yaml", Rule("ACME101"));
        var result = Check(repo);
        Assert.Empty(result.Notifications);
        var f = Assert.Single(result.Findings);
        Assert.Equal(("ACME101", Level.Warning, Motor, 28), (f.RuleId, f.Level, f.File, f.Span.StartLine));

        // The acceptance comment recognises the company id as a rule of the run.
        repo.Write(Motor, Samples.MotorWith("    pickup: 7.2 A sec", "    pickup: 7.2 A sec  # settinglint-accept ACME101: firm ceiling waived for the test"));
        var accepted = Check(repo);
        Assert.NotNull(Assert.Single(accepted.Findings).Suppression);
    }

    [Fact]
    public void Two_packs_with_one_prefix_stop_the_run_at_the_second_prefix_line()
    {
        using var repo = Repo("packs: [builtin, acme, acme-too]\n");
        repo.Write("acme/pack.yaml", "prefix: ACME\n");
        repo.Write("acme/ACME101/rule.yaml", Rule("ACME101"));
        // The prefix on line 3, so that the line is told apart from the first pack's.
        repo.Write("acme-too/pack.yaml", "# A second pack that copied the first one's manifest.\ntitle: Copied pack\nprefix: ACME\n");
        repo.Write("acme-too/ACME102/rule.yaml", Rule("ACME102"));
        var result = Check(repo);
        var (file, line, message) = Only(result);
        Assert.Equal(("acme-too/pack.yaml", 3), (file, line));
        Assert.Equal(9, result.Notifications[0].Span!.Value.StartColumn);
        Assert.Contains("the prefix ACME is also declared by acme/pack.yaml", message, StringComparison.Ordinal);
        Assert.Empty(result.Findings);
    }

    [Theory]
    [InlineData("prefix: SL\n", 1, "reserved for the built-in rules")]
    [InlineData("title: x\nprefix: acme\n", 2, "not two to eight capital letters")]
    [InlineData("title: x\nprefix: A\n", 2, "not two to eight capital letters")]
    [InlineData("title: No prefix\n", 1, "must declare the prefix")]
    [InlineData("prefix: ACME\nowner: x\n", 2, "has no key 'owner'")]
    [InlineData("- ACME\n", 1, "is a mapping with the key 'prefix'")]
    public void A_broken_pack_yaml_is_a_configuration_error_at_its_line(string manifest, int line, string message)
    {
        using var repo = Repo("packs: [acme]\n");
        repo.Write("acme/pack.yaml", manifest);
        repo.Write("acme/ACME101/rule.yaml", Rule("ACME101"));
        var (file, at, text) = Only(Check(repo));
        Assert.Equal(("acme/pack.yaml", line), (file, at));
        Assert.Contains(message, text, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("SL951", "SL951", "reserved for the built-in rules")]
    [InlineData("BETA101", "BETA101", "this pack's ids are its prefix ACME")]
    [InlineData("ACMEX101", "ACMEX101", "this pack's ids are its prefix ACME")]
    [InlineData("ACME102", "ACME101", "a pack's rule lies in a folder named by its id")]
    public void A_company_rule_with_an_id_its_pack_may_not_use_is_an_error_at_the_id_line(string id, string folder, string message)
    {
        using var repo = Repo("packs: [builtin, acme]\n");
        repo.Write("acme/pack.yaml", "prefix: ACME\n");
        repo.Write($"acme/{folder}/rule.yaml", Rule(id));
        var (file, line, text) = Only(Check(repo));
        Assert.Equal(($"acme/{folder}/rule.yaml", 1), (file, line));
        Assert.StartsWith(id + ": ", text, StringComparison.Ordinal);
        Assert.Contains(message, text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_pack_without_pack_yaml_keeps_SL_ids_and_is_told_how_to_use_a_prefix()
    {
        using var repo = Repo("packs: [house]\n");
        repo.Write("house/SL951/rule.yaml", Rule("SL951"));
        Assert.Equal("SL951", Assert.Single(Check(repo).Findings).RuleId);

        repo.Write("house/ACME101/rule.yaml", Rule("ACME101"));
        var (file, line, text) = Only(Check(repo));
        Assert.Equal(("house/ACME101/rule.yaml", 1), (file, line));
        Assert.Contains("declare the prefix in the pack folder's pack.yaml ('prefix: ACME')", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Fixture_folders_of_a_configured_pack_are_not_plant_files()
    {
        using var repo = Repo("packs: [acme]\n");
        repo.Write("acme/pack.yaml", "prefix: ACME\n");
        repo.Write("acme/ACME101/rule.yaml", Rule("ACME101"));
        // A fixture motor broken on purpose (a bare number for a current: SL006 if it were read).
        repo.Write("acme/ACME101/fixtures/bus.yaml", Samples.Bus);
        repo.Write("acme/ACME101/fixtures/fires.yaml", Samples.MotorWith("    pickup: 7.2 A sec", "    # expect: ACME101\n    pickup: 7.2").Replace("../buses/bus-1.yaml", "bus.yaml", StringComparison.Ordinal));
        var result = Check(repo);
        Assert.Empty(result.Notifications);
        Assert.DoesNotContain(result.CheckedFiles, f => f.StartsWith("acme/", StringComparison.Ordinal));
        Assert.Equal([Motor], result.Findings.Select(f => f.File).Distinct());

        // Named one by one, a fixture is still not a plant file.
        var named = Linter.Check(new CheckRequest(repo.Root, [repo.PathOf("acme/ACME101/fixtures/fires.yaml")]));
        Assert.Empty(named.Findings);
        Assert.Empty(named.CheckedFiles);

        // Not configured as a pack, the same folder is just files of the repository.
        repo.Write(".settinglint.yaml", "packs: []\n");
        Assert.Contains(Check(repo).Findings, f => f.File == "acme/ACME101/fixtures/fires.yaml" && f.RuleId == "SL006");
    }

    [Fact]
    public void The_fixture_runner_holds_a_pack_to_its_prefix()
    {
        using var repo = new TempRepo();
        repo.Write("acme/pack.yaml", "prefix: ACME\n");
        repo.Write("acme/ACME101/rule.yaml", Rule("ACME101"));
        repo.Write("acme/ACME101/fixtures/bus.yaml", Samples.Bus);
        repo.Write("acme/ACME101/fixtures/fires.yaml", Samples.MotorWith("    pickup: 7.2 A sec", "    # expect: ACME101 actual=108 A limit=1 A\n    pickup: 7.2 A sec").Replace("../buses/bus-1.yaml", "bus.yaml", StringComparison.Ordinal));
        var (results, problems) = FixtureRunner.Run(repo.PathOf("acme"));
        Assert.Empty(problems);
        var r = Assert.Single(results);
        Assert.True(r.Passed, string.Join("; ", r.Problems.Concat(r.WrongValues)));
        Assert.Equal(("ACME101", 2), (r.RuleId, r.CheckedValues));

        repo.Write("acme/pack.yaml", "prefix: BETA\n");
        var (_, wrong) = FixtureRunner.Run(repo.PathOf("acme/ACME101"));
        Assert.Contains("this pack's ids are its prefix BETA", Assert.Single(wrong).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void The_demo_s_company_pack_loads_with_its_prefix_and_its_fixtures_pass()
    {
        var pack = Path.Combine(RepositoryPaths.Root(), "examples", "firm-rules");
        var (results, problems) = FixtureRunner.Run(pack);
        Assert.Empty(problems);
        Assert.Equal(["TWE101"], results.Select(r => r.RuleId));
        Assert.All(results, r => Assert.True(r.Passed));
    }
}
