namespace SettingLint.Tests.Support;

/// <summary>Invented setting files: the smallest bus and motor that satisfy the schemas in schema/.</summary>
public static class Samples
{
    /// <summary>A bus with every required key (schema/bus.schema.json). 8 lines.</summary>
    public const string Bus = """
        kind: bus
        format: 1
        tag: BUS-1
        nominal_voltage: 4160 V
        fault_current_max: 28 kA
        x_over_r: 15
        grounding: low-resistance
        ground_fault_current: 400 A

        """;

    /// <summary>A relay model with one range.</summary>
    public const string RelayModel = """
        kind: relay-model
        format: 1
        tag: RELAY-A
        ranges:
          short_circuit.pickup: { min: 2 xCT, max: 20 xCT, step: 0.1 xCT }

        """;

    /// <summary>
    /// A motor with every key that schema/motor-protection.schema.json requires, and one protection element.
    /// Line numbers are used by the golden tests: 5 bus, 6 motor, 9 full_load_current, 18 starter,
    /// 21 transformers, 23 ground_ct, 25 protection, 26 short_circuit, 28 its pickup.
    /// </summary>
    public const string Motor = """
        kind: motor-protection
        format: 1
        tag: M-1
        title: Test pump
        bus: ../buses/bus-1.yaml
        motor:
          rated_output: 450 hp
          rated_voltage: 4000 V
          full_load_current: 58 A
          service_factor: 1.15
          locked_rotor_current: 6.2 xFLC
          acceleration_time: 4.5 s
          safe_stall_time_cold: 14 s
          safe_stall_time_hot: 10 s
          starts_cold: 2
          starts_hot: 1
          winding_leads: 6
        starter:
          type: circuit-breaker
          interrupting_rating: 40 kA
        transformers:
          phase_ct: { primary: 75 A, secondary: 5 A, class: C50, burden: 0.3 ohm }
          ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }
          vt: { primary: 4200 V, secondary: 120 V }
        protection:
          short_circuit:
            enabled: true
            pickup: 7.2 A sec

        """;

    /// <summary>
    /// The sample motor with a thermal element set at 1.3 x FLC: above the 1.25 x FLC that NFPA 70 430.32(A)(1) allows
    /// for a service factor of 1.15, so SL801 fires wherever NFPA 70 governs and nowhere else.
    /// </summary>
    public static readonly string ThermalAbove125 = MotorWith("protection:\n", """
        protection:
          thermal:
            enabled: true
            pickup: 1.3 xFLC
            time_constant: 9 min
            cooling_time_constant: 27 min

        """);

    /// <summary><see cref="ThermalAbove125"/> with another tag, for repositories of several such motors.</summary>
    public static string ThermalAbove125Tagged(string tag) => Replace(ThermalAbove125, "tag: M-1", "tag: " + tag);

    /// <summary>The sample motor with one exact piece of text replaced (it must occur exactly once).</summary>
    public static string MotorWith(string old, string replacement) => Replace(Motor, old, replacement);

    /// <summary>Replaces text that must occur exactly once, so that a changed sample fails loudly.</summary>
    public static string Replace(string text, string old, string replacement)
    {
        var first = text.IndexOf(old, StringComparison.Ordinal);
        if (first < 0 || text.IndexOf(old, first + 1, StringComparison.Ordinal) >= 0)
        {
            throw new ArgumentException("'" + old + "' must occur exactly once in the sample.", nameof(old));
        }
        return text[..first] + replacement + text[(first + old.Length)..];
    }

    /// <summary>The 1-based line and column (UTF-16 units) of the first occurrence of a needle: an oracle independent of the parser.</summary>
    public static (int Line, int Column) Pos(string text, string needle, int occurrence = 1)
    {
        var index = -1;
        for (var i = 0; i < occurrence; i++)
        {
            index = text.IndexOf(needle, index + 1, StringComparison.Ordinal);
            if (index < 0) throw new ArgumentException("'" + needle + "' not found.", nameof(needle));
        }
        var line = 1;
        var lineStart = 0;
        for (var i = 0; i < index; i++)
        {
            if (text[i] == '\n') { line++; lineStart = i + 1; }
        }
        return (line, index - lineStart + 1);
    }

    /// <summary>Writes the sample bus and motor (motors/m-1.yaml, buses/bus-1.yaml) into a repository.</summary>
    public static void WriteMinimal(TempRepo repo, string? motor = null, string? bus = null)
    {
        repo.Write("buses/bus-1.yaml", bus ?? Bus);
        repo.Write("motors/m-1.yaml", motor ?? Motor);
    }
}
