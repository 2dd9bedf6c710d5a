using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>`config show PATH`: the configuration that governs a file, value by value, with the file and line of each.</summary>
public sealed class ConfigCommandTests
{
    private const string RootConfig = """
        fail_on: warning
        electrical_code: NFPA 70
        rules:
          SL201: warning
          SL205:
            parameters:
              coordination_margin: 0.3 s

        """;

    // An invented 50 Hz site under IEC practice.
    private const string HarbourConfig = """
        # Harbour Works: a 50 Hz site under IEC practice.
        electrical_code: IEC 60364
        exclude:
          - drafts/**
        rules:
          SL201: off
          SL205:
            parameters:
              coordination_margin: 0.25 s

        """;

    // The sample motor with its thermal element at 1.3 x FLC, above the 1.25 x FLC of NFPA 70 430.32(A)(1) for a
    // service factor of 1.15: SL801 wherever NFPA 70 governs.
    private static string Motor(string tag) => Samples.ThermalAbove125Tagged(tag);

    private static TempRepo TwoSites()
    {
        var repo = new TempRepo();
        repo.Write(".settinglint.yaml", RootConfig);
        repo.Write("harbour-works/.settinglint.yaml", HarbourConfig);
        repo.Write("harbour-works/buses/bus-1.yaml", Samples.Replace(Samples.Bus, "nominal_voltage: 4160 V\n", "nominal_voltage: 4160 V\nfrequency: 50 Hz\n"));
        repo.Write("harbour-works/motors/m-1.yaml", Motor("HW-P1"));
        repo.Write("mill-road/buses/bus-1.yaml", Samples.Bus);
        repo.Write("mill-road/motors/m-1.yaml", Motor("MR-P1"));
        return repo;
    }

    [Fact]
    public void Shows_each_value_of_a_folders_file_over_the_roots_with_its_file_and_line()
    {
        using var repo = TwoSites();
        var run = Cli.Run("config", "show", repo.PathOf("harbour-works/motors/m-1.yaml"));
        Assert.Equal(0, run.Exit);
        Assert.Equal("""
            Configuration of harbour-works/motors/m-1.yaml
            files (farthest first): .settinglint.yaml, harbour-works/.settinglint.yaml

            fail_on: warning  (.settinglint.yaml:1)
            packs: builtin  (default)
            electrical_code: IEC 60364  (harbour-works/.settinglint.yaml:2)
            include: every YAML file  (default)
            exclude: drafts/**  (harbour-works/.settinglint.yaml:4)
            rules.SL201: off  (harbour-works/.settinglint.yaml:6)
            rules.SL205.parameters.coordination_margin: 0.25 s  (harbour-works/.settinglint.yaml:9)
            other rules: at their own level, with their own parameters

            """, run.Stdout);
    }

    // A repository whose configuration lives in a sub-folder (as this one's demo does), checked from its top: the one
    // outermost file below is the run's root configuration, so its packs and fail_on hold and are not refused as a
    // folder's. With two side by side, neither is.
    [Fact]
    public void Checked_from_above_the_one_outermost_file_below_is_the_root_configuration()
    {
        using var repo = new TempRepo();
        repo.Write("site/.settinglint.yaml", "fail_on: warning\npacks:\n  - builtin\n");
        repo.Write("site/north/.settinglint.yaml", "electrical_code: IEC 60364\n");
        var one = Cli.Run("check", repo.Root);
        Assert.Equal(0, one.Exit);
        var shown = Cli.Run("config", "show", repo.Root);
        Assert.Contains("fail_on: warning  (site/.settinglint.yaml:1)", shown.Stdout, StringComparison.Ordinal);

        repo.Write("other/.settinglint.yaml", "electrical_code: NFPA 70\n");
        shown = Cli.Run("config", "show", repo.Root);
        Assert.Contains("fail_on: error  (default)", shown.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void A_folder_without_a_file_of_its_own_shows_the_roots_values()
    {
        using var repo = TwoSites();
        var run = Cli.Run("config", "show", repo.PathOf("mill-road/motors"));
        Assert.Equal(0, run.Exit);
        Assert.Equal("""
            Configuration of mill-road/motors
            files (farthest first): .settinglint.yaml

            fail_on: warning  (.settinglint.yaml:1)
            packs: builtin  (default)
            electrical_code: NFPA 70  (.settinglint.yaml:2)
            include: every YAML file  (default)
            exclude: none  (default)
            rules.SL201: warning  (.settinglint.yaml:4)
            rules.SL205.parameters.coordination_margin: 0.3 s  (.settinglint.yaml:7)
            other rules: at their own level, with their own parameters

            """, run.Stdout);
    }

    // The check applies what config show says: NFPA 70 430.32(A)(1) (SL801) at Mill Road only, SL201 off at Harbour Works.
    [Fact]
    public void The_check_applies_each_folders_configuration_Nfpa70_430_32_A_1()
    {
        using var repo = TwoSites();
        var run = Cli.CheckJson(repo);
        Assert.True(run.Exit is 0 or 1, run.ToString());
        var rules = run.Findings.GroupBy(f => f.File).ToDictionary(g => g.Key, g => g.Select(f => f.Rule).ToHashSet());
        Assert.DoesNotContain("SL801", rules.GetValueOrDefault("harbour-works/motors/m-1.yaml") ?? []);
        Assert.DoesNotContain("SL201", rules.GetValueOrDefault("harbour-works/motors/m-1.yaml") ?? []);
        Assert.Contains("SL801", rules["mill-road/motors/m-1.yaml"]);
        Assert.Contains("SL201", rules["mill-road/motors/m-1.yaml"]);
    }

    [Fact]
    public void A_folders_file_that_sets_another_fail_on_is_refused_at_its_line()
    {
        using var repo = TwoSites();
        repo.Write("mill-road/.settinglint.yaml", "# Mill Road\nfail_on: never\n");
        var run = Cli.Run("config", "show", repo.PathOf("mill-road/motors/m-1.yaml"));
        Assert.Equal(2, run.Exit);
        Assert.StartsWith("mill-road/.settinglint.yaml:2:10: error: Configuration: fail_on holds for the whole run", run.Stderr, StringComparison.Ordinal);
        Assert.Equal(2, Cli.CheckJson(repo).Exit);
    }
}
