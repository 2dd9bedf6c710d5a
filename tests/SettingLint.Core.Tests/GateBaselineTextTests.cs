using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>
/// The baseline's text exactly: the header that tells a reviewer what the file is and how to rewrite it, a blank line
/// before each entry (so that a rewritten baseline diffs entry by entry), and an unclosed quote that never passes.
/// </summary>
public sealed class GateBaselineTextTests
{
    [Fact]
    public void A_baseline_is_written_exactly_so()
    {
        var f = new Finding("SL201", Level.Warning, "motors/m 1.yaml", SourceSpan.At(3, 5), "protection.short_circuit.pickup", "Pickup low.", ImmutableSortedDictionary<string, FindingValue>.Empty);
        var expected =
            "# SettingLint baseline: findings accepted as they stood when this file was written.\n" +
            "# 'settinglint check --baseline FILE' reports them as unchanged and fails only on findings not listed here.\n" +
            "# One entry a line: rule, file, key path, fingerprint (a hash of the three; line numbers are not used, so\n" +
            "# editing the lines around a finding keeps it matched). The comment above an entry is the finding's message.\n" +
            "# Delete an entry once its finding is fixed, or rewrite the file: settinglint baseline PATH --output FILE\n" +
            "settinglint-baseline 1\n" +
            "\n" +
            "# warning: Pickup low.\n" +
            $"SL201 \"motors/m 1.yaml\" protection.short_circuit.pickup {Fingerprints.Of("motors/m 1.yaml", "SL201", "protection.short_circuit.pickup")}\n";
        Assert.Equal(expected, Baseline.Write([f]));
    }

    [Fact]
    public void An_unclosed_quote_is_refused_even_around_a_valid_fingerprint()
    {
        // Read as if closed at the line's end, the last value would be the entry's true fingerprint and the entry would pass.
        var fp = Fingerprints.Of("m.yaml", "SL201", "a");
        var (baseline, problems) = Baseline.Parse($"settinglint-baseline 1\nSL201 m.yaml a \"{fp}\n");
        Assert.Null(baseline);
        Assert.Equal((2, "A baseline entry is four values: rule, file, key path, fingerprint (a value with spaces in double quotes)."),
            (Assert.Single(problems).Line, problems[0].Message));
        // Closed, the same entry is good.
        Assert.Single(Baseline.Parse($"settinglint-baseline 1\nSL201 m.yaml a \"{fp}\"\n").Baseline!.Entries);
    }
}
