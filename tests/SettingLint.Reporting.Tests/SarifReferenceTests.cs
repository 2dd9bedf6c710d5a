using System.Collections.Immutable;
using System.Text.Json;
using CsCheck;
using SettingLint.Tests.Shared;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

/// <summary>
/// <see cref="SarifReporter"/> against the Sarif.Sdk reference (<see cref="SarifReference"/>): the parsed documents
/// must be equal and have the same properties in the same order, on the sample cases and on random results.
/// Numbers may be spelled differently (4 against 4.0), and strings escaped differently.
/// </summary>
public sealed class SarifReferenceTests
{
    private static readonly DateTimeOffset Start = new(2025, 3, 1, 8, 30, 0, TimeSpan.Zero);

    private static readonly Dictionary<string, Func<(CheckResult Result, ReportContext Context)>> Named = new(StringComparer.Ordinal)
    {
        ["findings"] = () => SarifValidationTests.Case("findings"),
        ["clean"] = () => SarifValidationTests.Case("clean"),
        ["notifications"] = () => SarifValidationTests.Case("notifications"),
        ["omit-suppressed"] = () => SarifValidationTests.Case("omit-suppressed"),
        ["escaped-uris"] = () => (Samples.Result() with
        {
            Findings = [.. new[] { "motors/P-102 spare.yaml", "motors/#7 feed.yaml", "c:odd/100%.yaml", "motors/Pümpe-3.yaml" }
                .Select(static file => Samples.Pickup with { File = file })],
        }, Samples.Context()),
        ["root-with-slash"] = () => (Samples.Result() with { RepositoryRoot = "/r/" }, Samples.Context()),
        ["root-with-space"] = () => (Samples.Result() with { RepositoryRoot = "/srv/plant settings" }, Samples.Context()),
        ["values-named-like-properties"] = () => (Samples.Result() with
        {
            Findings = [Samples.Pickup with { Values = Samples.Pickup.Values.SetItem("tags", new FindingValue("3", 3)).SetItem("keyPath", "other") }],
        }, Samples.Context()),
        ["values-clashing-after-renaming"] = () => (Samples.Result() with
        {
            Findings = [Samples.Pickup with
            {
                Values = Samples.Pickup.Values.SetItem("keyPath", "first").SetItem("value.keyPath", new FindingValue("2 A", 2, "A"))
                    .SetItem("units", new FindingValue("3 s", 3, "s")).SetItem("value.units", "text"),
            }],
        }, Samples.Context()),
        ["odd-numbers"] = () => (Samples.Result() with
        {
            Findings = [Samples.Pickup with
            {
                Values = Samples.Pickup.Values.SetItem("nan", new FindingValue("NaN", double.NaN, "A"))
                    .SetItem("inf", new FindingValue("inf", double.PositiveInfinity, "A")).SetItem("huge", new FindingValue("x", 1e300, "V"))
                    .SetItem("negativeZero", new FindingValue("-0", -0.0)).SetItem("tiny", new FindingValue("e", double.Epsilon, "")),
            }],
        }, Samples.Context()),
        ["fix"] = () => (Samples.Result() with { Findings = [Samples.Pickup with { Fix = new FindingFix(new SourceSpan(31, 13, 31, 21), "44 A sec", "1.76 kA pri (44 A sec)") }] }, Samples.Context()),
        ["region-before-start"] = () => (Samples.Result() with { Findings = [Samples.Pickup with { Span = new SourceSpan(0, 0, 0, 0) }] }, Samples.Context()),
        ["timestamps"] = () => (Samples.Result(), Samples.Context() with { Timestamps = true, StartTimeUtc = Start, EndTimeUtc = Start.AddMilliseconds(1250.7) }),
        ["timestamps-off"] = () => (Samples.Result(), Samples.Context() with { StartTimeUtc = Start, EndTimeUtc = Start }),
        ["baseline-in-the-repository"] = () => (WithBaseline(".settinglint-baseline.yaml"), Samples.Context()),
        ["baseline-outside"] = () => (WithBaseline("/etc/settinglint/baseline.yaml"), Samples.Context()),
        ["baseline-omitted-for-code-scanning"] = () => (WithBaseline(".settinglint-baseline.yaml"), Samples.Context(omitSuppressed: true)),
        ["no-rules"] = () => (Samples.Result() with { Rules = [] }, Samples.Context()),
        ["unknown-and-repeated-rules"] = () => (Samples.Result() with { Rules = [Samples.Thermal, Samples.Thermal, Samples.Undervoltage] }, Samples.Context()),
        ["rule-texts-blank-or-alike"] = () => (Samples.Clean() with
        {
            Rules =
            [
                Samples.Thermal with { Summary = " Thermal trip time is SHORTER than the start time. ", Tags = [] },
                Samples.Instantaneous with { Summary = "", Title = "", HelpMarkdown = " ", Tags = default },
                Samples.Undervoltage with { Summary = " ", HelpMarkdown = "``**``" },
            ],
        }, Samples.Context()),
        ["notifications-of-every-shape"] = () => (Samples.Result(
            Samples.BadConfig, Samples.Crash,
            new Notification(NotificationKind.Internal, "no exception text", "rules/SL900.yaml", new SourceSpan(2, 1, 1, 0)),
            new Notification(NotificationKind.Internal, "odd exception", Exception: "not a type: boom"),
            new Notification(NotificationKind.Configuration, "configuration with exception text", Span: new SourceSpan(1, 1, 1, 2), Exception: "System.Exception: x")),
            Samples.Context()),
        ["not-run"] = () => (Samples.Result(Samples.Crash) with
        {
            NotRun =
            [
                new CheckNotRun("SL201", Level.Error, "motors/p-101a.yaml", "P-101A", ["bus.fault_current_min"]),
                new CheckNotRun("SL999", Level.Warning, "motors/Pümpe 3.yaml", "P-3", ["bus", "relay_model"]),
            ],
        }, Samples.Context()),
        ["another-tool"] = () => (Samples.Result(), Samples.Context() with { Tool = new ToolInfo(" ", "", new Uri("/opt/settinglint/docs", UriKind.Absolute)) }),
    };

    public static TheoryData<string> Cases => [.. Named.Keys];

    private static CheckResult WithBaseline(string baselineFile) => Samples.Result() with
    {
        Findings = [Samples.Pickup with { BaselineState = BaselineState.New }, Samples.ThermalSuppressed with { BaselineState = BaselineState.Unchanged }, Samples.Delay],
        BaselineFile = baselineFile,
        Absent =
        [
            new AbsentResult("SL201", "motors/P-9.yaml", "protection.50.pickup", "0123456789abcdef", "pickup 1 A is below", 7),
            new AbsentResult("SL999", "motors/P 10.yaml", "", "fedcba9876543210", "", 0),
        ],
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_sample_cases_are_written_as_the_sdk_wrote_them(string name)
    {
        var (result, context) = Named[name]();
        AssertSameLog(SarifReference.Render(result, context), Samples.Render(new SarifReporter(), result, context));
    }

    [Trait("Category", "Property")]
    [Fact]
    public void Random_results_are_written_as_the_sdk_wrote_them() =>
        Input.SampleSeeded((result, context) =>
        {
            AssertSameLog(SarifReference.Render(result, context), Samples.Render(new SarifReporter(), result, context));
        }, iter: 400);

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_sdk_reads_the_log_back_unchanged(string name)
    {
        var (result, context) = Named[name]();
        var reference = SarifReference.Render(result, context);
        var ours = Samples.Render(new SarifReporter(), result, context);
        // The SDK refuses some of its own logs (a blank tool name or help text, which it leaves out but requires): ours too.
        if (Record.Exception(() => SarifReference.Deserialize(reference)) is { } refused)
        {
            Assert.IsType(refused.GetType(), Record.Exception(() => SarifReference.Deserialize(ours)));
            return;
        }
        var log = SarifReference.Deserialize(ours);
        Assert.Equal(result.Rules.Length, log.Runs[0].Tool.Driver.Rules?.Count ?? 0);
        AssertSameLog(reference, SarifReference.Serialize(log));
    }

    [Fact]
    public void The_comparison_does_see_a_change_of_order_or_value()
    {
        var reference = SarifReference.Render(Samples.Result(), Samples.Context());
        var reordered = reference.Replace("\"version\": \"0.1.0\",\n          \"semanticVersion\": \"0.1.0\",",
            "\"semanticVersion\": \"0.1.0\",\n          \"version\": \"0.1.0\",", StringComparison.Ordinal);
        Assert.NotEqual(reference, reordered);
        Assert.ThrowsAny<Xunit.Sdk.XunitException>(() => AssertSameLog(reference, reordered));
        Assert.ThrowsAny<Xunit.Sdk.XunitException>(() => AssertSameLog(reference, reference.Replace("2400.0", "2401", StringComparison.Ordinal)));
        AssertSameLog(reference, reference.Replace("2400.0", "2400", StringComparison.Ordinal));
    }

    // Equal documents (System.Text.Json's DeepEquals), and the same property names in the same order at every level,
    // which DeepEquals does not look at.
    private static void AssertSameLog(string expected, string actual)
    {
        using var expectedDoc = JsonDocument.Parse(expected);
        using var actualDoc = JsonDocument.Parse(actual);
        var expectedNodes = Nodes(expectedDoc.RootElement);
        var actualNodes = Nodes(actualDoc.RootElement);
        Assert.Equal(expectedNodes.Select(static n => n.Path), actualNodes.Select(static n => n.Path));
        if (JsonElement.DeepEquals(expectedDoc.RootElement, actualDoc.RootElement)) return;
        var (path, value, other) = expectedNodes.Zip(actualNodes, static (e, a) => (e.Path, e.Value, a.Value))
            .First(static pair => !JsonElement.DeepEquals(pair.Item2, pair.Item3));
        Assert.Fail($"{path}: expected {value.GetRawText()}, got {other.GetRawText()}");
    }

    // Every value with its path from the root, in document order; an object or array comes before its members.
    private static List<(string Path, JsonElement Value)> Nodes(JsonElement root)
    {
        var nodes = new List<(string, JsonElement)>();
        void Visit(string path, JsonElement element)
        {
            nodes.Add((path, element));
            if (element.ValueKind == JsonValueKind.Object)
            {
                foreach (var property in element.EnumerateObject()) Visit(path + "." + property.Name, property.Value);
            }
            else if (element.ValueKind == JsonValueKind.Array)
            {
                var i = 0;
                foreach (var item in element.EnumerateArray()) Visit(path + "[" + i++ + "]", item);
            }
        }
        Visit("$", root);
        return nodes;
    }

    // Random inputs. Texts mix what JSON must escape, what encoders treat differently (non-ASCII, emoji, U+2028)
    // and what the SDK trims or compares (blanks, case); numbers include the ones JSON cannot hold.
    private static readonly Gen<string> Piece = Gen.OneOf(
        Gen.OneOf("", " ", "\"quoted\"", "back\\slash", "line\nbreak\r\n", "\ttab", "\u0000\u0001\u001f\u007f", "ünïcødé Ω",
            "😀 emoji", "<b>&amp;'</b>", "\u2028\u2029\u0085", "{pickup}", "4.0", "null", "SHORT", "short"),
        Gen.Char["abcXYZ019 .-_/:#%\"\\\n\té中"].Array[0, 8].Select(static chars => new string(chars)));

    private static readonly Gen<string> Text = Piece.Array[0, 3].Select(static pieces => string.Concat(pieces));

    private static readonly Gen<string> File = Gen.OneOf(
        "motors/P-101A.yaml", "motors/P-102 spare.yaml", "motors/#7 feed.yaml", "c:odd/100%.yaml", "motors/Pümpe-3.yaml",
        "a/../b.yaml", ".settinglint.yaml", "dir/ü 😀.yaml", "x?y=1&z.yaml", "back\\slash.yaml", "trailing/");

    private static readonly Gen<string> RuleId = Gen.OneOf("SL101", "SL112", "SL201", "SL999", "");

    private static readonly Gen<SourceSpan> Span =
        Gen.Select(Gen.Int[-1, 9], Gen.Int[-1, 9], Gen.Int[-1, 9], Gen.Int[-1, 9], static (a, b, c, d) => new SourceSpan(a, b, c, d));

    private static readonly Gen<double?> Number = Gen.OneOf(
        Gen.Const((double?)null),
        Gen.OneOf<double?>(double.NaN, double.PositiveInfinity, double.NegativeInfinity, 0.0, -0.0, 4.0, 0.1, 1.6, 2400,
            -17.25, 1e300, -1e-300, double.MaxValue, double.Epsilon, 1e21, 123456789012345678),
        Gen.Double.Select(static d => (double?)d));

    private static readonly Gen<FindingValue> Value =
        Gen.Select(Text, Number, Gen.OneOf("A", "s", "xFLC", "%", "Ω", "", "A pri").Null(0.4), static (text, number, unit) => new FindingValue(text, number, unit));

    private static readonly Gen<string> ValueName = Gen.OneOf(
        Gen.OneOf("pickup", "factor", "keyPath", "value.keyPath", "messageId", "tags", "value.tags", "units", "value.units", "sarifv2/x", "", "Ä", "a\"b"),
        Text);

    private static readonly Gen<ImmutableSortedDictionary<string, FindingValue>> Values =
        Gen.Select(ValueName, Value).Array[0, 6].Select(static pairs =>
        {
            var values = ImmutableSortedDictionary.CreateBuilder<string, FindingValue>(StringComparer.Ordinal);
            foreach (var (name, value) in pairs) values[name] = value;
            return values.ToImmutable();
        });

    private static readonly Gen<Finding> FindingGen =
        from ruleId in RuleId
        from level in Gen.Enum<Level>()
        from file in File
        from span in Span
        from keyPath in Text
        from template in Gen.OneOf(Text, Gen.Const("{pickup} below {factor} and {missing}"))
        from values in Values
        from suppression in Gen.Select(Text, File, Span, static (why, file, at) => new Suppression(why, file, at)).Null(0.7)
        from baseline in Gen.Enum<BaselineState>().Nullable(0.5)
        from fix in Gen.Select(Gen.Int[1, 9], Gen.Int[1, 9], Gen.Int[0, 9], Text, Text,
            static (line, column, length, inserted, shown) => new FindingFix(new SourceSpan(line, column, line, column + length), inserted, shown)).Null(0.7)
        select new Finding(ruleId, level, file, span, keyPath, template, values) { Suppression = suppression, BaselineState = baseline, Fix = fix };

    private static readonly Gen<RuleDescriptor> Rule =
        from id in RuleId
        from name in Text
        from summary in Text
        from title in Gen.OneOf(Text, Gen.Const(summary), Gen.Const(" " + summary.ToUpperInvariant() + " "))
        from help in Gen.OneOf(Text, Gen.Const("**Bold** title and `code`"), Gen.Const("**``**"))
        from level in Gen.Enum<Level>()
        from tags in Gen.OneOf(Gen.Const(default(ImmutableArray<string>)), Text.Array[0, 3].Select(static t => t.ToImmutableArray()))
        select new RuleDescriptor(id, name, title, summary, help, level, tags);

    private static readonly Gen<Notification> NotificationGen =
        from kind in Gen.Enum<NotificationKind>()
        from message in Text
        from file in File.Null(0.4)
        from span in Span.Nullable(0.4)
        from exception in Gen.OneOf(Text, Gen.OneOf("System.IO.IOException: disk full\n   at X.Y()", "no colon here", ": leading colon",
            "Not A Type: x", "A.B`1+C_d: y", "Ä: z")).Null(0.3)
        select new Notification(kind, message, file, span, exception);

    private static readonly Gen<CheckNotRun> NotRunGen =
        from ruleId in RuleId
        from level in Gen.Enum<Level>()
        from file in File
        from motor in Text
        from paths in Gen.OneOf(Text, Gen.OneOf("bus", "relay_model", "bus.upstream", "motor.no_load_current")).Array[1, 3]
        select new CheckNotRun(ruleId, level, file, motor, [.. paths]);

    private static readonly Gen<AbsentResult> Absent =
        from ruleId in RuleId
        from file in File
        from keyPath in Gen.OneOf(Gen.Const(""), Text)
        from fingerprint in Text
        from message in Gen.OneOf(Gen.Const(""), Text)
        from line in Gen.Int[-1, 40]
        select new AbsentResult(ruleId, file, keyPath, fingerprint, message, line);

    private static readonly Gen<DateTimeOffset?> Time = Gen.OneOf(
        Gen.Const((DateTimeOffset?)null),
        Gen.OneOf<DateTimeOffset?>(DateTimeOffset.UnixEpoch, DateTimeOffset.MinValue, DateTimeOffset.MaxValue,
            new DateTimeOffset(2025, 3, 1, 8, 30, 0, 999, TimeSpan.FromHours(-5))),
        Gen.DateTimeOffset.Select(static t => (DateTimeOffset?)t));

    private static readonly Gen<ToolInfo> Tool = Gen.Select(
        Gen.OneOf("SettingLint", "", " ", "Other \"tool\" ü"),
        Gen.OneOf("0.1.0", "", "1.2.3-beta.1+x"),
        Gen.OneOf("https://settinglint.invalid/", "https://example.invalid/docs", "file:///opt/docs/", "/opt/docs"),
        static (name, version, uri) => new ToolInfo(name, version, new Uri(uri, UriKind.Absolute)));

    private static readonly Gen<(CheckResult, ReportContext)> Input =
        from root in Gen.OneOf("/r", "/r/", "/srv/plant settings", "/", "/ü/😀 x")
        from findings in FindingGen.Array[0, 5]
        from rules in Rule.Array[0, 4]
        from notifications in NotificationGen.Array[0, 4]
        from failOn in Gen.Enum<Level>()
        from baselineFile in Gen.OneOf(".settinglint-baseline.yaml", "/etc/settinglint/baseline.yaml", "base line.yaml").Null(0.4)
        from absent in Absent.Array[0, 3]
        from notRun in NotRunGen.Array[0, 3]
        from timestamps in Gen.Bool
        from omitSuppressed in Gen.Bool
        from start in Time
        from end in Time
        from tool in Tool
        select (new CheckResult(root, [.. findings], [.. rules], [.. notifications], findings.Length, failOn)
            {
                Files = RunFiles.Of([], [("motors/m-1.yaml", "M-1", null)]),
                BaselineFile = baselineFile,
                Absent = [.. absent],
                NotRun = [.. notRun],
            },
            new ReportContext("/r", timestamps, omitSuppressed, tool) { StartTimeUtc = start, EndTimeUtc = end });
}
