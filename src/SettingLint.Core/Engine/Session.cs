using System.Collections.Immutable;
using SettingLint.Core.Configuration;
using SettingLint.Core.Discovery;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Engine;

/// <summary>Everything a run is set up with: root, configuration and compiled rules, or the problems that stop it (exit 2).</summary>
public sealed record Session(string Root, SettingsConfig Config, RuleSet Rules, ImmutableArray<Notification> Problems)
{
    /// <summary>Finds the root and the configuration for the checked paths and loads the rule packs it names.</summary>
    public static Session Open(IReadOnlyList<string> paths, SchemaSet? schemas = null)
    {
        var s = schemas ?? SchemaSet.Shared;
        s.Warm();
        var first = paths.Count == 0 ? "." : paths[0];
        var root = RepositoryRoot.Find(first);
        // The built-in pack compiles on the thread pool (started by the command already, or now) while the
        // configuration is read: the two longest steps of a one-file run overlap.
        var builtIn = RuleLoader.CompiledBuiltIn(s);
        var (config, problems) = SettingsConfig.Load(root, first, s);
        var results = new List<RuleLoadResult>();
        RuleLoader? folders = null;
        foreach (var pack in config.Packs)
        {
            results.Add(pack == "builtin" ? builtIn.GetAwaiter().GetResult() : (folders ??= new RuleLoader(s)).Load(RuleLoader.FromFolder(pack, root)));
        }
        var merged = RuleLoader.Merge(results);
        var loaded = RuleLoader.Configure(merged, config.Overrides);
        // Asked of the packs as loaded: a rule that its configuration made unusable (a parameter in the wrong unit) is
        // reported for that alone, not also as missing.
        var unknown = config.Overrides.ById.Keys.Where(id => !merged.Rules.Any(r => r.Id == id) && !EngineRules.All.Any(r => r.Id == id))
            .Select(id => new Notification(NotificationKind.Configuration, $"Configuration: the rule {id} is not in any loaded pack.", config.File));
        return new Session(root, config, new RuleSet(loaded.Rules), [.. problems, .. loaded.Problems, .. unknown]);
    }

    /// <summary>Runs the check, with the gate's options when given; configuration problems give a result with no findings and exit 2.</summary>
    public CheckResult Check(IReadOnlyList<string> paths, Level? failOn, bool parallel = true, GateOptions? gate = null)
    {
        var threshold = failOn ?? Config.FailOn ?? Level.Error;
        if (Problems.Length > 0)
        {
            return new CheckResult(Root, [], [.. EngineRules.All.Concat(Rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal)], Problems, 0, [], threshold);
        }
        if (gate is not null) return GatedCheck.Run(this, paths, threshold, parallel, gate);
        return new Checker(Rules).Run(new CheckOptions(paths, threshold, Parallel: parallel, Include: Config.Includes, ElectricalCode: Config.ElectricalCodeOf));
    }
}
