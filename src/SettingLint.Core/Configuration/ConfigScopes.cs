using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Configuration;

/// <summary>
/// The configuration of each folder of one run: the root configuration, then every folder's own `.settinglint.yaml` on
/// the way down to a file. A folder's chain is resolved once, when a file of it is first asked about (discovery asks
/// about every file it lists), and shared by the folders below it that have no file of their own.
/// </summary>
public sealed class ConfigScopes
{
    private readonly IFileSource _source;
    private readonly SchemaSet _schemas;
    private readonly RuleLoadResult _packs;
    private readonly ConcurrentDictionary<string, Lazy<Scope>> _folders = new(StringComparer.Ordinal);

    /// <param name="source">Where the run reads files.</param>
    /// <param name="schemas">The schemas (the configuration's among them).</param>
    /// <param name="root">The run's root configuration (<see cref="SettingsConfig"/>): its file is where scoping starts.</param>
    /// <param name="packs">The loaded rule packs before any configuration, which each folder's rule settings are applied to.</param>
    /// <param name="rootRules">The rules configured by the root file alone, shared by every folder that adds no rule setting.</param>
    public ConfigScopes(IFileSource source, SchemaSet schemas, SettingsConfig root, RuleLoadResult packs, ImmutableArray<CompiledRule> rootRules)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(root);
        _source = source;
        _schemas = schemas;
        _packs = packs;
        RootConfig = root;
        var rootFile = root.File is { } f ? ConfigFile.Read(source, SourcePaths.Full(source.Root, f), schemas).File : null;
        RootFile = rootFile;
        BaseFolder = root.File is { } file ? Folder(file) : "";
        Root = new Scope(rootFile is null ? EffectiveConfig.None with { Folder = BaseFolder } : EffectiveConfig.None.Then(rootFile), null, [], rootRules);
    }

    /// <summary>The run's root configuration, whose fail_on and packs hold for every file.</summary>
    public SettingsConfig RootConfig { get; }

    /// <summary>The root configuration's keys with their places; null when there is none.</summary>
    public ConfigFile? RootFile { get; }

    /// <summary>The folder of the root configuration ("" for the repository root, or when there is none).</summary>
    public string BaseFolder { get; }

    /// <summary>The scope of the root configuration alone.</summary>
    public Scope Root { get; }

    /// <summary>What governs the files of one folder.</summary>
    /// <param name="Effective">The merged configuration, with where each value came from.</param>
    /// <param name="Own">The folder's own file as read; null when the folder shares its parent's scope.</param>
    /// <param name="Problems">The problems of the folder's own file (exit 2).</param>
    /// <param name="Rules">The rules as configured for this folder.</param>
    public sealed record Scope(EffectiveConfig Effective, ConfigFile? Own, ImmutableArray<Notification> Problems, ImmutableArray<CompiledRule> Rules);

    /// <summary>The scope of a root-relative file.</summary>
    public Scope For(string relativePath) => Of(Folder(relativePath));

    /// <summary>The problems of every folder's file asked about so far, in file and line order.</summary>
    public ImmutableArray<Notification> Problems =>
    [
        .. _folders.Values.Select(l => l.Value).Where(s => s.Own is not null || !s.Problems.IsEmpty).Distinct()
            .SelectMany(s => s.Problems)
            .OrderBy(n => n.File, StringComparer.Ordinal).ThenBy(n => n.Span?.StartLine ?? 0).ThenBy(n => n.Message, StringComparer.Ordinal),
    ];

    private static string Folder(string relativePath)
    {
        var slash = relativePath.LastIndexOf('/');
        return slash < 0 ? "" : relativePath[..slash];
    }

    private bool Below(string folder) =>
        BaseFolder.Length == 0 ? folder.Length > 0 : folder.StartsWith(BaseFolder + "/", StringComparison.Ordinal);

    private Scope Of(string folder)
    {
        if (!Below(folder)) return Root;
        return _folders.GetOrAdd(folder, f => new Lazy<Scope>(() => Resolve(f))).Value;
    }

    private Scope Resolve(string folder)
    {
        var parent = Of(Folder(folder));
        string? path = null;
        foreach (var name in SettingsConfig.FileNames)
        {
            var candidate = SourcePaths.Full(_source.Root, folder + "/" + name);
            if (_source.Probe(candidate) == EntryKind.File) { path = candidate; break; }
        }
        if (path is null) return parent;
        var (file, problems) = ConfigFile.Read(_source, path, _schemas);
        // A file that does not validate is not applied: its problems stop the run.
        if (file is null) return parent with { Own = null, Problems = problems };
        var found = problems.ToBuilder();
        RunWide(file, found);
        var effective = parent.Effective.Then(file);
        var rules = parent.Rules;
        if (!file.Rules.IsEmpty)
        {
            var configured = RuleLoader.Configure(_packs, effective.Overrides());
            // Problems of farther files are theirs, reported where those are read.
            found.AddRange(configured.Problems.Where(p => p.File == file.File));
            foreach (var (id, entry) in file.Rules.Where(r => !_packs.Rules.Any(x => x.Id == r.Key) && !EngineRules.All.Any(x => x.Id == r.Key)))
            {
                found.Add(new Notification(NotificationKind.Configuration, $"Configuration: the rule {id} is not in any loaded pack.", file.File, entry.Key.Span));
            }
            rules = configured.Rules;
        }
        return new Scope(effective, file, found.ToImmutable(), rules);
    }

    /// <summary>
    /// fail_on and packs hold for the whole run and are read from the root configuration only. A folder's file that
    /// says otherwise is a configuration problem at its line (exit 2), not ignored: carried on with the root's value,
    /// the run would pass that folder's files under a threshold or without a pack its author believed applied. The
    /// same value as the root's says nothing new and is accepted.
    /// </summary>
    private void RunWide(ConfigFile file, ImmutableArray<Notification>.Builder problems)
    {
        var root = RootConfig.File ?? "none (the defaults)";
        var runFailOn = RootConfig.FailOn is { } l ? (l == Level.None ? "never" : l.Token()) : "error";
        if (file.FailOn is { } fo && fo.Value != runFailOn)
        {
            problems.Add(new Notification(NotificationKind.Configuration,
                $"Configuration: fail_on holds for the whole run and is read from the root configuration only ({root}, fail_on {runFailOn}); " +
                $"this folder's file sets {fo.Value}. Set it in the root configuration, or remove it here.", file.File, fo.Span));
        }
        if (file.Packs is { } packs)
        {
            var here = packs.Value.Select(p => p == "builtin" ? p : Path.GetFullPath(SourcePaths.Full(_source.Root, file.Folder.Length == 0 ? p : file.Folder + "/" + p)))
                .Order(StringComparer.Ordinal);
            if (!here.SequenceEqual(RootConfig.Packs.Order(StringComparer.Ordinal), StringComparer.Ordinal))
            {
                problems.Add(new Notification(NotificationKind.Configuration,
                    $"Configuration: packs hold for the whole run and are read from the root configuration only ({root}); " +
                    "this folder's file names others. Name them in the root configuration, or remove them here.", file.File, packs.Span));
            }
        }
    }
}
