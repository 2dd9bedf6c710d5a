using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// No silent passes: a missing protective element is a finding where it leaves a gap, and a rule that applies but cannot
/// be evaluated for missing data is reported with the key paths that are missing; a rule that does not apply (its guard
/// false, its element out of service or absent) and an optional key with a fallback are not.
/// </summary>
public sealed class NotRunTests
{
    private static readonly Lazy<RuleSet> Pack = new(() => BuiltInRules.Load());

    /// <summary>A 4160 V low-resistance grounded bus with every optional key the rules read.</summary>
    private const string FullBus = """
        kind: bus
        format: 1
        tag: BUS-1
        nominal_voltage: 4160 V
        max_voltage: 4370 V
        fault_current_max: 20 kA
        fault_current_min: 14 kA
        x_over_r: 12
        grounding: low-resistance
        ground_fault_current: 400 A
        voltage_unbalance_max: 1 %
        upstream:
          curve: iec-very-inverse
          pickup: 1500 A
          time_multiplier: 0.5

        """;

    /// <summary>A 1000 hp motor on a breaker; its protection block is given by each test.</summary>
    private static string Motor(string protection, string relayModel = "relay_model: ../models/relay.yaml\n") => $$"""
        kind: motor-protection
        format: 1
        tag: K-1
        title: Test compressor
        bus: ../buses/bus-1.yaml
        {{relayModel}}motor:
          rated_output: 1000 hp
          rated_voltage: 4000 V
          full_load_current: 128 A
          service_factor: 1.15
          locked_rotor_current: 6.0 xFLC
          acceleration_time: 6 s
          safe_stall_time_cold: 20 s
          safe_stall_time_hot: 15 s
          starts_cold: 2
          starts_hot: 1
          winding_leads: 3
        starter:
          type: circuit-breaker
          interrupting_rating: 31.5 kA
          operating_time: 50 ms
        transformers:
          phase_ct: { primary: 150 A, secondary: 5 A, class: C100, burden: 0.5 ohm }
          ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }
          vt: { primary: 4200 V, secondary: 120 V }
        {{protection}}
        """;

    private const string Thermal = """
          thermal:
            enabled: true
            pickup: 1.1 xFLC
            time_constant: 8 min
            cooling_time_constant: 24 min
        """;

    private const string ShortCircuit = """
          short_circuit:
            enabled: true
            pickup: 10 xCT
            delay: 0 s
        """;

    private const string GroundFault = """
          ground_fault:
            enabled: true
            pickup: 20 A pri
            delay: 0.1 s
        """;

    private const string Relay = """
        kind: relay-model
        format: 1
        tag: RELAY-A
        ranges:
          short_circuit.pickup: { min: 2 xCT, max: 20 xCT, step: 0.1 xCT }

        """;

    private static CheckResult Run(string motor, string bus = FullBus, bool withBus = true)
    {
        using var repo = new TempRepo();
        if (withBus) repo.Write("buses/bus-1.yaml", bus);
        repo.Write("models/relay.yaml", Relay);
        repo.Write("motors/k-1.yaml", motor);
        return new Checker(Pack.Value).Run(new CheckOptions([repo.Root], Parallel: false));
    }

    private static string Protection(params string[] elements) => "protection:\n" + string.Join("\n", elements) + "\n";

    private static Dictionary<string, string[]> NotRun(CheckResult result) =>
        result.NotRun.ToDictionary(n => n.RuleId, n => n.MissingPaths.ToArray(), StringComparer.Ordinal);

    [Fact]
    public void A_breaker_fed_motor_without_thermal_and_short_circuit_elements_gets_both_findings()
    {
        // The case of the issue: a 1000 hp motor on a breaker whose file has a ground-fault element only. It used to
        // get no finding at all; an absent element now counts as out of service (common practice: no element written
        // down, no protection assumed).
        var result = Run(Motor(Protection(GroundFault)));
        var ids = result.Findings.Where(f => f.RuleId is "SL204" or "SL808").Select(f => (f.RuleId, f.KeyPath, f.Span.StartLine)).ToList();
        var protectionLine = Samples.Pos(Motor(Protection(GroundFault)), "protection:").Line;
        Assert.Equal(new[] { ("SL204", "protection.short_circuit.enabled", protectionLine), ("SL808", "protection.thermal.enabled", protectionLine) }, ids);
        Assert.Equal(Level.Error, result.Findings.Single(f => f.RuleId == "SL204").Level);
        // The rules of the absent elements do not apply: they are not "not run".
        Assert.DoesNotContain(result.NotRun, n => n.RuleId.StartsWith("SL8", StringComparison.Ordinal) || n.RuleId.StartsWith("SL20", StringComparison.Ordinal));
    }

    [Fact]
    public void The_same_motor_with_both_elements_in_service_gets_neither_finding()
    {
        var result = Run(Motor(Protection(Thermal, ShortCircuit, GroundFault)));
        Assert.DoesNotContain(result.Findings, f => f.RuleId is "SL204" or "SL808" or "SL305");
        Assert.Empty(result.NotRun);
    }

    [Theory]
    [InlineData("low-resistance", true)]
    [InlineData("high-resistance", true)]
    [InlineData("solid", true)]
    [InlineData("ungrounded", false)]
    public void A_grounded_bus_needs_a_ground_fault_element(string grounding, bool fires)
    {
        var bus = Samples.Replace(FullBus, "grounding: low-resistance", "grounding: " + grounding);
        var absent = Run(Motor(Protection(Thermal, ShortCircuit)), bus);
        var disabled = Run(Motor(Protection(Thermal, ShortCircuit, "  ground_fault:\n    enabled: false\n")), bus);
        Assert.Equal(fires, absent.Findings.Any(f => f.RuleId == "SL305"));
        Assert.Equal(fires, disabled.Findings.Any(f => f.RuleId == "SL305"));
        Assert.Equal(Level.Warning, absent.Rules.Single(r => r.Id == "SL305").DefaultLevel);
    }

    [Fact]
    public void A_low_resistance_bus_without_its_ground_fault_current_leaves_the_ground_rules_not_run()
    {
        var bus = Samples.Replace(FullBus, "ground_fault_current: 400 A\n", "");
        var result = Run(Motor(Protection(Thermal, ShortCircuit, GroundFault)), bus);
        var notRun = NotRun(result);
        Assert.Equal(["bus.ground_fault_current"], notRun["SL301"]);
        Assert.Equal(["bus.ground_fault_current"], notRun["SL302"]);
        Assert.Equal(2, notRun.Count);
        var entry = result.NotRun.First(n => n.RuleId == "SL301");
        Assert.Equal(("motors/k-1.yaml", "K-1", Level.Error), (entry.File, entry.Motor, entry.Level));
    }

    [Fact]
    public void On_a_solid_bus_the_resistor_rules_do_not_apply_and_are_not_reported()
    {
        // The guard (a resistance-grounded bus) is false: no let-through current is needed.
        var bus = Samples.Replace(Samples.Replace(FullBus, "ground_fault_current: 400 A\n", ""), "grounding: low-resistance", "grounding: solid");
        Assert.Empty(Run(Motor(Protection(Thermal, ShortCircuit, GroundFault)), bus).NotRun);
    }

    [Fact]
    public void A_missing_minimum_fault_current_leaves_SL202_not_run_and_nothing_else()
    {
        // SL205 falls back to the maximum fault current (coalesce): a fallback that is there is not a gap.
        var bus = Samples.Replace(FullBus, "fault_current_min: 14 kA\n", "");
        var notRun = NotRun(Run(Motor(Protection(Thermal, ShortCircuit, GroundFault)), bus));
        Assert.Equal(["SL202"], notRun.Keys);
        Assert.Equal(["bus.fault_current_min"], notRun["SL202"]);
    }

    [Fact]
    public void A_missing_input_of_an_element_out_of_service_or_absent_is_not_a_gap()
    {
        var bus = Samples.Replace(Samples.Replace(FullBus, "fault_current_min: 14 kA\n", ""), "ground_fault_current: 400 A\n", "");
        var disabled = Run(Motor(Protection(Thermal, "  short_circuit:\n    enabled: false\n", "  ground_fault:\n    enabled: false\n")), bus);
        Assert.Empty(disabled.NotRun);
        var absent = Run(Motor(Protection(Thermal)), bus);
        Assert.Empty(absent.NotRun);
    }

    [Fact]
    public void Optional_keys_with_a_fallback_or_an_optional_argument_are_not_gaps()
    {
        // No max_voltage (SL201, SL206, SL303 fall back to the rated voltage), no acceleration_time_max (SL103, SL701,
        // SL805 fall back to acceleration_time), no full_load_level (SL804, SL806 use the IEC hot curve), no code letter
        // (SL101 has nothing to cross-check).
        var bus = Samples.Replace(FullBus, "max_voltage: 4370 V\n", "");
        var result = Run(Motor(Protection(Thermal, ShortCircuit, GroundFault, "  acceleration:\n    enabled: true\n    time: 8 s\n")), bus);
        Assert.Empty(result.NotRun);
    }

    [Fact]
    public void A_bus_without_upstream_protection_names_the_upstream_once_not_its_keys()
    {
        var bus = FullBus[..FullBus.IndexOf("upstream:", StringComparison.Ordinal)];
        var notRun = NotRun(Run(Motor(Protection(Thermal, ShortCircuit, GroundFault)), bus));
        Assert.Equal(["bus.upstream"], notRun["SL205"]);
        Assert.Equal(["bus.upstream"], notRun["SL206"]);
    }

    [Fact]
    public void A_setting_missing_from_an_element_in_service_is_a_gap()
    {
        var noDelay = Samples.Replace(ShortCircuit, "\n    delay: 0 s", "");
        var notRun = NotRun(Run(Motor(Protection(Thermal, noDelay, GroundFault))));
        Assert.Equal(["protection.short_circuit.delay"], notRun["SL205"]);
    }

    [Fact]
    public void A_missing_bus_file_is_named_as_the_bus_and_a_missing_relay_model_as_the_relay_model()
    {
        var result = Run(Motor(Protection(Thermal, ShortCircuit, GroundFault), relayModel: ""), withBus: false);
        var notRun = NotRun(result);
        Assert.Equal(["relay_model"], notRun["SL108"]);
        Assert.Equal(["bus"], notRun["SL202"]);
        Assert.Equal(["bus"], notRun["SL301"]);
        Assert.All(result.NotRun, n => Assert.True(n.MissingPaths.All(p => p is "bus" or "relay_model"), n.RuleId + ": " + n.MissingText));
        Assert.Contains(result.Findings, f => f.RuleId == EngineRules.Reference);
    }

    [Fact]
    public void A_soft_starter_without_its_current_limit_names_the_limit_and_no_optional_key()
    {
        // Every rule stopped here is stopped by the missing limit alone: acceleration_time_max and the other optional
        // inputs of a start are not what is missing (a function's optional arguments are not traced).
        var motor = Samples.Replace(Motor(Protection(Thermal, ShortCircuit, GroundFault, "  acceleration:\n    enabled: true\n    time: 8 s\n")),
            "  type: circuit-breaker\n", "  type: soft-starter\n");
        var result = Run(motor);
        Assert.Contains(result.NotRun, n => n.RuleId == "SL703");
        Assert.All(result.NotRun, n => Assert.Equal("starter.soft_start_current_limit", n.MissingText));
    }

    [Fact]
    public void Undercurrent_without_the_minimum_load_current_is_not_run()
    {
        var notRun = NotRun(Run(Motor(Protection(Thermal, ShortCircuit, GroundFault, "  undercurrent:\n    enabled: true\n    pickup: 0.4 xFLC\n    delay: 5 s\n"))));
        Assert.Equal(["motor.minimum_load_current"], notRun["SL901"]);
        Assert.Equal(["motor.no_load_current"], notRun["SL902"]);
    }
}
