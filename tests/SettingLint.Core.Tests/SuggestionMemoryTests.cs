using System.Collections.Concurrent;
using System.Globalization;
using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// The suggestions of a check keep, of a motor that failed a rule, only what a fix of its settings needs (the windows and
/// a few numbers, <see cref="SettingFacts"/>), taken when its outcomes are all in: its document goes with its bus group,
/// as a passing motor's does, and the suggestion is the one the whole run's outcomes and motors would give.
/// </summary>
public sealed class SuggestionMemoryTests
{
    // SL201 and SL202 both bound the 50P pickup, one from below and one from above.
    private static readonly Lazy<RuleSet> Pickup = new(() => BuiltInRules.Load(r => r.Id is "SL201" or "SL202"));

    // The highest steady voltage raises the start current (SL201); the weakest source bounds the pickup from above (SL202).
    private static string Bus(string tag) => Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: " + tag) + "max_voltage: 4370 V\nfault_current_min: 3 kA\n";

    // A relay whose 50P steps (2.1 xCT + k x 0.2 xCT, 75:5 CT) do not fall on the value the written form alone would give.
    private static readonly string Relay = Samples.Replace(Samples.Replace(Samples.RelayModel, "tag: RELAY-A", "tag: RELAY-B"),
        "{ min: 2 xCT, max: 20 xCT, step: 0.1 xCT }", "{ min: 2.1 xCT, max: 20 xCT, step: 0.2 xCT }");

    private static string Motor(string tag, string bus) => Samples.Replace(
        Samples.MotorWith("pickup: 7.2 A sec", "pickup: 150 A sec"),
        "tag: M-1\ntitle: Test pump\nbus: ../buses/bus-1.yaml\n",
        $"tag: {tag}\ntitle: Test pump\nbus: ../buses/{bus}.yaml\nrelay_model: ../models/relay-b.yaml\n");

    /// <summary>Two motors, each alone on its bus (two groups), each with a 50P pickup too high for SL202.</summary>
    private static TempRepo Repository()
    {
        var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Bus("BUS-1"));
        repo.Write("buses/bus-2.yaml", Bus("BUS-2"));
        repo.Write("models/relay-b.yaml", Relay);
        repo.Write("motors/m-1.yaml", Motor("M-1", "bus-1"));
        repo.Write("motors/m-2.yaml", Motor("M-2", "bus-2"));
        return repo;
    }

    /// <summary>At the first outcome of each motor, counts the documents of the motors of other buses (groups done before) still alive.</summary>
    private sealed class Probe : ICheckObserver
    {
        private readonly List<(string Bus, WeakReference Document)> _seen = [];
        private string? _bus;
        private bool _counted;

        public List<int> AliveOfGroupsDone { get; } = [];

        public void OnMotor(MotorProtection motor)
        {
            _bus = motor.Bus!.Tag;
            _counted = false;
            _seen.Add((_bus, new WeakReference(motor.Document)));
        }

        // By the first outcome every listener has been told of this motor: the suggestions' collector has let the last one go.
        public void OnOutcome(RuleOutcome outcome)
        {
            if (_counted) return;
            _counted = true;
            var done = _seen.Where(s => s.Bus != _bus).Select(s => s.Document).ToList();
            if (done.Count > 0) AliveOfGroupsDone.Add(Heap.Alive(done));
        }
    }

    private sealed class Kept : ICheckObserver
    {
        public SuggestionSet? Set { get; private set; }

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }

    [Fact]
    public void A_failing_motor_s_document_is_collected_before_the_run_ends()
    {
        using var repo = Repository();
        var probe = new Probe();
        var kept = new Kept();
        var result = Linter.Check(new CheckRequest(repo.Root, []) { Rules = Pickup.Value, Parallel = false, Suggest = true, Observers = [probe, kept] });

        Assert.Equal(["motors/m-1.yaml", "motors/m-2.yaml"], result.Findings.Where(f => f.RuleId == "SL202").Select(f => f.File).Order(StringComparer.Ordinal));
        // The second group's motor counted the first's document, which failed SL202 and was collected all the same.
        Assert.Equal([0], probe.AliveOfGroupsDone);
        // And its suggestion was still made, from what was taken of it while it was evaluated.
        Assert.Equal(["motors/m-1.yaml 45.5", "motors/m-2.yaml 45.5"], kept.Set!.Applied.Select(f => f.MotorFile + " " + f.NewText));
    }

    /// <summary>Every outcome and motor of a run, kept to its end: how the suggestions were worked out before they kept less.</summary>
    private sealed class Everything : ICheckObserver
    {
        public ConcurrentDictionary<string, MotorProtection> Motors { get; } = new(StringComparer.Ordinal);

        public ConcurrentQueue<RuleOutcome> Outcomes { get; } = new();

        public void OnMotor(MotorProtection motor) => Motors[motor.Document.RelativePath] = motor;

        public void OnOutcome(RuleOutcome outcome) => Outcomes.Enqueue(outcome);
    }

    private static string Describe(SettingFix f) => string.Join(" | ",
        f.MotorFile, f.Motor, f.Setting, f.Span, f.OldText, f.NewText, f.Unit, f.OldSi.ToString("R", CultureInfo.InvariantCulture), f.NewSi.ToString("R", CultureInfo.InvariantCulture),
        f.Terms, f.Window.Actual.ToString("R", CultureInfo.InvariantCulture), f.Window.Dim, f.Window.Percent,
        string.Join(", ", f.Window.Lower), string.Join(", ", f.Window.Upper), f.Reason, f.Preference, f.Shown(f.NewSi));

    // SL201 (common practice): pickup >= 1.7 x the locked-rotor current at the bus's highest voltage, 6.2 x 58 A x 4370/4000
    // = 392.87 A, so 667.87 A pri. SL202 (common practice, the 1.5 from memory): pickup <= 0.866 x 3 kA / 1.5 = 1732 A pri.
    // 150 A sec (2250 A pri) fails SL202 only. Both rules prefer the lowest pickup, so the fix is the lowest relay step at or
    // above 667.87 A: 157.5 A + 35 x 15 A = 682.5 A pri = 45.5 A sec. Without SL201's bound (it passed) the window would have
    // no lower side and the fix would be the least change down to SL202's limit instead (114.5 A sec).
    [Fact]
    public void A_suggestion_on_a_setting_two_rules_bound_is_the_one_the_whole_run_s_outcomes_give()
    {
        using var repo = Repository();
        var everything = new Everything();
        var kept = new Kept();
        Linter.Check(new CheckRequest(repo.Root, []) { Rules = Pickup.Value, Parallel = false, Suggest = true, Observers = [everything, kept] });

        var fix = Assert.Single(kept.Set!.Applied, f => f.MotorFile == "motors/m-1.yaml");
        Assert.Equal(("150", "45.5", "A sec"), (fix.OldText, fix.NewText, fix.Unit));
        Assert.Equal(682.5, fix.NewSi, 9);
        Assert.Equal(["SL201", "SL202"], fix.RuleIds.ToArray());
        Assert.Equal(667.87, Assert.Single(fix.Window.Lower).Limit, 2);
        Assert.Equal(1732, Assert.Single(fix.Window.Upper).Limit, 6);
        Assert.Equal("682 A pri (45.5 A sec)", fix.Shown(fix.NewSi));
        Assert.Equal("SL201, SL202 prefer the lowest value: the most sensitive pickup that still rides through the offset start", fix.Preference);
        Assert.Equal(Samples.Pos(File.ReadAllText(repo.PathOf("motors/m-1.yaml")), "150 A sec"), (fix.Span.StartLine, fix.Span.StartColumn));

        // The same fix from every outcome and the motor kept to the end of the run, as the suggestions were made before.
        var preferences = Pickup.Value.Rules.Where(r => r.Prefer is not null).ToDictionary(r => r.Id, r => r.Prefer!, StringComparer.Ordinal);
        var window = Assert.Single(SettingWindows.Derive(everything.Outcomes), w => w.MotorFile == fix.MotorFile && w.Setting == fix.Setting);
        var whole = FixMaker.For(SettingFacts.For(window, everything.Motors[fix.MotorFile]), File.ReadAllText(repo.PathOf(fix.MotorFile)), FixPlanner.Preferred(window, preferences));
        Assert.Equal(Describe(whole!), Describe(fix));
    }
}
