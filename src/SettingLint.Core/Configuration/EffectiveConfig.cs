using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Configuration;

/// <summary>
/// The configuration that governs the files of one folder: the root file, then each folder's `.settinglint.yaml` on the
/// way down, a nearer file overriding a farther one key by key (for a rule: enabled, severity and each parameter on
/// their own). Every value keeps the file and line it came from.
/// </summary>
/// <param name="Folder">Root-relative folder ("" for the root).</param>
/// <param name="Files">The configuration files that apply, farthest first.</param>
public sealed record EffectiveConfig(
    string Folder,
    ImmutableArray<string> Files,
    Placed<string>? ElectricalCode,
    Placed<ImmutableArray<string>>? Include,
    Placed<ImmutableArray<string>>? Exclude,
    ImmutableSortedDictionary<string, RuleEntry> Rules)
{
    /// <summary>No configuration file at all.</summary>
    public static EffectiveConfig None { get; } = new("", [], null, null, null, ImmutableSortedDictionary<string, RuleEntry>.Empty.WithComparers(StringComparer.Ordinal));

    /// <summary>This configuration with a nearer file's keys over it.</summary>
    public EffectiveConfig Then(ConfigFile file)
    {
        ArgumentNullException.ThrowIfNull(file);
        var rules = Rules.ToBuilder();
        foreach (var (id, entry) in file.Rules)
        {
            var farther = Rules.GetValueOrDefault(id);
            rules[id] = farther is null ? entry : new RuleEntry(
                entry.Enabled ?? farther.Enabled,
                entry.Severity ?? farther.Severity,
                farther.Parameters.SetItems(entry.Parameters),
                entry.Key);
        }
        return new EffectiveConfig(
            file.Folder,
            Files.Add(file.File),
            file.ElectricalCode ?? ElectricalCode,
            file.Include ?? Include,
            file.Exclude ?? Exclude,
            rules.ToImmutable());
    }

    /// <summary>The rule settings as the rule loader applies them to compiled rules.</summary>
    public RuleOverrides Overrides() => new(Rules.ToDictionary(
        r => r.Key,
        r => new RuleOverride(
            r.Value.Enabled?.Value,
            r.Value.Enabled?.Value == false ? Level.None : r.Value.Severity?.Value,
            r.Value.Parameters.IsEmpty ? null : r.Value.Parameters.ToDictionary(p => p.Key, p => (p.Value.Value, p.Value.Span, p.Value.File), StringComparer.Ordinal)),
        StringComparer.Ordinal));

    /// <summary>
    /// Whether a root-relative file passes the include and exclude globs that govern it; each glob is matched against
    /// the path relative to the folder of the file that wrote it (as the schema says: "relative to this file").
    /// </summary>
    public bool Includes(string relativePath)
    {
        if (Include is { } inc && !inc.Value.Any(g => Glob.Matches(g, Below(inc.File, relativePath)))) return false;
        return Exclude is not { } exc || !exc.Value.Any(g => Glob.Matches(g, Below(exc.File, relativePath)));
    }

    // The path relative to the configuration file's folder; a path outside that folder is matched as the root names it.
    private static string Below(string configFile, string relativePath)
    {
        var slash = configFile.LastIndexOf('/');
        if (slash < 0) return relativePath;
        var folder = configFile[..(slash + 1)];
        return relativePath.StartsWith(folder, StringComparison.Ordinal) ? relativePath[folder.Length..] : relativePath;
    }
}
