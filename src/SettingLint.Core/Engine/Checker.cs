using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Binding;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Engine;

/// <summary>
/// The pipeline of one run: discover, load, validate and bind, resolve references, evaluate rules, collect findings.
/// Each file's work is independent after loading, so files run in parallel; the output order never depends on it.
/// </summary>
public sealed class Checker(IRuleSet rules, SchemaSet? schemas = null)
{
    private readonly SchemaSet _schemas = schemas ?? SchemaSet.Shared;

    /// <summary>One setting file after binding, with the builder that holds its findings.</summary>
    private sealed class FileState(LoadedFile loaded, bool reported)
    {
        public LoadedFile Loaded { get; } = loaded;

        public bool Reported { get; } = reported;

        public FindingBuilder Findings { get; } = new(loaded.RelativePath);

        public string? Kind { get; set; }

        public BoundDocument? Document { get; set; }

        public MotorProtection? Motor { get; set; }

        /// <summary>Binding is done once; a referenced file can be asked for by several motors at once.</summary>
        public Lock Gate { get; } = new();
    }

    /// <summary>Runs a check.</summary>
    public CheckResult Run(CheckOptions options)
    {
        _schemas.Warm();
        var paths = options.Paths.Count == 0 ? ["."] : options.Paths;
        var root = options.Root is { } given ? Path.GetFullPath(given).TrimEnd(Path.DirectorySeparatorChar) : RepositoryRoot.Find(paths[0]);
        var notifications = new ConcurrentBag<Notification>();
        var descriptors = EngineRules.All.Concat(rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal).ToImmutableArray();
        if (options.Changes is { TouchesSettings: false } untouched)
        {
            // Nothing that can change a finding changed: no need to read the repository at all.
            return new CheckResult(root, [], descriptors, [], 0, [], options.FailOn) { Scope = Scope(untouched, []) };
        }
        var overlay = options.Overlay;
        var include = overlay is null ? options.Include : rel => !overlay.Hidden.Contains(rel) && (options.Include?.Invoke(rel) ?? true);
        var discovery = FileDiscovery.Find(root, paths, include);
        foreach (var m in discovery.Missing)
        {
            notifications.Add(new Notification(NotificationKind.Configuration, "The path '" + m + "' does not exist."));
        }
        foreach (var o in discovery.Outside)
        {
            notifications.Add(new Notification(NotificationKind.Configuration,
                "The path '" + o + "' lies outside the repository root " + root + " (found from the first path); check it in a run of its own."));
        }

        var states = new ConcurrentDictionary<string, Lazy<FileState>>(StringComparer.Ordinal);
        var limits = options.EffectiveLimits;
        var toLoad = discovery.Files;
        if (options.Changes is { EverythingBecause: null } planned)
        {
            // Load only what the change can reach, found by a quick read of every file's references.
            var (refs, unsure) = QuickScan.Read(root, discovery.Files,
                f => overlay is not null && overlay.Contents.TryGetValue(f.RelativePath, out var b) ? b : File.ReadAllBytes(f.FullPath),
                limits.MaxFileBytes, options.Parallel);
            if (planned.LoadPlan(root, refs, unsure, discovery.Files.Select(f => f.RelativePath)) is { } plan)
            {
                toLoad = [.. discovery.Files.Where(f => plan.Contains(f.RelativePath))];
            }
        }
        LoadedFile Read(string full, string rel)
        {
            if (overlay is null) return YamlLoader.LoadFile(full, rel, limits);
            if (overlay.Contents.TryGetValue(rel, out var bytes)) return YamlLoader.Load(bytes, full, rel, limits);
            return overlay.Hidden.Contains(rel) ? new LoadedFile(full, rel, null, [], []) : YamlLoader.LoadFile(full, rel, limits);
        }
        FileState LoadState(string full, string rel, bool reported) => new(Guard(() => Read(full, rel), rel, notifications)
            ?? new LoadedFile(full, rel, null, [], []), reported);
        foreach (var f in toLoad)
        {
            var file = f;
            states[f.FullPath] = new Lazy<FileState>(() => LoadState(file.FullPath, file.RelativePath, true));
        }
        var discovered = toLoad.Select(f => states[f.FullPath]).ToArray();
        ForEach(options.Parallel, discovered, s => _ = s.Value);

        var settingFiles = discovered.Select(s => s.Value).Where(s => s.Loaded.IsSettingFile || s.Loaded.Failed).ToArray();
        // Buses and relay models first: motors refer to them.
        ForEach(options.Parallel, settingFiles, s => Guard(() => BindOwn(s), s.Loaded.RelativePath, notifications));
        var resolver = new ReferenceResolver<FileState>(root, states, Bound, (full, rel) => LoadState(full, rel, false));
        ForEach(options.Parallel, settingFiles.Where(s => s.Kind == SchemaSet.MotorProtection).ToArray(),
            s => Guard(() => BindMotor(s, resolver), s.Loaded.RelativePath, notifications));

        var motors = settingFiles.Where(s => s.Motor is not null).Select(s => s.Motor!).ToArray();
        var index = new RepositoryIndex(motors);
        ReportDuplicateTags(settingFiles);
        // A changed-files run binds every file (the index needs them all) but evaluates and reports only its selection.
        var (selected, dependants) = options.Changes is { EverythingBecause: null } changes
            ? changes.Select(root, ChangeSet.ReferencesOf(root, index), settingFiles.Select(s => s.Loaded.RelativePath).ToList())
            : (null, ImmutableSortedSet<string>.Empty);
        bool Reported(FileState s) => s.Reported && (selected is null || selected.Contains(s.Loaded.RelativePath));
        var reported = settingFiles.Where(Reported).ToArray();
        var motorStates = reported.Where(s => s.Motor is not null).ToArray();
        ForEach(options.Parallel, motorStates, s => Guard(() => rules.Evaluate(s.Motor!, index, s.Findings, notifications.Add), s.Loaded.RelativePath, notifications, "a rule failed on this motor"));

        var known = descriptors.Select(d => d.Id).ToHashSet(StringComparer.Ordinal);
        IEnumerable<Finding> Own(FileState s)
        {
            IReadOnlyList<Finding> own = [.. s.Loaded.Findings, .. s.Findings.Findings];
            return options.Accept ? Acceptances.Apply(s.Loaded, own, known) : own;
        }
        var findings = discovery.Findings.Where(f => selected is null || selected.Contains(f.File))
            .Concat(reported.SelectMany(Own))
            .OrderBy(f => f, Finding.Order)
            .ToImmutableArray();
        var motorNames = motorStates.Select(s => s.Motor!.Tag).OrderBy(t => t, StringComparer.Ordinal).ToImmutableArray();
        return new CheckResult(
            root,
            findings,
            descriptors,
            [.. notifications.OrderBy(n => n.File ?? "", StringComparer.Ordinal).ThenBy(n => n.Message, StringComparer.Ordinal)],
            reported.Length,
            motorNames,
            options.FailOn)
        {
            CheckedFiles = [.. reported.Select(s => s.Loaded.RelativePath).Order(StringComparer.Ordinal)],
            Scope = options.Changes is { } c ? Scope(c, dependants) : null,
        };
    }

    private static ChangeScope Scope(ChangeSet changes, ImmutableSortedSet<string> dependants) =>
        new(changes.Revision, changes.Staged, [.. changes.Changed], [.. changes.Deleted], [.. dependants], changes.EverythingBecause);

    /// <summary>A tag names one piece of equipment in the repository: every later file that reuses one is told where it is taken.</summary>
    private static void ReportDuplicateTags(IEnumerable<FileState> files)
    {
        var tagged = files.Where(f => f.Document?["tag"] is TextValue).GroupBy(f => ((TextValue)f.Document!["tag"]!).Value, StringComparer.Ordinal);
        foreach (var group in tagged)
        {
            var ordered = group.OrderBy(f => f.Loaded.RelativePath, StringComparer.Ordinal).ToList();
            foreach (var later in ordered.Skip(1))
            {
                later.Findings.Add(EngineRules.WrongType, later.Document!["tag"]!.Span, "tag",
                    "The tag '{tag}' is already used by {other}; a tag names one piece of equipment in the repository.",
                    ("tag", group.Key), ("other", ordered[0].Loaded.RelativePath));
            }
        }
    }

    private static void ForEach<T>(bool parallel, IReadOnlyList<T> items, Action<T> action)
    {
        if (parallel && items.Count > 1) Parallel.ForEach(items, action);
        else foreach (var item in items) action(item);
    }

    private static T? Guard<T>(Func<T> work, string file, ConcurrentBag<Notification> notifications)
        where T : class
    {
        try
        {
            return work();
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            notifications.Add(new Notification(NotificationKind.Internal, "Internal error while reading this file: " + ex.Message, file, null, ex.ToString()));
            return null;
        }
    }

    private static void Guard(Action work, string file, ConcurrentBag<Notification> notifications, string what = "internal error while checking this file")
    {
        try
        {
            work();
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            notifications.Add(new Notification(NotificationKind.Internal, char.ToUpperInvariant(what[0]) + what[1..] + ": " + ex.Message, file, null, ex.ToString()));
        }
    }

    private BoundDocument? Bound(FileState s)
    {
        BindOwn(s);
        return s.Document;
    }

    /// <summary>Checks kind and format, then validates and binds the file's own values.</summary>
    private void BindOwn(FileState s)
    {
        lock (s.Gate)
        {
            BindOwnLocked(s);
        }
    }

    private void BindOwnLocked(FileState s)
    {
        if (s.Kind is not null || s.Loaded.Root is not YMapping root) return;
        var kindNode = root["kind"];
        if (kindNode is null)
        {
            var near = s.Loaded.MisspeltKindKey;
            s.Findings.Add(EngineRules.MissingKey, near?.Span ?? SourceSpan.FileStart, "kind",
                "The required key 'kind' is missing{hint}; a setting file starts with kind ({kinds}) and format.",
                ("hint", near is null ? "" : " ('" + near.Value + "' here looks like it)"), ("kinds", string.Join(", ", SchemaSet.SettingKinds)));
            s.Kind = "";
            return;
        }
        if (kindNode is not YScalar { Type: ScalarType.String } kindScalar || !SchemaSet.SettingKinds.Contains(kindScalar.Value))
        {
            s.Findings.Add(EngineRules.KindOrFormat, kindNode?.Span ?? SourceSpan.FileStart, "kind",
                "Unknown kind {kind}; a setting file is one of {kinds}.",
                ("kind", kindNode is YScalar ks ? "'" + ks.Value + "'" : kindNode?.Describe() ?? "(none)"),
                ("kinds", string.Join(", ", SchemaSet.SettingKinds)));
            s.Kind = "";
            return;
        }
        var formatEntry = root.Find("format");
        if (formatEntry is null)
        {
            s.Findings.Add(EngineRules.MissingKey, root.Find("kind")!.Key.Span, "format",
                "The required key 'format' is missing; this version reads format 1.");
        }
        else if (formatEntry.Value is not YScalar { Type: ScalarType.Int, Value: "1" })
        {
            s.Findings.Add(EngineRules.KindOrFormat, formatEntry.Value.Span, "format",
                "Unknown format {format}; this version of SettingLint reads format 1.",
                ("format", formatEntry.Value is YScalar fs ? "'" + fs.Value + "'" : formatEntry.Value.Describe()));
            s.Kind = "";
            return;
        }
        s.Kind = kindScalar.Value;
        s.Document = DocumentBinder.Bind(s.Kind, s.Loaded.Path, s.Loaded.RelativePath, root, s.Findings, _schemas);
    }

    private void BindMotor(FileState s, ReferenceResolver<FileState> resolver)
    {
        var doc = s.Document;
        if (doc is null) return;
        Bus? bus = null;
        var busEntry = doc.Root.Find("bus");
        if (busEntry?.Value is YMapping inline)
        {
            bus = new Bus(DocumentBinder.BindInlineBus(doc.Path, doc.RelativePath, inline, s.Findings, _schemas));
        }
        else if (doc["bus"] is TextValue busRef)
        {
            bus = resolver.Resolve(doc, busRef, SchemaSet.Bus, s.Findings) is { } b ? new Bus(b) : null;
        }
        RelayModel? relay = null;
        if (doc["relay_model"] is TextValue relayRef && resolver.Resolve(doc, relayRef, SchemaSet.RelayModel, s.Findings) is { } r)
        {
            relay = new RelayModel(r, RelayRanges(r));
        }
        s.Motor = new MotorProtection(doc, bus, relay);
    }

    private static ImmutableArray<RelayRange> RelayRanges(BoundDocument doc)
    {
        var ranges = ImmutableArray.CreateBuilder<RelayRange>();
        if (doc.Root["ranges"] is not YMapping m) return ranges.ToImmutable();
        foreach (var e in m.Entries)
        {
            var p = "ranges." + e.Key.Value;
            if (doc[p + ".min"] is WrittenValue min && doc[p + ".max"] is WrittenValue max)
            {
                ranges.Add(new RelayRange(e.Key.Value, min, max, doc[p + ".step"] as WrittenValue));
            }
        }
        return ranges.ToImmutable();
    }
}
