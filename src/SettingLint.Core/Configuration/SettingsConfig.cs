using System.Collections.Immutable;
using System.Text.RegularExpressions;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Configuration;

/// <summary>The repository's `.settinglint.yaml`: packs, rule overrides, include/exclude globs, fail threshold.</summary>
/// <param name="File">The config file relative to the root; null when there is none.</param>
/// <param name="Packs">"builtin" or absolute folders of a company's own rules.</param>
public sealed record SettingsConfig(
    string? File,
    Level? FailOn,
    ImmutableArray<string> Include,
    ImmutableArray<string> Exclude,
    ImmutableArray<string> Packs,
    RuleOverrides Overrides)
{
    public const string FileName = ".settinglint.yaml";

    /// <summary>The names a configuration file may have in a folder, the preferred one first.</summary>
    public static readonly ImmutableArray<string> FileNames = [FileName, ".settinglint.yml"];

    /// <summary>Whether a file name (without folder) is a configuration file's.</summary>
    public static bool IsFileName(string name) => FileNames.Contains(name);

    /// <summary>`electrical_code`: the electrical code that governs the repository's installations; null when not declared.</summary>
    public string? ElectricalCode { get; init; }

    /// <summary>The electrical code this file declares, for every file (a folder's own configuration refines it: <see cref="ConfigScopes"/>).</summary>
    public string? ElectricalCodeOf(string relativePath) => ElectricalCode;

    public static SettingsConfig Default { get; } = new(null, null, [], [], ["builtin"], new RuleOverrides(new Dictionary<string, RuleOverride>()));

    /// <summary>Whether a root-relative path passes the include and exclude globs.</summary>
    public bool Includes(string relativePath)
    {
        if (Include.Length > 0 && !Include.Any(g => Glob.Matches(g, relativePath))) return false;
        return !Exclude.Any(g => Glob.Matches(g, relativePath));
    }

    /// <summary>
    /// Finds the run's root configuration, the outermost one between the source's root and the checked path (absolute),
    /// and reads it through the source; problems carry the file's positions. Files nearer the checked path are the
    /// configuration of their folders (<see cref="ConfigScopes"/>), whichever folder a run starts from.
    /// </summary>
    public static (SettingsConfig Config, ImmutableArray<Notification> Problems) Load(IFileSource source, string checkedPath, SchemaSet schemas)
    {
        ArgumentNullException.ThrowIfNull(source);
        var root = source.Root;
        var dir = source.Probe(checkedPath) == EntryKind.Folder ? checkedPath : Path.GetDirectoryName(checkedPath) ?? root;
        string? outermost = null;
        for (var d = dir; d is not null && Discovery.RepositoryRoot.Contains(root, d); d = Path.GetDirectoryName(d))
        {
            foreach (var name in FileNames)
            {
                var f = Path.Combine(d, name);
                if (source.Probe(f) == EntryKind.File) { outermost = f; break; }
            }
        }
        outermost ??= OnlyOutermostBelow(source, dir);
        return outermost is null ? (Default, []) : Read(source, outermost, schemas);
    }

    /// <summary>
    /// A check started above every configuration (the top of a repository whose configuration lives in a sub-folder)
    /// takes, as its root configuration, the one file below the start that every other lies under: its packs and
    /// fail_on are those its author wrote for the files it governs. With several side by side, none is the root.
    /// </summary>
    private static string? OnlyOutermostBelow(IFileSource source, string dir)
    {
        if (source.Probe(dir) != EntryKind.Folder) return null;
        var rel = Discovery.RepositoryRoot.Relative(source.Root, dir);
        var found = FileNames.SelectMany(name => source.FindFiles(rel == "." ? "" : rel, name))
            .Select(f => (File: f, Folder: f.Contains('/', StringComparison.Ordinal) ? f[..(f.LastIndexOf('/') + 1)] : ""))
            .ToList();
        var outer = found.Where(a => !found.Any(b => b.Folder != a.Folder && a.Folder.StartsWith(b.Folder, StringComparison.Ordinal))).ToList();
        return outer.Count == 1 ? Path.Combine(source.Root, outer[0].File) : null;
    }

    private static (SettingsConfig, ImmutableArray<Notification>) Read(IFileSource source, string path, SchemaSet schemas)
    {
        var root = source.Root;
        var rel = Discovery.RepositoryRoot.Relative(root, path);
        var loaded = source.Load(path, rel, LoadLimits.Default);
        var findings = new FindingBuilder(rel);
        foreach (var f in loaded.Findings) findings.Add(f);
        YMapping? m = loaded.Root as YMapping;
        if (m is null && loaded.Root is not null && !(loaded.Root is YScalar { Type: ScalarType.Null }))
        {
            findings.Add(EngineMessages.ConfigurationMappingKeys, loaded.Root.Span, "");
        }
        if (m is not null) SchemaValidator.Validate(m, schemas.Get(SchemaSet.Config), findings);
        var problems = findings.Findings.Select(f => new Notification(NotificationKind.Configuration, "Configuration: " + f.Message, rel, f.Span) { RuleId = f.RuleId, Values = f.Values }).ToList();
        if (problems.Count > 0 || m is null) return (Default with { File = rel }, [.. problems]);

        Level? failOn = m["fail_on"] is YScalar fo ? (fo.Value == "never" ? Level.None : Levels.Parse(fo.Value)) : null;
        ImmutableArray<string> List(string key) => m[key] is YSequence s ? [.. s.Items.OfType<YScalar>().Select(x => x.Value)] : [];
        var baseDir = Path.GetDirectoryName(path)!;
        var packs = ImmutableArray.CreateBuilder<string>();
        if (m["packs"] is YSequence ps)
        {
            foreach (var p in ps.Items.OfType<YScalar>())
            {
                if (p.Value == "builtin") { packs.Add("builtin"); continue; }
                var folder = Path.GetFullPath(Path.Combine(baseDir, p.Value));
                if (!Discovery.RepositoryRoot.Contains(root, folder) || source.Probe(folder) != EntryKind.Folder)
                {
                    problems.Add(new Notification(NotificationKind.Configuration, $"Configuration: the rule pack '{p.Value}' is not a folder inside the repository.", rel, p.Span));
                    continue;
                }
                packs.Add(folder);
            }
        }
        else
        {
            packs.Add("builtin");
        }
        var overrides = new Dictionary<string, RuleOverride>(StringComparer.Ordinal);
        if (m["rules"] is YMapping rules)
        {
            foreach (var e in rules.Entries)
            {
                switch (e.Value)
                {
                    case YScalar s:
                        overrides[e.Key.Value] = s.Value switch
                        {
                            "off" => new RuleOverride(false, Level.None, null),
                            "on" => new RuleOverride(true, null, null),
                            _ => new RuleOverride(true, Levels.Parse(s.Value), null),
                        };
                        break;
                    case YMapping o:
                    {
                        bool? enabled = o["enabled"] is YScalar en ? en.Value is "true" or "True" or "TRUE" : null;
                        Level? level = o["severity"] is YScalar sv ? Levels.Parse(sv.Value) : null;
                        if (enabled == false) level = Level.None;
                        Dictionary<string, (string, SourceSpan, string)>? prm = null;
                        if (o["parameters"] is YMapping pm)
                        {
                            prm = pm.Entries.Where(p => p.Value is YScalar).ToDictionary(p => p.Key.Value, p => (((YScalar)p.Value).Value, p.Value.Span, rel), StringComparer.Ordinal);
                        }
                        overrides[e.Key.Value] = new RuleOverride(enabled, level, prm);
                        break;
                    }
                }
            }
        }
        var code = m["electrical_code"] is YScalar ec ? ec.Value : null;
        return (new SettingsConfig(rel, failOn, List("include"), List("exclude"), packs.ToImmutable(), new RuleOverrides(overrides)) { ElectricalCode = code }, [.. problems]);
    }
}

/// <summary>Glob patterns on root-relative paths: `**` any folders, `*` within a name, `?` one character.</summary>
internal static class Glob
{
    private static readonly System.Collections.Concurrent.ConcurrentDictionary<string, Regex> Cache = new(StringComparer.Ordinal);

    public static bool Matches(string pattern, string path)
    {
        // A long-lived host (the language server) sees the configuration edited key by key: the cache is emptied
        // rather than let grow with every pattern ever typed.
        if (Cache.Count > MaxCached) Cache.Clear();
        return Cache.GetOrAdd(pattern, static p => new Regex("^" + ToRegex(p) + "$", RegexOptions.CultureInvariant, TimeSpan.FromSeconds(1))).IsMatch(path);
    }

    private const int MaxCached = 256;

    private static string ToRegex(string glob)
    {
        var sb = new System.Text.StringBuilder();
        for (var i = 0; i < glob.Length; i++)
        {
            var c = glob[i];
            if (c == '*' && i + 1 < glob.Length && glob[i + 1] == '*')
            {
                var slash = i + 2 < glob.Length && glob[i + 2] == '/';
                sb.Append(slash ? "(.*/)?" : ".*");
                i += slash ? 2 : 1;
            }
            else if (c == '*') sb.Append("[^/]*");
            else if (c == '?') sb.Append("[^/]");
            else sb.Append(Regex.Escape(c.ToString()));
        }
        return sb.ToString();
    }
}
