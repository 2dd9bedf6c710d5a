using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// Which electrical code governs a motor (`electrical_code` in .settinglint.yaml, read by rules as
/// config.electrical_code), and SL801, which applies NFPA 70 430.32(A)(1) only where NFPA 70 governs.
/// </summary>
public sealed class ElectricalCodeTests
{
    // The sample motor with a thermal element set at 1.3 x FLC: above the 1.25 x FLC that NFPA 70 430.32(A)(1)
    // allows for a service factor of 1.15, so SL801 fires wherever NFPA 70 governs.
    private static readonly string HighPickup = Samples.ThermalAbove125;

    // Common practice: NFPA 70 is the code of 60 Hz installations in the US; a declared code always wins, and with none
    // declared a bus of another frequency leaves the code undeclared (the contract's default frequency is 60 Hz).
    [Theory]
    [InlineData(null, null, "NFPA 70")]
    [InlineData(null, 60.0, "NFPA 70")]
    [InlineData(null, 50.0, null)]
    [InlineData("IEC 60364", null, "IEC 60364")]
    [InlineData("NFPA 70", 50.0, "NFPA 70")]
    public void Governing_code_CommonPractice(string? declared, double? frequency, string? expected) =>
        Assert.Equal(expected, ElectricalCodes.Governing(declared, frequency));

    // NFPA 70 430.32(A)(1): with no code declared (the default, a bus of unstated frequency) the NEC limit applies.
    [Fact]
    public void Sl801_applies_by_default_Nfpa70_430_32_A_1() => Assert.Single(Sl801(config: null));

    // NFPA 70 430.32(A)(1) applies where the repository declares NFPA 70.
    [Fact]
    public void Sl801_applies_under_a_declared_Nfpa70_Nfpa70_430_32_A_1() => Assert.Single(Sl801("electrical_code: NFPA 70\n"));

    // A repository under IEC 60364 (or any other code) does not answer to NFPA 70 430.32: no SL801.
    [Theory]
    [InlineData("IEC 60364")]
    [InlineData("other")]
    public void Sl801_does_not_apply_under_another_code(string code) => Assert.Empty(Sl801($"electrical_code: {code}\n"));

    // A code the schema does not know is a configuration problem, not a silent "other".
    [Fact]
    public void An_unknown_code_is_a_configuration_problem()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, HighPickup);
        repo.Write(".settinglint.yaml", "electrical_code: NEC 2023\n");
        var session = Session.Open([repo.Root]);
        Assert.Contains(session.Problems, p => p.Message.Contains("electrical_code", StringComparison.Ordinal));
    }

    // A suggested value is found and verified by checks in memory; they must run under the code the check ran under.
    // The sample motor's 50P pickup (7.2 A sec = 108 A) is below its asymmetrical start current and gets a suggested
    // value (SL201); its thermal pickup of 1.3 x FLC draws no SL801 under IEC 60364. A verifying check that fell back to
    // NFPA 70 would see SL801 appear in the file and refuse the 50P value as "gaining" it.
    [Fact]
    public void A_suggestion_is_verified_under_the_same_code()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, HighPickup);
        repo.Write(".settinglint.yaml", "electrical_code: IEC 60364\n");
        var fixes = new FixesKept();
        var result = Linter.Check(new CheckRequest(repo.Root, [repo.Root]) { Parallel = false, Suggest = true, Observers = [fixes] });
        Assert.Contains(result.Findings, f => f.RuleId == "SL201" && f.Fix is not null);
        Assert.DoesNotContain(result.Findings, f => f.RuleId == "SL801");
        var set = fixes.Set!;
        Assert.DoesNotContain(set.Refused, r => r.Why.Contains("SL801", StringComparison.Ordinal));
        Assert.Contains(set.Applied, f => f.Setting == "protection.short_circuit.pickup");
    }

    private static List<Finding> Sl801(string? config)
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, HighPickup);
        if (config is not null) repo.Write(".settinglint.yaml", config);
        var session = Session.Open([repo.Root]);
        Assert.Empty(session.Problems);
        var result = session.Check([repo.Root], null, parallel: false);
        return [.. result.Findings.Where(f => f.RuleId == "SL801")];
    }

    private sealed class FixesKept : ICheckObserver
    {
        public SuggestionSet? Set { get; private set; }

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }
}
