using System.Collections.Immutable;
using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// The files the confirming run of the suggestions reads (<see cref="FixFinder.Reach"/>): the fixed motors, the other motors
/// on their buses and those buses' files, as the check divided them; never the motors or files of other buses.
/// </summary>
public sealed class FixReachTests
{
    private static string Motor(string tag, string bus) => Samples.Replace(Samples.Motor,
        "tag: M-1\ntitle: Test pump\nbus: ../buses/bus-1.yaml\n", $"tag: {tag}\ntitle: Test pump\nbus: {bus}\n");

    [Fact]
    public void A_fix_reads_its_motor_and_the_motors_and_file_of_its_bus()
    {
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", "packs: []\n");
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("buses/bus-2.yaml", Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: BUS-2"));
        repo.Write("motors/a/m-1.yaml", Motor("M-1", "../../buses/bus-1.yaml"));
        repo.Write("motors/m-2.yaml", Motor("M-2", "../buses/bus-2.yaml"));
        repo.Write("motors/m-3.yaml", Motor("M-3", "../buses/bus-1.yaml"));
        // A motor with its bus written inline is on a bus of its own.
        repo.Write("motors/m-4.yaml", Samples.Replace(Samples.Motor, "tag: M-1\ntitle: Test pump\nbus: ../buses/bus-1.yaml\n",
            "tag: M-4\ntitle: Test pump\nbus:\n  tag: BUS-4\n  nominal_voltage: 4160 V\n  frequency: 60 Hz\n"));
        var result = Linter.Check(new CheckRequest(repo.Root, []) { Parallel = false });

        Assert.Equal(["motors/a/m-1.yaml", "motors/m-2.yaml", "motors/m-3.yaml", "motors/m-4.yaml"], Enumerable.Range(0, result.Files.MotorCount).Select(result.Files.MotorFile));
        Assert.Equal("buses/bus-1.yaml buses/bus-2.yaml buses/bus-1.yaml (inline)", string.Join(" ", Enumerable.Range(0, result.Files.MotorCount).Select(m => result.Files.MotorBus(m) ?? "(inline)")));
        Assert.Equal(["buses/bus-1.yaml", "motors/a/m-1.yaml", "motors/m-3.yaml"], FixFinder.Reach(result, ["motors/a/m-1.yaml"]));
        Assert.Equal(["buses/bus-2.yaml", "motors/m-2.yaml"], FixFinder.Reach(result, ["motors/m-2.yaml"]));
        Assert.Equal(["motors/m-4.yaml"], FixFinder.Reach(result, ["motors/m-4.yaml"]));
        Assert.Equal(["buses/bus-1.yaml", "buses/bus-2.yaml", "motors/a/m-1.yaml", "motors/m-2.yaml", "motors/m-3.yaml"], FixFinder.Reach(result, ["motors/m-2.yaml", "motors/m-3.yaml"]));
        Assert.Empty(FixFinder.Reach(result, [])!);

        // The fixed files are confirmed a bus at a time: a piece's overlay holds its own fixes, and no other piece reads a
        // motor of its buses. Buses in path order (the inline one is its motor's own), whole buses up to the size.
        string[] fixing = ["motors/m-4.yaml", "motors/m-3.yaml", "motors/m-2.yaml", "motors/a/m-1.yaml"];
        Assert.Equal("motors/a/m-1.yaml motors/m-3.yaml motors/m-2.yaml motors/m-4.yaml", Shown(FixFinder.Pieces(fixing, result)));
        Assert.Equal("motors/a/m-1.yaml motors/m-3.yaml | motors/m-2.yaml motors/m-4.yaml", Shown(FixFinder.Pieces(fixing, result, 2)));
        Assert.Equal("motors/a/m-1.yaml motors/m-3.yaml | motors/m-2.yaml | motors/m-4.yaml", Shown(FixFinder.Pieces(fixing, result, 1)));
        Assert.Equal("motors/m-2.yaml motors/m-3.yaml", Shown(FixFinder.Pieces(["motors/m-3.yaml", "motors/m-2.yaml"], null, 1)));
    }

    private static string Shown(List<List<string>> pieces) => string.Join(" | ", pieces.Select(p => string.Join(" ", p)));

    [Fact]
    public void A_confirming_run_reads_the_relay_model_its_motor_names_though_the_reach_leaves_it_out()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        // 12.25 A sec is 2.45 x the 5 A CT secondary, between the sample relay's 50P steps of 0.1 xCT from 2 xCT: only a run
        // that reads the relay model finds SL108 (rule SL108's own fixtures hold the same arithmetic).
        repo.Write("motors/m-1.yaml", Samples.Replace(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 12.25 A sec"),
            "bus: ../buses/bus-1.yaml\n", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay-a.yaml\n"));
        var result = Linter.Check(new CheckRequest(repo.Root, []) { Parallel = false, Suggest = false });
        var expected = result.Findings.Where(f => f.File == "motors/m-1.yaml").Select(f => f.RuleId + " " + f.KeyPath).ToArray();
        Assert.Contains("SL108 protection.short_circuit.pickup", expected);

        var within = FixFinder.Reach(result, ["motors/m-1.yaml"]);
        Assert.Equal(["buses/bus-1.yaml", "motors/m-1.yaml"], within);
        var confirmed = FixFinder.Run(BuiltInRules.Load(), repo.Root, null, new DiskSource(repo.Root),
            ImmutableSortedSet.Create(StringComparer.Ordinal, "motors/m-1.yaml"), null, within);
        Assert.Equal(expected, confirmed.Findings.Where(f => f.File == "motors/m-1.yaml").Select(f => f.RuleId + " " + f.KeyPath));
    }

    private sealed class Fixes : ICheckObserver
    {
        public SuggestionSet? Set { get; private set; }

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }

    private static string Rule(string id, string when, string check, string subject) => $"""
        id: {id}
        title: A test rule
        summary: A rule written for this test only.
        rationale: |
          Made up to steer a fix: not a rule of practice.
        basis:
          - none (a test)
        severity: error
        tags: [test]
        applies_to: motor-protection
        {when}check: {check}
        subject: {subject}
        message: "{id} fails."

        """;

    // The confirming run is what refuses a value the windows alone would give: TST101 bounds the 50P pickup to at most 600 A
    // pri (40 A sec on the 75:5 CT), and TST102, which never bounds the pickup, asks for a delay once the pickup is below
    // 1,000 A pri. The fix to 40 A sec passes TST101 and makes TST102 fail on the delay: it is refused, with that reason.
    [Fact]
    public void A_fix_that_would_make_another_rule_fail_in_its_file_is_refused_by_the_confirming_run()
    {
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", "packs: [house]\n");
        repo.Write("house/pack.yaml", "prefix: TST\ntitle: Test rules\n");
        repo.Write("house/TST101/rule.yaml", Rule("TST101", "", "protection.short_circuit.pickup <= 600 A", "protection.short_circuit.pickup"));
        repo.Write("house/TST102/rule.yaml", Rule("TST102", "when: protection.short_circuit.pickup < 1000 A\n", "protection.short_circuit.delay >= 0.05 s", "protection.short_circuit.delay"));
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("motors/m-1.yaml", Samples.MotorWith("pickup: 7.2 A sec", "pickup: 150 A sec\n    delay: 0 s"));
        var fixes = new Fixes();
        var result = Linter.Check(new CheckRequest(repo.Root, []) { Parallel = false, Suggest = true, Observers = [fixes] });

        Assert.Equal(["TST101 protection.short_circuit.pickup"], result.Findings.Select(f => f.RuleId + " " + f.KeyPath));
        Assert.Empty(fixes.Set!.Applied);
        var (fix, why) = Assert.Single(fixes.Set.Refused);
        Assert.Equal(("motors/m-1.yaml", "protection.short_circuit.pickup", "40"), (fix.MotorFile, fix.Setting, fix.NewText));
        Assert.StartsWith("the file would gain TST102 at protection.short_circuit.delay: ", why, StringComparison.Ordinal);
        Assert.Null(Assert.Single(result.Findings).Fix);
    }
}
