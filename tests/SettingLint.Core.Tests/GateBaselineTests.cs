using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>The baseline file: its text, reading it back, and matching a run's findings to it by fingerprint.</summary>
public sealed class GateBaselineTests
{
    private static Finding F(string rule, string file, string keyPath, int line = 3, Level level = Level.Error, string message = "pickup too low") =>
        new(rule, level, file, SourceSpan.At(line, 5), keyPath, message, ImmutableSortedDictionary<string, FindingValue>.Empty);

    private static CheckResult Result(params Finding[] findings) =>
        new("/r", [.. findings], [], [], 2, Level.Error) { Files = RunFiles.Of(["motors/m-1.yaml", "motors/m-2.yaml"], [("motors/m-1.yaml", "M-1", null)]) };

    private static Baseline Read(string text)
    {
        var (baseline, problems) = Baseline.Parse(text);
        Assert.Empty(problems);
        return baseline!;
    }

    [Fact]
    public void The_text_is_sorted_readable_and_reads_back()
    {
        var text = Baseline.Write([F("SL201", "motors/m-2.yaml", "protection.short_circuit.pickup"), F("SL102", "motors/m-1.yaml", "motor.safe_stall_time_hot", level: Level.Warning, message: "hot\nlonger")]);
        Assert.Contains("\nsettinglint-baseline 1\n", text, StringComparison.Ordinal);
        Assert.Contains("# warning: hot longer\nSL102 motors/m-1.yaml motor.safe_stall_time_hot " + Fingerprints.Of("motors/m-1.yaml", "SL102", "motor.safe_stall_time_hot") + "\n", text, StringComparison.Ordinal);
        Assert.True(text.IndexOf("SL102", StringComparison.Ordinal) < text.IndexOf("SL201 ", StringComparison.Ordinal));
        Assert.DoesNotContain(":3", text, StringComparison.Ordinal); // no line numbers
        var b = Read(text);
        Assert.Equal(["SL102", "SL201"], b.Entries.Select(e => e.RuleId));
        Assert.Equal("hot longer", b.Entries[0].Message);
        Assert.Equal("motor.safe_stall_time_hot", b.Entries[0].KeyPath);
    }

    [Fact]
    public void Values_with_spaces_quotes_or_nothing_are_quoted_and_read_back()
    {
        var odd = F("SL003", "motors/pump \"7\" spare.yaml", "");
        var b = Read(Baseline.Write([odd]));
        var e = Assert.Single(b.Entries);
        Assert.Equal(("motors/pump \"7\" spare.yaml", ""), (e.File, e.KeyPath));
        Assert.Equal(odd.Fingerprint, e.Fingerprint);
    }

    [Theory]
    [InlineData("", "'settinglint-baseline 1' is missing")]
    [InlineData("# only comments\n", "'settinglint-baseline 1' is missing")]
    [InlineData("kind: bus\n", "not a SettingLint baseline")]
    [InlineData("settinglint-baseline 1\nSL201 motors/m-1.yaml\n", "four values")]
    [InlineData("settinglint-baseline 1\nX201 motors/m-1.yaml a.b 0123\n", "not a rule id")]
    [InlineData("settinglint-baseline 1\nSL201 motors/m-1.yaml a.b 00000000000000000000000000000000\n", "fingerprint does not match")]
    [InlineData("settinglint-baseline 1\nSL201 \"motors/m-1.yaml a.b 0\n", "four values")]
    public void A_broken_baseline_is_refused_at_its_line(string text, string message)
    {
        var (baseline, problems) = Baseline.Parse(text);
        Assert.Null(baseline);
        Assert.Contains(message, Assert.Single(problems).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Findings_match_by_fingerprint_not_by_line()
    {
        var b = Read(Baseline.Write([F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup", line: 20)]));
        var moved = b.Apply(Result(F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup", line: 44), F("SL201", "motors/m-2.yaml", "protection.short_circuit.pickup")), "settinglint.baseline", _ => true);
        Assert.Equal([BaselineState.Unchanged, BaselineState.New], moved.Findings.Select(f => f.BaselineState!.Value));
        Assert.Empty(moved.Absent);
        Assert.Equal("settinglint.baseline", moved.BaselineFile);
        Assert.False(moved.Fails(moved.Findings[0]));
        Assert.True(moved.Fails(moved.Findings[1]));
        Assert.Equal(ExitCodes.Findings, moved.ExitCode);
    }

    [Fact]
    public void Each_entry_accepts_one_finding_so_a_second_one_at_the_same_path_is_new()
    {
        var b = Read(Baseline.Write([F("SL003", "motors/m-1.yaml", "x")]));
        var r = b.Apply(Result(F("SL003", "motors/m-1.yaml", "x"), F("SL003", "motors/m-1.yaml", "x", line: 9)), "b", _ => true);
        Assert.Equal([BaselineState.Unchanged, BaselineState.New], r.Findings.Select(f => f.BaselineState!.Value));
    }

    [Fact]
    public void Entries_without_a_finding_are_absent_for_checked_files_and_deleted_files_only()
    {
        var b = Read(Baseline.Write([
            F("SL201", "motors/m-1.yaml", "protection.short_circuit.pickup"),
            F("SL201", "motors/gone.yaml", "protection.short_circuit.pickup"),
            F("SL201", "motors/not-checked.yaml", "protection.short_circuit.pickup")]));
        var r = b.Apply(Result(), "b", file => file != "motors/gone.yaml");
        Assert.Equal(["motors/gone.yaml", "motors/m-1.yaml"], r.Absent.Select(a => a.File).Order(StringComparer.Ordinal));
        Assert.All(r.Absent, a => Assert.True(a.BaselineLine > 0));
        Assert.Equal(ExitCodes.Clean, r.ExitCode);
    }
}
