namespace SettingLint.Tests.Support;

/// <summary>
/// A small plant in a git work tree for the gate's tests, with a test pack (prefix TST) so that the built-in rules'
/// verdicts on the sample do not enter.
/// </summary>
public static class GatePlant
{
    public const string M1 = "motors/m-1.yaml";
    public const string M2 = "motors/m-2.yaml";
    public const string M3 = "motors/m-3.yaml";
    public const string BaselineFile = "settinglint.baseline";

    // Two test rules in a pack of their own, so that the built-in rules' verdicts on the sample do not enter:
    // TST101 on the motor alone (the sample's 7.2 A sec on 75:5 is 108 A primary, under 200 A), TST102 over the bus
    // (this motor's hot stall time against the other motors' longest acceleration time).
    private const string OwnRule = """
        id: TST101
        title: Short-circuit pickup above a test ceiling
        summary: Test rule on one motor.
        rationale: Test rule.
        basis: [common practice]
        severity: error
        tags: [50P]
        applies_to: motor-protection
        check: protection.short_circuit.pickup <= 200 A
        subject: protection.short_circuit.pickup
        message: Pickup {actual} above {limit}.

        """;

    private const string BusRule = """
        id: TST102
        title: Hot stall time shorter than another motor's start
        summary: Test rule over the motors of one bus.
        rationale: Test rule.
        basis: [common practice]
        severity: error
        tags: ["49"]
        applies_to: motor-protection
        let:
          longest: others_max(motor.acceleration_time)
        check: motor.safe_stall_time_hot >= longest
        subject: motor.safe_stall_time_hot
        message: Hot stall time {actual} is shorter than {limit}.

        """;

    /// <summary>
    /// m-1 and m-2 on bus-1, m-3 alone on bus-2; m-2 starts for 30 s, longer than m-1's 10 s hot stall time, so TST102
    /// fires on m-1 exactly when m-2 is loaded with it. Committed clean of TST101.
    /// </summary>
    public static GitWorkTree Create()
    {
        var git = new GitWorkTree();
        git.Write(".settinglint.yaml", "packs: [tests]\n");
        git.Write("tests/pack.yaml", "prefix: TST\n");
        git.Write("tests/TST101/rule.yaml", OwnRule);
        git.Write("tests/TST102/rule.yaml", BusRule);
        git.Write("buses/bus-1.yaml", Samples.Bus);
        git.Write("buses/bus-2.yaml", Samples.Bus.Replace("tag: BUS-1", "tag: BUS-2", StringComparison.Ordinal));
        git.Write(M1, Samples.Motor);
        git.Write(M2, Motor("M-2", "bus-1", "acceleration_time: 4.5 s", "acceleration_time: 30 s"));
        git.Write(M3, Motor("M-3", "bus-2"));
        git.Commit("plant");
        return git;
    }

    public static string Motor(string tag, string bus, string? old = null, string? now = null)
    {
        var text = Samples.MotorWith("tag: M-1", "tag: " + tag).Replace("../buses/bus-1.yaml", "../buses/" + bus + ".yaml", StringComparison.Ordinal);
        return old is null ? text : Samples.Replace(text, old, now!);
    }
}
