using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A full run evaluates a motor's own rules as soon as it is bound and keeps of it only what the rules over its bus read;
/// the findings are those of evaluating every rule once every motor is bound, and the rest of each document is let go.
/// </summary>
public sealed class StagedEvaluationTests
{
    private static readonly string RepoRoot = FindRoot();

    private static string FindRoot()
    {
        var dir = AppContext.BaseDirectory;
        while (!File.Exists(Path.Combine(dir, "SettingLint.sln"))) dir = Path.GetDirectoryName(dir)!;
        return dir;
    }

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
        Rule("SL953", "A relay range rule, which runs in the first step.", "warning", "50", """
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

    /// <summary>The demo repository's files, and motors on two buses and inline ones, some with mistakes, a duplicate tag and a broken file.</summary>
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
        return repo;
    }

    private static string Describe(CheckResult r) => string.Join("\n",
        r.Findings.Select(f => $"{f.File}:{f.Span} {f.RuleId} {f.Level} {f.KeyPath} {f.Message} [{string.Join(", ", f.Values.Select(v => v.Key + "=" + v.Value.Text))}]")
            .Concat(r.Notifications.Select(n => $"notification {n.Kind} {n.File} {n.Message}"))
            .Append($"files={r.FilesChecked} motors={string.Join(",", r.Motors)} exit={r.ExitCode}"));

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Two_steps_give_the_findings_of_one(bool parallel)
    {
        using var repo = Repository();
        var rules = new RuleSet(Rules());
        var staged = new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: parallel));
        var oneStep = new Checker(rules) { OneStep = true }.Run(new CheckOptions([repo.Root], Parallel: parallel));

        Assert.Equal(Describe(oneStep), Describe(staged));
        // The comparison means something only if the rules over a bus fire, on their own motors and on others.
        Assert.Contains(staged.Findings, f => f.RuleId == "SL603");
        Assert.Contains(staged.Findings, f => f.RuleId == "SL951");
        Assert.Contains(staged.Findings, f => f.RuleId == "SL952");
        Assert.Contains(staged.Findings, f => f.RuleId == "SL953");
    }

    [Fact]
    public void Two_steps_give_the_findings_of_one_on_mutated_motors()
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
            var staged = new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: true));
            var oneStep = new Checker(rules) { OneStep = true }.Run(new CheckOptions([repo.Root], Parallel: false));
            Assert.Equal(Describe(oneStep), Describe(staged));
            compared += staged.Findings.Length;
        }
        Assert.True(compared > 100, "the mutated repositories gave too few findings to compare: " + compared);
    }

    [Fact]
    public async Task The_later_paths_of_the_built_in_pack_are_those_of_its_rule_over_the_bus()
    {
        var builtIn = await RuleLoader.CompiledBuiltIn(SchemaSet.Shared);
        var rules = new RuleSet(builtIn.Rules);
        // SL603 (rules/SL603/rule.yaml) is the pack's only rule that reads other motors: its guard, check, subject and aggregate.
        Assert.Equal(
            ["motor.acceleration_time", "motor.acceleration_time_max", "protection.undervoltage.delay", "protection.undervoltage.enabled", "tag"],
            rules.LaterPaths!.Order(StringComparer.Ordinal));
    }

    [Fact]
    public void A_rule_over_the_bus_that_reads_relay_ranges_keeps_whole_documents()
    {
        var rules = new RuleLoader(SchemaSet.Shared).Load([new RuleSource("test/r/rule.yaml", Encoding.UTF8.GetBytes(Rule("SL954", "Ranges and other motors together.", "warning", "50", """
            for_each: relay_model.ranges
            when: others_count() >= 0
            check: item.value <= item.max
            subject: protection.{item.setting}
            message: "{actual}"
            """)))]);
        Assert.Empty(rules.Problems);
        Assert.Null(new RuleSet(rules.Rules).LaterPaths);
    }

    /// <summary>Counts, at the first motor of the second step (every motor's first step is over by then), the whole documents still alive.</summary>
    private sealed class Probe(RuleSet inner, ConcurrentBag<WeakReference> whole) : IStagedRuleSet
    {
        private int _first;

        public int? AliveAtSecondStep { get; private set; }

        public ConcurrentBag<int> KeptValues { get; } = [];

        public ImmutableArray<RuleDescriptor> Descriptors => inner.Descriptors;

        public IReadOnlySet<string>? LaterPaths => inner.LaterPaths;

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify) =>
            inner.Evaluate(motor, index, findings, notify);

        public void EvaluateOwn(MotorProtection motor, RepositoryIndex run, FindingBuilder findings, Action<Notification> notify) =>
            inner.EvaluateOwn(motor, run, findings, notify);

        public void EvaluateAcrossBus(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
        {
            if (Interlocked.Exchange(ref _first, 1) == 0) AliveAtSecondStep = Heap.Alive(whole);
            KeptValues.Add(motor.Document.Values.Count);
            inner.EvaluateAcrossBus(motor, index, findings, notify);
        }
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void No_whole_motor_document_outlives_its_first_step(bool parallel)
    {
        using var repo = Repository();
        var whole = new ConcurrentBag<WeakReference>();
        var probe = new Probe(new RuleSet(Rules()), whole);
        var result = new Checker(probe) { OnStaged = d => whole.Add(new WeakReference(d)) }.Run(new CheckOptions([repo.Root], Parallel: parallel));

        Assert.True(whole.Count >= 30, "motors staged: " + whole.Count);
        Assert.Equal(0, probe.AliveAtSecondStep);
        // A motor of the sample keeps at most the five later paths of the pack and the test rules' few, of its 30-odd values.
        Assert.All(probe.KeptValues, n => Assert.InRange(n, 1, 9));
        Assert.Contains(result.Findings, f => f.RuleId == "SL951");
    }

    /// <summary>The built-in rule set with later paths that leave out the tag.</summary>
    private sealed class NoTag(RuleSet inner) : IStagedRuleSet
    {
        public ImmutableArray<RuleDescriptor> Descriptors => inner.Descriptors;

        public IReadOnlySet<string>? LaterPaths { get; } = inner.LaterPaths!.Where(p => p != "tag").ToHashSet(StringComparer.Ordinal);

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify) =>
            inner.Evaluate(motor, index, findings, notify);

        public void EvaluateOwn(MotorProtection motor, RepositoryIndex run, FindingBuilder findings, Action<Notification> notify) =>
            inner.EvaluateOwn(motor, run, findings, notify);

        public void EvaluateAcrossBus(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify) =>
            inner.EvaluateAcrossBus(motor, index, findings, notify);
    }

    [Fact]
    public void The_run_keeps_each_motors_tag_whatever_paths_the_rule_set_asks_for()
    {
        using var repo = Repository();
        var rules = new RuleSet(Rules());
        var staged = new Checker(new NoTag(rules)).Run(new CheckOptions([repo.Root], Parallel: false));
        var oneStep = new Checker(rules) { OneStep = true }.Run(new CheckOptions([repo.Root], Parallel: false));
        Assert.Equal(Describe(oneStep), Describe(staged));
        // motors/x-twice.yaml takes the tag M-5 of motors/m-05.yaml; the motors are named by their tags, not their files.
        Assert.Contains(staged.Findings, f => f.File == "motors/x-twice.yaml" && f.Message.Contains("already used by motors/m-05.yaml", StringComparison.Ordinal));
        Assert.Contains("M-5", staged.Motors);
    }

    [Fact]
    public void A_restricted_document_answers_for_its_paths_as_the_whole_one_does()
    {
        using var repo = Repository();
        var captured = new ConcurrentBag<BoundDocument>();
        var rules = new RuleSet(Rules()) { Motors = m => captured.Add(m.Document) };
        new Checker(rules).Run(new CheckOptions([repo.Root], Parallel: false));
        Assert.NotEmpty(captured);
        foreach (var doc in captured)
        {
            // Bound paths, their parents, keys that hold lists or wrong values, and paths below a value or nowhere at all.
            var paths = doc.Values.Keys
                .SelectMany(p => new[] { p, p + ".below", p.Contains('.', StringComparison.Ordinal) ? p[..p.LastIndexOf('.')] : p + "x" })
                .Concat(["motor", "protection", "bus", "relay_model", "nowhere.at.all", "", ".", "tag"])
                .Distinct(StringComparer.Ordinal).ToArray();
            var keep = paths.Where((_, i) => i % 3 != 1).ToHashSet(StringComparer.Ordinal);
            var kept = doc.Restrict(new PathSelection(keep));
            foreach (var p in keep)
            {
                Assert.Equal(doc[p], kept[p]);
                Assert.Equal(doc.SpanOf(p), kept.SpanOf(p));
            }
            Assert.All(kept.Values.Keys, k => Assert.Contains(k, keep));
            Assert.Equal(doc.Tag, kept.Tag);
            Assert.Equal((doc.Kind, doc.Path, doc.RelativePath), (kept.Kind, kept.Path, kept.RelativePath));
        }
    }
}
