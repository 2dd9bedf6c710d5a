using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A voltage setting in a finding is shown primary and in the terms its relay model sets it in (V sec, % or xVT),
/// as a current is shown primary and in A sec (setting-files contract, additions: xVT).
/// </summary>
public sealed class VoltageTermsTests
{
    [Fact]
    public void Voltage_ranges_are_shown_in_the_relay_models_own_terms()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("models/relay.yaml", """
            kind: relay-model
            format: 1
            tag: RELAY-V
            ranges:
              undervoltage.pickup: { min: 0.5 xVT, max: 0.8 xVT, step: 0.01 xVT }
              overvoltage.pickup: { min: 100 %, max: 105 %, step: 1 % }

            """);
        repo.Write("motors/m-1.yaml", Samples.Replace(
            Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay.yaml"),
            "    pickup: 7.2 A sec\n",
            "    pickup: 7.2 A sec\n  undervoltage:\n    enabled: true\n    pickup: 3640 V pri\n    delay: 5 s\n  overvoltage:\n    enabled: true\n    pickup: 126 V sec\n    delay: 3 s\n"));
        var rules = new RuleLoader(SchemaSet.Shared).Load([new RuleSource("test/rule.yaml", Encoding.UTF8.GetBytes("""
            id: SL954
            title: Test rule
            summary: A rule for the tests.
            rationale: Tests only.
            basis: [common practice]
            severity: warning
            tags: [27]
            applies_to: motor-protection
            for_each: relay_model.ranges
            let:
              low: item.min
            check: item.value >= item.min and item.value <= item.max
            subject: protection.{item.setting}
            message: "{low}"
            """))]);
        Assert.Empty(rules.Problems);
        var findings = new Checker(new RuleSet(rules.Rules)).Run(new CheckOptions([repo.Root])).Findings
            .Where(f => f.RuleId == "SL954").ToDictionary(f => f.KeyPath, StringComparer.Ordinal);
        // 3640 V against 0.5 x 4200 V = 2100 V to 0.8 x 4200 V = 3360 V: shown as multiples of the VT's 4200 V.
        var under = findings["protection.undervoltage.pickup"].Values;
        Assert.Equal("3.64 kV pri (0.867 xVT)", under["actual"].Text);
        Assert.Equal("3.36 kV pri (0.8 xVT)", under["limit"].Text);
        Assert.Equal("2.1 kV pri (0.5 xVT)", under["low"].Text);
        // 126 V sec x 4200 / 120 = 4410 V against 100 % to 105 % of 4000 V: shown in percent of rated voltage.
        var over = findings["protection.overvoltage.pickup"].Values;
        Assert.Equal("4.41 kV pri (110 %)", over["actual"].Text);
        Assert.Equal("4.2 kV pri (105 %)", over["limit"].Text);
    }
}
