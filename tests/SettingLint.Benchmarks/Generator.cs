using System.Globalization;
using System.Text;

namespace SettingLint.Benchmarks;

/// <summary>
/// Writes a synthetic, valid setting repository: 20 motors per bus, two relay models, N motors. Like a real repository,
/// most motors are set correctly: one in <see cref="PlantedEvery"/> carries a planted finding (an overvoltage pickup
/// within the measuring error of the bus's highest voltage, SL607), so that a run's findings are a few, not one per motor.
/// </summary>
public static class Generator
{
    /// <summary>One motor in this many has a planted finding.</summary>
    public const int PlantedEvery = 50;

    public static string Write(int motors) => Write(motors, PlantedEvery);

    /// <summary>A repository where one motor in <paramref name="plantedEvery"/> has the planted finding (1: every motor; 0: none).</summary>
    public static string Write(int motors, int plantedEvery)
    {
        var dir = Path.Combine(Path.GetTempPath(), $"settinglint-bench-{motors}-{Guid.NewGuid():N}"[..40]);
        Directory.CreateDirectory(Path.Combine(dir, ".git"));
        Directory.CreateDirectory(Path.Combine(dir, "buses"));
        Directory.CreateDirectory(Path.Combine(dir, "models"));
        Directory.CreateDirectory(Path.Combine(dir, "motors"));
        var buses = (motors + 19) / 20;
        for (var b = 1; b <= buses; b++)
        {
            File.WriteAllText(Path.Combine(dir, "buses", $"sg-{b:D4}.yaml"), Bus(b));
        }
        File.WriteAllText(Path.Combine(dir, "models", "relay-a.yaml"), Model("RELAY-A", "Synthetic motor relay A, 5 A inputs"));
        File.WriteAllText(Path.Combine(dir, "models", "relay-b.yaml"), Model("RELAY-B", "Synthetic motor relay B, 5 A inputs"));
        for (var m = 1; m <= motors; m++)
        {
            File.WriteAllText(Path.Combine(dir, "motors", $"p-{m:D5}.yaml"), Motor(m, (m - 1) / 20 + 1, plantedEvery > 0 && m % plantedEvery == 0));
        }
        return dir;
    }

    private static string Bus(int b) => $"""
        # yaml-language-server: $schema=../../schema/bus.schema.json
        # Synthetic 4.16 kV switchgear bus {b} for benchmarks.
        kind: bus
        format: 1
        tag: SG-{b:D4}
        title: 4.16 kV synthetic switchgear bus {b}
        nominal_voltage: 4160 V
        max_voltage: 4370 V
        min_voltage: 3950 V
        fault_current_max: {17 + b % 3} kA
        fault_current_min: 13 kA
        x_over_r: 12
        grounding: low-resistance
        ground_fault_current: 400 A
        voltage_unbalance_max: 1 %
        upstream:
          curve: iec-very-inverse
          pickup: 1400 A
          time_multiplier: 0.5

        """;

    private static string Model(string tag, string title) => $"""
        # yaml-language-server: $schema=../../schema/relay-model.schema.json
        kind: relay-model
        format: 1
        tag: {tag}
        title: {title}
        ranges:
          thermal.pickup:                {"{"} min: 1.00 xFLC, max: 1.50 xFLC, step: 0.01 xFLC {"}"}
          thermal.time_constant:         {"{"} min: 1 min, max: 180 min, step: 1 min {"}"}
          thermal.cooling_time_constant: {"{"} min: 1 min, max: 600 min, step: 1 min {"}"}
          short_circuit.pickup:          {"{"} min: 1.00 xCT, max: 20.00 xCT, step: 0.01 xCT {"}"}
          short_circuit.delay:           {"{"} min: 0 s, max: 10 s, step: 0.01 s {"}"}
          ground_fault.pickup:           {"{"} min: 0.05 xCT, max: 1.00 xCT, step: 0.01 xCT {"}"}
          ground_fault.delay:            {"{"} min: 0 s, max: 10 s, step: 0.01 s {"}"}
          differential.pickup_running:   {"{"} min: 0.05 xCT, max: 1.00 xCT, step: 0.01 xCT {"}"}
          differential.pickup_starting:  {"{"} min: 0.05 xCT, max: 1.00 xCT, step: 0.01 xCT {"}"}
          unbalance.trip_pickup:         {"{"} min: 5 %, max: 100 %, step: 1 % {"}"}
          undervoltage.delay:            {"{"} min: 0.1 s, max: 60 s, step: 0.1 s {"}"}
          overvoltage.delay:             {"{"} min: 0.1 s, max: 60 s, step: 0.1 s {"}"}
          acceleration.time:             {"{"} min: 1.0 s, max: 250.0 s, step: 0.1 s {"}"}
          undercurrent.pickup:           {"{"} min: 0.10 xFLC, max: 0.95 xFLC, step: 0.01 xFLC {"}"}

        """;

    private static string Motor(int m, int bus, bool planted)
    {
        // Small, safe variations around a correctly set 1250 hp pump on a 200:5 CT.
        var flc = 154 + m % 9;                              // 154..162 A
        var accel = (3.3 + (m % 5) * 0.1).ToString("F1", CultureInfo.InvariantCulture);
        var model = m % 2 == 0 ? "relay-b" : "relay-a";
        // 112 % of 4000 V is 4480 V, 2.5 % above the bus's 4370 V and inside SL602's 107-113 % window; the planted
        // 110 % (4400 V) keeps only 0.7 % above it, within SL607's 2 % room.
        var overvoltage = planted ? "110 %" : "112 %";
        var sb = new StringBuilder();
        sb.Append($"""
            # yaml-language-server: $schema=../../schema/motor-protection.schema.json
            kind: motor-protection
            format: 1
            tag: P-{m:D5}
            title: Synthetic pump {m}
            bus: ../buses/sg-{bus:D4}.yaml
            relay_model: ../models/{model}.yaml
            motor:
              rated_output: 1250 hp
              rated_voltage: 4000 V
              full_load_current: {flc} A
              service_factor: 1.15
              locked_rotor_current: 6.0 xFLC
              locked_rotor_code: F
              acceleration_time: {accel} s
              acceleration_time_max: 5.5 s
              safe_stall_time_cold: 18 s
              safe_stall_time_hot: 14 s
              starts_cold: 2
              starts_hot: 1
              starts_per_hour: 3
              winding_leads: 6
              minimum_load_current: 95 A
              no_load_current: 38 A
            starter:
              type: circuit-breaker
              interrupting_rating: 31.5 kA
              operating_time: 50 ms
            transformers:
              phase_ct: {"{"} primary: 200 A, secondary: 5 A, class: C100, burden: 0.4 ohm {"}"}
              ground_ct: {"{"} connection: residual {"}"}
              vt: {"{"} primary: 4200 V, secondary: 120 V {"}"}
            protection:
              thermal:
                enabled: true
                pickup: 1.15 xFLC
                time_constant: 6 min
                cooling_time_constant: 18 min
                full_load_level: 22 %
              short_circuit:
                enabled: true
                pickup: 46 A sec
                delay: 0 s
              ground_fault:
                enabled: true
                pickup: 60 A pri
                delay: 0.1 s
              differential:
                enabled: true
                pickup_running: 0.1 xCT
                pickup_starting: 0.2 xCT
                delay_running: 0 s
                delay_starting: 0.1 s
              unbalance:
                enabled: true
                alarm_pickup: 10 %
                trip_pickup: 20 %
                delay: 3 s
              undervoltage:
                enabled: true
                pickup: 90 %
                delay: 6.5 s
              overvoltage:
                enabled: true
                pickup: {overvoltage}
                delay: 3 s
              acceleration:
                enabled: true
                time: 6.5 s
              undercurrent:
                enabled: true
                pickup: 0.45 xFLC
                delay: 5 s
              starts:
                enabled: true
                per_hour: 2
                time_between: 20 min

            """);
        return sb.ToString();
    }
}
