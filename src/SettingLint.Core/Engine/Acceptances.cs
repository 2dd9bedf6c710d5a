using System.Collections.Immutable;
using System.Text.RegularExpressions;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Engine;

/// <summary>Applies a file's acceptance comments to its findings, and reports faulty or stale ones as SL010.</summary>
internal static partial class Acceptances
{
    /// <summary>
    /// The file's findings with <see cref="Finding.Suppression"/> set where an acceptance with a reason covers them,
    /// plus an SL010 finding for each acceptance without a reason, each unknown id and each id that matches nothing.
    /// </summary>
    /// <param name="file">The loaded file, for its lines and tree.</param>
    /// <param name="findings">The file's findings (of loading, binding and the rules).</param>
    /// <param name="knownRules">Every rule id of the run, engine rules included.</param>
    public static IReadOnlyList<Finding> Apply(LoadedFile file, IReadOnlyList<Finding> findings, IReadOnlySet<string> knownRules) =>
        Apply(file.RelativePath, AcceptComments.Find(file), findings, knownRules);

    /// <summary>
    /// The same with the file's acceptance comments found beforehand, while its tree was there: a check keeps only
    /// those of each file, not its lines and tree, until its findings are known.
    /// </summary>
    /// <param name="relativePath">The file, relative to the repository root.</param>
    /// <param name="comments">The file's acceptance comments (<see cref="AcceptComments.Find(LoadedFile)"/>).</param>
    /// <param name="findings">The file's findings (of loading, binding and the rules).</param>
    /// <param name="knownRules">Every rule id of the run, engine rules included.</param>
    public static IReadOnlyList<Finding> Apply(string relativePath, ImmutableArray<AcceptComment> comments, IReadOnlyList<Finding> findings, IReadOnlySet<string> knownRules)
    {
        if (comments.IsEmpty) return findings;
        var result = findings.ToArray();
        var problems = new FindingBuilder(relativePath);
        // An error in the file's own data (it does not parse, a key is missing or empty, a value or unit is wrong, a
        // reference is broken) keeps some rules from running on it; an acceptance of such a rule that matches nothing
        // there is not known to be stale, and saying so would bury the error that explains it.
        var dataError = findings.Any(f => f.Level == Level.Error && f.Suppression is null && IsDataRule(f.RuleId));
        // The narrowest acceptance gives its reason when a line one and a block one both cover a finding.
        foreach (var c in comments.OrderBy(c => c.LastLine - c.FirstLine).ThenBy(c => c.Span.StartLine))
        {
            var ids = string.Join(" ", c.RuleIds);
            if (c.RuleIds.IsEmpty)
            {
                problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                    "This acceptance names no rule; write the rule ids before the colon, as in '# {marker} SL110: why it is acceptable'.",
                    ("marker", AcceptComments.Marker));
                continue;
            }
            if (c.Reason is null)
            {
                problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                    "This acceptance of {ids} gives no reason, so it accepts nothing; write the reason after a colon: '# {marker} {ids}: why it is acceptable'.",
                    ("ids", ids), ("marker", AcceptComments.Marker));
                continue;
            }
            if (c.LastLine < c.FirstLine)
            {
                problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                    "This acceptance of {ids} stands before nothing: no YAML follows it.", ("ids", ids));
                continue;
            }
            foreach (var id in c.RuleIds.Distinct(StringComparer.Ordinal))
            {
                if (id is EngineRules.Suppression or EngineRules.GateChange)
                {
                    problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                        "{id} cannot be accepted in the source: it reports on acceptances and on changes to the gate themselves.", ("id", id));
                    continue;
                }
                if (!RuleId().IsMatch(id) || !knownRules.Contains(id))
                {
                    problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                        "This acceptance names {id}, which is not a rule of this run (see 'settinglint rules list').", ("id", id));
                    continue;
                }
                var matched = false;
                for (var k = 0; k < result.Length; k++)
                {
                    var f = result[k];
                    if (f.RuleId != id || f.File != relativePath || !c.Covers(f.Span.StartLine)) continue;
                    matched = true;
                    if (f.Suppression is null) result[k] = f with { Suppression = new Suppression(c.Reason, relativePath, c.Span) };
                }
                if (!matched && !(dataError && !IsDataRule(id)))
                {
                    problems.Add(EngineRules.Suppression, c.Span, c.KeyPath,
                        "No {id} finding lies on {lines}, which this acceptance covers: it is stale; remove {id} from it, or the whole comment.",
                        ("id", id), ("lines", c.LinesText));
                }
            }
        }
        return problems.HasAny ? [.. result, .. problems.Findings] : result;
    }

    // SL001-SL009: the engine's checks of the data itself, which run before and apart from the rules.
    private static bool IsDataRule(string id) => string.CompareOrdinal(id, EngineRules.Syntax) >= 0 && string.CompareOrdinal(id, EngineRules.KindOrFormat) <= 0 && id.Length == 5;

    [GeneratedRegex("^SL[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex RuleId();
}
