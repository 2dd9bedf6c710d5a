namespace SettingLint.Cli.Tests;

/// <summary>The markdown summary end to end: `--format markdown`, `--summary FILE` beside another format, exit codes.</summary>
public sealed class GateSummaryTests
{
    [Fact]
    public void The_summary_tables_new_findings_with_their_numbers_and_exits_like_any_format()
    {
        using var git = new GateGitRepo();
        git.Commit("clean");
        Assert.Equal(0, Cli.Run(["check", git.Root, "--format", "markdown"]).Exit);
        git.Edit(GateGitRepo.Bus, "fault_current_max: 18 kA", "fault_current_max: 40 kA");

        var run = Cli.Run(["check", git.Root, "--format", "markdown", "--changed-since", "HEAD", "--link-base", "https://git.example.invalid/plant/blob/abc/"]);
        Assert.Equal(1, run.Exit);
        Assert.StartsWith("## SettingLint: the gate fails\n", run.Stdout, StringComparison.Ordinal);
        var row = run.Stdout.Split('\n').Single(l => l.StartsWith("| error | SL203 |", StringComparison.Ordinal));
        Assert.Contains("[motors/p-201.yaml:41](https://git.example.invalid/plant/blob/abc/motors/p-201.yaml#L41)", row, StringComparison.Ordinal);
        Assert.EndsWith("| 31.5 kA | 40 kA | -8.5 kA |", row, StringComparison.Ordinal);
        Assert.Contains("**Motors checked (2):** P-201, P-301", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("Changed since HEAD: 1 file changed, 0 deleted; 2 dependants re-checked", run.Stdout, StringComparison.Ordinal);
        Assert.EndsWith("> These rules screen settings for review; they do not replace a protection study by a qualified engineer. Local codes and licensed practice prevail.\n", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void Summary_appends_the_markdown_beside_the_main_report()
    {
        using var git = new GateGitRepo();
        var summary = git.Temp.WriteOutside("step-summary.md", "# Earlier step\n");
        var sarif = Path.Combine(git.Temp.Outer, "out.sarif");
        var run = Cli.Run(["check", git.Root, "--format", "sarif", "--output", sarif, "--summary", summary]);
        Assert.Equal(0, run.Exit);
        Assert.True(File.Exists(sarif));
        var text = File.ReadAllText(summary);
        Assert.StartsWith("# Earlier step\n## SettingLint: the gate passes\n", text, StringComparison.Ordinal);
    }
}
