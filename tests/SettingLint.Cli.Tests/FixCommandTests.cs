using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>`settinglint fix`: the value every rule on a setting accepts, written over exactly the old number's characters.</summary>
public sealed class FixCommandTests
{
    // SL201 (common practice, fact of the trade): pickup >= 1.7 x LRC at the bus's maximum voltage. Sample motor:
    // LRC 6.2 x 58 A = 359.6 A at 4000 V, scaled to 4370 V = 392.86 A; 1.7 x that = 667.9 A pri = 44.52 A sec (75:5 CT),
    // so the least change in the written form (one decimal of A sec) is 44.6 A sec (669 A pri).
    private const string Bus = Samples.Bus + "max_voltage: 4370 V\n";

    private static TempRepo Repo(string motor, params string[] rules)
    {
        var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Bus);
        repo.Write("motors/m-1.yaml", motor);
        // Only the rules under test (SL201 by default), from a pack of their own, so that the sample's other gaps do not matter here.
        foreach (var id in rules.Length == 0 ? ["SL201"] : rules)
        {
            var pack = Path.Combine(repo.Root, "pack", id);
            Directory.CreateDirectory(pack);
            File.Copy(Path.Combine(RepositoryPaths.Root(), "rules", id, "rule.yaml"), Path.Combine(pack, "rule.yaml"));
        }
        repo.Write(".settinglint.yaml", "packs: [pack]\n");
        return repo;
    }

    [Fact]
    public void A_secondary_value_stays_secondary_on_the_least_change()
    {
        using var repo = Repo(Samples.Motor);
        var run = Cli.Run("fix", repo.Root);
        Assert.Equal(0, run.Exit);
        Assert.Contains("set protection.short_circuit.pickup 7.2 A sec -> 44.6 A sec", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("669 A pri (44.6 A sec)", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 44.6 A sec"), File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
        Assert.Empty(Cli.CheckJson(repo).Findings);
    }

    // --rule limits the fixes to findings of the rules named: the sample's only finding is SL201's, so --rule SL202
    // changes nothing, --rule SL201 makes the fix above, and a rule that is not loaded is a usage error.
    [Fact]
    public void Rule_limits_the_fixes_to_the_rules_named()
    {
        using var repo = Repo(Samples.Motor, "SL201", "SL202");
        var other = Cli.Run("fix", repo.Root, "--rule", "SL202");
        Assert.Equal(0, other.Exit);
        Assert.Equal(Samples.Motor, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
        Assert.Equal(2, Cli.Run("fix", repo.Root, "--rule", "SL999").Exit);
        Assert.Equal(Samples.Motor, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
        var own = Cli.Run("fix", repo.Root, "--rule", "SL201");
        Assert.Contains("set protection.short_circuit.pickup 7.2 A sec -> 44.6 A sec", own.Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 44.6 A sec"), File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
    }

    // The pull-request summary carries the suggestion in its own column: the value as it would be written, and both sides.
    [Fact]
    public void The_markdown_summary_has_the_suggested_value()
    {
        using var repo = Repo(Samples.Motor);
        var run = Cli.Run("check", repo.Root, "--format", "markdown");
        Assert.Contains("| suggested |", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("| 44.6 A sec (669 A pri (44.6 A sec)) |", run.Stdout, StringComparison.Ordinal);
        Assert.DoesNotContain("| suggested |", Cli.Run("check", repo.Root, "--format", "markdown", "--no-suggest").Stdout, StringComparison.Ordinal);
    }

    // SL202 (common practice; the 1.5 security factor from memory): pickup <= 0.866 x fault_current_min / 1.5. With a
    // weakest source of 3 kA that is 1732 A pri = 115.5 A sec, so 150 A sec (2250 A pri) is too high. The least change
    // would be 115 A sec; SL201 and SL202 prefer the lowest pickup (rule.yaml's prefer), so the fix goes to the lowest
    // value above the start: 44.52 A sec rounded up in the written form (whole A sec) is 45 A sec (675 A pri).
    [Fact]
    public void A_pickup_too_high_comes_down_to_the_most_sensitive_value_above_the_start()
    {
        var motor = Samples.MotorWith("pickup: 7.2 A sec", "pickup: 150 A sec");
        using var repo = Repo(motor, "SL201", "SL202");
        repo.Write("buses/bus-1.yaml", Bus + "fault_current_min: 3 kA\n");
        Assert.Contains(Cli.CheckJson(repo).Findings, f => f.Rule == "SL202");
        var run = Cli.Run("fix", repo.Root);
        Assert.Contains("set protection.short_circuit.pickup 150 A sec -> 45 A sec: 2.25 kA pri (150 A sec) -> 675 A pri (45 A sec) [SL201, SL202] "
            + "(SL201, SL202 prefer the lowest value: the most sensitive pickup that still rides through the offset start)", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 45 A sec"), File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
        Assert.Empty(Cli.CheckJson(repo).Findings);
    }

    // The demo's B-401: a core-balance 50G at 2 A sec through a 250:5 CT is 100 A pri, above SL302's 20 % of the 400 A
    // resistor current (80 A pri, common practice). SL302 prefers the lowest pickup, but no rule bounds a core-balance
    // element from below (SL303's false residual is for residual connections), so the fix is the least change: the
    // highest 0.01 xCT step (2.5 A pri) at or below 80 A, which is 80 A = 1.6 A sec; never the relay's 0.05 xCT minimum.
    [Fact]
    public void A_preferred_side_needs_a_rule_bound_on_that_side_not_only_the_relay_range()
    {
        var run = Cli.Run("check", Path.Combine(RepositoryPaths.Root(), "examples"));
        var line = run.Stdout.Split('\n').Single(l => l.Contains("b-401.yaml:45:13: ", StringComparison.Ordinal) && l.Contains(" SL302: ", StringComparison.Ordinal));
        Assert.EndsWith("[suggested: 1.6 A sec]", line, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_shows_the_suggestion_in_text_and_json_and_leaves_the_file_alone()
    {
        using var repo = Repo(Samples.Motor);
        var text = Cli.Run("check", repo.Root);
        Assert.Contains("error SL201: ", text.Stdout, StringComparison.Ordinal);
        Assert.Contains("[suggested: 44.6 A sec]", text.Stdout, StringComparison.Ordinal);
        var json = Cli.CheckJson(repo).Json.GetProperty("findings")[0].GetProperty("suggested");
        Assert.Equal("44.6 A sec", json.GetProperty("value").GetString());
        Assert.Equal("669 A pri (44.6 A sec)", json.GetProperty("shown").GetString());
        // "    pickup: 7.2 A sec" on line 28: the value is columns 13 to 22.
        Assert.Equal((28, 13, 22), (json.GetProperty("line").GetInt32(), json.GetProperty("column").GetInt32(), json.GetProperty("endColumn").GetInt32()));
        Assert.DoesNotContain("suggested", Cli.Run("check", repo.Root, "--no-suggest").Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.Motor, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
    }

    [Fact]
    public void Crlf_flow_mappings_quotes_and_comments_are_kept_byte_for_byte()
    {
        var motor = Samples.MotorWith("  short_circuit:\n    enabled: true\n    pickup: 7.2 A sec\n",
            "  short_circuit: { enabled: true, pickup: \"7.2 A sec\", delay: 0 s }   # 50P, from sheet 12 # keep\n").Replace("\n", "\r\n", StringComparison.Ordinal);
        using var repo = Repo(motor);
        var bytes = new byte[] { 0xEF, 0xBB, 0xBF }.Concat(System.Text.Encoding.UTF8.GetBytes(motor)).ToArray();
        repo.WriteBytes("motors/m-1.yaml", bytes);
        Assert.Equal(0, Cli.Run("fix", repo.Root).Exit);
        var expected = new byte[] { 0xEF, 0xBB, 0xBF }.Concat(System.Text.Encoding.UTF8.GetBytes(motor.Replace("\"7.2 A sec\"", "\"44.6 A sec\"", StringComparison.Ordinal))).ToArray();
        Assert.Equal(expected, File.ReadAllBytes(repo.PathOf("motors/m-1.yaml")));
    }

    [Fact]
    public void An_accepted_finding_is_not_fixed_and_a_second_run_changes_nothing()
    {
        var accepted = Samples.MotorWith("pickup: 7.2 A sec", "pickup: 7.2 A sec   # settinglint-accept SL201: study 12 sets it below the start on purpose");
        using var repo = Repo(accepted);
        var run = Cli.Run("fix", repo.Root);
        Assert.Contains("changed 0 values in 0 files", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(accepted, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));

        using var plain = Repo(Samples.Motor);
        Cli.Run("fix", plain.Root);
        var once = File.ReadAllBytes(plain.PathOf("motors/m-1.yaml"));
        var again = Cli.Run("fix", plain.Root);
        Assert.Contains("changed 0 values in 0 files", again.Stdout, StringComparison.Ordinal);
        Assert.Equal(once, File.ReadAllBytes(plain.PathOf("motors/m-1.yaml")));
    }

    [Fact]
    public void Dry_run_prints_a_unified_diff_and_writes_nothing()
    {
        using var repo = Repo(Samples.Motor);
        var run = Cli.Run("fix", repo.Root, "--dry-run");
        Assert.Equal(0, run.Exit);
        Assert.Contains("--- a/motors/m-1.yaml\n+++ b/motors/m-1.yaml\n@@ -25,4 +25,4 @@\n protection:\n   short_circuit:\n     enabled: true\n-    pickup: 7.2 A sec\n+    pickup: 44.6 A sec\n", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.Motor, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
        Assert.Empty(Directory.GetFiles(repo.PathOf("motors"), ".*"));
    }

    [Fact]
    public void An_empty_window_names_the_rules_and_changes_nothing()
    {
        // A 10 s start and a 10.5 s hot stall: the 48 timer must exceed 1.1 x 10 s = 11 s (SL701) and stay below 10.5 s
        // (SL702), so no timer fits (common practice: time alone cannot tell the start from the stall).
        var motor = Samples.MotorWith("acceleration_time: 4.5 s", "acceleration_time: 10 s").Replace("safe_stall_time_hot: 10 s", "safe_stall_time_hot: 10.5 s", StringComparison.Ordinal)
            + "  acceleration:\n    enabled: true\n    time: 9 s\n";
        using var repo = Repo(motor, "SL701", "SL702");
        var run = Cli.Run("fix", repo.Root);
        Assert.Contains("no fix for protection.acceleration.time (9 s): no value satisfies every rule: SL701 needs above 11 s", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("SL702 needs below 10.5 s", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(motor, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));

        // check reports the conflict once, on the setting, with both bounds as numbers.
        var json = Cli.CheckJson(repo).Json.GetProperty("findings").EnumerateArray().Single(f => f.GetProperty("ruleId").GetString() == "SL020");
        Assert.Equal("protection.acceleration.time", json.GetProperty("keyPath").GetString());
        Assert.Equal(11, json.GetProperty("values").GetProperty("lower").GetProperty("number").GetDouble(), 9);
        Assert.Equal(10.5, json.GetProperty("values").GetProperty("upper").GetProperty("number").GetDouble(), 9);
        Assert.Equal("SL701", json.GetProperty("values").GetProperty("lower_rule").GetProperty("text").GetString());
        Assert.Equal("SL702", json.GetProperty("values").GetProperty("upper_rule").GetProperty("text").GetString());
    }

    [Fact]
    public void A_file_with_an_engine_finding_is_never_touched()
    {
        var broken = Samples.MotorWith("  winding_leads: 6\n", "  winding_leads: 6\n  winding_leads: 3\n");
        using var repo = Repo(broken);
        Cli.Run("fix", repo.Root);
        Assert.Equal(broken, File.ReadAllText(repo.PathOf("motors/m-1.yaml")));
    }

    [Fact]
    public void On_the_demo_every_fixed_setting_is_clean_after_and_nothing_new_appears()
    {
        using var repo = new TempRepo();
        CopyDirectory(Path.Combine(RepositoryPaths.Root(), "examples"), repo.Root);
        var before = Cli.CheckJson(repo).Findings;
        var run = Cli.Run("fix", repo.Root);
        Assert.Equal(0, run.Exit);
        var set = run.Stdout.Split('\n').Where(l => l.Contains(": set protection.", StringComparison.Ordinal)).ToList();
        Assert.NotEmpty(set);
        var after = Cli.CheckJson(repo).Findings;
        var gained = after.Where(f => !before.Any(b => b.Rule == f.Rule && b.File == f.File)).ToList();
        Assert.True(gained.Count == 0, "new findings: " + string.Join("; ", gained));
        foreach (var line in set)
        {
            var where = line[..line.IndexOf(": set ", StringComparison.Ordinal)].Split(':');
            Assert.DoesNotContain(after, f => f.File == where[0] && f.Line == int.Parse(where[1], System.Globalization.CultureInfo.InvariantCulture) && f.Rule != "SL110");
        }
        var again = Cli.Run("fix", repo.Root);
        Assert.Contains("changed 0 values in 0 files", again.Stdout, StringComparison.Ordinal);
    }

    private static void CopyDirectory(string from, string to)
    {
        foreach (var dir in Directory.GetDirectories(from, "*", SearchOption.AllDirectories)) Directory.CreateDirectory(dir.Replace(from, to, StringComparison.Ordinal));
        foreach (var file in Directory.GetFiles(from, "*", SearchOption.AllDirectories)) File.Copy(file, file.Replace(from, to, StringComparison.Ordinal), true);
    }
}
