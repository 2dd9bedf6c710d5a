using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Configuration;

/// <summary>A value of one configuration file with the place it is written.</summary>
public sealed record Placed<T>(T Value, string File, SourceSpan Span);

/// <summary>One rule's entry in one configuration file: each part null when that file does not set it.</summary>
/// <param name="Enabled">false for `off` or `enabled: false`; true for `on`, a level word or `enabled: true`.</param>
/// <param name="Severity">The level written (a level word or `severity:`); null when the file leaves it to farther files or the rule.</param>
/// <param name="Key">Where the nearest file that names the rule names it.</param>
public sealed record RuleEntry(Placed<bool>? Enabled, Placed<Level>? Severity, ImmutableSortedDictionary<string, Placed<string>> Parameters, Placed<string> Key);

/// <summary>
/// What one `.settinglint.yaml` says, key by key, with the place of each value: what a folder's file adds to the files
/// farther up. A key the file does not write is null or empty, so that a nearer file overrides only what it writes.
/// </summary>
/// <param name="File">Root-relative path of the file.</param>
/// <param name="Folder">Root-relative folder it governs ("" for the root).</param>
public sealed record ConfigFile(
    string File,
    string Folder,
    Placed<string>? FailOn,
    Placed<ImmutableArray<string>>? Packs,
    Placed<ImmutableArray<string>>? Include,
    Placed<ImmutableArray<string>>? Exclude,
    Placed<string>? ElectricalCode,
    ImmutableSortedDictionary<string, RuleEntry> Rules)
{
    /// <summary>
    /// Reads and validates a configuration file (absolute) through a source: the file, or null with the problems that
    /// stop the run (a file that does not validate says nothing that can be trusted).
    /// </summary>
    public static (ConfigFile? File, ImmutableArray<Notification> Problems) Read(IFileSource source, string fullPath, SchemaSet schemas)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(schemas);
        var rel = Discovery.RepositoryRoot.Relative(source.Root, fullPath);
        var folder = rel.Contains('/', StringComparison.Ordinal) ? rel[..rel.LastIndexOf('/')] : "";
        var loaded = source.Load(fullPath, rel, LoadLimits.Default);
        var findings = new FindingBuilder(rel);
        foreach (var f in loaded.Findings) findings.Add(f);
        var m = loaded.Root as YMapping;
        if (m is null && loaded.Root is not null && loaded.Root is not YScalar { Type: ScalarType.Null })
        {
            findings.Add(EngineMessages.ConfigurationMappingKeys, loaded.Root.Span, "");
        }
        if (m is not null) SchemaValidator.Validate(m, schemas.Get(SchemaSet.Config), findings);
        if (findings.HasAny)
        {
            return (null, [.. findings.Findings.Select(f => new Notification(NotificationKind.Configuration, "Configuration: " + f.Message, rel, f.Span) { RuleId = f.RuleId, Values = f.Values })]);
        }
        return (Parse(rel, folder, m), []);
    }

    /// <summary>The keys of a configuration that validated (or of none: an empty file).</summary>
    public static ConfigFile Parse(string file, string folder, YMapping? m)
    {
        Placed<T> At<T>(T value, YNode node) => new(value, file, node.Span);
        Placed<ImmutableArray<string>>? List(string key) =>
            m?[key] is YSequence s ? At<ImmutableArray<string>>([.. s.Items.OfType<YScalar>().Select(x => x.Value)], s) : null;
        var rules = ImmutableSortedDictionary.CreateBuilder<string, RuleEntry>(StringComparer.Ordinal);
        if (m?["rules"] is YMapping rm)
        {
            foreach (var e in rm.Entries)
            {
                var none = ImmutableSortedDictionary<string, Placed<string>>.Empty.WithComparers(StringComparer.Ordinal);
                var key = At(e.Key.Value, e.Key);
                rules[e.Key.Value] = e.Value switch
                {
                    YScalar { Value: "off" } s => new RuleEntry(At(false, s), null, none, key),
                    YScalar { Value: "on" } s => new RuleEntry(At(true, s), null, none, key),
                    YScalar s => new RuleEntry(At(true, s), Levels.Parse(s.Value) is { } l ? At(l, s) : null, none, key),
                    YMapping o => new RuleEntry(
                        o["enabled"] is YScalar en ? At(en.Value is "true" or "True" or "TRUE", en) : null,
                        o["severity"] is YScalar sv && Levels.Parse(sv.Value) is { } level ? At(level, sv) : null,
                        o["parameters"] is YMapping pm
                            ? pm.Entries.Where(p => p.Value is YScalar).ToImmutableSortedDictionary(p => p.Key.Value, p => At(((YScalar)p.Value).Value, p.Value), StringComparer.Ordinal)
                            : none,
                        key),
                    _ => new RuleEntry(null, null, none, key),
                };
            }
        }
        return new ConfigFile(
            file,
            folder,
            m?["fail_on"] is YScalar fo ? At(fo.Value, fo) : null,
            List("packs"),
            List("include"),
            List("exclude"),
            m?["electrical_code"] is YScalar ec ? At(ec.Value, ec) : null,
            rules.ToImmutable());
    }
}
