using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Binding;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A run keeps of each file only what later steps need: no YAML tree or text outlives the file's own binding, and
/// what was read from the tree (key spans, acceptance comments, relay ranges, an inline bus) still works without it.
/// </summary>
public sealed class CheckerMemoryTests
{
    private static readonly RuleDescriptor Probe = new("SL990", "memory-probe", "Test finding", "A finding made by the test.", "", Level.Warning, []);

    /// <summary>A rule set that, when the first motor is evaluated (every file is bound by then), counts the trees still alive, then reports findings at key paths.</summary>
    private sealed class ProbeRules(ConcurrentBag<WeakReference> loaded, params string[] findingPaths) : IRuleSet
    {
        private int _first;

        public int? AliveAtEvaluation { get; private set; }

        public ImmutableArray<RuleDescriptor> Descriptors => [Probe];

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
        {
            if (Interlocked.Exchange(ref _first, 1) == 0) AliveAtEvaluation = Heap.Alive(loaded);
            foreach (var path in findingPaths)
            {
                findings.Add(new Finding(Probe.Id, Level.Warning, motor.Document.RelativePath, motor.Document.SpanOf(path), path, "At {path}.",
                    ImmutableSortedDictionary<string, FindingValue>.Empty.Add("path", path)));
            }
        }
    }

    private static (CheckResult Result, ProbeRules Rules, int Loaded) Check(TempRepo repo, bool parallel, params string[] findingPaths)
    {
        var weak = new ConcurrentBag<WeakReference>();
        var rules = new ProbeRules(weak, findingPaths);
        var checker = new Checker(rules)
        {
            OnLoaded = f =>
            {
                weak.Add(new WeakReference(f));
                if (f.Root is not null) weak.Add(new WeakReference(f.Root));
                weak.Add(new WeakReference(f.Lines));
            },
        };
        var result = checker.Run(new CheckOptions([repo.Root], Parallel: parallel));
        return (result, rules, weak.Count);
    }

    private static string Describe(Finding f) => f.File + ":" + f.Span + " " + f.RuleId + " " + f.Message;

    private static void WriteRepository(TempRepo repo, string? motor = null)
    {
        Samples.WriteMinimal(repo, motor);
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        repo.Write("motors/m-2.yaml", Samples.Replace(Samples.MotorWith("tag: M-1", "tag: M-2"), "bus: ../buses/bus-1.yaml", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay-a.yaml"));
        // An inline bus, bound with its motor's file.
        repo.Write("motors/m-3.yaml", Samples.MotorWith("bus: ../buses/bus-1.yaml",
            "bus:\n  tag: BUS-M3\n  nominal_voltage: 4160 V\n  fault_current_max: 28 kA\n  x_over_r: 15\n  grounding: low-resistance\n  ground_fault_current: 400 A").Replace("tag: M-1", "tag: M-3", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void No_tree_or_text_is_alive_when_the_rules_run(bool parallel)
    {
        using var repo = new TempRepo();
        WriteRepository(repo, Samples.MotorWith("protection:", "# settinglint-accept SL990: checked in study 12\nprotection:"));
        var (result, rules, loaded) = Check(repo, parallel, "protection.short_circuit.pickup");

        Assert.Equal(3, result.Motors.Length);
        Assert.True(loaded >= 15, "each of the 5 files should have been seen loading, with its tree and lines");
        Assert.Equal(0, rules.AliveAtEvaluation);
        // What was read off the trees before they went still shows: the inline bus, the relay model's range, the acceptance.
        Assert.Empty(result.Findings.Where(f => f.RuleId != Probe.Id).Select(Describe));
        Assert.Equal("checked in study 12", Assert.Single(result.Findings, f => f.File == "motors/m-1.yaml").Suppression?.Justification);
    }

    [Fact]
    public void Bound_models_keep_what_their_trees_told()
    {
        using var repo = new TempRepo();
        WriteRepository(repo);
        repo.Write("models/relay-b.yaml", Samples.RelayModel.Replace("tag: RELAY-A", "tag: RELAY-B", StringComparison.Ordinal).Replace(
            "ranges:\n", "ranges:\n  thermal.pickup: { min: 1 xFLC, max: 1.5 xFLC }\n  ground_fault.delay: { min: 0 s, max: 10 s, step: 0.01 s }\n", StringComparison.Ordinal));
        repo.Write("motors/m-4.yaml", Samples.Replace(Samples.MotorWith("tag: M-1", "tag: M-4"), "bus: ../buses/bus-1.yaml", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay-b.yaml"));
        var motors = new ConcurrentDictionary<string, MotorProtection>(StringComparer.Ordinal);
        var rules = new MotorSink(motors);
        var result = new Checker(rules).Run(new CheckOptions([repo.Root]));

        Assert.Empty(result.Findings.Select(Describe));
        // Ranges in the order of the file, one relay model object for all its users.
        Assert.Equal(["thermal.pickup", "ground_fault.delay", "short_circuit.pickup"], motors["motors/m-4.yaml"].RelayModel!.Ranges.Select(r => r.Setting));
        Assert.Null(motors["motors/m-4.yaml"].RelayModel!.Ranges[0].Step);
        Assert.Equal(["short_circuit.pickup"], motors["motors/m-2.yaml"].RelayModel!.Ranges.Select(r => r.Setting));
        // The inline bus is the motor's own file; the referenced one is shared by its motors.
        var inline = motors["motors/m-3.yaml"].Bus!;
        Assert.Equal("motors/m-3.yaml", inline.Document.RelativePath);
        Assert.Equal(28_000, inline.Document.Measure("fault_current_max")!.Value);
        Assert.Same(motors["motors/m-1.yaml"].Bus, motors["motors/m-2.yaml"].Bus);
        Assert.Equal("buses/bus-1.yaml", motors["motors/m-1.yaml"].Bus!.Document.RelativePath);
    }

    private sealed class MotorSink(ConcurrentDictionary<string, MotorProtection> motors) : IRuleSet
    {
        public ImmutableArray<RuleDescriptor> Descriptors => [];

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify) =>
            motors[motor.Document.RelativePath] = motor;
    }

    // A block acceptance needs the tree for the block's extent, and the tree tells a '#' in a quoted scalar from a comment.
    [Fact]
    public void Acceptances_read_while_the_tree_was_there_cover_blocks_and_skip_quoted_text()
    {
        using var repo = new TempRepo();
        var motor = Samples.MotorWith("protection:", "# settinglint-accept SL990: breaker replacement ordered\nprotection:")
            .Replace("title: Test pump", "title: \"pump # settinglint-accept SL990: text, not a comment\"", StringComparison.Ordinal);
        WriteRepository(repo, motor);
        var (result, _, _) = Check(repo, true, "protection.short_circuit.pickup", "protection.short_circuit", "title");

        var mine = result.Findings.Where(f => f.File == "motors/m-1.yaml").ToList();
        Assert.DoesNotContain(mine, f => f.RuleId == EngineRules.Suppression);
        Assert.Equal("breaker replacement ordered", Assert.Single(mine, f => f.KeyPath == "protection.short_circuit.pickup").Suppression?.Justification);
        Assert.Equal("breaker replacement ordered", Assert.Single(mine, f => f.KeyPath == "protection.short_circuit").Suppression?.Justification);
        Assert.Null(Assert.Single(mine, f => f.KeyPath == "title").Suppression);
        Assert.All(result.Findings.Where(f => f.File != "motors/m-1.yaml"), f => Assert.Null(f.Suppression));
    }

    private const string SpanMotor = """
        kind: motor-protection
        format: 1
        tag: M-9
        title:
        bus:
          nominal_voltage: 4160 V
          fault_current_max: lots
          x_over_r: 15
        motor:
          full_load_current: 58 A
          rated_voltage: 4000 V
          notes: [first, { inner: 1 }]
          "odd.key": { deeper: 1 }
          "": { below_empty: 2 }
        starter:
          type: circuit-breaker
          interrupting_rating: 40
        protection:
          short_circuit:
            enabled: true
            pickup: 7.2 A sec
          thermal: 5

        """;

    // The spans findings are placed at must be those the tree gave, for bound values, unbound scalars, mappings,
    // lists, keys with dots, paths deeper than the file goes and paths that are not there.
    [Theory]
    [InlineData(SpanMotor, "motor-protection")]
    [InlineData(Samples.Motor, "motor-protection")]
    [InlineData(Samples.RelayModel, "relay-model")]
    [InlineData(Samples.Bus, "bus")]
    public void SpanOf_gives_the_spans_of_the_tree_it_no_longer_holds(string text, string kind)
    {
        var loaded = YamlLoader.Load(Encoding.UTF8.GetBytes(text), "/repo/x.yaml", "x.yaml", LoadLimits.Default);
        var root = Assert.IsType<YMapping>(loaded.Root);
        var doc = DocumentBinder.Bind(kind, loaded.Path, loaded.RelativePath, root, new FindingBuilder("x.yaml"), SchemaSet.Shared);
        var paths = new List<string> { "", ".", "nope", "nope.deeper", ".below_empty", "motor..below_empty", "motor.", "motor.odd.key", "motor.odd.key.deeper" };
        void Collect(YNode node, string? prefix)
        {
            if (node is not YMapping m) return;
            foreach (var e in m.Entries)
            {
                var p = prefix is null ? e.Key.Value : prefix + "." + e.Key.Value;
                paths.AddRange([p, p + ".x", p + ".x.y", p + "."]);
                Collect(e.Value, p);
            }
        }
        Collect(root, null);
        paths.AddRange(doc.Values.Keys);
        Assert.All(paths, p => Assert.Equal(TreeSpanOf(root, doc, p), doc.SpanOf(p)));
        // Unbound scalars give their own span, not their key's.
        if (text == SpanMotor)
        {
            Assert.Null(doc["bus.fault_current_max"]);
            Assert.Equal(Samples.Pos(text, "lots").Line, doc.SpanOf("bus.fault_current_max").StartLine);
            Assert.Equal(Samples.Pos(text, "lots").Column, doc.SpanOf("bus.fault_current_max").StartColumn);
            Assert.Equal(Samples.Pos(text, "thermal").Column, doc.SpanOf("protection.thermal.pickup").StartColumn);
        }
    }

    // The placing rule as it was written on the tree: the bound value, else walk the keys.
    private static SourceSpan TreeSpanOf(YMapping root, BoundDocument doc, string path)
    {
        if (doc.Values.TryGetValue(path, out var v)) return v.Span;
        YNode node = root;
        YScalar? key = null;
        foreach (var part in path.Split('.'))
        {
            if (node is not YMapping m || m.Find(part) is not { } e) return key?.Span ?? SourceSpan.FileStart;
            key = e.Key;
            node = e.Value;
        }
        return node is YScalar ? node.Span : key?.Span ?? SourceSpan.FileStart;
    }
}
