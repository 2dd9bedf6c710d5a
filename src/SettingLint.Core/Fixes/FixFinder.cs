using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Fixes;

/// <summary>What a run of the fix machinery found: fixes checked by a second run, and settings left without one and why.</summary>
/// <param name="Applied">Fixes whose value a second check confirmed.</param>
/// <param name="Refused">Settings without a fix, with the reason: no value in the window, or the second check refused it.</param>
/// <param name="Texts">The text of each file the fixes are in, as the check read it.</param>
public sealed record SuggestionSet(ImmutableArray<SettingFix> Applied, ImmutableArray<(SettingFix Fix, string Why)> Refused, IReadOnlyDictionary<string, SourceText> Texts)
{
    public static SuggestionSet None { get; } = new([], [], new Dictionary<string, SourceText>());

    /// <summary>The findings with the fix of their setting attached, where there is one.</summary>
    public ImmutableArray<Finding> Attach(ImmutableArray<Finding> findings)
    {
        if (Applied.IsEmpty) return findings;
        var bySetting = Applied.ToDictionary(f => (f.MotorFile, f.Setting));
        return [.. findings.Select(f => f.Suppression is null && bySetting.TryGetValue((f.File, f.KeyPath), out var fix)
            ? f with { Fix = new FindingFix(fix.ValueRegion(Texts[fix.MotorFile].Text), fix.Written!, fix.Shown(fix.NewSi)) }
            : f)];
    }

    /// <summary>An SL020 finding for each setting whose rules leave no value, on the setting, naming the rules and their bounds.</summary>
    public ImmutableArray<Finding> Conflicts()
    {
        var found = ImmutableArray.CreateBuilder<Finding>();
        foreach (var (fix, _) in Refused)
        {
            if (!fix.Window.IsEmpty) continue;
            var lo = fix.Window.TightestLower!;
            var up = fix.Window.TightestUpper!;
            var values = ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new KeyValuePair<string, FindingValue>[]
            {
                new("setting", fix.Setting),
                new("lower", new FindingValue(FixMaker.Show(fix.Window, lo.Limit), lo.Limit, fix.Window.Percent ? "" : (fix.Window.Dim.Plain ?? Dimension.None).SiSymbol())),
                new("lower_rule", lo.RuleId),
                new("lower_phrase", SettingWindows.Phrase(lo.Op)),
                new("lower_label", lo.Label),
                new("upper", new FindingValue(FixMaker.Show(fix.Window, up.Limit), up.Limit, fix.Window.Percent ? "" : (fix.Window.Dim.Plain ?? Dimension.None).SiSymbol())),
                new("upper_rule", up.RuleId),
                new("upper_phrase", SettingWindows.Phrase(up.Op)),
                new("upper_label", up.Label),
            });
            var message = EngineMessages.NoCompliantValue;
            found.Add(new Finding(message.RuleId, Level.Warning, fix.MotorFile, fix.Span, fix.Setting, message.Template, values) { MessageId = message.Id });
        }
        return found.ToImmutable();
    }

    /// <summary>
    /// A check's result with the fixes attached to their findings and the conflicts added. A conflict stands with the
    /// findings on its setting: unchanged from the baseline when they all are.
    /// </summary>
    public CheckResult ApplyTo(CheckResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        if (Applied.IsEmpty && Refused.IsEmpty) return result;
        var conflicts = Conflicts().Select(c =>
        {
            var states = result.Findings.Where(f => f.File == c.File && f.KeyPath == c.KeyPath && f.Suppression is null).Select(f => f.BaselineState).ToList();
            return states.Any(s => s is not null) ? c with { BaselineState = states.Any(s => s is not BaselineState.Unchanged) ? BaselineState.New : BaselineState.Unchanged } : c;
        });
        return result with { Findings = [.. Attach(result.Findings).AddRange(conflicts).Order(Finding.Order)] };
    }

    /// <summary>Each fixed file's new text.</summary>
    public IEnumerable<(string File, SourceText Old, string New)> NewTexts() =>
        Applied.GroupBy(f => f.MotorFile, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal)
            .Select(g => (g.Key, Texts[g.Key], FixPlanner.Apply(Texts[g.Key].Text, g)));
}

/// <summary>A file's text and whether it began with a byte order mark, so that it can be written back byte for byte apart from the edits.</summary>
public sealed class SourceText
{
    private static readonly UTF8Encoding Utf8 = new(false, true);

    // The bytes as read, decoded when asked: a suggestion set holds the text of every file it fixes, and UTF-16 strings of
    // them were twice the size (2,000 files at 100,000 generated motors, docs/performance.md).
    private readonly byte[] _bytes;

    private SourceText(byte[] bytes, bool bom)
    {
        _bytes = bytes;
        Bom = bom;
    }

    /// <summary>The text, without the byte order mark.</summary>
    public string Text => Utf8.GetString(_bytes, Bom ? 3 : 0, _bytes.Length - (Bom ? 3 : 0));

    /// <summary>Whether the file began with a byte order mark.</summary>
    public bool Bom { get; }

    /// <summary>Decodes a file's bytes (they are kept, not copied: the caller does not change them); null when they are not UTF-8.</summary>
    public static SourceText? Decode(byte[]? bytes)
    {
        if (bytes is null) return null;
        var bom = bytes.Length >= 3 && bytes[0] == 0xEF && bytes[1] == 0xBB && bytes[2] == 0xBF;
        return System.Text.Unicode.Utf8.IsValid(bytes.AsSpan(bom ? 3 : 0)) ? new SourceText(bytes, bom) : null;
    }

    /// <summary>Another text of the same file, encoded as this one was.</summary>
    public byte[] Encode(string text)
    {
        var body = Utf8.GetBytes(text);
        return Bom ? [0xEF, 0xBB, 0xBF, .. body] : body;
    }
}

/// <summary>
/// Works out the fixes of a check's findings from the settings' windows and facts that the same check took of its motors
/// (<see cref="SettingFacts"/>): makes a value for each setting with a finding, and keeps only the values that a second check of
/// the changed files confirms (no finding left on the setting, none gained in the file). The second check reads through
/// the first's file source (the staged contents, an editor's buffers) and reaches the other motors of the bus, as the first did.
/// </summary>
internal static class FixFinder
{
    /// <summary>Computes the fixes of the unsuppressed findings of a check (of some rules only, when given).</summary>
    /// <param name="rules">The run's rules (without listeners).</param>
    /// <param name="source">The files as the check read them.</param>
    /// <param name="include">The configuration's include and exclude.</param>
    /// <param name="findings">The check's findings.</param>
    /// <param name="onlyRules">Fix only findings of these rules; empty for all.</param>
    /// <param name="electricalCode">The electrical code the configuration declares per file, as the check had it.</param>
    /// <param name="settings">The windows and facts the check took of the settings that a rule failed on (<see cref="SettingFacts.Of"/>).</param>
    /// <param name="scopes">The folders' configurations, as the check had them: each motor's fix is confirmed under its folder's rules.</param>
    /// <param name="check">
    /// The check whose findings these are: its division of the motors by bus tells what a confirming run of some fixed
    /// files reads (the files it read when it read fewer than all, <see cref="CheckResult.LoadedFiles"/>, else
    /// <see cref="Reach"/>) and which files are confirmed together. Null confirms every fix in one run over the repository.
    /// </param>
    public static SuggestionSet Compute(RuleSet rules, IFileSource source, Func<string, bool>? include, ImmutableArray<Finding> findings, IReadOnlySet<string> onlyRules,
        Func<string, string?>? electricalCode, IEnumerable<SettingFacts> settings, Configuration.ConfigScopes? scopes = null, CheckResult? check = null)
    {
        ArgumentNullException.ThrowIfNull(rules);
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(onlyRules);
        ArgumentNullException.ThrowIfNull(settings);
        var fixable = FixPlanner.Fixable(findings, onlyRules);
        if (fixable.Count == 0) return SuggestionSet.None;

        var root = source.Root;
        // One rule set for every confirming round: each folder's rules are built once, on first use.
        IRuleSet confirming = scopes is null ? rules : new Engine.ScopedRuleSet(rules, scopes);
        var texts = new Dictionary<string, SourceText>(StringComparer.Ordinal);
        string? Read(string rel)
        {
            if (texts.TryGetValue(rel, out var known)) return known.Text;
            if (SourceText.Decode(source.Read(rel)) is not { } text) return null;
            texts[rel] = text;
            return text.Text;
        }
        // By file, then setting, so that the files are read in an order that does not depend on the order of work.
        var ordered = settings.OrderBy(s => s.MotorFile, StringComparer.Ordinal).ThenBy(s => s.Setting, StringComparer.Ordinal);
        var preferences = rules.Rules.Where(r => r.Prefer is not null).ToDictionary(r => r.Id, r => r.Prefer!, StringComparer.Ordinal);
        var plan = FixPlanner.Plan(fixable, ordered, Read, preferences);
        var refused = plan.Where(f => !f.HasValue).Select(f => (f, f.Reason!)).ToList();
        var fixes = plan.Where(f => f.HasValue).ToList();
        var known = findings.Select(f => (f.File, f.RuleId, f.KeyPath)).ToHashSet();
        for (var round = 0; round < 3 && fixes.Count > 0; round++)
        {
            var byFile = fixes.GroupBy(f => f.MotorFile, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.ToList(), StringComparer.Ordinal);
            // Whole buses at a time, a few hundred fixed files each: a run holds the groups of its files, and all of them at
            // once were most of a default check's peak at 100,000 generated motors (2,000 fixes; docs/performance.md). A fix
            // changes only its file's findings and those of the other motors on its bus (the rules over a bus compare them),
            // so a piece's overlay holds its own fixes only, and the new texts of the others are not made until their turn.
            // Each piece's fixes are judged by its own run, whose findings then go (keeping every piece's to the end made no
            // measurable difference to the peak at 100,000 generated motors: 70-73 MiB either way).
            var bad = new List<(SettingFix, string)>();
            foreach (var piece in Pieces(byFile.Keys, check))
            {
                var contents = piece.ToImmutableDictionary(f => f, f => texts[f].Encode(FixPlanner.Apply(texts[f].Text, byFile[f])), StringComparer.Ordinal);
                var files = ImmutableSortedSet.CreateRange(StringComparer.Ordinal, piece);
                var within = check is null ? null : check.LoadedFiles ?? Reach(check, files);
                // By file: a search of every finding for every fix grows with the square of the motors (10,000 by 10,000).
                var after = Run(confirming, root, include, new OverlaySource(source, contents), files, electricalCode, within).Findings
                    .Where(f => f.Suppression is null && files.Contains(f.File)).ToLookup(f => f.File, StringComparer.Ordinal);
                foreach (var fix in piece.SelectMany(f => byFile[f]))
                {
                    var inFile = after[fix.MotorFile];
                    var left = inFile.FirstOrDefault(f => f.KeyPath == fix.Setting);
                    var gained = inFile.FirstOrDefault(f => !known.Contains((f.File, f.RuleId, f.KeyPath)));
                    if (left is not null) bad.Add((fix, $"{fix.Written} would still get {left.RuleId}: {left.Message}"));
                    else if (gained is not null) bad.Add((fix, $"the file would gain {gained.RuleId} at {gained.KeyPath}: {gained.Message}"));
                }
            }
            if (bad.Count == 0) break;
            refused.AddRange(bad);
            var drop = bad.Select(b => b.Item1).ToHashSet();
            fixes = [.. fixes.Where(f => !drop.Contains(f))];
        }
        return new SuggestionSet([.. fixes], [.. refused.OrderBy(r => r.Item1.MotorFile, StringComparer.Ordinal).ThenBy(r => r.Item1.Span.StartLine)], texts);
    }

    /// <summary>
    /// What a confirming run must read to check fixes in these motor files, from the check that found them: the files, the
    /// other motors on their buses (the rules over a bus compare them) and those buses' files. A relay model is read when a
    /// motor names it, as any reference is. A fix changes a setting's value, never a tag or a bus, so the check's own
    /// division of the motors by bus holds for the fixed files. Without it the confirming run discovered and quick-read the
    /// whole repository again while the check's result was alive: peak RSS of a default check at 100,000 generated motors
    /// (2,000 with a fix) was 142 MiB, against 77-79 MiB with no suggestions. It read every bus and relay model as well
    /// until 2026-12-05 (5,002 files in each piece of 250 fixes, every bus bound for the whole piece): the check of 100,000
    /// generated motors took 22 s instead of 18 (docs/performance.md).
    /// </summary>
    /// <returns>Root-relative files, sorted; null when the check reported no motor (a run over other files).</returns>
    public static IReadOnlyList<string>? Reach(CheckResult result, IEnumerable<string> files)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(files);
        var run = result.Files;
        if (run.MotorCount == 0) return null;
        var fixing = files.ToHashSet(StringComparer.Ordinal);
        var buses = new HashSet<string>(StringComparer.Ordinal);
        var within = new HashSet<string>(StringComparer.Ordinal);
        foreach (var file in fixing)
        {
            var m = run.MotorIndexOf(file);
            if (m < 0) continue;
            within.Add(file);
            if (run.MotorBus(m) is { } bus) buses.Add(bus);
        }
        for (var m = 0; m < run.MotorCount; m++)
        {
            // Only a bus-mate's path is made into a string (a motor's bus is one of a few shared strings).
            if (run.MotorBus(m) is { } bus && buses.Contains(bus)) within.Add(run.MotorFile(m));
        }
        within.UnionWith(buses.Where(run.Contains));
        var reach = within.ToList();
        reach.Sort(StringComparer.Ordinal);
        return reach;
    }

    private const int ConfirmPiece = 250;

    /// <summary>
    /// The fixed files divided for their confirming runs: each bus's fixed motors together (a motor with its bus inline, or
    /// none, alone), whole buses taken in order up to <paramref name="size"/> files (a bus with more is a piece of its own).
    /// Without the check, one piece.
    /// </summary>
    internal static List<List<string>> Pieces(IEnumerable<string> files, CheckResult? check, int size = ConfirmPiece)
    {
        string BusOf(string file)
        {
            if (check is null) return "";
            var m = check.Files.MotorIndexOf(file);
            return m >= 0 && check.Files.MotorBus(m) is { } bus ? bus : file;
        }
        var pieces = new List<List<string>>();
        foreach (var bus in files.GroupBy(BusOf, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal))
        {
            var count = bus.Count();
            if (pieces.Count == 0 || (pieces[^1].Count > 0 && pieces[^1].Count + count > size)) pieces.Add([]);
            pieces[^1].AddRange(bus.Order(StringComparer.Ordinal));
        }
        return pieces;
    }

    /// <summary>A confirming run: the files as if they had changed, read with what <paramref name="within"/> names (all when null); only they are reported.</summary>
    internal static CheckResult Run(IRuleSet rules, string root, Func<string, bool>? include, IFileSource source, ImmutableSortedSet<string> files, Func<string, string?>? electricalCode, IReadOnlyList<string>? within)
    {
        var changes = new ChangeSet("fix", null, false, files, [], null, ImmutableDictionary<string, byte[]>.Empty);
        IReadOnlyList<string> paths = within is null ? [root] : [.. within.Select(rel => SourcePaths.Full(root, rel))];
        // In sequence, on the calling thread. The native build crashed in about 1 of 15 default checks of 100,000 generated
        // motors when two ran at once on the 2-core machine (access violations, once a jump into the heap); each crash that left
        // a stack was in a confirming piece's bus groups. 2 in 30 such runs, none in 34 with --no-suggest and none in 40 with the
        // pieces in sequence. That is evidence, not proof; the cause is not found (docs/performance.md). The cost:
        // 100,000 motors 17.7 -> 19.5 s, 10,000 1.62 -> 1.70 s (one run each, 2026-12-05).
        return new Checker(rules).Run(new CheckOptions(paths, Root: root, Include: include, Source: source, Changes: changes, ElectricalCode: electricalCode, Parallel: false));
    }
}
