using System.Collections.Immutable;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

public sealed class TextReporterTests
{
    private static string[] Lines(CheckResult result, ReportContext context)
    {
        var text = Samples.Render(new TextReporter(), result, context);
        Assert.EndsWith("\n", text, StringComparison.Ordinal);
        Assert.DoesNotContain('\r', text);
        return text[..^1].Split('\n');
    }

    [Fact]
    public void Paths_are_relative_to_a_current_directory_inside_the_root()
    {
        Assert.Equal(
        [
            "P-101A.yaml:4:3: error SL201: pickup 2400 A is below 1.6 x locked-rotor current 1620 A",
            "P-102 spare.yaml:12:7: note SL305: undervoltage delay 0.2 s is shorter than the transfer time bus B-1 transfer",
            "settinglint: accepted SL112: 1 finding accepted in the source, in P-101A.yaml (--show-accepted lists them)",
            "Rules:",
            "  SL201  Instantaneous pickup is below the asymmetric locked-rotor current.  (settinglint rules show SL201)",
            "  SL305  Undervoltage delay is shorter than the bus transfer time.  (settinglint rules show SL305)",
            "1 error, 0 warnings, 1 note in 3 files (3 motors); 1 accepted in the source",
        ], Lines(Samples.Result(), Samples.Context("/r/motors")));
    }

    [Fact]
    public void Show_accepted_lists_each_accepted_finding_with_its_reason()
    {
        var lines = Lines(Samples.Result(), Samples.Context("/r/motors") with { ShowAccepted = true });
        Assert.Equal("P-101A.yaml:9:5: warning SL112: thermal trip time 8.5 s is shorter than start time 9.2 s [suppressed: accepted for the 2024 outage, see MOC-17]", lines[1]);
        Assert.DoesNotContain(lines, l => l.StartsWith("settinglint: accepted", StringComparison.Ordinal));
        Assert.Contains("  SL112  Thermal trip time is shorter than the start time.  (settinglint rules show SL112)", lines);
    }

    [Fact]
    public void Accepted_findings_of_one_rule_in_many_files_are_one_line()
    {
        var accepted = Enumerable.Range(1, 5).Select(i => Samples.ThermalSuppressed with { File = $"motors/M-{i}.yaml" }).ToList();
        var result = Samples.Result() with { Findings = [Samples.Pickup, .. accepted] };
        var lines = Lines(result, Samples.Context("/r"));
        Assert.Equal("settinglint: accepted SL112: 5 findings accepted in the source, in motors/M-1.yaml, motors/M-2.yaml, motors/M-3.yaml and 2 other files (--show-accepted lists them)", Assert.Single(lines, l => l.Contains("accepted SL112", StringComparison.Ordinal)));
        Assert.Equal("1 error, 0 warnings, 0 notes in 3 files (3 motors); 5 accepted in the source", lines[^1]);
    }

    [Fact]
    public void New_in_the_baseline_accepted_and_gate_changes_are_counted_apart()
    {
        // Every number of the summary says where its findings are: the errors are the lines listed, the rest are named.
        var baselined = Samples.Pickup with { File = "motors/K-201.yaml", BaselineState = BaselineState.Unchanged };
        var fresh = Samples.Pickup with { BaselineState = BaselineState.New };
        var accepted = Samples.ThermalSuppressed with { Level = Level.Error, BaselineState = BaselineState.New };
        var gateChange = new Finding(EngineRules.GateChange, Level.Warning, ".settinglint.yaml", new Core.Documents.SourceSpan(2, 1, 2, 9), "rules.SL201", "SL201 switched off", ImmutableSortedDictionary<string, FindingValue>.Empty) { BaselineState = BaselineState.New };
        var result = Samples.Result() with { Findings = [gateChange, baselined, fresh, accepted], BaselineFile = "settinglint.baseline" };
        var lines = Lines(result, Samples.Context("/r"));
        Assert.Equal(".settinglint.yaml:2:1: warning SL011: SL201 switched off", lines[0]);
        Assert.Equal("motors/P-101A.yaml:4:3: error SL201: pickup 2400 A is below 1.6 x locked-rotor current 1620 A", lines[1]);
        Assert.Equal(1, lines.Count(l => l.Contains(": error SL", StringComparison.Ordinal)));
        Assert.Contains("Baseline settinglint.baseline: 1 new, 1 unchanged (not listed), 0 absent; only new findings can fail the run.", lines);
        Assert.Equal("1 error, 0 warnings, 0 notes in 3 files (3 motors); 1 in the baseline (not listed); 1 accepted in the source; 1 change to the gate (SL011)", lines[^1]);
    }

    [Fact]
    public void Paths_are_relative_to_the_root_when_standing_in_it()
    {
        Assert.StartsWith("motors/P-101A.yaml:4:3: error SL201: ", Lines(Samples.Result(), Samples.Context("/r"))[0], StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("/elsewhere", "../r/motors/P-101A.yaml:4:3: error SL201: ")]
    [InlineData("/r/buses/east", "../../motors/P-101A.yaml:4:3: error SL201: ")]
    [InlineData("/r/motors/", "P-101A.yaml:4:3: error SL201: ")]
    public void Paths_climb_out_of_a_current_directory_elsewhere(string cwd, string expectedStart)
    {
        Assert.StartsWith(expectedStart, Lines(Samples.Result(), Samples.Context(cwd))[0], StringComparison.Ordinal);
    }

    [Fact]
    public void Suppressed_findings_can_be_omitted_but_are_still_counted()
    {
        var lines = Lines(Samples.Result(), Samples.Context("/r", omitSuppressed: true));
        // Two findings, the legend of their two rules, the summary: the omitted rule is not in the legend either.
        Assert.Equal(6, lines.Length);
        Assert.DoesNotContain(lines, static l => l.Contains("SL112", StringComparison.Ordinal));
        Assert.Equal("1 error, 0 warnings, 1 note in 3 files (3 motors); 1 accepted in the source", lines[^1]);
    }

    [Fact]
    public void Notifications_come_first_located_when_they_have_a_file()
    {
        var unlocated = new Notification(NotificationKind.Configuration, "no setting files under 'plant/'");
        var lines = Lines(Samples.Result(Samples.BadConfig, unlocated, Samples.Crash), Samples.Context("/r/motors"));
        Assert.Equal("../.settinglint.yaml:3:5: error: unknown rule id SL999 in 'rules'", lines[0]);
        Assert.Equal("settinglint: error: no setting files under 'plant/'", lines[1]);
        Assert.Equal("settinglint: internal error: the evaluator failed on motor P-102", lines[2]);
        Assert.Equal("1 error, 0 warnings, 1 note in 3 files (3 motors); 1 accepted in the source; 2 configuration errors; 1 internal error", lines[^1]);
    }

    [Fact]
    public void A_notification_with_a_file_but_no_span_shows_the_file_alone()
    {
        var n = new Notification(NotificationKind.Configuration, "rule file is empty", "rules/SL900.yaml");
        Assert.Equal("rules/SL900.yaml: error: rule file is empty", Lines(Samples.Result(n), Samples.Context())[0]);
    }

    [Fact]
    public void Messages_that_span_lines_stay_on_one_line()
    {
        var n = new Notification(NotificationKind.Configuration, "bad YAML:\nmapping values are not allowed\r\nhere");
        Assert.Equal("settinglint: error: bad YAML: mapping values are not allowed here", Lines(Samples.Result(n), Samples.Context())[0]);
    }

    [Fact]
    public void A_clean_run_prints_only_the_summary()
    {
        Assert.Equal(["0 errors, 0 warnings, 0 notes in 1 file (1 motor)"], Lines(Samples.Clean(), Samples.Context()));
    }

    [Theory]
    [InlineData(0, 0, 0, 0, 0, 0, 0, 0, "0 errors, 0 warnings, 0 notes in 0 files (0 motors)")]
    [InlineData(1, 1, 1, 1, 1, 1, 1, 1, "1 error, 1 warning, 1 note in 1 file (1 motor); 1 suppressed; 1 configuration error; 1 internal error")]
    [InlineData(3, 1, 0, 1, 12, 7, 0, 0, "3 errors, 1 warning, 0 notes in 12 files (7 motors); 1 suppressed")]
    [InlineData(2, 5, 2, 0, 2, 2, 3, 2, "2 errors, 5 warnings, 2 notes in 2 files (2 motors); 3 configuration errors; 2 internal errors")]
    public void Summary_wording_gets_singular_and_plural_right(
        int errors, int warnings, int notes, int suppressed, int files, int motors, int configuration, int internalErrors, string expected)
    {
        Assert.Equal(expected, new ReportSummary(errors, warnings, notes, suppressed, files, motors, configuration, internalErrors).ToSentence());
    }

    [Theory]
    [InlineData(1, "0 errors, 0 warnings, 0 notes in 1 file (1 motor); 1 check not run for missing data")]
    [InlineData(3, "0 errors, 0 warnings, 0 notes in 1 file (1 motor); 3 checks not run for missing data")]
    public void The_summary_says_how_many_checks_were_not_run(int notRun, string expected)
    {
        Assert.Equal(expected, (new ReportSummary(0, 0, 0, 0, 1, 1, 0, 0) { NotRun = notRun }).ToSentence());
    }

    [Fact]
    public void A_clean_run_with_checks_not_run_lists_them_per_motor_with_the_missing_keys()
    {
        var result = Samples.Clean() with
        {
            NotRun =
            [
                new CheckNotRun("SL202", Level.Warning, "motors/K-201.yaml", "K-201", ["bus.fault_current_min"]),
                new CheckNotRun("SL301", Level.Error, "motors/K-201.yaml", "K-201", ["bus.ground_fault_current"]),
            ],
        };
        Assert.Equal(
        [
            "Checks not run for missing data:",
            "  ../motors/K-201.yaml (K-201): SL202 (bus.fault_current_min), SL301 (bus.ground_fault_current)",
            "0 errors, 0 warnings, 0 notes in 1 file (1 motor); 2 checks not run for missing data",
        ], Lines(result, Samples.Context("/r/ci")));
    }

    [Fact]
    public void Summary_counts_levels_of_unsuppressed_findings_only()
    {
        var suppressedError = Samples.Pickup with { Suppression = new Suppression("known", "motors/P-101A.yaml", default) };
        var result = Samples.Result() with { Findings = [suppressedError, Samples.ThermalSuppressed with { Suppression = null }, Samples.Delay] };
        Assert.Equal(new ReportSummary(0, 1, 1, 1, 3, 3, 0, 0), ReportSummary.Of(result));
    }

    [Fact]
    public void Output_is_identical_twice()
    {
        var result = Samples.Result(Samples.BadConfig);
        Assert.Equal(
            Samples.Render(new TextReporter(), result, Samples.Context("/r/motors")),
            Samples.Render(new TextReporter(), result, Samples.Context("/r/motors")));
    }

    [Fact]
    public void Findings_keep_the_order_they_are_given()
    {
        var result = Samples.Result() with { Findings = ImmutableArray.Create(Samples.Delay, Samples.Pickup) };
        var lines = Lines(result, Samples.Context());
        Assert.Contains("SL305", lines[0], StringComparison.Ordinal);
        Assert.Contains("SL201", lines[1], StringComparison.Ordinal);
    }
}
