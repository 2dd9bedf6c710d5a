using System.Collections.Immutable;
using System.Text.RegularExpressions;
using SettingLint.Core.Findings;
using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Linting;

/// <summary>An expected or actual finding of a fixture: file, line, rule.</summary>
public sealed record FixtureLine(string File, int Line, string RuleId)
{
    public override string ToString() => $"{File}:{Line}: {RuleId}";
}

/// <summary>
/// The outcome of one rule's fixtures: what was expected and missed, what came unexpectedly, which named values differ
/// from the markers, and what was wrong with the fixtures.
/// </summary>
public sealed record FixtureResult(string RuleId, string Folder, ImmutableArray<FixtureLine> Missed, ImmutableArray<FixtureLine> Unexpected, ImmutableArray<string> Problems, int Expected)
{
    /// <summary>Findings on the expected line whose named values differ from the marker's, one line each.</summary>
    public ImmutableArray<string> WrongValues { get; init; } = [];

    /// <summary>How many named values the markers checked (and found right).</summary>
    public int CheckedValues { get; init; }

    /// <summary>How many of <see cref="CheckedValues"/> belong to the folder's own rule; the built-in pack requires at least one per rule.</summary>
    public int OwnCheckedValues { get; init; }

    /// <summary>Checks not run for missing data that differ from the `# not-run:` markers, one line each.</summary>
    public ImmutableArray<string> WrongNotRun { get; init; } = [];

    public bool Passed => Missed.IsEmpty && Unexpected.IsEmpty && Problems.IsEmpty && WrongValues.IsEmpty && WrongNotRun.IsEmpty;
}

/// <summary>
/// Runs rule fixtures. A `# expect: SL201 SL202` comment says those rules must fire on the next line;
/// every other line of the folder's files must be clean for the folder's own rule. A rule id may be followed by
/// named values, `# expect: SL201 limit=858 A actual=750 A`, which the finding must carry to the precision written
/// (half a unit of the last digit). A `# not-run: SL202 bus.fault_current_min` comment anywhere in a file says that the
/// rule applies to the file's motor but cannot be evaluated, for exactly those missing key paths; the folder's own rule
/// may be "not run" on no other file.
/// </summary>
public static partial class FixtureRunner
{
    [GeneratedRegex(@"^\s*#\s*expect:\s*(?<ids>.*)$", RegexOptions.CultureInvariant)]
    private static partial Regex Marker();

    [GeneratedRegex(@"^\s*#\s*not-run:\s*(?<body>.*)$", RegexOptions.CultureInvariant)]
    private static partial Regex NotRunMarker();

    [GeneratedRegex(@"^[A-Z]{2,8}[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex RuleId();

    /// <summary>Runs the fixtures of every rule folder under a folder (a pack, or one rule's folder), given as an absolute path.</summary>
    public static (ImmutableArray<FixtureResult> Results, ImmutableArray<Notification> LoadProblems) Run(string folder, SchemaSet? schemas = null)
    {
        var s = schemas ?? SchemaSet.Shared;
        var full = SourcePaths.Absolute(folder, null);
        // The whole pack is loaded, so a marker may name any of its rules; a single rule folder loads the built-in pack beside it.
        var packRoot = File.Exists(Path.Combine(full, "rule.yaml")) ? Path.GetDirectoryName(full)! : full;
        var loaded = new RuleLoader(s).Load(RuleLoader.FromFolder(packRoot, packRoot));
        if (!loaded.Problems.IsEmpty) return ([], loaded.Problems);
        var known = loaded.Rules.Select(r => r.Id).Concat(EngineRules.All.Select(r => r.Id)).ToHashSet(StringComparer.Ordinal);
        var ruleSet = new RuleSet(loaded.Rules);
        var results = ImmutableArray.CreateBuilder<FixtureResult>();
        // The loaded rules already name their files; those under the asked folder are the ones to test.
        var asked = loaded.Rules
            .Select(r => (Rule: r, File: Path.GetFullPath(Path.Combine(packRoot, r.SourceFile))))
            .Where(x => Discovery.RepositoryRoot.Contains(full, x.File))
            .OrderBy(x => x.File, StringComparer.Ordinal);
        foreach (var (rule, file) in asked)
        {
            results.Add(RunOne(rule.Id, Path.Combine(Path.GetDirectoryName(file)!, "fixtures"), ruleSet, known));
        }
        return (results.ToImmutable(), []);
    }

    private static FixtureResult RunOne(string ruleId, string fixtures, RuleSet rules, HashSet<string> known)
    {
        var problems = ImmutableArray.CreateBuilder<string>();
        if (!Directory.Exists(fixtures))
        {
            problems.Add("The rule has no fixtures folder.");
            return new FixtureResult(ruleId, fixtures, [], [], problems.ToImmutable(), 0);
        }
        // Through the one entry point, as `check` runs: the fixtures folder is the root, the pack's rules replace the configuration's.
        var result = Linter.Check(new CheckRequest(fixtures, [fixtures]) { Root = fixtures, FailOn = Level.Note, Parallel = false, Rules = rules });
        foreach (var n in result.Notifications) problems.Add((n.File is null ? "" : n.File + ": ") + n.Message);
        var expected = new HashSet<FixtureLine>();
        var expectedValues = new Dictionary<FixtureLine, (int MarkerLine, ImmutableArray<MarkerValue> Values)>();
        var expectedNotRun = new Dictionary<(string File, string RuleId), string>();
        var files = Directory.EnumerateFiles(fixtures, "*.yaml", SearchOption.AllDirectories).OrderBy(f => f, StringComparer.Ordinal);
        foreach (var file in files)
        {
            var rel = Discovery.RepositoryRoot.Relative(fixtures, file);
            var lines = File.ReadAllLines(file);
            for (var i = 0; i < lines.Length; i++)
            {
                if (NotRunMarker().Match(lines[i]) is { Success: true } nr)
                {
                    var words = nr.Groups["body"].Value.Split([' ', ',', '\t'], StringSplitOptions.RemoveEmptyEntries);
                    if (words.Length < 2 || !RuleId().IsMatch(words[0]) || !known.Contains(words[0]))
                    {
                        problems.Add($"{rel}:{i + 1}: a not-run marker names a known rule and the missing key paths: '# not-run: SL202 bus.fault_current_min'.");
                        continue;
                    }
                    expectedNotRun[(rel, words[0])] = string.Join(", ", words.Skip(1).Order(StringComparer.Ordinal));
                    continue;
                }
                var m = Marker().Match(lines[i]);
                if (!m.Success) continue;
                var target = i + 1;
                while (target < lines.Length && Marker().IsMatch(lines[target])) target++;
                var parsed = FixtureMarker.Parse(m.Groups["ids"].Value, out var markerProblem);
                foreach (var (id, values) in parsed)
                {
                    if (!RuleId().IsMatch(id) || !known.Contains(id))
                    {
                        problems.Add($"{rel}:{i + 1}: the marker names '{id}', which is not a known rule.");
                        continue;
                    }
                    var line = new FixtureLine(rel, target + 1, id);
                    expected.Add(line);
                    if (!values.IsEmpty) expectedValues[line] = (i + 1, values);
                }
                if (markerProblem is not null) problems.Add($"{rel}:{i + 1}: {markerProblem}");
            }
        }
        var expectedIds = expected.Select(e => e.RuleId).Append(ruleId).ToHashSet(StringComparer.Ordinal);
        var actual = result.Findings.Where(f => expectedIds.Contains(f.RuleId))
            .Select(f => new FixtureLine(f.File, f.Span.StartLine, f.RuleId)).ToHashSet();
        // Findings of other rules matter only where a marker names them.
        actual.RemoveWhere(a => a.RuleId != ruleId && !expected.Contains(a));
        if (!expected.Any(e => e.RuleId == ruleId)) problems.Add("No fixture expects the rule to fire (add a '# expect: " + ruleId + "' marker).");
        var missed = expected.Except(actual).OrderBy(x => x.File, StringComparer.Ordinal).ThenBy(x => x.Line).ToImmutableArray();
        var unexpected = actual.Except(expected).OrderBy(x => x.File, StringComparer.Ordinal).ThenBy(x => x.Line).ToImmutableArray();
        if (result.Findings.Any(f => f.RuleId.StartsWith("SL0", StringComparison.Ordinal) && !expected.Any(e => e.RuleId == f.RuleId)))
        {
            foreach (var f in result.Findings.Where(f => f.RuleId.StartsWith("SL0", StringComparison.Ordinal)))
            {
                problems.Add($"{f.File}:{f.Span.StartLine}:{f.Span.StartColumn}: the fixture itself is not a valid setting file: {f.RuleId} {f.Message}");
            }
        }
        var (wrong, checkedValues, ownCheckedValues) = CompareValues(ruleId, result.Findings, expectedValues);
        return new FixtureResult(ruleId, fixtures, missed, unexpected, problems.ToImmutable(), expected.Count)
        {
            WrongValues = wrong,
            CheckedValues = checkedValues,
            OwnCheckedValues = ownCheckedValues,
            WrongNotRun = CompareNotRun(ruleId, result.NotRun, expectedNotRun),
        };
    }

    /// <summary>The checks not run of the folder's rule and of the rules the markers name, against the markers.</summary>
    private static ImmutableArray<string> CompareNotRun(string ruleId, ImmutableArray<CheckNotRun> notRun, Dictionary<(string File, string RuleId), string> expected)
    {
        var wrong = ImmutableArray.CreateBuilder<string>();
        var named = expected.Keys.Select(k => k.RuleId).Append(ruleId).ToHashSet(StringComparer.Ordinal);
        var actual = notRun.Where(n => named.Contains(n.RuleId) && (n.RuleId == ruleId || expected.ContainsKey((n.File, n.RuleId))))
            .ToDictionary(n => (n.File, n.RuleId), n => n.MissingText);
        foreach (var (key, paths) in expected.OrderBy(e => e.Key.File, StringComparer.Ordinal))
        {
            if (!actual.TryGetValue(key, out var got)) wrong.Add($"{key.File}: {key.RuleId} expected not run for {paths}, but it was evaluated or did not apply");
            else if (got != paths) wrong.Add($"{key.File}: {key.RuleId} expected not run for {paths}, found {got}");
        }
        foreach (var (key, paths) in actual.OrderBy(a => a.Key.File, StringComparer.Ordinal))
        {
            if (!expected.ContainsKey(key)) wrong.Add($"{key.File}: {key.RuleId} was not run for missing {paths} (add '# not-run: {key.RuleId} {paths.Replace(",", "", StringComparison.Ordinal)}' if that is intended)");
        }
        return wrong.ToImmutable();
    }

    private static (ImmutableArray<string> Wrong, int Checked, int OwnChecked) CompareValues(
        string ruleId, ImmutableArray<Finding> findings, Dictionary<FixtureLine, (int MarkerLine, ImmutableArray<MarkerValue> Values)> expectedValues)
    {
        var wrong = ImmutableArray.CreateBuilder<string>();
        var count = 0;
        var own = 0;
        foreach (var (line, (markerLine, values)) in expectedValues.OrderBy(x => x.Key.File, StringComparer.Ordinal).ThenBy(x => x.Key.Line))
        {
            var onLine = findings.Where(f => f.RuleId == line.RuleId && f.File == line.File && f.Span.StartLine == line.Line).ToList();
            if (onLine.Count == 0) continue; // already reported as missed
            foreach (var v in values)
            {
                // Several findings of one rule on a line (a rule over relay ranges): one of them must carry the value.
                var got = onLine.Select(f => f.Values.GetValueOrDefault(v.Name)).ToList();
                if (got.Any(g => g is not null && v.Matches(g)))
                {
                    count++;
                    if (line.RuleId == ruleId) own++;
                    continue;
                }
                var shown = got.Where(g => g is not null).Select(g => g!.Number is { } n ? Formats.Number(n) + (string.IsNullOrEmpty(g.Unit) ? "" : " " + g.Unit) + " (" + g.Text + ")" : g!.Text).ToList();
                wrong.Add($"{line.File}:{markerLine}: {line.RuleId} {v.Name} expected {v.Written}, found " + (shown.Count == 0 ? "no such value" : string.Join(" / ", shown)));
            }
        }
        return (wrong.ToImmutable(), count, own);
    }
}
