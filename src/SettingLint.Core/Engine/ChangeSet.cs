using System.Collections.Immutable;
using SettingLint.Core.Configuration;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Engine;

/// <summary>
/// What changed since a revision, as root-relative paths, with the old contents the gate compares against; and the
/// rule that turns it into the setting files to check.
/// </summary>
/// <param name="Revision">The revision as the user gave it.</param>
/// <param name="Commit">The commit it names; null before the first commit (everything staged is new).</param>
/// <param name="Staged">The new side is the index, not the working tree.</param>
/// <param name="Changed">Added or modified files, sorted.</param>
/// <param name="Deleted">Deleted files, sorted.</param>
/// <param name="EverythingBecause">Why every file must be checked (a configuration, rule or baseline file changed); null when not.</param>
/// <param name="OldContents">The contents at the revision of the changed and deleted YAML files and of the baseline, when they existed there.</param>
public sealed record ChangeSet(
    string Revision,
    string? Commit,
    bool Staged,
    ImmutableSortedSet<string> Changed,
    ImmutableSortedSet<string> Deleted,
    string? EverythingBecause,
    ImmutableDictionary<string, byte[]> OldContents)
{
    /// <summary>Whether the change can alter any finding: a YAML file changed or was deleted, or everything is to be checked.</summary>
    public bool TouchesSettings => EverythingBecause is not null || Changed.Concat(Deleted).Any(FileDiscovery.IsYaml);

    /// <summary>
    /// Finds the changes since a revision (with <paramref name="staged"/>, those in the index) in the work tree that
    /// holds <paramref name="root"/>.
    /// </summary>
    /// <param name="git">The work tree.</param>
    /// <param name="commit">The commit <paramref name="revision"/> names, as <see cref="GitRepository.Open(string, string)"/> found it; null when it names none.</param>
    /// <param name="root">The SettingLint repository root (absolute).</param>
    /// <param name="revision">The revision to compare with.</param>
    /// <param name="staged">Compare the index rather than the working tree.</param>
    /// <param name="packFolders">The rule pack folders of the configuration (absolute; "builtin" is skipped).</param>
    /// <param name="baselineFile">The baseline in use, root-relative; null when none.</param>
    public static ChangeSet Detect(GitRepository git, string? commit, string root, string revision, bool staged, IEnumerable<string> packFolders, string? baselineFile)
    {
        // Only the staged contents may be compared with a HEAD that names nothing yet (before the first commit: everything staged is new).
        if (commit is null && !(staged && revision == "HEAD")) throw GitRepository.NotARevision(revision);
        var changed = ImmutableSortedSet.CreateBuilder<string>(StringComparer.Ordinal);
        var deleted = ImmutableSortedSet.CreateBuilder<string>(StringComparer.Ordinal);
        var gitPathOf = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var c in git.Changes(commit, staged))
        {
            var full = Path.GetFullPath(Path.Combine(git.TopLevel, c.Path));
            if (!RepositoryRoot.Contains(root, full)) continue;
            var rel = RepositoryRoot.Relative(root, full);
            gitPathOf[rel] = c.Path;
            (c.Deleted ? deleted : changed).Add(rel);
        }
        var packs = packFolders.Where(p => p != "builtin").Select(p => RepositoryRoot.Relative(root, p).TrimEnd('/') + "/").ToList();
        string? everything = null;
        foreach (var rel in changed.Concat(deleted))
        {
            var name = rel[(rel.LastIndexOf('/') + 1)..];
            if (SettingsConfig.IsFileName(name)) everything = "the configuration " + rel + " changed";
            else if (packs.Any(p => rel.StartsWith(p, StringComparison.Ordinal))) everything = "the rule file " + rel + " changed";
            else if (rel == baselineFile) everything = "the baseline " + rel + " changed";
            if (everything is not null) break;
        }
        var old = ImmutableDictionary<string, byte[]>.Empty.WithComparers(StringComparer.Ordinal);
        if (commit is not null)
        {
            var wanted = changed.Concat(deleted).Where(r => FileDiscovery.IsYaml(r) || r == baselineFile).ToList();
            var contents = git.Show(commit, wanted.Select(r => gitPathOf[r]));
            old = old.AddRange(wanted.Where(r => contents.ContainsKey(gitPathOf[r])).Select(r => KeyValuePair.Create(r, contents[gitPathOf[r]])));
        }
        return new ChangeSet(revision, commit, staged, changed.ToImmutable(), deleted.ToImmutable(), everything, old);
    }

    /// <summary>
    /// The setting files to check: the changed ones; every motor on a bus that changed, that a changed motor is or was
    /// on (the rules compare motors on one bus), or whose file was deleted; every motor whose relay model changed or was
    /// deleted. Returns the selection and, of it, the files selected only as dependants.
    /// </summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="motors">The bus and relay model each motor file refers to.</param>
    /// <param name="settingFiles">Every setting file of the run, root-relative.</param>
    public (ImmutableSortedSet<string> Selected, ImmutableSortedSet<string> Dependants) Select(string root, IReadOnlyCollection<MotorReferences> motors, IEnumerable<string> settingFiles)
    {
        var buses = TouchedBuses(root, motors);
        var selected = ImmutableSortedSet.CreateBuilder<string>(StringComparer.Ordinal);
        foreach (var f in settingFiles)
        {
            if (Changed.Contains(f)) selected.Add(f);
        }
        foreach (var m in motors)
        {
            if (Selects(m, buses)) selected.Add(m.File);
        }
        var all = selected.ToImmutable();
        return (all, all.Except(Changed));
    }

    /// <summary>
    /// The files a changed-files run must load: the selection, the other motors on the buses of the selected motors (the
    /// rules compare motors on one bus), the files the quick read was not sure of, and the files with the tag of a
    /// selected file (a tag names one piece of equipment: the first file with it, by path, is told of the others). Null
    /// when the quick read of a changed file was not sure enough.
    /// </summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="motors">The bus and relay model each motor file refers to.</param>
    /// <param name="uncertain">The files the quick read was not sure of.</param>
    /// <param name="settingFiles">Every setting file of the run, root-relative.</param>
    /// <param name="tags">The tag of each file the quick read was sure of, by file; none when not given.</param>
    public ImmutableHashSet<string>? LoadPlan(string root, IReadOnlyCollection<MotorReferences> motors, IReadOnlyCollection<string> uncertain, IEnumerable<string> settingFiles,
        IReadOnlyDictionary<string, string>? tags = null)
    {
        // A changed file that could not be read quickly may be a motor on any bus.
        if (uncertain.Any(Changed.Contains)) return null;
        var (selected, _) = Select(root, motors, settingFiles);
        var busesOfSelected = motors.Where(m => selected.Contains(m.File) && m.Bus is not null).Select(m => m.Bus!).ToHashSet(StringComparer.Ordinal);
        var plan = ImmutableHashSet.CreateBuilder<string>(StringComparer.Ordinal);
        plan.UnionWith(selected);
        plan.UnionWith(uncertain);
        plan.UnionWith(motors.Where(m => m.Bus is { } b && busesOfSelected.Contains(b)).Select(m => m.File));
        if (tags is not null)
        {
            var selectedTags = selected.Select(f => tags.GetValueOrDefault(f)).OfType<string>().ToHashSet(StringComparer.Ordinal);
            if (selectedTags.Count > 0) plan.UnionWith(tags.Where(t => selectedTags.Contains(t.Value)).Select(t => t.Key));
        }
        return plan.ToImmutable();
    }

    /// <summary>The motors of a bound repository with their references, resolved as the reference resolver does.</summary>
    public static ImmutableArray<MotorReferences> ReferencesOf(string root, RepositoryIndex index) =>
        [.. index.Motors.Select(m => ReferencesOf(root, m))];

    /// <summary>Whether the change selects a motor with these references (see <see cref="Select"/>), given its touched buses.</summary>
    internal bool Selects(MotorReferences motor, IReadOnlySet<string> touchedBuses) =>
        (motor.Bus is { } bus && touchedBuses.Contains(bus)) || (motor.RelayModel is { } relay && (Changed.Contains(relay) || Deleted.Contains(relay)));

    /// <summary>A bound motor's references, resolved as the reference resolver does.</summary>
    internal static MotorReferences ReferencesOf(string root, MotorProtection motor) =>
        new(motor.Document.RelativePath, Reference(root, motor.Document, "bus"), Reference(root, motor.Document, "relay_model"));

    /// <summary>The buses whose motors the change selects: changed or deleted files, the buses changed motors are or were on.</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="motors">The references of (at least) the changed motors.</param>
    internal HashSet<string> TouchedBuses(string root, IReadOnlyCollection<MotorReferences> motors)
    {
        var buses = new HashSet<string>(StringComparer.Ordinal);
        foreach (var rel in Changed.Union(Deleted))
        {
            buses.Add(rel); // a bus file itself, or nothing on a bus has this path
            if (OldContents.TryGetValue(rel, out var bytes) && OldReference(root, rel, bytes, "bus") is { } oldBus) buses.Add(oldBus);
        }
        foreach (var m in motors)
        {
            if (Changed.Contains(m.File) && m.Bus is { } bus) buses.Add(bus);
        }
        return buses;
    }

    // The root-relative file a motor's reference names (resolved as the reference resolver does), or null for none or inline.
    private static string? Reference(string root, BoundDocument doc, string key) =>
        doc[key] is TextValue t ? Resolve(root, Path.GetDirectoryName(doc.Path) ?? root, t.Value) : null;

    private static string? OldReference(string root, string rel, byte[] bytes, string key)
    {
        var loaded = YamlLoader.Load(bytes, Path.Combine(root, rel), rel, LoadLimits.Default);
        if (loaded.Root is not YMapping m || m[key] is not YScalar { Type: ScalarType.String } s) return null;
        var dir = Path.GetDirectoryName(Path.Combine(root, rel.Replace('/', Path.DirectorySeparatorChar))) ?? root;
        return Resolve(root, dir, s.Value);
    }

    /// <summary>A reference as the resolver reads it: relative to the referring file's folder, inside the root; null otherwise.</summary>
    public static string? Resolve(string root, string fromDir, string reference)
    {
        if (reference.Length == 0 || Path.IsPathRooted(reference) || reference.Contains('\0', StringComparison.Ordinal)) return null;
        var full = Path.GetFullPath(Path.Combine(fromDir, reference));
        return RepositoryRoot.Contains(root, full) ? RepositoryRoot.Relative(root, full) : null;
    }
}

/// <summary>The bus and relay model files a motor file refers to, root-relative; null for none, an inline bus, or a path outside the root.</summary>
public sealed record MotorReferences(string File, string? Bus, string? RelayModel);
