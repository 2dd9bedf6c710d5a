using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Binding;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Engine;

/// <summary>
/// The pipeline of one run: discover, load, validate and bind, resolve references, evaluate rules, collect findings.
/// Each file's work is independent after loading, so files run in parallel; the output order never depends on it.
/// </summary>
internal sealed class Checker(IRuleSet rules, SchemaSet? schemas = null)
{
    private readonly SchemaSet _schemas = schemas ?? SchemaSet.Shared;

    /// <summary>Called with each file as it is loaded, before it is bound; tests hold it weakly to see that no tree outlives its binding.</summary>
    internal Action<LoadedFile>? OnLoaded { get; init; }

    /// <summary>Called with a motor's whole document once its own rules ran and only its later paths are kept; tests hold it weakly.</summary>
    internal Action<BoundDocument>? OnStaged { get; init; }

    /// <summary>
    /// Evaluates every rule of a motor in one go after binding even when the rule set can do it in two steps; tests
    /// compare the two. The two steps keep 63 MB of heap at 10,000 motors where one step keeps 151 MB (docs/performance.md).
    /// </summary>
    internal bool OneStep { get; init; }

    /// <summary>Does each pass's work in the reverse of discovery order; tests use it to show that the output order does not come from the order of work.</summary>
    internal bool Reversed { get; init; }

    /// <summary>
    /// What a run keeps of one file once its own values are bound: its findings, bound values (of a motor in a full run,
    /// only those its later rules read) and acceptance comments. Its YAML tree and text are not kept, so that a run's
    /// memory grows with the number of files only by these.
    /// </summary>
    private sealed class FileState(string path, string relativePath, bool reported, bool isChecked, IReadOnlyList<Finding> loadFindings)
    {
        /// <summary>Absolute path.</summary>
        public string Path { get; } = path;

        public string RelativePath { get; } = relativePath;

        /// <summary>Whether the file was discovered (a file loaded only because a reference names it is not reported).</summary>
        public bool Reported { get; } = reported;

        /// <summary>Whether it is a setting file (its YAML has a kind) or failed to load at all: such a file is checked and counted.</summary>
        public bool IsChecked { get; } = isChecked;

        /// <summary>The findings of loading (syntax, duplicate keys, limits).</summary>
        public IReadOnlyList<Finding> LoadFindings { get; } = loadFindings;

        public FindingBuilder Findings { get; } = new(relativePath);

        public string? Kind { get; set; }

        public BoundDocument? Document { get; set; }

        /// <summary>A bus file as a bus, made once for every motor on it.</summary>
        public Bus? AsBus { get; set; }

        /// <summary>A relay-model file as a relay model with its ranges in file order, made once for every motor that uses it.</summary>
        public RelayModel? AsRelayModel { get; set; }

        /// <summary>The bus written inline in a motor file.</summary>
        public Bus? InlineBus { get; set; }

        public MotorProtection? Motor { get; set; }

        /// <summary>The acceptance comments, found while the tree was there (it tells comments from text and finds blocks).</summary>
        public ImmutableArray<AcceptComment> Acceptances { get; set; } = [];
    }

    /// <summary>Runs a check.</summary>
    public CheckResult Run(CheckOptions options) => Run(options, usePlan: true);

    // With usePlan, a changed-files run loads only what its quick read says the change can reach.
    private CheckResult Run(CheckOptions options, bool usePlan)
    {
        _schemas.Warm();
        IReadOnlyList<string> shown = options.Paths.Count == 0 ? ["."] : options.Paths;
        var paths = shown.Select(p => SourcePaths.Absolute(p, options.WorkingDirectory)).ToArray();
        var source = options.Source
            ?? new DiskSource(options.Root is { } given ? SourcePaths.Absolute(given, options.WorkingDirectory) : RepositoryRoot.Find(paths[0], options.WorkingDirectory ?? paths[0]));
        var root = source.Root;
        var notifications = new ConcurrentBag<Notification>();
        var descriptors = EngineRules.All.Concat(rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal).ToImmutableArray();
        if (options.Changes is { TouchesSettings: false } untouched)
        {
            // Nothing that can change a finding changed: no need to read the repository at all.
            return new CheckResult(root, [], descriptors, [], 0, [], options.FailOn) { Scope = Scope(untouched, []) };
        }
        var discovery = source.Discover(paths, shown, options.Include);
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
        IReadOnlyList<string>? planned = null;
        IReadOnlyDictionary<string, string>? quickTags = null;
        if (usePlan && options.Changes is { EverythingBecause: null } changed)
        {
            // Load only what the change can reach, found by a quick read of every file's references.
            var (refs, unsure, tags) = QuickScan.Read(root, discovery.Files, source, limits.MaxFileBytes, options.Parallel);
            quickTags = tags;
            if (changed.LoadPlan(root, refs, unsure, discovery.Files.Select(f => f.RelativePath), tags) is { } plan)
            {
                toLoad = [.. discovery.Files.Where(f => plan.Contains(f.RelativePath))];
                planned = [.. toLoad.Select(f => f.RelativePath).Order(StringComparer.Ordinal)];
            }
        }
        LoadedFile Read(string full, string rel) => source.Load(full, rel, limits);
        // A file's own work in one go, while its tree is there: kind and format, validation and binding, acceptance
        // comments. The tree and text are garbage once this returns, so only a few trees are alive at any time.
        FileState LoadState(string full, string rel, bool reported)
        {
            var loaded = Guard(() => Read(full, rel), rel, notifications) ?? new LoadedFile(full, rel, null, [], []);
            OnLoaded?.Invoke(loaded);
            var state = new FileState(full, rel, reported, loaded.IsSettingFile || loaded.Failed, loaded.Findings);
            // A file without a kind binds to nothing: a reference to it is SL007 whether it is bound or not.
            if (loaded.IsSettingFile) Guard(() => BindOwn(state, loaded), rel, notifications);
            if (reported && state.IsChecked && options.Accept) Guard(() => state.Acceptances = AcceptComments.Find(loaded), rel, notifications);
            return state;
        }
        foreach (var f in toLoad)
        {
            var file = f;
            states[f.FullPath] = new Lazy<FileState>(() => LoadState(file.FullPath, file.RelativePath, true));
        }
        var discovered = toLoad.Select(f => states[f.FullPath]).ToArray();
        if (Reversed) Array.Reverse(discovered);
        // A bus or relay model is loaded and bound by whichever comes first, the pass over it or a motor that names
        // it (Lazy runs it once). Own binding never resolves a reference, so no file waits on one that waits on it.
        var resolver = new ReferenceResolver<FileState>(source, states, s => s.Document, (full, rel) => LoadState(full, rel, false));
        // A run that reports every file evaluates a motor's own rules as soon as it is bound, and keeps of it only what
        // the rules over its bus read once every motor is bound (a changed-files run needs the whole index to choose).
        var staged = !OneStep && rules is IStagedRuleSet { LaterPaths: { } later } stager && options.Changes is not { EverythingBecause: null }
            // The run itself reads the tag of every motor afterwards (duplicate tags, the motors checked).
            ? (Rules: stager, Keep: new PathSelection(later.Append("tag")), Run: new RepositoryIndex([]))
            : default;
        ForEach(options.Parallel, discovered, lazy =>
        {
            var s = lazy.Value;
            if (s.Kind != SchemaSet.MotorProtection) return;
            Guard(() => BindMotor(s, resolver, options.ElectricalCode), s.RelativePath, notifications);
            if (staged.Rules is null || s.Motor is not { } motor || !s.Reported) return;
            Guard(() => staged.Rules.EvaluateOwn(motor, staged.Run, s.Findings, notifications.Add), s.RelativePath, notifications, "a rule failed on this motor");
            var kept = motor.Document.Restrict(staged.Keep);
            s.Document = kept;
            s.Motor = motor with { Document = kept };
            OnStaged?.Invoke(motor.Document);
        });
        var settingFiles = discovered.Select(s => s.Value).Where(s => s.IsChecked).ToArray();

        var motors = settingFiles.Where(s => s.Motor is not null).Select(s => s.Motor!).ToArray();
        var index = new RepositoryIndex(motors);
        ReportDuplicateTags(settingFiles);
        // A changed-files run binds every file (the index needs them all) but evaluates and reports only its selection.
        var (selected, dependants) = options.Changes is { EverythingBecause: null } changes
            ? changes.Select(root, ChangeSet.ReferencesOf(root, index), settingFiles.Select(s => s.RelativePath).ToList())
            : (null, ImmutableSortedSet<string>.Empty);
        bool Reported(FileState s) => s.Reported && (selected is null || selected.Contains(s.RelativePath));
        var reported = settingFiles.Where(Reported).ToArray();
        // A selected file that the quick read was not sure of may have the tag of a file the plan left unread.
        if (planned is not null && UnreadTagMate(reported, planned, quickTags!)) return Run(options, usePlan: false);
        var motorStates = reported.Where(s => s.Motor is not null).ToArray();
        if (Reversed) Array.Reverse(motorStates);
        ForEach(options.Parallel, motorStates, s => Guard(
            () =>
            {
                if (staged.Rules is null) rules.Evaluate(s.Motor!, index, s.Findings, notifications.Add);
                else staged.Rules.EvaluateAcrossBus(s.Motor!, index, s.Findings, notifications.Add);
            },
            s.RelativePath, notifications, "a rule failed on this motor"));

        var known = descriptors.Select(d => d.Id).ToHashSet(StringComparer.Ordinal);
        IEnumerable<Finding> Own(FileState s)
        {
            IReadOnlyList<Finding> own = [.. s.LoadFindings, .. s.Findings.Findings];
            return options.Accept ? Acceptances.Apply(s.RelativePath, s.Acceptances, own, known) : own;
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
            CheckedFiles = [.. reported.Select(s => s.RelativePath).Order(StringComparer.Ordinal)],
            NotRun = [.. reported.SelectMany(s => s.Findings.NotRun).Order(CheckNotRun.Order)],
            MotorFiles = [.. motorStates.Select(s => (s.RelativePath, s.Motor!.Tag)).OrderBy(m => m.RelativePath, StringComparer.Ordinal)],
            Scope = options.Changes is { } c ? Scope(c, dependants) : null,
            LoadedFiles = planned,
        };
    }

    private static bool UnreadTagMate(IEnumerable<FileState> reported, IReadOnlyList<string> planned, IReadOnlyDictionary<string, string> quickTags)
    {
        var tags = reported.Select(s => s.Document?["tag"]).OfType<TextValue>().Select(t => t.Value).ToHashSet(StringComparer.Ordinal);
        if (tags.Count == 0) return false;
        var loaded = planned.ToHashSet(StringComparer.Ordinal);
        return quickTags.Any(t => tags.Contains(t.Value) && !loaded.Contains(t.Key));
    }

    private static ChangeScope Scope(ChangeSet changes, ImmutableSortedSet<string> dependants) =>
        new(changes.Revision, changes.Staged, [.. changes.Changed], [.. changes.Deleted], [.. dependants], changes.EverythingBecause);

    /// <summary>A tag names one piece of equipment in the repository: every later file that reuses one is told where it is taken.</summary>
    private static void ReportDuplicateTags(IEnumerable<FileState> files)
    {
        var tagged = files.Where(f => f.Document?["tag"] is TextValue).GroupBy(f => ((TextValue)f.Document!["tag"]!).Value, StringComparer.Ordinal);
        foreach (var group in tagged)
        {
            var ordered = group.OrderBy(f => f.RelativePath, StringComparer.Ordinal).ToList();
            foreach (var later in ordered.Skip(1))
            {
                later.Findings.Add(EngineMessages.TagAlreadyUsedBy, later.Document!["tag"]!.Span, "tag",
                    ("tag", group.Key), ("other", ordered[0].RelativePath));
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

    /// <summary>Checks kind and format, then validates and binds the file's own values, an inline bus included.</summary>
    private void BindOwn(FileState s, LoadedFile loaded)
    {
        if (loaded.Root is not YMapping root) return;
        var kindNode = root["kind"];
        if (kindNode is null)
        {
            var near = loaded.MisspeltKindKey;
            s.Findings.Add(EngineMessages.RequiredKeyKindMissing, near?.Span ?? SourceSpan.FileStart, "kind",
                ("hint", near is null ? "" : " ('" + near.Value + "' here looks like it)"), ("kinds", string.Join(", ", SchemaSet.SettingKinds)));
            s.Kind = "";
            return;
        }
        if (kindNode is not YScalar { Type: ScalarType.String } kindScalar || !SchemaSet.SettingKinds.Contains(kindScalar.Value))
        {
            s.Findings.Add(EngineMessages.UnknownKindSettingFile, kindNode?.Span ?? SourceSpan.FileStart, "kind",
                ("kind", kindNode is YScalar ks ? "'" + ks.Value + "'" : kindNode?.Describe() ?? "(none)"),
                ("kinds", string.Join(", ", SchemaSet.SettingKinds)));
            s.Kind = "";
            return;
        }
        var formatEntry = root.Find("format");
        if (formatEntry is null)
        {
            s.Findings.Add(EngineMessages.RequiredKeyFormatMissing, root.Find("kind")!.Key.Span, "format");
        }
        else if (formatEntry.Value is not YScalar { Type: ScalarType.Int, Value: "1" })
        {
            s.Findings.Add(EngineMessages.UnknownFormatVersionSettinglint, formatEntry.Value.Span, "format",
                ("format", formatEntry.Value is YScalar fs ? "'" + fs.Value + "'" : formatEntry.Value.Describe()));
            s.Kind = "";
            return;
        }
        s.Kind = kindScalar.Value;
        var doc = DocumentBinder.Bind(s.Kind, s.Path, s.RelativePath, root, s.Findings, _schemas);
        s.Document = doc;
        switch (s.Kind)
        {
            case SchemaSet.Bus:
                s.AsBus = new Bus(doc);
                break;
            case SchemaSet.RelayModel:
                s.AsRelayModel = new RelayModel(doc, RelayRanges(doc, root));
                break;
            case SchemaSet.MotorProtection when root["bus"] is YMapping inline:
                s.InlineBus = new Bus(DocumentBinder.BindInlineBus(s.Path, s.RelativePath, inline, s.Findings, _schemas));
                break;
        }
    }

    /// <summary>Resolves a motor's bus and relay model (loading and binding them on first use) and makes the motor.</summary>
    private static void BindMotor(FileState s, ReferenceResolver<FileState> resolver, Func<string, string?>? declaredCode)
    {
        var doc = s.Document;
        if (doc is null) return;
        var bus = s.InlineBus;
        if (bus is null && doc["bus"] is TextValue busRef)
        {
            bus = resolver.Resolve(doc, busRef, SchemaSet.Bus, s.Findings)?.AsBus;
        }
        RelayModel? relay = null;
        if (doc["relay_model"] is TextValue relayRef)
        {
            relay = resolver.Resolve(doc, relayRef, SchemaSet.RelayModel, s.Findings)?.AsRelayModel;
        }
        s.Motor = new MotorProtection(doc, bus, relay) { ElectricalCode = ElectricalCodes.Governing(declaredCode?.Invoke(s.RelativePath), bus?.Frequency) };
    }

    // In the order of the file, which only its tree still knows.
    private static ImmutableArray<RelayRange> RelayRanges(BoundDocument doc, YMapping root)
    {
        var ranges = ImmutableArray.CreateBuilder<RelayRange>();
        if (root["ranges"] is not YMapping m) return ranges.ToImmutable();
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
