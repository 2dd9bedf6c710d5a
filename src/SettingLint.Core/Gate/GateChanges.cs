using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Configuration;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Gate;

/// <summary>
/// Finds the parts of a change that loosen the gate (SL011), by comparing each changed configuration, rule, baseline
/// and setting file with its version at the revision: a rule switched off, a lower severity or a less strict
/// fail_on, a dropped pack, new exclusions (warnings); any parameter or check change (a note, since its direction
/// cannot be judged in general); a new acceptance comment or baseline entry (warnings).
/// </summary>
internal static class GateChanges
{
    /// <summary>The SL011 findings of a change, at their lines on the new side (line 1 of a deleted file).</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="changes">The change, with its old contents.</param>
    /// <param name="readNew">The new side of a root-relative file; null when it is gone.</param>
    /// <param name="packFolders">The configuration's rule pack folders (absolute; "builtin" is skipped).</param>
    /// <param name="baselineFile">The baseline in use, root-relative; null when none.</param>
    /// <param name="defaultLevelOf">The level a rule has when the configuration says nothing of it; null for an unknown rule.</param>
    /// <param name="findings">The run's findings: a new acceptance is reported when it accepts one of them.</param>
    public static ImmutableArray<Finding> Find(
        string root,
        ChangeSet changes,
        Func<string, byte[]?> readNew,
        IEnumerable<string> packFolders,
        string? baselineFile,
        Func<string, Level?> defaultLevelOf,
        IReadOnlyList<Finding> findings)
    {
        var packs = packFolders.Where(p => p != "builtin").Select(p => Discovery.RepositoryRoot.Relative(root, p).TrimEnd('/') + "/").ToList();
        var result = new List<Finding>();
        foreach (var rel in changes.Changed.Concat(changes.Deleted).Order(StringComparer.Ordinal))
        {
            var old = changes.OldContents.GetValueOrDefault(rel);
            var now = changes.Deleted.Contains(rel) ? null : readNew(rel);
            var name = rel[(rel.LastIndexOf('/') + 1)..];
            var found = new Found(rel);
            if (rel == baselineFile) CompareBaseline(old, now, found);
            else if (!Discovery.FileDiscovery.IsYaml(rel)) continue;
            else if (SettingsConfig.IsFileName(name))
            {
                // A folder's file says what changes from the files above it: a rule it does not name keeps their level.
                CompareConfig(rel, old, now, found, defaultLevelOf, Above(rel, changes, readNew, oldSide: true), Above(rel, changes, readNew, oldSide: false));
            }
            else if (packs.Any(p => rel.StartsWith(p, StringComparison.Ordinal))) CompareRule(rel, old, now, found);
            else CompareAcceptances(rel, old, now, found, findings);
            result.AddRange(found.Items);
        }
        return [.. result.OrderBy(f => f, Finding.Order)];
    }

    /// <summary>The SL011 findings of one file.</summary>
    private sealed class Found(string file)
    {
        public List<Finding> Items { get; } = [];

        public void Warn(SourceSpan span, string keyPath, EngineMessage message, params (string Name, FindingValue Value)[] values) =>
            Add(Level.Warning, span, keyPath, message, values);

        // A parameter or check change may tighten as well as loosen: a note, for the reviewer to judge.
        public void Note(SourceSpan span, string keyPath, EngineMessage message, params (string Name, FindingValue Value)[] values) =>
            Add(Level.Note, span, keyPath, message, values);

        private void Add(Level level, SourceSpan span, string keyPath, EngineMessage message, (string Name, FindingValue Value)[] values) =>
            Items.Add(new Finding(message.RuleId, level, file, span, keyPath, message.Template,
                ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, values.Select(v => KeyValuePair.Create(v.Name, v.Value)))) { MessageId = message.Id });
    }

    private static LoadedFile? Load(string rel, byte[]? bytes) =>
        bytes is null ? null : YamlLoader.Load(bytes, rel, rel, LoadLimits.Default);

    // ---- configuration

    /// <summary>
    /// A rule as one configuration file names it: `enabled` (false for `off`; true for `on`, a level word or
    /// `enabled: true`) and `severity`, each null when the file leaves it to the files above (as ConfigFile reads them).
    /// </summary>
    private sealed record RuleEntry(bool? Enabled, Level? Severity, SourceSpan Span, ImmutableDictionary<string, (string Text, SourceSpan Span)> Parameters);

    /// <summary>
    /// A rule after a chain of configuration files: `enabled` and `severity` each from the nearest file that sets it,
    /// key by key as EffectiveConfig merges them, so that a folder's `severity: warning` under the root's `off` keeps
    /// the rule off, and a folder's `on` brings back the severity the root gave beside its `enabled: false`.
    /// </summary>
    private readonly record struct RuleState(bool? Enabled, Level? Severity)
    {
        public RuleState Then(RuleEntry? r) => r is null ? this : new(r.Enabled ?? Enabled, r.Severity ?? Severity);

        public Level LevelOr(Level defaultLevel) => Enabled == false ? Level.None : Severity ?? defaultLevel;
    }

    /// <summary>
    /// The configuration files in the folders above a configuration file, farthest first, on the old side of the
    /// change or the new: what the file's own keys override.
    /// </summary>
    private static List<ConfigView> Above(string rel, ChangeSet changes, Func<string, byte[]?> readNew, bool oldSide)
    {
        var views = new List<ConfigView>();
        var folders = rel.Split('/')[..^1];
        for (var depth = 0; depth < folders.Length; depth++)
        {
            var prefix = string.Concat(folders[..depth].Select(f => f + "/"));
            foreach (var name in SettingsConfig.FileNames)
            {
                var path = prefix + name;
                var changed = changes.Changed.Contains(path) || changes.Deleted.Contains(path);
                var bytes = oldSide && changed ? changes.OldContents.GetValueOrDefault(path) : readNew(path);
                if (bytes is null) continue;
                views.Add(ReadConfig(Load(path, bytes)));
                break;
            }
        }
        return views;
    }

    private sealed record ConfigView(
        Level FailOn,
        SourceSpan? FailOnSpan,
        ImmutableDictionary<string, RuleEntry> Rules,
        ImmutableArray<(string Text, SourceSpan Span)> Packs,
        ImmutableArray<(string Text, SourceSpan Span)> Include,
        ImmutableArray<(string Text, SourceSpan Span)> Exclude,
        SourceSpan RulesSpan)
    {
        /// <summary>Whether the file has an `include` key (an empty list included): without one, it narrows nothing.</summary>
        public bool IncludeGiven { get; init; }

        /// <summary>Where the `include` key is (line 1 without one).</summary>
        public SourceSpan IncludeSpan { get; init; } = SourceSpan.FileStart;

        /// <summary>`electrical_code` and its place; null when the file does not declare one.</summary>
        public (string Text, SourceSpan Span)? ElectricalCode { get; init; }
    }

    private static ConfigView ReadConfig(LoadedFile? file)
    {
        var m = file?.Root as YMapping;
        Level failOn = Level.Error;
        SourceSpan? failOnSpan = null;
        if (m?["fail_on"] is YScalar fo)
        {
            failOn = fo.Value == "never" ? Level.None : Levels.Parse(fo.Value) ?? Level.Error;
            failOnSpan = fo.Span;
        }
        var rules = ImmutableDictionary.CreateBuilder<string, RuleEntry>(StringComparer.Ordinal);
        if (m?["rules"] is YMapping rm)
        {
            foreach (var e in rm.Entries)
            {
                switch (e.Value)
                {
                    case YScalar s:
                        rules[e.Key.Value] = new RuleEntry(s.Value != "off", s.Value is "off" or "on" ? null : Levels.Parse(s.Value), s.Span, ImmutableDictionary<string, (string, SourceSpan)>.Empty);
                        break;
                    case YMapping o:
                    {
                        bool? enabled = o["enabled"] is YScalar en ? en.Value is "true" or "True" or "TRUE" : null;
                        Level? level = o["severity"] is YScalar sv ? Levels.Parse(sv.Value) : null;
                        var prm = o["parameters"] is YMapping pm
                            ? pm.Entries.Where(p => p.Value is YScalar).ToImmutableDictionary(p => p.Key.Value, p => (((YScalar)p.Value).Value, p.Value.Span), StringComparer.Ordinal)
                            : ImmutableDictionary<string, (string, SourceSpan)>.Empty;
                        rules[e.Key.Value] = new RuleEntry(enabled, level, e.Key.Span, prm);
                        break;
                    }
                }
            }
        }
        ImmutableArray<(string, SourceSpan)> List(string key) =>
            m?[key] is YSequence s ? [.. s.Items.OfType<YScalar>().Select(x => (x.Value, x.Span))] : [];
        var packs = m?["packs"] is YSequence ? List("packs") : [("builtin", SourceSpan.FileStart)];
        return new ConfigView(failOn, failOnSpan, rules.ToImmutable(), packs, List("include"), List("exclude"), m?.Find("rules")?.Key.Span ?? SourceSpan.FileStart)
        {
            ElectricalCode = m?["electrical_code"] is YScalar ec ? (ec.Value, ec.Span) : null,
            IncludeGiven = m?["include"] is YSequence,
            IncludeSpan = m?.Find("include")?.Key.Span ?? SourceSpan.FileStart,
        };
    }

    // How strict a threshold is: note fails on the most, never on nothing.
    private static int Strictness(Level l) => l switch { Level.Note => 3, Level.Warning => 2, Level.Error => 1, _ => 0 };

    private static string FailOnToken(Level l) => l == Level.None ? "never" : l.Token();

    private static void CompareConfig(string rel, byte[]? oldBytes, byte[]? newBytes, Found found, Func<string, Level?> defaultLevelOf, List<ConfigView> oldAbove, List<ConfigView> newAbove)
    {
        var old = ReadConfig(Load(rel, oldBytes));
        var now = ReadConfig(Load(rel, newBytes));
        // fail_on and packs are read from the root configuration only (the outermost file): a file with another above
        // it may repeat the root's value and nothing else (another value stops the run), so a change there loosens nothing.
        var folderFile = oldAbove.Count > 0 || newAbove.Count > 0;
        if (!folderFile && Strictness(now.FailOn) < Strictness(old.FailOn))
        {
            found.Warn(now.FailOnSpan ?? SourceSpan.FileStart, "fail_on", EngineMessages.FailOnFewerFindings,
                ("new", FailOnToken(now.FailOn)), ("old", FailOnToken(old.FailOn)));
        }
        foreach (var id in old.Rules.Keys.Union(now.Rules.Keys).Order(StringComparer.Ordinal))
        {
            var o = old.Rules.GetValueOrDefault(id);
            var n = now.Rules.GetValueOrDefault(id);
            var defaultLevel = defaultLevelOf(id) ?? Level.Error;
            Level Effective(RuleEntry? r, List<ConfigView> above) =>
                above.Aggregate(default(RuleState), (state, v) => state.Then(v.Rules.GetValueOrDefault(id))).Then(r).LevelOr(defaultLevel);
            var (ol, nl) = (Effective(o, oldAbove), Effective(n, newAbove));
            var span = n?.Span ?? now.RulesSpan;
            if (nl == Level.None && ol != Level.None)
            {
                found.Warn(span, "rules." + id, EngineMessages.SwitchedOffLongerReports, ("id", id), ("old", ol.Token()));
            }
            else if (nl < ol)
            {
                found.Warn(span, "rules." + id, EngineMessages.SeverityLoweredFrom, ("id", id), ("old", ol.Token()), ("new", nl.Token()));
            }
            // Named element types and FindingValue spelt out: the code means the same, and a mutation testing tool can
            // compile its variants of this method (unnamed, they failed to compile and the whole method went unmeasured).
            var op = o?.Parameters ?? ImmutableDictionary<string, (string Text, SourceSpan Span)>.Empty;
            var np = n?.Parameters ?? ImmutableDictionary<string, (string Text, SourceSpan Span)>.Empty;
            foreach (var p in op.Keys.Union(np.Keys).Order(StringComparer.Ordinal))
            {
                var ot = op.TryGetValue(p, out var ov) ? ov.Text : null;
                var nt = np.TryGetValue(p, out var nv) ? nv.Text : null;
                if (ot == nt) continue;
                found.Note(nt is null ? span : nv.Span, "rules." + id + ".parameters." + p, EngineMessages.ParameterChangedFromCheck,
                    ("parameter", new FindingValue(p)), ("id", id), ("old", ot ?? "the rule's default"), ("new", nt ?? "the rule's default"));
            }
        }
        CompareCode(old, now, found);
        foreach (var (pack, _) in folderFile ? [] : old.Packs.Where(p => !now.Packs.Any(q => q.Text == p.Text)))
        {
            found.Warn(now.Packs.IsEmpty ? SourceSpan.FileStart : now.Packs[0].Span, "packs", EngineMessages.RulePackLongerUsed, ("pack", pack));
        }
        foreach (var (glob, span) in now.Exclude.Where(p => !old.Exclude.Any(q => q.Text == p.Text)))
        {
            found.Warn(span, "exclude", EngineMessages.FilesMatchingExcludedLonger, ("glob", glob));
        }
        if (!old.IncludeGiven && now.IncludeGiven)
        {
            found.Warn(now.Include.IsEmpty ? now.IncludeSpan : now.Include[0].Span, "include", EngineMessages.OnlyFilesMatchingChecked,
                ("globs", now.Include.IsEmpty ? "(none)" : string.Join(", ", now.Include.Select(i => i.Text))));
        }
        // Without an `include` of its own the file narrows nothing: the root's file then checks every YAML file, and a
        // folder's file leaves its folder to the include of the files above, whose globs are not these.
        else if (now.IncludeGiven || newAbove.Any(v => v.IncludeGiven))
        {
            foreach (var (glob, _) in old.Include.Where(p => !now.Include.Any(q => q.Text == p.Text)))
            {
                found.Warn(now.Include.IsEmpty ? SourceSpan.FileStart : now.Include[0].Span, "include", EngineMessages.FilesMatchingLongerIncluded, ("glob", glob));
            }
        }
    }

    // The governing code decides which rules run (SL801 only under NFPA 70). Moving away from NFPA 70, declared or
    // implied by a 60 Hz bus when none is declared, stops the built-in rules of that code: a warning. Any other change
    // stops the rules of a company's own packs written for the old code and starts those of the new: a note, for the
    // reviewer to judge. The same in the root's file and in a folder's.
    private static void CompareCode(ConfigView old, ConfigView now, Found found)
    {
        var (o, n) = (old.ElectricalCode?.Text, now.ElectricalCode?.Text);
        if (o == n) return;
        var span = now.ElectricalCode?.Span ?? SourceSpan.FileStart;
        (string, FindingValue)[] values = [("new", n ?? "not declared"), ("old", o ?? "not declared")];
        if (n != Model.ElectricalCodes.Nfpa70 && (o is null || o == Model.ElectricalCodes.Nfpa70))
        {
            found.Warn(span, "electrical_code", EngineMessages.CodeNoLongerNfpa70, values);
        }
        else
        {
            found.Note(span, "electrical_code", EngineMessages.CodeChanged, values);
        }
    }

    // ---- rule files of a company's own pack

    private static void CompareRule(string rel, byte[]? oldBytes, byte[]? newBytes, Found found)
    {
        var old = Load(rel, oldBytes)?.Root as YMapping;
        var now = Load(rel, newBytes)?.Root as YMapping;
        if (old is null) return; // a new rule only adds checks
        var id = (old["id"] as YScalar)?.Value ?? rel;
        if (now is null)
        {
            found.Warn(SourceSpan.FileStart, "", newBytes is null ? EngineMessages.RuleDeleted : EngineMessages.RuleFileNoLongerLoads, ("id", id));
            return;
        }
        var ol = (old["severity"] as YScalar)?.Value is { } os ? Levels.Parse(os) : null;
        var nl = (now["severity"] as YScalar)?.Value is { } ns ? Levels.Parse(ns) : null;
        if (ol is { } o && nl is { } n && n < o)
        {
            found.Warn(now["severity"]!.Span, "severity", EngineMessages.SeverityLoweredFrom, ("id", id), ("old", o.Token()), ("new", n.Token()));
        }
        var oldParams = old["parameters"] as YMapping;
        if (now["parameters"] is YMapping np)
        {
            foreach (var e in np.Entries)
            {
                var nd = Text((e.Value as YMapping)?["default"]);
                var od = Text((oldParams?[e.Key.Value] as YMapping)?["default"]);
                if (od is null || nd == od) continue;
                found.Note((e.Value as YMapping)?["default"]?.Span ?? e.Key.Span, "parameters." + e.Key.Value + ".default", EngineMessages.DefaultChangedFromCheck,
                    ("parameter", e.Key.Value), ("id", id), ("old", od), ("new", nd ?? "(none)"));
            }
        }
        foreach (var key in (string[])["let", "when", "check", "for_each", "applies_to"])
        {
            if (Canonical(old[key]) == Canonical(now[key])) continue;
            found.Note(now.Find(key)?.Key.Span ?? SourceSpan.FileStart, key, EngineMessages.ChangedCheckRuleStill, ("key", key), ("id", id));
        }
    }

    private static string? Text(YNode? node) => node is YScalar s ? s.Value : null;

    // A node's content without positions, to compare two versions of a rule.
    private static string Canonical(YNode? node)
    {
        var sb = new StringBuilder();
        void Walk(YNode? n)
        {
            switch (n)
            {
                case null: sb.Append('~'); break;
                case YScalar s: sb.Append('"').Append(s.Value).Append('"'); break;
                case YSequence q: sb.Append('['); foreach (var i in q.Items) { Walk(i); sb.Append(','); } sb.Append(']'); break;
                case YMapping m: sb.Append('{'); foreach (var e in m.Entries) { sb.Append(e.Key.Value).Append(':'); Walk(e.Value); sb.Append(','); } sb.Append('}'); break;
            }
        }
        Walk(node);
        return sb.ToString();
    }

    // ---- baseline

    private static void CompareBaseline(byte[]? oldBytes, byte[]? newBytes, Found found)
    {
        if (newBytes is null) return; // no baseline: every finding counts again
        var (now, _) = Baseline.Parse(Encoding.UTF8.GetString(newBytes));
        if (now is null || now.Entries.IsEmpty) return; // a broken baseline stops the run on its own
        var old = oldBytes is null ? null : Baseline.Parse(Encoding.UTF8.GetString(oldBytes)).Baseline;
        if (old is null)
        {
            found.Warn(SourceSpan.At(now.Entries[0].Line, 1), "", EngineMessages.NewBaselineAcceptsFindings,
                ("count", new FindingValue(now.Entries.Length.ToString(System.Globalization.CultureInfo.InvariantCulture), now.Entries.Length, "")));
            return;
        }
        var counts = old.Entries.GroupBy(e => e.Fingerprint, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        foreach (var e in now.Entries)
        {
            if (counts.TryGetValue(e.Fingerprint, out var c) && c > 0) { counts[e.Fingerprint] = c - 1; continue; }
            found.Warn(SourceSpan.At(e.Line, 1), e.File + "#" + e.KeyPath + "#" + e.RuleId, EngineMessages.BaselineAcceptsAtFinding,
                ("id", e.RuleId), ("file", e.File), ("keyPath", e.KeyPath.Length == 0 ? "(the file)" : e.KeyPath));
        }
    }

    // ---- acceptance comments in setting files

    // Only acceptances that accept a finding of this run count: a faulty or stale one is SL010 already.
    private static void CompareAcceptances(string rel, byte[]? oldBytes, byte[]? newBytes, Found found, IReadOnlyList<Finding> findings)
    {
        var accepting = findings.Where(f => f.File == rel && f.Suppression is not null)
            .Select(f => (f.RuleId, f.Suppression!.Span)).ToHashSet();
        if (accepting.Count == 0) return;
        var now = Load(rel, newBytes);
        if (now is null) return;
        var added = AcceptComments.Find(now);
        if (added.IsEmpty) return;
        var old = Load(rel, oldBytes);
        var before = (old is null ? [] : AcceptComments.Find(old))
            .Where(c => c.Reason is not null)
            .SelectMany(c => c.RuleIds.Select(id => id + "\n" + c.Reason))
            .GroupBy(k => k, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        foreach (var c in added.Where(c => c.Reason is not null))
        {
            foreach (var id in c.RuleIds.Distinct(StringComparer.Ordinal).Where(id => accepting.Contains((id, c.Span))))
            {
                var key = id + "\n" + c.Reason;
                if (before.TryGetValue(key, out var n) && n > 0) { before[key] = n - 1; continue; }
                found.Warn(c.Span, c.KeyPath, EngineMessages.NewAcceptanceOnFinding,
                    ("id", id), ("lines", c.LinesText), ("reason", c.Reason!));
            }
        }
    }
}
