using System.Collections.Immutable;
using System.Text.RegularExpressions;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Rules;

/// <summary>
/// A company pack's `pack.yaml`: the prefix of its rule ids (`prefix: ACME` for `ACME101`).
/// </summary>
/// <param name="Folder">The pack folder (absolute).</param>
/// <param name="File">The manifest, relative to the repository root (for messages).</param>
/// <param name="Prefix">The declared prefix.</param>
/// <param name="PrefixSpan">Where the prefix is written.</param>
public sealed record PackManifest(string Folder, string File, string Prefix, SourceSpan PrefixSpan);

/// <summary>
/// The rule packs a configuration names, loaded with their id rules: the built-in pack owns the prefix SL; a folder
/// with a `pack.yaml` uses its declared prefix for every rule, each rule in a folder named by its id; a folder without
/// one keeps SLnnn ids as before company prefixes existed (a clash with a built-in id is reported by <see cref="RuleLoader.Merge"/>).
/// Two packs may not declare one prefix.
/// </summary>
public static partial class RulePacks
{
    /// <summary>The name of a pack's manifest, at the pack folder's root.</summary>
    public const string ManifestName = "pack.yaml";

    /// <summary>The prefix of the built-in rules (and of the engine's own ids); no company pack may declare it.</summary>
    public const string BuiltInPrefix = "SL";

    /// <summary>The pack name of the built-in rules in a configuration's `packs:`.</summary>
    public const string BuiltIn = "builtin";

    [GeneratedRegex("^[A-Z]{2,8}$", RegexOptions.CultureInvariant)]
    private static partial Regex PrefixPattern();

    // What the built-in rules and packs without pack.yaml use (SL0xx are the engine's own ids).
    [GeneratedRegex("^SL[1-9][0-9]{2}$", RegexOptions.CultureInvariant)]
    private static partial Regex SlRuleId();

    /// <summary>Loads each pack in order (the built-in one through <paramref name="builtIn"/>), then reports prefixes declared twice.</summary>
    /// <param name="source">Where the pack folders are read.</param>
    /// <param name="packs">"builtin" or absolute pack folders, in the configuration's order.</param>
    /// <param name="builtIn">The compiled built-in pack.</param>
    /// <param name="loader">A loader for folder packs (made only when one is named).</param>
    public static ImmutableArray<RuleLoadResult> Load(IFileSource source, IEnumerable<string> packs, Func<RuleLoadResult> builtIn, Func<RuleLoader> loader)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(packs);
        ArgumentNullException.ThrowIfNull(builtIn);
        ArgumentNullException.ThrowIfNull(loader);
        var results = ImmutableArray.CreateBuilder<RuleLoadResult>();
        var manifests = new List<PackManifest>();
        foreach (var pack in packs)
        {
            if (pack == BuiltIn)
            {
                results.Add(builtIn());
                continue;
            }
            var (manifest, manifestProblems) = ReadManifest(source, pack);
            if (manifest is not null) manifests.Add(manifest);
            var loaded = loader().Load(RuleLoader.FromSource(source, pack));
            results.Add(CheckIds(loaded, manifest, manifestProblems));
        }
        var collisions = Collisions(manifests);
        if (!collisions.IsEmpty) results.Add(new RuleLoadResult([], collisions));
        return results.ToImmutable();
    }

    /// <summary>
    /// Reads a pack folder's `pack.yaml` through a source; null without problems when there is none (the pack keeps
    /// SLnnn ids), null with problems at their lines when it is not a valid manifest.
    /// </summary>
    public static (PackManifest? Manifest, ImmutableArray<Notification> Problems) ReadManifest(IFileSource source, string folder)
    {
        ArgumentNullException.ThrowIfNull(source);
        var full = Path.Combine(folder, ManifestName);
        if (source.Probe(full) != EntryKind.File) return (null, []);
        var rel = RepositoryRoot.Relative(source.Root, full);
        var loaded = source.Load(full, rel, LoadLimits.Default);
        Notification Problem(string message, SourceSpan span) => new(NotificationKind.Configuration, "Rule pack: " + message, rel, span);
        if (loaded.Findings.Count > 0)
        {
            return (null, [.. loaded.Findings.Select(f => new Notification(NotificationKind.Configuration, "Rule pack: " + f.Message, rel, f.Span) { RuleId = f.RuleId, Values = f.Values })]);
        }
        if (loaded.Root is not YMapping m)
        {
            return (null, [Problem("pack.yaml is a mapping with the key 'prefix' (the prefix of the pack's rule ids, as 'prefix: ACME').", loaded.Root?.Span ?? SourceSpan.FileStart)]);
        }
        var problems = ImmutableArray.CreateBuilder<Notification>();
        foreach (var e in m.Entries.Where(e => e.Key.Value is not ("prefix" or "title")))
        {
            problems.Add(Problem($"pack.yaml has no key '{e.Key.Value}'; it has 'prefix' and an optional 'title'.", e.Key.Span));
        }
        if (m["title"] is { } title and not YScalar { Type: ScalarType.String })
        {
            problems.Add(Problem("The title of a pack is one line of text.", title.Span));
        }
        PackManifest? manifest = null;
        switch (m.Find("prefix"))
        {
            case null:
                problems.Add(Problem("pack.yaml must declare the prefix of the pack's rule ids, as 'prefix: ACME'.", m.Span));
                break;
            case { Value: YScalar p } when p.Value == BuiltInPrefix:
                problems.Add(Problem($"The prefix {BuiltInPrefix} is reserved for the built-in rules; choose a prefix of your own, as 'prefix: ACME'.", p.Span));
                break;
            case { Value: YScalar { Type: ScalarType.String } p } when PrefixPattern().IsMatch(p.Value):
                manifest = new PackManifest(folder, rel, p.Value, p.Span);
                break;
            case { Value: var v }:
                problems.Add(Problem($"The prefix '{(v as YScalar)?.Value}' is not two to eight capital letters A-Z, as 'prefix: ACME' (ids ACME101, ...).", v.Span));
                break;
        }
        return problems.Count > 0 ? (null, problems.ToImmutable()) : (manifest, []);
    }

    /// <summary>Each prefix declared by a second pack is a problem at that pack's `prefix:` line.</summary>
    public static ImmutableArray<Notification> Collisions(IEnumerable<PackManifest> manifests)
    {
        var first = new Dictionary<string, PackManifest>(StringComparer.Ordinal);
        var problems = ImmutableArray.CreateBuilder<Notification>();
        foreach (var m in manifests)
        {
            if (first.TryGetValue(m.Prefix, out var earlier))
            {
                problems.Add(new Notification(NotificationKind.Configuration,
                    $"Rule pack: the prefix {m.Prefix} is also declared by {earlier.File}; two packs cannot share a prefix, give this one its own.", m.File, m.PrefixSpan));
                continue;
            }
            first[m.Prefix] = m;
        }
        return problems.ToImmutable();
    }

    /// <summary>
    /// Keeps the rules whose ids the pack may use and reports the others at their `id:` line: with a manifest, the
    /// declared prefix and three digits, in a folder of that name; without one, SLnnn.
    /// </summary>
    public static RuleLoadResult CheckIds(RuleLoadResult loaded, PackManifest? manifest, ImmutableArray<Notification> manifestProblems)
    {
        ArgumentNullException.ThrowIfNull(loaded);
        // A broken manifest leaves the pack's ids unjudged and its rules unloaded: its own problem is the one to fix first.
        if (!manifestProblems.IsEmpty) return new RuleLoadResult([], [.. manifestProblems, .. loaded.Problems]);
        var problems = loaded.Problems.ToBuilder();
        var rules = ImmutableArray.CreateBuilder<CompiledRule>();
        foreach (var rule in loaded.Rules)
        {
            if (IdProblem(rule, manifest) is { } message)
            {
                problems.Add(new Notification(NotificationKind.Configuration, rule.Id + ": " + message, rule.SourceFile, rule.Span));
                continue;
            }
            rules.Add(rule);
        }
        return new RuleLoadResult(rules.ToImmutable(), problems.ToImmutable());
    }

    private static string? IdProblem(CompiledRule rule, PackManifest? manifest)
    {
        var id = rule.Id;
        if (manifest is null)
        {
            if (SlRuleId().IsMatch(id)) return null;
            var letters = new string([.. id.TakeWhile(char.IsAsciiLetterUpper)]);
            return $"a pack without {ManifestName} uses ids SL101 to SL999; to use {id}, declare the prefix in the pack folder's {ManifestName} ('prefix: {(letters.Length >= 2 ? letters : "ACME")}').";
        }
        var prefix = manifest.Prefix;
        var digits = id.Length == prefix.Length + 3 && id.StartsWith(prefix, StringComparison.Ordinal) && id[prefix.Length..].All(char.IsAsciiDigit);
        if (!digits)
        {
            if (id.StartsWith(BuiltInPrefix, StringComparison.Ordinal) && id.Length == 5 && id[2..].All(char.IsAsciiDigit))
            {
                return $"the ids SLnnn are reserved for the built-in rules; this pack's prefix is {prefix} ({manifest.File}), so its ids are {prefix}101 and the like.";
            }
            return $"this pack's ids are its prefix {prefix} ({manifest.File}) and three digits, as {prefix}101.";
        }
        var folder = Path.GetFileName(Path.GetDirectoryName(rule.SourceFile.Replace('\\', '/')) ?? "");
        if (folder != id) return $"the rule lies in the folder '{folder}'; a pack's rule lies in a folder named by its id ({id}/rule.yaml).";
        return null;
    }

    /// <summary>
    /// Whether a root-relative file lies in a fixtures folder of a configured pack folder: test data for the pack's
    /// rules, never a file of the plant.
    /// </summary>
    public static Func<string, bool> FixtureFilter(string root, IEnumerable<string> packs)
    {
        var prefixes = packs.Where(p => p != BuiltIn)
            .Select(p => RepositoryRoot.Relative(root, p).TrimEnd('/'))
            .Select(p => p is "." or "" ? "" : p + "/")
            .ToArray();
        if (prefixes.Length == 0) return static _ => false;
        return rel => prefixes.Any(p => rel.StartsWith(p, StringComparison.Ordinal) && ("/" + rel[p.Length..]).Contains("/fixtures/", StringComparison.Ordinal));
    }
}
