using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

/// <summary>Hand-made results over an invented plant (motor tags P-101A, P-102, K-201).</summary>
internal static class Samples
{
    public const string Root = "/r";

    public static readonly RuleDescriptor Thermal = new(
        "SL112", "ThermalTimeBelowStartTime", "Thermal trip time is shorter than the start time.",
        "Checks that the thermal model lets a cold start finish before it trips.",
        "The **thermal** element must ride through a start; see `startTime`.", Level.Warning, ["49", "thermal"]);

    public static readonly RuleDescriptor Instantaneous = new(
        "SL201", "InstantaneousPickupBelowLockedRotor", "Instantaneous pickup is below the asymmetric locked-rotor current.",
        "Checks the instantaneous overcurrent pickup against the locked-rotor current with its asymmetry factor.",
        "The **50** element must not trip on the asymmetrical inrush.", Level.Error, ["50", "overcurrent"]);

    public static readonly RuleDescriptor Undervoltage = new(
        "SL305", "UndervoltageDelayShort", "Undervoltage delay is shorter than the bus transfer time.",
        "Checks that the undervoltage element waits for a bus transfer.",
        "Trip on **27** only after a transfer had time to finish.", Level.Note, ["27", "voltage"]);

    public static ImmutableArray<RuleDescriptor> Rules => [Thermal, Instantaneous, Undervoltage];

    public static Finding Pickup => new(
        "SL201", Level.Error, "motors/P-101A.yaml", new SourceSpan(4, 3, 4, 18), "protection.50.pickup",
        "pickup {pickup} is below {factor} x locked-rotor current {lockedRotor}",
        ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new Dictionary<string, FindingValue>
        {
            ["pickup"] = new("2400 A", 2400, "A"),
            ["factor"] = new("1.6", 1.6),
            ["lockedRotor"] = new("1620 A", 1620, "A"),
        }));

    public static Finding ThermalSuppressed => new Finding(
        "SL112", Level.Warning, "motors/P-101A.yaml", new SourceSpan(9, 5, 9, 12), "protection.49.tripTime",
        "thermal trip time {trip} is shorter than start time {start}",
        ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new Dictionary<string, FindingValue>
        {
            ["trip"] = new("8.5 s", 8.5, "s"),
            ["start"] = new("9.2 s", 9.2, "s"),
        }))
    {
        Suppression = new Suppression("accepted for the 2024 outage, see MOC-17", "motors/P-101A.yaml", new SourceSpan(8, 5, 8, 60)),
    };

    public static Finding Delay => new(
        "SL305", Level.Note, "motors/P-102 spare.yaml", new SourceSpan(12, 7, 12, 11), "protection.27.delay",
        "undervoltage delay {delay} is shorter than the transfer time {transfer}",
        ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, new Dictionary<string, FindingValue>
        {
            ["delay"] = new("0.2 s", 0.2, "s"),
            ["transfer"] = new("bus B-1 transfer"),
        }));

    /// <summary>Three findings (one suppressed) in 3 files, 3 motors, no notifications.</summary>
    public static CheckResult Result(params Notification[] notifications) => new(
        Root,
        [Pickup, ThermalSuppressed, Delay],
        Rules,
        [.. notifications],
        FilesChecked: 3,
        FailOn: Level.Warning)
    {
        Files = RunFiles.Of([], [("motors/K-201.yaml", "K-201", null), ("motors/P-101A.yaml", "P-101A", null), ("motors/P-102 spare.yaml", "P-102", null)]),
    };

    public static CheckResult Clean() => new(Root, [], Rules, [], 1, Level.Warning) { Files = RunFiles.Of([], [("motors/K-201.yaml", "K-201", null)]) };

    public static readonly Notification BadConfig = new(
        NotificationKind.Configuration, "unknown rule id SL999 in 'rules'", ".settinglint.yaml", new SourceSpan(3, 5, 3, 10));

    public static readonly Notification Crash = new(
        NotificationKind.Internal, "the evaluator failed on motor P-102", Exception: "System.InvalidOperationException: boom\n   at SettingLint.Core.Engine.Run()");

    public static ToolInfo Tool => ToolInfo.ForVersion("0.1.0");

    public static ReportContext Context(string cwd = Root, bool omitSuppressed = false) => new(cwd, false, omitSuppressed, Tool);

    public static string Render(IReporter reporter, CheckResult result, ReportContext context)
    {
        using var writer = new StringWriter(System.Globalization.CultureInfo.InvariantCulture);
        reporter.Write(result, context, writer);
        return writer.ToString();
    }
}
