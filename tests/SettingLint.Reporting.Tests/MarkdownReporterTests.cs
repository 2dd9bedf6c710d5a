using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Tests.Shared;

namespace SettingLint.Reporting.Tests;

/// <summary>The markdown summary: a golden file for a known case, and the escaping and limits around it.</summary>
public sealed class MarkdownReporterTests
{
    private static ImmutableSortedDictionary<string, FindingValue> Values(params (string Name, string Text, double Number)[] values) =>
        ImmutableSortedDictionary.CreateRange(StringComparer.Ordinal, values.Select(v => KeyValuePair.Create(v.Name, new FindingValue(v.Text, v.Number, "A"))));

    // Invented plant: a new short-circuit error on K-201, a baselined note on P-101A, an accepted warning, an absent
    // entry, and a gate change in the configuration.
    private static CheckResult Known()
    {
        var sc = new Finding("SL201", Level.Error, "motors/K-201.yaml", new SourceSpan(28, 13, 28, 22), "protection.short_circuit.pickup",
            "Short-circuit pickup {actual} is below {limit} | 1.7 x the start", Values(("actual", "288 A pri (7.2 A sec)", 288), ("limit", "1.1 kA pri (27.5 A sec)", 1100), ("margin", "-812 A pri (-20.3 A sec)", -812)))
        { BaselineState = BaselineState.New };
        var note = Samples.Delay with { BaselineState = BaselineState.Unchanged };
        var accepted = Samples.ThermalSuppressed with { BaselineState = BaselineState.New };
        var gate = new Finding(EngineRules.GateChange, Level.Warning, ".settinglint.yaml", SourceSpan.At(3, 10), "rules.SL110",
            "SL110 is switched off (it was note): it no longer reports anything.", ImmutableSortedDictionary<string, FindingValue>.Empty)
        { BaselineState = BaselineState.New };
        return new CheckResult(Samples.Root, [gate, sc, accepted, note], Samples.Rules, [], 4, Level.Error)
        {
            BaselineFile = "settinglint.baseline",
            Absent = [new AbsentResult("SL305", "motors/P-102 spare.yaml", "protection.27.pickup", Fingerprints.Of("motors/P-102 spare.yaml", "SL305", "protection.27.pickup"), "old note", 12)],
            Files = RunFiles.Of([], [("motors/K-201.yaml", "K-201", null), ("motors/P-101A.yaml", "P-101A", null), ("motors/P-102 spare.yaml", "P-102", null)]),
            Scope = new ChangeScope("origin/main", false, ["buses/B-1.yaml", ".settinglint.yaml"], [], ["motors/K-201.yaml"], null),
        };
    }

    private static string Render(CheckResult result, string? linkBase = null) =>
        Samples.Render(new MarkdownReporter { LinkBase = linkBase }, result, Samples.Context());

    private static string GoldenPath() => Path.Combine(RepositoryPaths.Root(), "tests", "SettingLint.Reporting.Tests", "golden", "markdown-summary.md");

    [Fact]
    public void The_summary_of_a_known_case_matches_the_golden_file()
    {
        var actual = Render(Known());
        var path = GoldenPath();
        var expected = File.Exists(path) ? File.ReadAllText(path) : null;
        // The golden is never written by the test: a differing output goes beside the test assembly, and
        // `bash tests/update-goldens.sh` copies it over the golden for review (DEVELOPERS.md).
        var output = Path.Combine(AppContext.BaseDirectory, "golden-actual", Path.GetFileName(path));
        if (expected != actual)
        {
            Directory.CreateDirectory(Path.GetDirectoryName(output)!);
            File.WriteAllText(output, actual);
        }
        else
        {
            if (File.Exists(output)) File.Delete(output);
        }
        Assert.True(expected is not null, path + " is missing; `bash tests/update-goldens.sh` writes it from this run's output for review.");
        Assert.Equal(expected, actual);
    }

    [Fact]
    public void Checks_not_run_get_a_section_and_a_count_even_when_the_gate_passes()
    {
        var result = Samples.Clean() with
        {
            NotRun = [new CheckNotRun("SL202", Level.Warning, "motors/K-201.yaml", "K-201", ["bus.fault_current_min", "bus.upstream"])],
        };
        var md = Render(result);
        Assert.StartsWith("## SettingLint: the gate passes\n", md, StringComparison.Ordinal);
        Assert.Contains("(1 motor); 1 check not run for missing data; exit code 0.", md, StringComparison.Ordinal);
        Assert.Contains("### Checks not run for missing data\n", md, StringComparison.Ordinal);
        Assert.Contains("| K-201 [motors/K-201.yaml](motors/K-201.yaml) | SL202 | `bus.fault_current_min`, `bus.upstream` |\n", md, StringComparison.Ordinal);
        Assert.DoesNotContain("not run", Render(Samples.Clean()), StringComparison.Ordinal);
    }

    [Fact]
    public void Links_take_a_base_and_encode_the_path()
    {
        var md = Render(Known(), "https://git.example.invalid/plant/blob/0123abc/");
        Assert.Contains("[motors/K-201.yaml:28](https://git.example.invalid/plant/blob/0123abc/motors/K-201.yaml#L28)", md, StringComparison.Ordinal);
        Assert.Contains("(https://git.example.invalid/plant/blob/0123abc/.settinglint.yaml#L3)", md, StringComparison.Ordinal);
    }

    [Fact]
    public void Without_a_baseline_every_open_finding_is_listed_and_there_is_no_baseline_column()
    {
        var md = Render(Samples.Result());
        Assert.Contains("| level | found | accepted in source |\n", md, StringComparison.Ordinal);
        Assert.Contains("### Findings\n", md, StringComparison.Ordinal);
        Assert.DoesNotContain("baseline", md, StringComparison.Ordinal);
        Assert.Contains("| note | SL305 | [motors/P-102 spare.yaml:12](motors/P-102%20spare.yaml#L12) |", md, StringComparison.Ordinal);
        Assert.StartsWith("## SettingLint: the gate fails\n", md, StringComparison.Ordinal);
    }

    [Fact]
    public void A_run_that_could_not_run_says_so_with_its_problems()
    {
        var md = Render(Samples.Result(Samples.BadConfig));
        Assert.StartsWith("## SettingLint: the check could not run\n\n### Problems of the run\n\n- [.settinglint.yaml:3](.settinglint.yaml#L3): error: unknown rule id SL999 in 'rules'\n", md, StringComparison.Ordinal);
    }

    [Fact]
    public void A_clean_run_passes_and_still_names_the_motors_and_the_caution()
    {
        var md = Render(Samples.Clean());
        Assert.StartsWith("## SettingLint: the gate passes\n", md, StringComparison.Ordinal);
        Assert.Contains("**Motors checked (1):** K-201\n", md, StringComparison.Ordinal);
        Assert.EndsWith("> " + MarkdownReporter.Caution + "\n", md, StringComparison.Ordinal);
        Assert.DoesNotContain("### ", md, StringComparison.Ordinal);
    }

    [Fact]
    public void At_most_a_hundred_rows_are_tabled_and_many_motors_fold_away()
    {
        var findings = Enumerable.Range(1, MarkdownReporter.MaxRows + 5)
            .Select(i => Samples.Pickup with { Span = SourceSpan.At(i, 1) }).ToImmutableArray();
        var motors = Enumerable.Range(1, 30).Select(i => "P-" + i.ToString("D3", System.Globalization.CultureInfo.InvariantCulture)).Select(m => ("motors/" + m + ".yaml", m, (string?)null));
        var md = Render(new CheckResult(Samples.Root, findings, Samples.Rules, [], 30, Level.Error) { Files = RunFiles.Of([], motors) });
        Assert.Equal(MarkdownReporter.MaxRows, md.Split('\n').Count(l => l.StartsWith("| error | SL201 |", StringComparison.Ordinal)));
        Assert.Contains("\n5 more not shown; the SARIF or JSON report has them all.\n", md, StringComparison.Ordinal);
        Assert.Contains("<details><summary>Motors checked (30)</summary>", md, StringComparison.Ordinal);
    }
}
