using System.Collections.Immutable;
using SettingLint.Core.Configuration;
using SettingLint.Core.Discovery;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Engine;

/// <summary>Everything a run is set up with: root, configuration and compiled rules, or the problems that stop it (exit 2).</summary>
public sealed record Session(string Root, SettingsConfig Config, RuleSet Rules, ImmutableArray<Notification> Problems)
{
    /// <summary>Finds the root and the configuration for the checked paths (absolute) on disk and loads the rule packs it names.</summary>
    public static Session Open(IReadOnlyList<string> paths, SchemaSet? schemas = null)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var first = SourcePaths.Absolute(paths.Count == 0 ? "." : paths[0], null);
        return Open(new DiskSource(RepositoryRoot.Find(first)), first, schemas);
    }

    /// <summary>
    /// Reads the configuration that applies to a checked path (absolute) through a source, and loads the rule packs it
    /// names from the same source (a revision's packs as they were then).
    /// </summary>
    public static Session Open(IFileSource source, string checkedPath, SchemaSet? schemas = null)
    {
        ArgumentNullException.ThrowIfNull(source);
        var s = schemas ?? SchemaSet.Shared;
        s.Warm();
        var root = source.Root;
        // The built-in pack compiles on the thread pool (started by the command already, or now) while the
        // configuration is read: the two longest steps of a one-file run overlap.
        var builtIn = RuleLoader.CompiledBuiltIn(s);
        var (config, problems) = SettingsConfig.Load(source, checkedPath, s);
        RuleLoader? folders = null;
        // Each pack with its id rules (pack.yaml prefixes, SL reserved); a prefix declared twice stops the run.
        var results = RulePacks.Load(source, config.Packs, () => builtIn.GetAwaiter().GetResult(), () => folders ??= new RuleLoader(s));
        var merged = RuleLoader.Merge(results);
        var loaded = RuleLoader.Configure(merged, config.Overrides);
        // Asked of the packs as loaded: a rule that its configuration made unusable (a parameter in the wrong unit) is
        // reported for that alone, not also as missing.
        var unknown = config.Overrides.ById.Keys.Where(id => !merged.Rules.Any(r => r.Id == id) && !EngineRules.All.Any(r => r.Id == id))
            .Select(id => new Notification(NotificationKind.Configuration, $"Configuration: the rule {id} is not in any loaded pack.", config.File));
        return new Session(root, config, new RuleSet(loaded.Rules), [.. problems, .. loaded.Problems, .. unknown])
        {
            Scopes = problems.IsEmpty ? new ConfigScopes(source, s, config, merged, loaded.Rules) : null,
        };
    }

    /// <summary>
    /// The configuration of each folder below the root configuration (its `.settinglint.yaml` files); null for a session
    /// made without reading configuration (the rule fixtures).
    /// </summary>
    public ConfigScopes? Scopes { get; init; }

    /// <summary>The rules a run applies: to each motor, <see cref="Rules"/> as its folder's configuration sets them.</summary>
    internal IRuleSet RunRules => Scopes is null ? Rules : new ScopedRuleSet(Rules, Scopes);

    /// <summary>Whether a root-relative file is checked under the include and exclude globs of its folder's configuration.</summary>
    public bool Includes(string relativePath) => Scopes?.For(relativePath).Effective.Includes(relativePath) ?? Config.Includes(relativePath);

    /// <summary>`electrical_code` of the configuration that governs a root-relative file; null when none declares one.</summary>
    public string? ElectricalCodeOf(string relativePath) =>
        Scopes is null ? Config.ElectricalCodeOf(relativePath) : Scopes.For(relativePath).Effective.ElectricalCode?.Value;

    /// <summary>
    /// A run's result, or, when a folder's configuration file that the run met has problems, a result with those
    /// problems alone (exit 2), as for the root configuration's.
    /// </summary>
    public CheckResult Finish(CheckResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        return Scopes?.Problems is { IsEmpty: false } found ? Stopped(result.FailOn, found) : result;
    }

    /// <summary>A result with no findings that carries the session's problems (exit 2), or other problems that stop a run.</summary>
    public CheckResult Stopped(Level threshold, ImmutableArray<Notification> problems) =>
        new(Root, [], [.. EngineRules.All.Concat(Rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal)], problems, 0, threshold);

    /// <summary>
    /// The checker's options under this session's configuration (its include and exclude globs, its root): the one
    /// place where the configuration becomes options, for this session's own run and the gate's.
    /// </summary>
    public CheckOptions Options(IReadOnlyList<string> paths, Level threshold, bool parallel) =>
        new(paths, threshold, Parallel: parallel, Include: Included(), Root: Root, ElectricalCode: ElectricalCodeOf);

    // The configuration's globs, less the fixture folders of its packs (test data of rules, never plant files).
    private Func<string, bool> Included()
    {
        var fixture = RulePacks.FixtureFilter(Root, Config.Packs);
        return rel => Includes(rel) && !fixture(rel);
    }

    /// <summary>Runs the check of absolute paths on disk without the gate; configuration problems give a result with no findings and exit 2.</summary>
    /// <remarks>Front ends call <c>Linter.Check</c>, which adds the gate, sources and observers; this is the engine's own run.</remarks>
    public CheckResult Check(IReadOnlyList<string> paths, Level? failOn, bool parallel = true)
    {
        var threshold = failOn ?? Config.FailOn ?? Level.Error;
        if (Problems.Length > 0) return Stopped(threshold, Problems);
        return Finish(new Checker(RunRules).Run(Options(paths, threshold, parallel)));
    }
}
