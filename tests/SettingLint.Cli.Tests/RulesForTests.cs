using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// `rules list --for PATH` and `rules show ID --for PATH`: the rules as a folder's configuration sets them (its
/// `.settinglint.yaml` over the root's, key by key), with the files and lines the values come from.
/// </summary>
public sealed class RulesForTests
{
    private const string RootConfig = """
        fail_on: error
        rules:
          SL201: warning
          SL205:
            parameters:
              coordination_margin: 0.3 s

        """;

    private const string SiteConfig = """
        # A site that treats SL201 as its own business and allows a smaller margin.
        electrical_code: IEC 60364
        rules:
          SL201: off
          SL205:
            parameters:
              coordination_margin: 0.25 s

        """;

    private static TempRepo TwoSites()
    {
        var repo = new TempRepo();
        repo.Write(".settinglint.yaml", RootConfig);
        repo.Write("site-a/.settinglint.yaml", SiteConfig);
        repo.Write("site-a/motors/m-1.yaml", Samples.Motor);
        repo.Write("site-b/motors/m-1.yaml", Samples.Motor);
        return repo;
    }

    private static string Line(string stdout, string id) => stdout.Split('\n').Single(l => l.StartsWith(id + " ", StringComparison.Ordinal));

    [Fact]
    public void A_folders_list_shows_its_own_levels_and_says_which_files_set_them()
    {
        using var repo = TwoSites();
        var site = Cli.Run("rules", "list", "--for", repo.PathOf("site-a/motors/m-1.yaml"));
        Assert.Equal((0, ""), (site.Exit, site.Stderr));
        Assert.Equal("Rules in effect for site-a/motors/m-1.yaml (configuration: .settinglint.yaml, site-a/.settinglint.yaml; electrical_code: IEC 60364 (site-a/.settinglint.yaml:2))",
            site.Stdout.Split('\n')[0]);
        Assert.StartsWith("SL201  none ", Line(site.Stdout, "SL201"), StringComparison.Ordinal);

        // Another folder without a file of its own has the root's view; so has the list without --for.
        var other = Cli.Run("rules", "list", "--for", repo.PathOf("site-b"));
        Assert.Equal("Rules in effect for site-b (configuration: .settinglint.yaml; electrical_code: not declared)", other.Stdout.Split('\n')[0]);
        Assert.StartsWith("SL201  warning ", Line(other.Stdout, "SL201"), StringComparison.Ordinal);
        // A rule neither file names keeps its own level in both.
        Assert.Equal(Line(site.Stdout, "SL205"), Line(other.Stdout, "SL205"));
    }

    [Fact]
    public void A_folders_list_in_json_carries_its_levels()
    {
        using var repo = TwoSites();
        var run = Cli.Run("rules", "list", "--for", repo.PathOf("site-a"), "--format", "json");
        Assert.Equal(0, run.Exit);
        using var doc = System.Text.Json.JsonDocument.Parse(run.Stdout);
        var sl201 = doc.RootElement.EnumerateArray().Single(e => e.GetProperty("id").GetString() == "SL201");
        Assert.Equal("none", sl201.GetProperty("severity").GetString());
    }

    [Fact]
    public void Show_for_a_folder_gives_the_parameter_in_effect_there_and_where_it_was_set()
    {
        using var repo = TwoSites();
        var site = Cli.Run("rules", "show", "SL205", "--for", repo.PathOf("site-a/motors/m-1.yaml"));
        Assert.Equal((0, ""), (site.Exit, site.Stderr));
        Assert.Contains("Parameters (default -> in effect for site-a/motors/m-1.yaml):", site.Stdout, StringComparison.Ordinal);
        Assert.Matches(@"\n  coordination_margin: [^\n]* -> 250 ms \(site-a/\.settinglint\.yaml:7\)   ", site.Stdout);
        var other = Cli.Run("rules", "show", "SL205", "--for", repo.PathOf("site-b"));
        Assert.Matches(@"\n  coordination_margin: [^\n]* -> 300 ms \(\.settinglint\.yaml:6\)   ", other.Stdout);

        var off = Cli.Run("rules", "show", "SL201", "--for", repo.PathOf("site-a"));
        Assert.Contains("\nSL201 (none; default error): ", off.Stdout, StringComparison.Ordinal);
        Assert.Contains("\nLevel set in: site-a/.settinglint.yaml:4\n", off.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void A_path_that_does_not_exist_is_refused()
    {
        using var repo = TwoSites();
        var run = Cli.Run("rules", "list", "--for", repo.PathOf("site-c"));
        Assert.Equal(2, run.Exit);
        Assert.Equal($"settinglint: the path '{repo.PathOf("site-c")}' does not exist.\n", run.Stderr.ReplaceLineEndings("\n"));
    }

    [Fact]
    public void The_demos_intake_site_lists_its_own_governing_code()
    {
        // examples/intake/.settinglint.yaml declares IEC 60364 for its folder (a 50 Hz site); the main site is under NFPA 70.
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        var intake = Cli.Run("rules", "list", "--for", Path.Combine(examples, "intake"));
        Assert.Equal((0, ""), (intake.Exit, intake.Stderr));
        Assert.Equal("Rules in effect for examples/intake (configuration: examples/.settinglint.yaml, examples/intake/.settinglint.yaml; electrical_code: IEC 60364 (examples/intake/.settinglint.yaml:4))",
            intake.Stdout.Split('\n')[0]);
        var main = Cli.Run("rules", "show", "SL801", "--for", Path.Combine(examples, "motors"));
        Assert.StartsWith("Rules in effect for examples/motors (configuration: examples/.settinglint.yaml; electrical_code: NFPA 70 (examples/.settinglint.yaml:5))\nSL801 (error; default error): ",
            main.Stdout.ReplaceLineEndings("\n"), StringComparison.Ordinal);
    }
}
