using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;
using Xunit.Abstractions;

namespace SettingLint.Cli.Tests;

/// <summary>
/// Every built-in rule whose subject is a setting, on its own failing fixtures: the fixes of its findings, applied in
/// memory (an overlay over the fixture folder), leave no finding of that rule on the fixed setting and no finding that
/// was not there before; and the rules left without a fix are named with the reason.
/// </summary>
public sealed class RuleFixTests(ITestOutputHelper output)
{
    /// <summary>
    /// Rules whose subject is a setting but for which no fix is offered in their fixtures, and why. A fix is only ever
    /// a number inside the window the rules' comparisons leave; these rules give none, or give one that cannot clear the finding.
    /// </summary>
    private static readonly ImmutableSortedDictionary<string, string> NoFix = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new Dictionary<string, string>
    {
        // The subject is an enable flag: the finding asks for an element to be switched on or off, which is a decision, not a number.
        ["SL203"] = "subject is protection.short_circuit.enabled (the breaking device must change, or the element be blocked above its rating)",
        ["SL204"] = "subject is protection.short_circuit.enabled (switch the element on: a decision, not a value)",
        ["SL305"] = "subject is protection.ground_fault.enabled (switch the element on: a decision, not a value)",
        ["SL401"] = "subject is protection.differential.enabled (the motor has no six leads for it)",
        ["SL808"] = "subject is protection.thermal.enabled (switch the element on: a decision, not a value)",
        // The comparison is of a quantity computed from the setting, not of the setting: no window on the setting is derived.
        ["SL205"] = "compares the clearing time (delay + the starter's operating time + margin) with the upstream curve, not the delay itself",
        ["SL803"] = "compares the IEC 60255-149 cold trip time computed from the time constant, not the time constant itself",
        ["SL804"] = "compares the IEC 60255-149 hot trip time computed from the time constant, not the time constant itself",
        ["SL805"] = "compares the IEC 60255-149 cold trip time computed from the time constant, not the time constant itself",
        ["SL806"] = "compares the IEC 60255-149 hot trip time computed from the time constant, not the time constant itself",
        // An 'or' of two settings: either may be changed, so neither is bounded alone.
        ["SL303"] = "its check is pickup >= false residual OR delay >= ride-through: either setting clears it, so neither has a window of its own",
        // A rule that applies only on one side of the present value: its bound is not in the window the first run derives, so
        // the value planned from the others is refused by the confirming check (never written), and no fix is offered.
        ["SL501"] = "a pickup of 100 % or more is outside SL504's guard (trip_pickup < 100 %), so SL504's 40 % bound is not in the window; the planned 99 % is refused by the confirming check (SL504)",
        ["SL605"] = "SL607 applies only above the bus's highest voltage, so its bound is not in the window of a pickup below it; the planned value is refused by the confirming check (SL607)",
    });

    [Fact]
    public void Fixes_of_each_rule_clear_its_findings_and_bring_no_new_one()
    {
        var rulesRoot = Path.Combine(RepositoryPaths.Root(), "rules");
        var loaded = new RuleLoader(SchemaSet.Shared).Load(RuleLoader.FromFolder(rulesRoot, rulesRoot));
        Assert.Empty(loaded.Problems);
        var pack = new RuleSet(loaded.Rules);
        var failures = new List<string>();
        var withoutFix = new SortedDictionary<string, string>(StringComparer.Ordinal);
        var fixedRules = new SortedSet<string>(StringComparer.Ordinal);
        var settingRules = loaded.Rules.Where(r => r.Subject.StartsWith(FixPlanner.SettingPrefix, StringComparison.Ordinal)).Select(r => r.Id).ToImmutableSortedSet(StringComparer.Ordinal);
        foreach (var id in settingRules)
        {
            var fixtures = Path.Combine(rulesRoot, id, "fixtures");
            var kept = new Kept();
            var before = Linter.Check(new CheckRequest(fixtures, [fixtures])
            {
                Root = fixtures, Rules = pack, Parallel = false, FailOn = Level.Note, Suggest = true, SuggestRules = ImmutableHashSet.Create(id), Observers = [kept],
            });
            Assert.Empty(before.Notifications);
            var set = kept.Set ?? SuggestionSet.None;
            if (set.Applied.IsEmpty)
            {
                var own = before.Findings.Where(f => f.RuleId == id && f.Suppression is null).ToList();
                withoutFix[id] = own.Count == 0 ? "no unsuppressed finding in its fixtures"
                    : set.Refused.IsEmpty ? "its comparisons leave no window on " + string.Join(", ", own.Select(f => f.KeyPath).Distinct(StringComparer.Ordinal))
                    : string.Join("; ", set.Refused.Select(r => r.Why).Distinct(StringComparer.Ordinal));
                continue;
            }
            fixedRules.Add(id);
            var contents = set.NewTexts().ToImmutableDictionary(t => t.File, t => t.Old.Encode(t.New), StringComparer.Ordinal);
            var after = Linter.Check(new CheckRequest(fixtures, [fixtures])
            {
                Source = new OverlaySource(new DiskSource(fixtures), contents), Rules = pack, Parallel = false, FailOn = Level.Note,
            });
            var known = before.Findings.Select(f => (f.File, f.RuleId, f.KeyPath)).ToHashSet();
            foreach (var fix in set.Applied)
            {
                foreach (var left in after.Findings.Where(f => f.File == fix.MotorFile && f.KeyPath == fix.Setting && f.RuleId == id && f.Suppression is null))
                {
                    failures.Add($"{id}: {fix.MotorFile} {fix.Setting} {fix.OldWritten} -> {fix.Written} still gets {left.RuleId}: {left.Message}");
                }
            }
            foreach (var gained in after.Findings.Where(f => contents.ContainsKey(f.File) && f.Suppression is null && !known.Contains((f.File, f.RuleId, f.KeyPath))))
            {
                failures.Add($"{id}: fixing {gained.File} brings {gained.RuleId} at {gained.KeyPath}: {gained.Message}");
            }
            // Fixing twice changes nothing: the fixed files get no further fix.
            var again = new Kept();
            Linter.Check(new CheckRequest(fixtures, [fixtures])
            {
                Source = new OverlaySource(new DiskSource(fixtures), contents), Rules = pack, Parallel = false, Suggest = true, SuggestRules = ImmutableHashSet.Create(id), Observers = [again],
            });
            foreach (var second in (again.Set ?? SuggestionSet.None).Applied.Where(f => contents.ContainsKey(f.MotorFile)))
            {
                failures.Add($"{id}: a second fix of {second.MotorFile} would change {second.Setting} again, {second.OldWritten} -> {second.Written}");
            }
        }
        output.WriteLine("Fixed in their fixtures: " + string.Join(", ", fixedRules));
        foreach (var (id, why) in withoutFix) output.WriteLine($"No fix for {id}: {why}");
        Assert.Empty(failures);
        Assert.Empty(withoutFix.Keys.Where(id => !NoFix.ContainsKey(id)).Select(id => id + ": " + withoutFix[id]));
        // A rule listed as without a fix that has one now must leave the list.
        Assert.DoesNotContain(NoFix.Keys, fixedRules.Contains);
    }

    private sealed class Kept : ICheckObserver
    {
        public SuggestionSet? Set { get; private set; }

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }
}
