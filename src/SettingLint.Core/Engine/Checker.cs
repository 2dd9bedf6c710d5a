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
/// A full run works bus by bus: a quick read of every file's references (<see cref="QuickScan"/>) tells which bus each
/// motor is on before anything is loaded, and each bus with its motors is loaded, bound, evaluated and let go as one
/// group, in parallel with the other groups. Then only the groups in flight are alive, with what the result lists of
/// every file (its path, its tag, its findings), so that a run's memory does not grow with the size of its motor files.
/// The output order never depends on the order of work.
/// </summary>
internal sealed class Checker(IRuleSet rules, SchemaSet? schemas = null)
{
    private readonly SchemaSet _schemas = schemas ?? SchemaSet.Shared;

    /// <summary>Called with each file as it is loaded, before it is bound; tests hold it weakly to see that no tree outlives its binding.</summary>
    internal Action<LoadedFile>? OnLoaded { get; init; }

    /// <summary>Called with each motor's and bus's document when its group is done and let go; tests hold it weakly.</summary>
    internal Action<BoundDocument>? OnDropped { get; init; }

    /// <summary>
    /// Binds every file (of a changed-files run, every file of its plan) before any rule runs and evaluates each motor
    /// against one index of them all, as a changed-files run does when a changed file is one the quick read is unsure
    /// of; tests compare it with the run bus by bus.
    /// </summary>
    internal bool OneGroup { get; init; }

    /// <summary>Does each pass's work in the reverse of discovery order; tests use it to show that the output order does not come from the order of work.</summary>
    internal bool Reversed { get; init; }

    /// <summary>A file while its group is in flight: everything read off it, and its findings so far.</summary>
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

        /// <summary>Whether its references were resolved: a motor bound ahead of its group is not bound again.</summary>
        public bool Resolved { get; set; }

        public MotorProtection? Motor { get; set; }

        /// <summary>The acceptance comments, found while the tree was there (it tells comments from text and finds blocks).</summary>
        public ImmutableArray<AcceptComment> Acceptances { get; set; } = [];
    }

    /// <summary>The work of one run on its files, shared by its ways of dividing them.</summary>
    private sealed class Work(Checker checker, CheckOptions options, IFileSource source, ConcurrentBag<Notification> notifications)
    {
        private readonly ConcurrentDictionary<string, Lazy<FileState>> _states = new(StringComparer.Ordinal);
        private ReferenceResolver<FileState>? _resolver;

        public ConcurrentBag<Notification> Notifications => notifications;

        // A bus or relay model is loaded and bound by whichever comes first, its group or a motor that names it (Lazy runs
        // it once). Own binding never resolves a reference, so no file waits on one that waits on it. A file that is not
        // entered (or no longer) is loaded again for the reference, unreported.
        private ReferenceResolver<FileState> Resolver => _resolver ??= new(source, _states, s => s.Document, (full, rel) => Load(full, rel, false));

        /// <summary>Makes a discovered file's state the one that a reference to it finds (replacing an unreported one).</summary>
        public void Enter(DiscoveredFile f) => _states[f.FullPath] = new Lazy<FileState>(() => Load(f.FullPath, f.RelativePath, true));

        /// <summary>Lets a file's state go: a later reference to it loads it again, unreported.</summary>
        public void Drop(string path) => _states.TryRemove(path, out _);

        /// <summary>Loads and binds entered files, a motor with its references; the states in the order of the files.</summary>
        public FileState[] Bind(IReadOnlyList<DiscoveredFile> files, bool parallel)
        {
            var resolver = Resolver;
            var bound = new FileState[files.Count];
            ForEach(parallel, Enumerable.Range(0, files.Count).ToArray(), i =>
            {
                var s = bound[i] = _states[files[i].FullPath].Value;
                if (s.Kind != SchemaSet.MotorProtection || s.Resolved) return;
                s.Resolved = true;
                Guard(() => BindMotor(s, resolver, options.ElectricalCode), s.RelativePath, notifications);
            });
            return bound;
        }

        /// <summary>Evaluates every rule on each of these motors, with the index the rules over a bus read.</summary>
        public void Evaluate(IReadOnlyList<FileState> motors, RepositoryIndex index, bool parallel) => ForEach(parallel, motors, s => Guard(
            () => checker.Rules.Evaluate(s.Motor!, index, s.Findings, notifications.Add), s.RelativePath, notifications, "a rule failed on this motor"));

        // A file's own work in one go, while its tree is there: kind and format, validation and binding, acceptance
        // comments. The tree and text are garbage once this returns, so only a few trees are alive at any time.
        private FileState Load(string full, string rel, bool reported)
        {
            var loaded = Guard(() => source.Load(full, rel, options.EffectiveLimits), rel, notifications) ?? new LoadedFile(full, rel, null, [], []);
            checker.OnLoaded?.Invoke(loaded);
            var state = new FileState(full, rel, reported, loaded.IsSettingFile || loaded.Failed, loaded.Findings);
            // A file without a kind binds to nothing: a reference to it is SL007 whether it is bound or not.
            if (loaded.IsSettingFile) Guard(() => checker.BindOwn(state, loaded), rel, notifications);
            if (reported && state.IsChecked && options.Accept) Guard(() => state.Acceptances = AcceptComments.Find(loaded), rel, notifications);
            return state;
        }
    }

    private IRuleSet Rules => rules;

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
            return new CheckResult(root, [], descriptors, [], 0, options.FailOn) { Scope = Scope(untouched, []) };
        }
        var work = new Work(this, options, source, notifications);
        KeptFiles kept;
        TagList tags;
        IReadOnlyList<string>? planned = null;
        var dependants = ImmutableSortedSet<string>.Empty;
        IReadOnlyList<Finding> discoveryFindings;
        if (options.Changes is { EverythingBecause: null } changes)
        {
            var discovery = Discover(source, paths, shown, options, notifications);
            // Load only what the change can reach, found by a quick read of every file's references; report only the
            // changed files and their dependants. The buses the changed motors are on choose the rest.
            // A run asked to read everything (usePlan false) binds every file as one group.
            ImmutableHashSet<string>? plan = null;
            ImmutableArray<MotorReferences> refs = [];
            ImmutableArray<string> unsure = [];
            IReadOnlyDictionary<string, string> quickTags = ImmutableDictionary<string, string>.Empty;
            if (usePlan)
            {
                (refs, unsure, quickTags) = QuickScan.Read(root, discovery.Files, source, options.EffectiveLimits.MaxFileBytes, options.Parallel);
                plan = changes.LoadPlan(root, refs, unsure, discovery.Files.Select(f => f.RelativePath), quickTags);
            }
            ImmutableSortedSet<string> selected;
            if (plan is null || OneGroup)
            {
                // A changed file the quick read is not sure of may be a motor on any bus: every file is bound, as one group.
                var toLoad = plan is null ? discovery.Files : [.. discovery.Files.Where(f => plan.Contains(f.RelativePath))];
                if (plan is not null) planned = [.. toLoad.Select(f => f.RelativePath).Order(StringComparer.Ordinal)];
                var settingFiles = BindAll(work, toLoad, options.Parallel);
                var index = new RepositoryIndex(settingFiles.Where(s => s.Motor is not null).Select(s => s.Motor!));
                (selected, dependants) = changes.Select(root, ChangeSet.ReferencesOf(root, index), settingFiles.Select(s => s.RelativePath).ToList());
                var reported = settingFiles.Where(s => selected.Contains(s.RelativePath)).ToArray();
                // A reported file that the quick read was not sure of may have the tag of a file the plan left unread.
                if (planned is not null && UnreadTagMate(TagsOf(reported).Select(t => t.Tag), planned, quickTags)) return Run(options, usePlan: false);
                work.Evaluate(Ordered(reported.Where(s => s.Motor is not null).ToArray()), index, options.Parallel);
                kept = Keep(reported);
                // The tags of every file bound, reported or not: a changed file may reuse the tag of one that did not change.
                tags = TagList.Of(TagsOf(settingFiles));
            }
            else
            {
                List<DiscoveredFile> toLoad = [.. discovery.Files.Where(f => plan.Contains(f.RelativePath))];
                planned = [.. toLoad.Select(f => f.RelativePath).Order(StringComparer.Ordinal)];
                // The buses a change touches come from the quick read of the changed motors it is sure of, and from binding
                // the others (bound first, with every file it is unsure of). A changed motor the quick read is sure of is
                // loaded with its bus group like any other: binding every changed motor first kept each one bound until its
                // group ran, which in the confirming run of 2,000 suggestions at 100,000 motors took the peak from about 235
                // to about 300 MiB.
                var unsureSet = unsure.ToHashSet(StringComparer.Ordinal);
                var changedRefs = refs.Where(m => changes.Changed.Contains(m.File) && !unsureSet.Contains(m.File)).ToList();
                Func<FileState, bool> Choose(IReadOnlyList<FileState> ahead)
                {
                    var buses = changes.TouchedBuses(root, [.. changedRefs.Concat(ahead.Where(s => s.Motor is not null && changes.Changed.Contains(s.RelativePath)).Select(s => ChangeSet.ReferencesOf(root, s.Motor!)))]);
                    return s => s.IsChecked && (changes.Changed.Contains(s.RelativePath) || (s.Motor is { } m && changes.Selects(ChangeSet.ReferencesOf(root, m), buses)));
                }
                var bound = new ConcurrentBag<FileTag>();
                kept = ByBus(work, BusGroups.Of(root, toLoad, refs, unsure), options.Parallel, Choose, bound);
                tags = TagList.Of(bound);
                selected = ImmutableSortedSet.CreateRange(StringComparer.Ordinal, kept.Paths());
                if (UnreadTagMate(kept.Tags(), planned, quickTags)) return Run(options, usePlan: false);
                dependants = selected.Except(changes.Changed);
            }
            discoveryFindings = [.. discovery.Findings.Where(f => selected.Contains(f.File))];
        }
        else if (OneGroup)
        {
            var discovery = Discover(source, paths, shown, options, notifications);
            discoveryFindings = discovery.Findings;
            var settingFiles = BindAll(work, discovery.Files, options.Parallel);
            var motors = settingFiles.Where(s => s.Motor is not null).ToArray();
            work.Evaluate(Ordered(motors), new RepositoryIndex(motors.Select(s => s.Motor!)), options.Parallel);
            kept = Keep(settingFiles);
            tags = kept.TagList();
        }
        else
        {
            // Only the groups hold the discovered files, each letting its own go when it is done: the run keeps no entry
            // (two paths) per file to its end. Peak RSS at 100,000 motors, native, --no-suggest: 219-230 MiB when the run held
            // them, 173 since.
            (var plan, discoveryFindings) = Plan(source, paths, shown, options, notifications);
            kept = ByBus(work, plan, options.Parallel);
            tags = kept.TagList();
        }

        var known = descriptors.Select(d => d.Id).ToHashSet(StringComparer.Ordinal);
        var reused = tags.Reused();
        // The result lists the files packed and sorted once (KeptFiles.ToRunFiles). Sorted copies of the whole list, lists
        // grown by doubling and a boxed tag per file had been large objects of 100,000 entries each, and garbage while the
        // suggestions ran; then the paths and tags as strings were most of what the result held (docs/performance.md).
        var files = kept.ToRunFiles();
        var findings = new List<Finding>(discoveryFindings);
        var notRun = new List<CheckNotRun>();
        IReadOnlyList<Finding> Accepted(string path, ImmutableArray<AcceptComment> acceptances, IReadOnlyList<Finding> own) =>
            options.Accept ? Acceptances.Apply(path, acceptances, own, known) : own;
        foreach (var (i, notes) in kept.WithNotes())
        {
            var path = kept.Path(i);
            IReadOnlyList<Finding> own = reused.Remove(path, out var more) ? [.. notes.Findings, .. more.Findings] : notes.Findings;
            findings.AddRange(Accepted(path, notes.Acceptances, own));
            notRun.AddRange(notes.NotRun);
        }
        // A reported file that reuses a tag and has nothing else (a changed-files run's tags include files it did not report).
        foreach (var (path, more) in reused)
        {
            if (files.Contains(path)) findings.AddRange(Accepted(path, [], more.Findings));
        }
        return new CheckResult(
            root,
            [.. findings.Order(Finding.Order)],
            descriptors,
            [.. notifications.OrderBy(n => n.File ?? "", StringComparer.Ordinal).ThenBy(n => n.Message, StringComparer.Ordinal)],
            kept.Count,
            options.FailOn)
        {
            Files = files,
            NotRun = [.. notRun.Order(CheckNotRun.Order)],
            Scope = options.Changes is { } c ? Scope(c, dependants) : null,
            LoadedFiles = planned,
        };
    }

    /// <summary>Finds the files to check; a path that is missing or outside the root is a notification.</summary>
    private static DiscoveryResult Discover(IFileSource source, string[] paths, IReadOnlyList<string> shown, CheckOptions options, ConcurrentBag<Notification> notifications)
    {
        var discovery = source.Discover(paths, shown, options.Include);
        foreach (var m in discovery.Missing)
        {
            notifications.Add(new Notification(NotificationKind.Configuration, "The path '" + m + "' does not exist."));
        }
        foreach (var o in discovery.Outside)
        {
            notifications.Add(new Notification(NotificationKind.Configuration,
                "The path '" + o + "' lies outside the repository root " + source.Root + " (found from the first path); check it in a run of its own."));
        }
        return discovery;
    }

    /// <summary>
    /// Finds a full run's files and divides them by bus, from a quick read of their references: what the run holds of the
    /// discovery is the groups and its findings (the quick read and the list of every file are let go here).
    /// </summary>
    private static (BusGroups Plan, IReadOnlyList<Finding> Findings) Plan(
        IFileSource source, string[] paths, IReadOnlyList<string> shown, CheckOptions options, ConcurrentBag<Notification> notifications)
    {
        var discovery = Discover(source, paths, shown, options, notifications);
        var scanned = QuickScan.Scan(source.Root, discovery.Files, (DiscoveredFile f, long max, ref byte[] buffer) => source.ReadInto(f.FullPath, f.RelativePath, max, ref buffer),
            options.EffectiveLimits.MaxFileBytes, options.Parallel, withTags: false);
        return (BusGroups.Of(source.Root, discovery.Files, scanned), discovery.Findings);
    }

    /// <summary>Enters and binds every one of these files; the setting files among them.</summary>
    private FileState[] BindAll(Work work, IReadOnlyList<DiscoveredFile> files, bool parallel)
    {
        foreach (var f in files) work.Enter(f);
        return [.. work.Bind(Ordered(files), parallel).Where(s => s.IsChecked)];
    }

    // Loops, not OfType: that boxes each nullable value, two short-lived objects per file.
    private static IEnumerable<FileTag> TagsOf(IEnumerable<FileState> files)
    {
        foreach (var s in files)
        {
            if (TagOf(s) is { } tag) yield return tag;
        }
    }

    private static FileTag? TagOf(FileState s) => s.Document?["tag"] is TextValue tag ? new FileTag(s.RelativePath, tag.Value, tag.Span) : null;

    /// <summary>
    /// A full run, bus by bus. The files the quick read is not sure of are bound first, to learn their bus; the files that
    /// no bus group holds (relay models, buses without motors) next, kept for the run since any motor may name them.
    /// Then each bus with its motors is loaded, bound, evaluated and let go, the groups in parallel.
    /// </summary>
    /// <param name="work">The run's work.</param>
    /// <param name="plan">The files, divided.</param>
    /// <param name="parallel">Run the groups in parallel.</param>
    /// <param name="choose">
    /// For a changed-files run: given the files bound first (the changed motors among them), which files to evaluate and
    /// report; null reports every file.
    /// </param>
    /// <param name="tags">Receives the tag of every setting file bound, reported or not, when <paramref name="choose"/> is given.</param>
    private KeptFiles ByBus(Work work, BusGroups plan, bool parallel, Func<IReadOnlyList<FileState>, Func<FileState, bool>>? choose = null, ConcurrentBag<FileTag>? tags = null)
    {
        var (kept, early, selected) = Ahead(work, plan, parallel, choose, tags);
        ForEach(parallel, Ordered(plan.Buses.Values.ToArray()), group => Group(work, plan, group, early.GetValueOrDefault(group.Bus) ?? [], selected, tags, parallel, kept));
        return kept;
    }

    /// <summary>
    /// Binds the files the quick read is not sure of, and those that no group holds; evaluates the motors that are on no
    /// shared bus. What the run keeps of them, and the motors bound ahead by the bus they name.
    /// </summary>
    private (KeptFiles Kept, Dictionary<string, List<FileState>> Early, Func<FileState, bool> Selected) Ahead(
        Work work, BusGroups plan, bool parallel, Func<IReadOnlyList<FileState>, Func<FileState, bool>>? choose, ConcurrentBag<FileTag>? tags)
    {
        // Every file but the motors of a sure bus is entered now, so that a motor bound early, or any motor that names a
        // relay model, shares the reported state of what it names instead of loading it unreported.
        // The list of what is kept is made once, as long as every file (else its growing would leave its old arrays behind).
        var kept = new KeptFiles(plan.First.Count + plan.Others.Count + plan.Buses.Values.Sum(g => g.Motors.Count + 1));
        foreach (var f in plan.First.Concat(plan.Others)) work.Enter(f);
        foreach (var g in plan.Buses.Values)
        {
            if (g.File is { } file) work.Enter(file);
        }
        var early = new Dictionary<string, List<FileState>>(StringComparer.Ordinal);
        var alone = new List<FileState>();
        var first = work.Bind(Ordered(plan.First), parallel);
        plan.First.Clear();
        var selected = choose?.Invoke(first) ?? (_ => true);
        foreach (var s in first)
        {
            if (s.Motor is { Bus: { } bus } motor && bus.Document.Path != motor.Document.Path)
            {
                // A motor bound ahead joins the group of the bus it names, bound as it is.
                (early.TryGetValue(bus.Document.RelativePath, out var list) ? list : early[bus.Document.RelativePath] = []).Add(s);
            }
            else
            {
                alone.Add(s);
            }
        }
        foreach (var bus in early.Keys)
        {
            if (!plan.Buses.ContainsKey(bus)) plan.Buses[bus] = new BusGroup(bus, null, []);
        }
        // A motor with an inline bus, or none, is on a bus of its own: one index serves them all.
        var loners = alone.Where(s => s.Motor is not null).ToArray();
        work.Evaluate(Ordered(loners.Where(selected).ToArray()), new RepositoryIndex(loners.Select(s => s.Motor!)), parallel);
        var done = alone.Concat(work.Bind(Ordered(plan.Others), parallel)).Where(s => s.IsChecked && s.Reported).ToList();
        Tags(done, tags);
        foreach (var s in done)
        {
            if (selected(s)) Keep(kept, s);
        }
        foreach (var s in loners) Drop(work, s.Document);
        return (kept, early, selected);
    }

    private static void Tags(IEnumerable<FileState> files, ConcurrentBag<FileTag>? tags)
    {
        if (tags is null) return;
        foreach (var t in TagsOf(files)) tags.Add(t);
    }

    /// <summary>Loads, binds and evaluates a bus with its motors, and lets them go; what the run keeps of them goes to <paramref name="kept"/>.</summary>
    private void Group(Work work, BusGroups plan, BusGroup group, List<FileState> early, Func<FileState, bool> selected, ConcurrentBag<FileTag>? tags, bool runParallel, KeptFiles kept)
    {
        var motorFiles = new List<DiscoveredFile>(group.Motors.Count);
        foreach (var number in group.Motors) motorFiles.Add(plan.Motor(number));
        foreach (var f in motorFiles) work.Enter(f);
        List<DiscoveredFile> files = group.File is { } busFile ? [busFile, .. motorFiles] : motorFiles;
        // One bus's motors are evaluated in sequence (the groups run in parallel), unless the bus has very many; a run asked
        // to work in sequence never goes parallel.
        var parallel = runParallel && group.Motors.Count >= 64;
        // Plain loops: each list is made once at its size. (They replaced LINQ chains when two crashes of the native build
        // were seen inside LINQ's Where iterator here; a later crash came with these loops too, so they were not the cure:
        // docs/performance.md, "The crash".)
        List<FileState> states = [.. work.Bind(Ordered(files), parallel), .. early];
        var motors = new List<FileState>(states.Count);
        var evaluated = new List<FileState>(states.Count);
        foreach (var s in states)
        {
            if (s.Motor is null) continue;
            motors.Add(s);
            if (selected(s)) evaluated.Add(s);
        }
        foreach (var s in motors)
        {
            // The quick read is sure of the bus, and the group's other motors are those the rules over the bus compare with.
            if (s.Motor!.Bus is { } bus && bus.Document.Path != s.Path && bus.Document.RelativePath != group.Bus)
            {
                work.Notifications.Add(new Notification(NotificationKind.Internal,
                    "Internal error while checking this file: the quick read of references found the bus " + group.Bus + ", the loader " + bus.Document.RelativePath + "; the rules over the bus may have missed motors.",
                    s.RelativePath));
            }
        }
        work.Evaluate(Ordered(evaluated), new RepositoryIndex(motors.Select(s => s.Motor!)), parallel);
        var done = new List<FileState>(states.Count);
        foreach (var s in states)
        {
            if (s.IsChecked && s.Reported) done.Add(s);
        }
        Tags(done, tags);
        foreach (var s in done)
        {
            if (selected(s)) Keep(kept, s);
        }
        var busDocument = motors.Select(s => s.Motor!.Bus?.Document).FirstOrDefault(d => d?.RelativePath == group.Bus);
        foreach (var s in motors) Drop(work, s.Document);
        Drop(work, busDocument);
        if (group.File is { } file) work.Drop(file.FullPath);
        early.Clear();
        // Nor do its files wait for the run to end.
        group.Motors.Clear();
        group.Motors.TrimExcess();
    }

    /// <summary>What the run keeps of reported files (<see cref="KeptFiles"/>).</summary>
    private static KeptFiles Keep(IReadOnlyCollection<FileState> files)
    {
        var kept = new KeptFiles(files.Count);
        foreach (var s in files) Keep(kept, s);
        return kept;
    }

    /// <summary>Keeps a reported file: its path, motor name, bus and tag, and its findings, checks not run and acceptances when it has any.</summary>
    private static void Keep(KeptFiles kept, FileState s)
    {
        var findings = s.LoadFindings.Count + s.Findings.Findings.Count;
        var notes = findings + s.Findings.NotRun.Count + s.Acceptances.Length == 0 ? null : new KeptFiles.Notes(
            findings == 0 ? [] : [.. s.LoadFindings, .. s.Findings.Findings],
            s.Findings.NotRun.Count == 0 ? [] : [.. s.Findings.NotRun],
            s.Acceptances);
        var bus = s.Motor?.Bus is { } b && b.Document.Path != s.Path ? b.Document.RelativePath : null;
        kept.Add(s.RelativePath, s.Motor?.Tag, bus, TagOf(s) is { } tag ? (tag.Tag, tag.Span) : null, notes);
    }

    private void Drop(Work work, BoundDocument? doc)
    {
        if (doc is null) return;
        work.Drop(doc.Path);
        OnDropped?.Invoke(doc);
    }

    private T[] Ordered<T>(IReadOnlyList<T> items)
    {
        var array = items.ToArray();
        if (Reversed) Array.Reverse(array);
        return array;
    }

    /// <summary>Whether a reported file has the tag of a file that the plan left unread (the quick read of a reported file may not have been sure of its tag).</summary>
    private static bool UnreadTagMate(IEnumerable<string> reportedTags, IReadOnlyList<string> planned, IReadOnlyDictionary<string, string> quickTags)
    {
        var tags = reportedTags.ToHashSet(StringComparer.Ordinal);
        if (tags.Count == 0) return false;
        var loaded = planned.ToHashSet(StringComparer.Ordinal);
        return quickTags.Any(t => tags.Contains(t.Value) && !loaded.Contains(t.Key));
    }

    private static ChangeScope Scope(ChangeSet changes, ImmutableSortedSet<string> dependants) =>
        new(changes.Revision, changes.Staged, [.. changes.Changed], [.. changes.Deleted], [.. dependants], changes.EverythingBecause);

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
