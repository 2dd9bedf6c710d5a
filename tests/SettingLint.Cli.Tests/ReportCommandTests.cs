using System.Diagnostics;
using System.Text.Json;
using SettingLint.Core.Findings;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>`settinglint report`: the folder it writes, its options, its exit codes and the change view against a git revision.</summary>
public sealed class ReportCommandTests
{
    private static string Examples => Path.Combine(RepositoryPaths.Root(), "examples");

    private const string Caution = "These rules screen settings for review; they do not replace a protection study by a qualified engineer. Local codes and licensed practice prevail.";

    [Fact]
    public void Report_writes_an_index_a_page_per_motor_and_the_plots()
    {
        using var repo = new TempRepo();
        var output = Path.Combine(repo.Outer, "out");
        var run = Cli.Run("report", Examples, "--output", output);
        Assert.True(run.Exit == ExitCodes.Clean, run.ToString());
        Assert.Contains("11 motors", run.Stdout, StringComparison.Ordinal);
        Assert.Contains(Caution, run.Stdout, StringComparison.Ordinal);
        Assert.True(File.Exists(Path.Combine(output, "index.html")));
        Assert.Equal(11, Directory.GetFiles(Path.Combine(output, "motors"), "*.html").Length);
        Assert.Equal(22, Directory.GetFiles(Path.Combine(output, "svg"), "*.svg").Length);
        var index = File.ReadAllText(Path.Combine(output, "index.html"));
        foreach (var tag in (string[])["B-401", "P-201", "P-202", "P-301", "P-302", "P-501", "P-502", "P-503"])
        {
            Assert.Contains("data-motor=\"" + tag + "\"", index, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Help_carries_the_caution()
    {
        var run = Cli.Run("report", "--help");
        Assert.Equal(ExitCodes.Clean, run.Exit);
        Assert.Contains(Caution, run.Stdout.ReplaceLineEndings(" ").Replace("  ", " ", StringComparison.Ordinal), StringComparison.Ordinal);
        Assert.Contains("--near-miss", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("--changed-since", run.Stdout, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("150%")]
    [InlineData("-5%")]
    [InlineData("ten")]
    public void A_bad_near_miss_is_a_usage_error(string value)
    {
        var run = Cli.Run("report", Examples, "--format", "json", "--near-miss", value);
        Assert.Equal(ExitCodes.Usage, run.Exit);
        Assert.Contains("--near-miss", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Json_has_margins_and_windows_and_follows_the_near_miss_share()
    {
        var at10 = Cli.Run("report", Examples, "--format", "json");
        var at0 = Cli.Run("report", Examples, "--format", "json", "--near-miss", "0%");
        Assert.True(at10.Exit == ExitCodes.Clean, at10.ToString());
        var motors = at10.Json.GetProperty("motors").EnumerateArray().ToList();
        Assert.Equal(11, motors.Count);
        Assert.Equal(0.1, at10.Json.GetProperty("nearMiss").GetDouble(), 12);
        Assert.All(motors, m => Assert.True(m.GetProperty("margins").GetArrayLength() > 10));
        Assert.Contains(motors, m => m.GetProperty("windows").EnumerateArray().Any(w => w.GetProperty("setting").GetString() == "protection.acceleration.time"));
        int NearMisses(CliRun r) => r.Json.GetProperty("motors").EnumerateArray().Sum(m => m.GetProperty("counts").GetProperty("nearMisses").GetInt32());
        Assert.True(NearMisses(at10) > 0);
        Assert.Equal(0, NearMisses(at0));
    }

    [Fact]
    public void A_missing_path_or_a_bad_configuration_is_a_usage_error()
    {
        Assert.Equal(ExitCodes.Usage, Cli.Run("report", Path.Combine(Examples, "no-such-folder"), "--format", "json").Exit);
        using var repo = Cli.Repo();
        repo.Write(".settinglint.yaml", "fail_on: sometimes\n");
        var run = Cli.Run("report", repo.Root, "--format", "json");
        Assert.Equal(ExitCodes.Usage, run.Exit);
        Assert.Contains(".settinglint.yaml", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Changed_since_marks_changed_settings_margins_and_findings_old_and_new()
    {
        using var repo = new TempRepo(git: false);
        CopyExamples(repo.Root);
        Git(repo.Root, "init", "-q");
        Git(repo.Root, "add", "-A");
        Git(repo.Root, "commit", "-q", "-m", "demo");
        // Fix P-202's planted pickup (46 A primary becomes 46 A secondary), drop P-502, add a copy of P-301.
        var p202 = Path.Combine(repo.Root, "examples", "motors", "p-202.yaml");
        File.WriteAllText(p202, Samples.Replace(File.ReadAllText(p202), "pickup: 46 A pri", "pickup: 46 A sec"));
        File.Delete(Path.Combine(repo.Root, "examples", "motors", "p-502.yaml"));
        File.WriteAllText(Path.Combine(repo.Root, "examples", "motors", "p-303.yaml"),
            Samples.Replace(File.ReadAllText(Path.Combine(repo.Root, "examples", "motors", "p-301.yaml")), "tag: P-301", "tag: P-303"));

        var run = Cli.Run("report", Path.Combine(repo.Root, "examples"), "--format", "json", "--changed-since", "HEAD");
        Assert.True(run.Exit == ExitCodes.Clean, run.ToString());
        Assert.Equal("HEAD", run.Json.GetProperty("changedSince").GetString());
        var motors = run.Json.GetProperty("motors").EnumerateArray().ToDictionary(m => m.GetProperty("tag").GetString()!);
        JsonElement Change(string tag) => motors[tag].GetProperty("change");
        Assert.Equal("unchanged", Change("P-301").GetProperty("kind").GetString());
        Assert.Equal("added", Change("P-303").GetProperty("kind").GetString());
        Assert.Equal("P-502", run.Json.GetProperty("removedMotors")[0].GetProperty("tag").GetString());

        var changed = Change("P-202");
        Assert.Equal("changed", changed.GetProperty("kind").GetString());
        var pickup = changed.GetProperty("settings").EnumerateArray().Single(s => s.GetProperty("path").GetString() == "protection.short_circuit.pickup");
        Assert.Equal("46 A pri", pickup.GetProperty("old").GetString());
        Assert.Equal("46 A sec (1.84 kA pri)", pickup.GetProperty("new").GetString());
        var sl201 = changed.GetProperty("margins").EnumerateArray().Single(m => m.GetProperty("key").GetString() == "SL201 protection.short_circuit.pickup");
        Assert.False(sl201.GetProperty("old").GetProperty("passed").GetBoolean());
        Assert.True(sl201.GetProperty("new").GetProperty("passed").GetBoolean());
        Assert.StartsWith("46 A pri", sl201.GetProperty("old").GetProperty("actual").GetString(), StringComparison.Ordinal);
        Assert.StartsWith("1.84 kA pri", sl201.GetProperty("new").GetProperty("actual").GetString(), StringComparison.Ordinal);
        var fixedIds = changed.GetProperty("fixedFindings").EnumerateArray().Select(f => f.GetProperty("ruleId").GetString()!).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(["SL108", "SL201"], fixedIds);
        Assert.Empty(changed.GetProperty("newFindings").EnumerateArray());

        // The same in HTML: the motor page shows the change, old value beside the new one.
        var output = Path.Combine(repo.Outer, "out");
        Assert.Equal(ExitCodes.Clean, Cli.Run("report", Path.Combine(repo.Root, "examples"), "--output", output, "--changed-since", "HEAD").Exit);
        var page = File.ReadAllText(Path.Combine(output, "motors", "p-202.html"));
        Assert.Contains("Changes since <code>HEAD</code>", page, StringComparison.Ordinal);
        Assert.Contains("46 A sec (1.84 kA pri)", page, StringComparison.Ordinal);
        Assert.Contains("<span class=\"was\">was 46 A pri", page, StringComparison.Ordinal);
        var index = File.ReadAllText(Path.Combine(output, "index.html"));
        Assert.Contains("Motors removed since", index, StringComparison.Ordinal);
        // The repository itself is left as it was: the old side lives in a temporary copy.
        Assert.Contains("46 A sec", File.ReadAllText(p202), StringComparison.Ordinal);
        Assert.False(File.Exists(Path.Combine(repo.Root, "examples", "motors", "p-502.yaml")));
    }

    // P-202's planted 46 A pri is below SL201's 1761 A (1.7 x its 1036 A start at 4370 V, common practice) and the relay's
    // 200 A minimum (SL108); the lowest 0.01 xCT step (2 A through its 200:5 CT) above is 1762 A pri, written as primary.
    [Fact]
    public void The_page_shows_the_suggested_value_with_the_finding_and_beside_the_window()
    {
        using var repo = new TempRepo();
        var output = Path.Combine(repo.Outer, "out");
        Assert.Equal(ExitCodes.Clean, Cli.Run("report", Examples, "--output", output).Exit);
        var page = File.ReadAllText(Path.Combine(output, "motors", "p-202.html"));
        var findings = page[page.IndexOf("<h2 id=\"findings\">", StringComparison.Ordinal)..page.IndexOf("<h2 id=\"plots\">", StringComparison.Ordinal)];
        var sl201 = findings[findings.IndexOf("<tr data-rule=\"SL201\">", StringComparison.Ordinal)..];
        Assert.StartsWith("<tr data-rule=\"SL201\">", sl201, StringComparison.Ordinal);
        Assert.Contains("suggested: <b>1762 A pri</b>", sl201[..sl201.IndexOf("</tr>", StringComparison.Ordinal)], StringComparison.Ordinal);
        var windows = page[page.IndexOf("<h2 id=\"windows\">", StringComparison.Ordinal)..page.IndexOf("<h2 id=\"margins\">", StringComparison.Ordinal)];
        var row = windows[windows.IndexOf("data-setting=\"protection.short_circuit.pickup\"", StringComparison.Ordinal)..];
        Assert.Contains("suggested: <b>1762 A pri</b>", row[..row.IndexOf("</tr>", StringComparison.Ordinal)], StringComparison.Ordinal);
        // A motor without findings suggests nothing.
        Assert.DoesNotContain("suggested:", File.ReadAllText(Path.Combine(output, "motors", "p-201.html")), StringComparison.Ordinal);
    }

    // P-201's 50P lowered from 46 A sec to 30 A sec (1200 A pri) is below SL201's 1761 A; the lowest 0.01 xCT step above
    // through its 200:5 CT is 1762 A = 44.05 A sec, written in A sec as the file writes it.
    [Fact]
    public void The_change_view_shows_what_fix_would_write()
    {
        using var repo = new TempRepo(git: false);
        CopyExamples(repo.Root);
        Git(repo.Root, "init", "-q");
        Git(repo.Root, "add", "-A");
        Git(repo.Root, "commit", "-q", "-m", "demo");
        var p201 = Path.Combine(repo.Root, "examples", "motors", "p-201.yaml");
        File.WriteAllText(p201, Samples.Replace(File.ReadAllText(p201), "pickup: 46 A sec ", "pickup: 30 A sec "));

        var output = Path.Combine(repo.Outer, "out");
        Assert.Equal(ExitCodes.Clean, Cli.Run("report", Path.Combine(repo.Root, "examples"), "--output", output, "--changed-since", "HEAD").Exit);
        var page = File.ReadAllText(Path.Combine(output, "motors", "p-201.html"));
        var changes = page[page.IndexOf("<h2 id=\"changes\">", StringComparison.Ordinal)..page.IndexOf("<h2 id=\"findings\">", StringComparison.Ordinal)];
        Assert.Contains("What <code>settinglint fix</code> would write", changes, StringComparison.Ordinal);
        var row = changes[changes.IndexOf("<table class=\"fix-changes\">", StringComparison.Ordinal)..];
        row = row[row.IndexOf("<tr data-path=\"protection.short_circuit.pickup\">", StringComparison.Ordinal)..];
        row = row[..row.IndexOf("</tr>", StringComparison.Ordinal)];
        Assert.Contains("suggested: <b>44.05 A sec</b>", row, StringComparison.Ordinal);
        Assert.Contains("30 A sec", row, StringComparison.Ordinal);
        // The report writes nothing into the repository.
        Assert.Contains("pickup: 30 A sec ", File.ReadAllText(p201), StringComparison.Ordinal);
    }

    [Fact]
    public void An_output_folder_that_cannot_be_written_is_a_usage_error()
    {
        using var repo = new TempRepo();
        var blocked = repo.Write("not-a-folder", "a file where the report folder should go\n");
        var run = Cli.Run("report", Examples, "--output", blocked);
        Assert.Equal(ExitCodes.Usage, run.Exit);
        Assert.Contains("cannot write the report", run.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void Report_on_one_motor_file_has_that_motor_only()
    {
        var run = Cli.Run("report", Path.Combine(Examples, "motors", "p-503.yaml"), "--format", "json");
        Assert.True(run.Exit == ExitCodes.Clean, run.ToString());
        var motor = Assert.Single(run.Json.GetProperty("motors").EnumerateArray());
        Assert.Equal("P-503", motor.GetProperty("tag").GetString());
        // The planted acceleration timer: 5 s against above 1.1 x the 8 s soft start; the window says so.
        var timer = motor.GetProperty("windows").EnumerateArray().Single(w => w.GetProperty("setting").GetString() == "protection.acceleration.time");
        Assert.False(timer.GetProperty("holds").GetBoolean());
        Assert.Equal("SL701", timer.GetProperty("lower").GetProperty("ruleId").GetString());
        Assert.Equal(8.8, timer.GetProperty("lower").GetProperty("limit").GetDouble(), 9);
    }

    [Fact]
    public void Changed_since_needs_a_git_revision()
    {
        using var repo = new TempRepo(git: false);
        CopyExamples(repo.Root);
        Git(repo.Root, "init", "-q");
        Git(repo.Root, "add", "-A");
        Git(repo.Root, "commit", "-q", "-m", "demo");
        var run = Cli.Run("report", repo.Root, "--format", "json", "--changed-since", "no-such-branch");
        Assert.Equal(ExitCodes.Usage, run.Exit);
        Assert.Contains("no-such-branch", run.Stderr, StringComparison.Ordinal);
    }

    private static void CopyExamples(string root)
    {
        foreach (var file in Directory.GetFiles(Examples, "*", SearchOption.AllDirectories))
        {
            var target = Path.Combine(root, "examples", Path.GetRelativePath(Examples, file));
            Directory.CreateDirectory(Path.GetDirectoryName(target)!);
            File.Copy(file, target);
        }
    }

    private static void Git(string dir, params string[] args)
    {
        var start = new ProcessStartInfo("git") { WorkingDirectory = dir, RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in (string[])["-c", "user.name=Test", "-c", "user.email=test@example.invalid", "-c", "commit.gpgsign=false", "-c", "init.defaultBranch=main"]) start.ArgumentList.Add(a);
        foreach (var a in args) start.ArgumentList.Add(a);
        using var p = Process.Start(start)!;
        var err = p.StandardError.ReadToEnd();
        p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, "git " + string.Join(' ', args) + ": " + err);
    }
}
