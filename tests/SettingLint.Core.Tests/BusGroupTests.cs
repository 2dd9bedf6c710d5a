using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Discovery;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;
using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A full run loads, binds and evaluates each bus with its motors as one group and lets the group go: the findings are
/// those of binding every file before any rule runs (as a changed-files run does), whatever the order of work, and a
/// finished group's documents are collected while the run goes on.
/// </summary>
public sealed class BusGroupTests
{
    private static readonly string RepoRoot = RepositoryPaths.Root();

    private static string Rule(string id, string summary, string severity, string tag, string body) => $"""
        id: {id}
        title: Test rule
        summary: {summary}
        rationale: Tests only.
        basis: [common practice]
        severity: {severity}
        tags: [{tag}]
        applies_to: motor-protection
        {body}
        """;

    // Aggregates in a let, in the guard and in the check, a subject that no expression reads, and a for_each rule beside them.
    private static readonly string[] TestRules =
    [
        Rule("SL951", "Longest other start against this motor's stall time.", "warning", "27", """
            let:
              longest_other: others_max(motor.acceleration_time)
              count: others_count()
            when: count > 0
            check: motor.safe_stall_time_hot >= 2 * longest_other
            subject: motor.safe_stall_time_cold
            message: "{longest_other} of {count} others"
            """),
        Rule("SL952", "Shortest other full-load current in the check itself.", "note", "27", """
            check: motor.full_load_current <= 1.5 * others_min(motor.full_load_current)
            subject: motor.full_load_current
            message: "{actual} against {limit}"
            """),
        Rule("SL953", "A relay range rule; relay models are shared by every group.", "warning", "50", """
            for_each: relay_model.ranges
            check: item.value >= item.min
            subject: protection.{item.setting}
            message: "{actual} below {limit}"
            """),
    ];

    private static ImmutableArray<CompiledRule> Rules()
    {
        var builtIn = RuleLoader.CompiledBuiltIn(SchemaSet.Shared).GetAwaiter().GetResult();
        var tests = new RuleLoader(SchemaSet.Shared).Load([.. TestRules.Select((r, i) => new RuleSource($"test/{i}/rule.yaml", Encoding.UTF8.GetBytes(r)))]);
        Assert.Empty(tests.Problems);
        return [.. builtIn.Rules, .. tests.Rules];
    }

    private static string Motor(int i, string bus, double acceleration, double delay, bool relay)
    {
        var text = Samples.Replace(Samples.Motor, "tag: M-1", "tag: M-" + i.ToString(CultureInfo.InvariantCulture));
        text = Samples.Replace(text, "bus: ../buses/bus-1.yaml", bus + (relay ? "\nrelay_model: ../models/relay-a.yaml" : ""));
        text = Samples.Replace(text, "acceleration_time: 4.5 s", "acceleration_time: " + acceleration.ToString(CultureInfo.InvariantCulture) + " s");
        text = Samples.Replace(text, "full_load_current: 58 A", "full_load_current: " + (40 + (i * 7 % 50)).ToString(CultureInfo.InvariantCulture) + " A");
        return text + "  undervoltage:\n    enabled: true\n    pickup: 90 %\n    delay: " + delay.ToString(CultureInfo.InvariantCulture) + " s\n";
    }

    /// <summary>
    /// The demo repository's files, and motors on two buses (one of them named from two folders) and inline ones, some with
    /// mistakes, a duplicate tag, a broken file, and references the quick read is not sure of.
    /// </summary>
    private static TempRepo Repository()
    {
        var repo = new TempRepo();
        foreach (var file in Directory.GetFiles(Path.Combine(RepoRoot, "examples"), "*.yaml", SearchOption.AllDirectories))
        {
            repo.Write("demo/" + Path.GetRelativePath(Path.Combine(RepoRoot, "examples"), file).Replace('\\', '/'), File.ReadAllText(file));
        }
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("buses/bus-2.yaml", Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: BUS-2"));
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        for (var i = 0; i < 24; i++)
        {
            var bus = (i % 4) switch
            {
                0 or 1 => "bus: ../buses/bus-1.yaml",
                2 => "bus: ../buses/bus-2.yaml",
                _ => "bus:\n  tag: BUS-M" + i.ToString(CultureInfo.InvariantCulture) + "\n  nominal_voltage: 4160 V\n  fault_current_max: 28 kA\n  x_over_r: 15\n  grounding: low-resistance\n  ground_fault_current: 400 A",
            };
            repo.Write($"motors/m-{i:00}.yaml", Motor(i, bus, 2 + (i * 3 % 11), 1 + (i * 5 % 9), relay: i % 3 == 0));
        }
        // A missing bus, a value without its unit, a tag taken twice, and a file that is not YAML.
        repo.Write("motors/x-missing-bus.yaml", Motor(90, "bus: ../buses/nowhere.yaml", 3, 2, relay: false));
        repo.Write("motors/x-no-unit.yaml", Samples.Replace(Motor(91, "bus: ../buses/bus-1.yaml", 3, 2, relay: true), "safe_stall_time_hot: 10 s", "safe_stall_time_hot: 10"));
        repo.Write("motors/x-twice.yaml", Motor(5, "bus: ../buses/bus-2.yaml", 9, 2, relay: false));
        repo.Write("motors/x-broken.yaml", "kind: motor-protection\nformat: 1\nmotor: [unclosed\n");
        // Motors of bus 2 in another folder, one naming it through a quoted reference with an escape (the quick read is
        // not sure of it, so it is bound ahead and joins the group), one naming another motor file as its bus.
        repo.Write("area-2/motors/y-1.yaml", Motor(31, "bus: ../../buses/bus-2.yaml", 8, 3, relay: true));
        repo.Write("area-2/motors/y-2.yaml", Motor(32, "bus: \"../../buses/bus\\x2d2.yaml\"", 2, 4, relay: false));
        repo.Write("area-2/motors/y-3.yaml", Motor(33, "bus: ../../motors/m-00.yaml", 2, 4, relay: false));
        return repo;
    }

    private static string Describe(CheckResult r) => string.Join("\n",
        r.Findings.Select(f => $"{f.File}:{f.Span} {f.RuleId} {f.Level} {f.KeyPath} {f.Message} [{string.Join(", ", f.Values.Select(v => v.Key + "=" + v.Value.Text))}]")
            .Concat(r.Notifications.Select(n => $"notification {n.Kind} {n.File} {n.Message}"))
            .Append($"files={r.FilesChecked} motors={string.Join(",", r.Motors)} exit={r.ExitCode}"));

    [Theory]
    [InlineData(false, false)]
    [InlineData(true, false)]
    [InlineData(false, true)]
    [InlineData(true, true)]
    public void Bus_by_bus_gives_the_findings_of_one_group(bool parallel, bool reversed)
    {
        using var repo = Repository();
        var rules = new RuleSet(Rules());
        var byBus = new Checker(rules) { Reversed = reversed }.Run(new CheckOptions([repo.Root], Parallel: parallel));
        var whole = new Checker(rules) { OneGroup = true }.Run(new CheckOptions([repo.Root], Parallel: false));

        Assert.Equal(Describe(whole), Describe(byBus));
        // The comparison means something only if the rules over a bus fire, on their own motors and on others.
        Assert.Contains(byBus.Findings, f => f.RuleId == "SL603");
        Assert.Contains(byBus.Findings, f => f.RuleId == "SL951");
        Assert.Contains(byBus.Findings, f => f.RuleId == "SL952");
        Assert.Contains(byBus.Findings, f => f.RuleId == "SL953");
        Assert.DoesNotContain(byBus.Notifications, n => n.Kind == NotificationKind.Internal);
    }

    [Fact]
    public void The_motors_of_a_bus_in_other_folders_are_compared_with_it()
    {
        using var repo = Repository();
        var result = new Checker(new RuleSet(Rules())).Run(new CheckOptions([repo.Root], Parallel: true));
        // Bus 2 has m-02, m-06, ..., m-22 (6), x-twice, and y-1 and y-2 in area-2: each counts the other 8 (SL951's message).
        var counts = result.Findings.Where(f => f.RuleId == "SL951" && f.Values["count"].Text == "8").Select(f => f.File).Order(StringComparer.Ordinal).ToList();
        Assert.Contains("area-2/motors/y-1.yaml", counts);
        Assert.Contains("area-2/motors/y-2.yaml", counts);
        Assert.Contains("motors/m-02.yaml", counts);
        Assert.DoesNotContain(result.Findings, f => f.RuleId == "SL951" && f.File.StartsWith("motors/m-0", StringComparison.Ordinal) && f.Values["count"].Text == "7");
        // A motor file named as a bus is SL007 (wrong kind), not a file that did not load, though its group may be done.
        Assert.Contains(result.Findings, f => f.File == "area-2/motors/y-3.yaml" && f.RuleId.StartsWith("SL0", StringComparison.Ordinal) && f.Message.Contains("motor-protection", StringComparison.Ordinal));
    }

    [Fact]
    public void Bus_by_bus_gives_the_findings_of_one_group_on_mutated_motors()
    {
        using var repo = Repository();
        var rules = new RuleSet(Rules());
        var motors = Directory.GetFiles(Path.Combine(repo.Root, "motors"), "m-*.yaml").Order(StringComparer.Ordinal).ToArray();
        var random = new Random(20261202);
        var compared = 0;
        for (var round = 0; round < 12; round++)
        {
            // Each round drops or changes lines of a few motors: keys go missing, values change, the bus reference breaks.
            foreach (var file in motors.OrderBy(_ => random.Next()).Take(4))
            {
                var lines = File.ReadAllLines(file).ToList();
                var at = random.Next(lines.Count);
                if (random.Next(2) == 0) lines.RemoveAt(at);
                else lines[at] = lines[at].Replace("s", "ms", StringComparison.Ordinal).Replace("1", "7", StringComparison.Ordinal);
                File.WriteAllLines(file, lines);
            }
            var byBus = new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: true));
            var whole = new Checker(rules) { OneGroup = true }.Run(new CheckOptions([repo.Root], Parallel: false));
            Assert.Equal(Describe(whole), Describe(byBus));
            compared += byBus.Findings.Length;
        }
        Assert.True(compared > 100, "the mutated repositories gave too few findings to compare: " + compared);
    }

    /// <summary>At the first motor of each group, counts the documents of the groups done before that are still alive.</summary>
    private sealed class Probe(RuleSet inner, ConcurrentBag<WeakReference> dropped) : IRuleSet
    {
        // The group by its first motor's file: holding the index would hold the group.
        private string? _last;

        public List<int> AliveAtEachGroup { get; } = [];

        public ImmutableArray<RuleDescriptor> Descriptors => inner.Descriptors;

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
        {
            var group = index.Motors[0].Document.RelativePath;
            if (group != _last) AliveAtEachGroup.Add(Heap.Alive(dropped));
            _last = group;
            inner.Evaluate(motor, index, findings, notify);
        }
    }

    [Fact]
    public void A_finished_groups_documents_are_collected_while_the_run_goes_on()
    {
        using var repo = Repository();
        var dropped = new ConcurrentBag<WeakReference>();
        var probe = new Probe(new RuleSet(Rules()), dropped);
        var result = new Checker(probe) { OnDropped = d => dropped.Add(new WeakReference(d)) }.Run(new CheckOptions([repo.Root], Parallel: false));

        // The motors and buses of the demo, the two test buses and the motors alone (inline buses) are dropped group by group.
        Assert.True(dropped.Count >= 35, "documents dropped: " + dropped.Count);
        Assert.True(probe.AliveAtEachGroup.Count >= 5, "groups: " + probe.AliveAtEachGroup.Count);
        Assert.All(probe.AliveAtEachGroup, n => Assert.Equal(0, n));
        Assert.Contains(result.Findings, f => f.RuleId == "SL951");
    }

    // In a frame of its own, so that no temporary of the test holds the discovered files.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static (BusGroups Plan, List<WeakReference> Motors) Divide(string root)
    {
        List<DiscoveredFile> files = [.. Enumerable.Range(0, 40).Select(i => new DiscoveredFile(Path.Combine(root, "motors", $"m-{i:D2}.yaml"), $"motors/m-{i:D2}.yaml"))];
        files.Add(new DiscoveredFile(Path.Combine(root, "buses", "bus-1.yaml"), "buses/bus-1.yaml"));
        // Discovered at a path other than the root joined with the relative one (as a link or a case-blind file system can give).
        files.Add(new DiscoveredFile("/elsewhere/motors/odd.yaml", "motors/odd.yaml"));
        ImmutableArray<MotorReferences> refs = [.. files.Where(f => f.RelativePath.StartsWith("motors/", StringComparison.Ordinal)).Select(f => new MotorReferences(f.RelativePath, "buses/bus-1.yaml", null))];
        return (BusGroups.Of(root, files, refs, []), [.. files.Where(f => f.RelativePath.StartsWith("motors/", StringComparison.Ordinal)).Select(f => new WeakReference(f))]);
    }

    [Fact]
    public void The_plan_of_a_full_run_holds_its_motors_by_number_and_gives_each_as_discovered()
    {
        var root = Path.Combine(Path.GetTempPath(), "plan-root");
        var (plan, motors) = Divide(root);

        Assert.Equal(0, Heap.Alive(motors));
        var group = Assert.Single(plan.Buses.Values);
        Assert.Equal(41, group.Motors.Count);
        Assert.Equal("buses/bus-1.yaml", group.File?.RelativePath);
        // By number, in discovery order: the 40 motors, then the one discovered elsewhere.
        Assert.Equal(new DiscoveredFile(Path.Combine(root, "motors", "m-07.yaml"), "motors/m-07.yaml"), plan.Motor(group.Motors[7]));
        Assert.Equal(new DiscoveredFile("/elsewhere/motors/odd.yaml", "motors/odd.yaml"), plan.Motor(group.Motors[40]));
        Assert.Equal(41, group.Motors.Select(plan.Motor).Distinct().Count());
    }

    [Fact]
    public void A_finished_groups_tags_are_not_kept_as_values_of_their_documents()
    {
        using var repo = Repository();
        var tags = new ConcurrentBag<WeakReference>();
        var probe = new Probe(new RuleSet(Rules()), tags);
        var result = new Checker(probe) { OnDropped = d => { if (d["tag"] is TextValue t) tags.Add(new WeakReference(t)); } }.Run(new CheckOptions([repo.Root], Parallel: false));

        // The run keeps each file's tag as text and place, for the rule that a tag names one piece of equipment (SL012).
        Assert.True(tags.Count >= 30, "tags dropped: " + tags.Count);
        Assert.All(probe.AliveAtEachGroup, n => Assert.Equal(0, n));
        Assert.Contains(result.Findings, f => f.RuleId == EngineRules.DuplicateTag);
    }

    /// <summary>A disk source that holds each file it discovers weakly, by its root-relative path.</summary>
    private sealed class WatchedSource(DiskSource inner, ConcurrentDictionary<string, WeakReference> discovered) : IFileSource
    {
        public string Root => inner.Root;

        public EntryKind Probe(string fullPath) => inner.Probe(fullPath);

        public byte[]? Read(string relativePath) => inner.Read(relativePath);

        public LoadedFile Load(string fullPath, string relativePath, LoadLimits limits) => ((IFileSource)inner).Load(fullPath, relativePath, limits);

        public DiscoveryResult Discover(IReadOnlyList<string> paths, IReadOnlyList<string> shown, Func<string, bool>? included)
        {
            var found = inner.Discover(paths, shown, included);
            foreach (var f in found.Files) discovered[f.RelativePath] = new WeakReference(f);
            return found;
        }

        public IReadOnlyList<string> FindFiles(string relativeFolder, string fileName) => inner.FindFiles(relativeFolder, fileName);
    }

    /// <summary>At the first motor of each group, counts the discovered files of the motors of the groups done before that are still alive.</summary>
    private sealed class DiscoveryProbe(RuleSet inner, ConcurrentDictionary<string, WeakReference> discovered) : IRuleSet
    {
        private readonly List<string> _done = [];
        private readonly List<string> _current = [];
        private string? _last;

        public List<int> AliveAtEachGroup { get; } = [];

        public ImmutableArray<RuleDescriptor> Descriptors => inner.Descriptors;

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
        {
            var group = index.Motors[0].Document.RelativePath;
            if (group != _last)
            {
                _done.AddRange(_current);
                _current.Clear();
                AliveAtEachGroup.Add(Heap.Alive(_done.Select(f => discovered[f])));
            }
            _last = group;
            _current.Add(motor.Document.RelativePath);
            inner.Evaluate(motor, index, findings, notify);
        }
    }

    [Fact]
    public void A_finished_groups_discovered_files_are_collected_while_the_run_goes_on()
    {
        using var repo = Repository();
        var discovered = new ConcurrentDictionary<string, WeakReference>(StringComparer.Ordinal);
        var probe = new DiscoveryProbe(new RuleSet(Rules()), discovered);
        var source = new WatchedSource(new DiskSource(repo.Root), discovered);
        var result = new Checker(probe).Run(new CheckOptions([repo.Root], Parallel: false, Source: source));

        // Each motor's discovered file (its two paths) goes with its group, not at the end of the run.
        Assert.True(discovered.Count >= 35, "files discovered: " + discovered.Count);
        Assert.True(probe.AliveAtEachGroup.Count >= 5, "groups: " + probe.AliveAtEachGroup.Count);
        Assert.All(probe.AliveAtEachGroup, n => Assert.Equal(0, n));
        Assert.Equal(new Checker(new RuleSet(Rules())).Run(new CheckOptions([repo.Root], Parallel: false)).Findings.Length, result.Findings.Length);
    }

    [Theory]
    [InlineData(false, "motors/m-01.yaml")]
    [InlineData(true, "motors/m-01.yaml")]
    [InlineData(true, "buses/bus-2.yaml")]
    [InlineData(true, "models/relay-a.yaml")]
    [InlineData(true, "motors/m-03.yaml", "area-2/motors/y-1.yaml", "motors/x-twice.yaml")]
    [InlineData(false, "motors/x-broken.yaml", "demo/motors/p-201.yaml")]
    public void A_changed_files_run_bus_by_bus_gives_the_findings_of_one_group(bool parallel, params string[] changed)
    {
        using var repo = Repository();
        var rules = new RuleSet(Rules());
        var changes = new ChangeSet("test", null, false, [.. changed], [], null, ImmutableDictionary<string, byte[]>.Empty);
        var byBus = new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: parallel, Changes: changes));
        var whole = new Checker(rules) { OneGroup = true }.Run(new CheckOptions([repo.Root], Parallel: false, Changes: changes));

        Assert.Equal(Describe(whole), Describe(byBus));
        // Immutable arrays compare by reference: their elements are compared here.
        Assert.Equal(whole.Scope!.Dependants.ToArray(), byBus.Scope!.Dependants.ToArray());
        Assert.Equal(whole.CheckedFiles.ToArray(), byBus.CheckedFiles.ToArray());
        Assert.Equal(whole.LoadedFiles?.ToArray(), byBus.LoadedFiles?.ToArray());
        // Each change reaches motors (a broken changed file, which the quick read is unsure of, makes the run read every file).
        Assert.Contains(byBus.CheckedFiles, f => f.Contains("/motors/", StringComparison.Ordinal) || f.StartsWith("motors/", StringComparison.Ordinal));
        Assert.Equal(changed.Contains("motors/x-broken.yaml"), byBus.LoadedFiles is null);
    }
}
