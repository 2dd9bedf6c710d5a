using System.Text;
using SettingLint.Core.Binding;
using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>Validation and binding of one file, and the references between files (bus, relay_model).</summary>
public sealed class BindingTests
{
    private const string File = "motors/m-1.yaml";

    private static (BoundDocument Doc, IReadOnlyList<Finding> Findings) Bind(string text, string kind = SchemaSet.MotorProtection)
    {
        var loaded = YamlLoader.Load(Encoding.UTF8.GetBytes(text), "/repo/" + File, File, LoadLimits.Default);
        Assert.Empty(loaded.Findings);
        var findings = new FindingBuilder(File);
        var doc = DocumentBinder.Bind(kind, loaded.Path, loaded.RelativePath, Assert.IsType<YMapping>(loaded.Root), findings, SchemaSet.Shared);
        return (doc, findings.Findings);
    }

    private static BoundDocument BindClean(string text)
    {
        var (doc, findings) = Bind(text);
        Assert.Empty(findings);
        return doc;
    }

    private static double Si(BoundDocument doc, string path) => Assert.IsType<MeasureValue>(doc[path]).Value;

    private static string WithProtection(string elements, string groundCt = "{ connection: core-balance, primary: 50 A, secondary: 5 A }") =>
        Samples.Replace(
            Samples.MotorWith("protection:\n  short_circuit:\n    enabled: true\n    pickup: 7.2 A sec\n", "protection:\n" + elements),
            "ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }", "ground_ct: " + groundCt);

    // Where a value written inside a replacement landed: found by plain text search, independent of the parser.
    private static (int Line, int Column) At(string text, string replacement, string value)
    {
        var (line, column) = Samples.Pos(text, replacement);
        return (line, column + replacement.LastIndexOf(value, StringComparison.Ordinal));
    }

    private static (string RuleId, int Line, int Column) Where(Finding f) => (f.RuleId, f.Span.StartLine, f.Span.StartColumn);

    [Fact]
    public void The_sample_motor_binds_without_findings_in_SI_units()
    {
        var doc = BindClean(Samples.Motor);
        Assert.Equal(58, Si(doc, "motor.full_load_current"));
        Assert.Equal(4000, Si(doc, "motor.rated_voltage"));
        Assert.Equal(450 * 745.699872, Si(doc, "motor.rated_output"), 6);
        Assert.Equal(359.6, Si(doc, "motor.locked_rotor_current"), 9); // 6.2 xFLC
        Assert.Equal(40_000, Si(doc, "starter.interrupting_rating"));
        Assert.Equal(108, Si(doc, "protection.short_circuit.pickup"), 9); // 7.2 A sec through 75:5
        Assert.Equal(15, Assert.IsType<MeasureValue>(doc["protection.short_circuit.pickup"]).SideRatio);
        Assert.Equal(7.2, Assert.IsType<MeasureValue>(doc["protection.short_circuit.pickup"]).Secondary!.Value, 9);
        Assert.Equal(1.15, Si(doc, "motor.service_factor"));
        Assert.Equal("M-1", doc.Tag);
        Assert.Equal("../buses/bus-1.yaml", doc.Text("bus"));
        Assert.True(doc.Flag("protection.short_circuit.enabled"));
    }

    // setting-files contract: `A sec` converts through the CT of that element: the ground CT for ground_fault.
    [Fact]
    public void A_sec_on_ground_fault_converts_through_the_ground_CT()
    {
        var doc = BindClean(WithProtection("  ground_fault:\n    enabled: true\n    pickup: 3 A sec\n  undercurrent:\n    enabled: true\n    pickup: 2 A sec\n"));
        Assert.Equal(30, Si(doc, "protection.ground_fault.pickup"), 9); // 50:5
        Assert.Equal(10, Assert.IsType<MeasureValue>(doc["protection.ground_fault.pickup"]).SideRatio);
        Assert.Equal(30, Si(doc, "protection.undercurrent.pickup"), 9); // phase CT 75:5
    }

    // ... and through the phase CT when the ground element is fed residually (sum of the phase CTs).
    [Fact]
    public void A_sec_on_ground_fault_converts_through_the_phase_CT_when_residual()
    {
        var doc = BindClean(WithProtection("  ground_fault:\n    enabled: true\n    pickup: 3 A sec\n", "{ connection: residual }"));
        Assert.Equal(45, Si(doc, "protection.ground_fault.pickup"), 9); // 75:5
        Assert.Equal(15, Assert.IsType<MeasureValue>(doc["protection.ground_fault.pickup"]).SideRatio);
    }

    [Fact]
    public void XCT_refers_to_the_element_CT_primary()
    {
        var core = BindClean(WithProtection("  ground_fault:\n    enabled: true\n    pickup: 0.5 xCT\n  differential:\n    enabled: true\n    pickup_running: 0.1 xCT\n"));
        Assert.Equal(25, Si(core, "protection.ground_fault.pickup"), 9);
        Assert.Equal(7.5, Si(core, "protection.differential.pickup_running"), 9);
        var residual = BindClean(WithProtection("  ground_fault:\n    enabled: true\n    pickup: 0.5 xCT\n", "{ connection: residual }"));
        Assert.Equal(37.5, Si(residual, "protection.ground_fault.pickup"), 9);
    }

    [Fact]
    public void A_sec_on_a_core_balance_CT_without_ratings_is_SL006_naming_the_CT()
    {
        var text = WithProtection("  ground_fault:\n    enabled: true\n    pickup: 3 A sec\n", "{ connection: core-balance }");
        var (_, findings) = Bind(text);
        var finding = Assert.Single(findings);
        Assert.Equal((EngineRules.Unit, Samples.Pos(text, "3 A sec").Line, Samples.Pos(text, "3 A sec").Column), Where(finding));
        Assert.Contains("transformers.ground_ct", finding.Message, StringComparison.Ordinal);
    }

    // setting-files contract: `V sec` converts through the VT (4200:120 = 35).
    [Fact]
    public void V_sec_converts_through_the_VT()
    {
        var doc = BindClean(WithProtection("  undervoltage:\n    enabled: true\n    pickup: 108 V sec\n    delay: 3 s\n  overvoltage:\n    enabled: true\n    pickup: 4.4 kV pri\n"));
        Assert.Equal(3780, Si(doc, "protection.undervoltage.pickup"), 9);
        Assert.Equal(35, Assert.IsType<MeasureValue>(doc["protection.undervoltage.pickup"]).SideRatio!.Value, 12);
        Assert.Equal(4400, Si(doc, "protection.overvoltage.pickup"), 9);
        Assert.Equal(35, Assert.IsType<MeasureValue>(doc["protection.overvoltage.pickup"]).SideRatio!.Value, 12); // for "(125.7 V sec)" in reports
    }

    // setting-files contract: % on a voltage element is percent of the motor's rated voltage (4000 V),
    // not of the VT primary (4200 V) nor of the bus (4160 V).
    [Fact]
    public void Percent_undervoltage_pickup_is_percent_of_motor_rated_voltage()
    {
        var doc = BindClean(WithProtection("  undervoltage:\n    enabled: true\n    pickup: 90 %\n  overvoltage:\n    enabled: true\n    pickup: 110 %\n  unbalance:\n    enabled: true\n    trip_pickup: 20 %\n"));
        Assert.Equal(3600, Si(doc, "protection.undervoltage.pickup"), 9);
        Assert.Equal(4400, Si(doc, "protection.overvoltage.pickup"), 9);
        Assert.Equal(0.2, Si(doc, "protection.unbalance.trip_pickup"), 12); // a plain percent is a fraction
    }

    [Fact]
    public void Thermal_settings_bind_in_SI()
    {
        var doc = BindClean(WithProtection("  thermal:\n    enabled: true\n    pickup: 1.15 xFLC\n    time_constant: 9 min\n    cooling_time_constant: 27 min\n    full_load_level: 25 %\n"));
        Assert.Equal(66.7, Si(doc, "protection.thermal.pickup"), 9);
        Assert.Equal(540, Si(doc, "protection.thermal.time_constant"), 9);
        Assert.Equal(1620, Si(doc, "protection.thermal.cooling_time_constant"), 9);
        Assert.Equal(0.25, Si(doc, "protection.thermal.full_load_level"), 12);
    }

    // SL006: setting-files contract, Quantities.
    [Theory]
    [InlineData("full_load_current: 58 A", "full_load_current: 58", "58", "has no unit")]
    [InlineData("full_load_current: 58 A", "full_load_current: '58'", "'58'", "has no unit")]
    [InlineData("full_load_current: 58 A", "full_load_current: 58 s", "58 s", "is a unit of time")]
    [InlineData("full_load_current: 58 A", "full_load_current: 58A", "58A", "needs a space")]
    [InlineData("full_load_current: 58 A", "full_load_current: 58 A pri", "58 A pri", "not accepted here")]
    [InlineData("pickup: 7.2 A sec", "pickup: 7.2 A", "7.2 A", "which side")]
    [InlineData("pickup: 7.2 A sec", "pickup: 5 s", "5 s", "is a unit of time")]
    [InlineData("pickup: 7.2 A sec", "pickup: 7.2 amps", "7.2 amps", "not a known unit")]
    [InlineData("locked_rotor_current: 6.2 xFLC", "locked_rotor_current: 6.2xFLC", "6.2xFLC", "needs a space")]
    [InlineData("rated_voltage: 4000 V", "rated_voltage: 1_000 V", "1_000 V", "not a number")]
    public void A_unit_problem_is_SL006_at_the_value(string old, string replacement, string value, string says)
    {
        var text = Samples.MotorWith(old, replacement);
        var (_, findings) = Bind(text);
        var finding = Assert.Single(findings);
        var (line, column) = At(text, replacement, value);
        Assert.Equal((EngineRules.Unit, line, column), Where(finding));
        Assert.Equal(new SourceSpan(line, column, line, column + value.Length), finding.Span);
        Assert.Contains(says, finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_1e3_number_is_fine() =>
        Assert.Equal(4000, Si(BindClean(Samples.MotorWith("rated_voltage: 4000 V", "rated_voltage: 4e3 V")), "motor.rated_voltage"));

    // SL005: wrong type or value outside its domain (rule catalogue SL005).
    [Theory]
    [InlineData("service_factor: 1.15", "service_factor: high", "high")]
    [InlineData("service_factor: 1.15", "service_factor: 0", "0")]
    [InlineData("starts_cold: 2", "starts_cold: -1", "-1")]
    [InlineData("starts_cold: 2", "starts_cold: 2.5", "2.5")]
    [InlineData("winding_leads: 6", "winding_leads: 4", "4")]
    [InlineData("type: circuit-breaker", "type: vacuum-contactor", "vacuum-contactor")]
    [InlineData("acceleration_time: 4.5 s", "acceleration_time: -4.5 s", "-4.5 s")]
    [InlineData("class: C50", "class: 50", "50")]
    [InlineData("enabled: true", "enabled: yes", "yes")] // YAML 1.2 core schema: `yes` is a string
    [InlineData("enabled: true", "enabled: 'true'", "'true'")]
    [InlineData("title: Test pump", "title: [a, b]", "[a, b]")]
    public void A_wrong_value_is_SL005_at_the_value(string old, string replacement, string value)
    {
        var text = Samples.MotorWith(old, replacement);
        var (_, findings) = Bind(text);
        var finding = Assert.Single(findings);
        var (line, column) = At(text, replacement, value);
        Assert.Equal((EngineRules.WrongType, line, column), Where(finding));
    }

    // SL004: the finding stands on the key of the mapping that lacks the key.
    [Fact]
    public void A_missing_required_key_is_SL004_at_the_parent_key()
    {
        var text = Samples.MotorWith("  full_load_current: 58 A\n", "");
        var (_, findings) = Bind(text);
        var missing = Assert.Single(findings, f => f.RuleId == EngineRules.MissingKey);
        Assert.Equal(new SourceSpan(6, 1, 6, 6), missing.Span); // "motor"
        Assert.Equal("motor.full_load_current", missing.KeyPath);
        Assert.Contains("'full_load_current'", missing.Message, StringComparison.Ordinal);
        Assert.Contains("from motor", missing.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_reference_is_reported_once_not_again_on_the_settings_that_need_it()
    {
        // FLC is the base of locked_rotor_current: 6.2 xFLC; without it only the SL004 is reported.
        var (_, findings) = Bind(Samples.MotorWith("  full_load_current: 58 A\n", ""));
        Assert.Equal([EngineRules.MissingKey], findings.Select(f => f.RuleId));
        var noTransformers = Samples.MotorWith(
            "transformers:\n  phase_ct: { primary: 75 A, secondary: 5 A, class: C50, burden: 0.3 ohm }\n  ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }\n  vt: { primary: 4200 V, secondary: 120 V }\n", "");
        var (_, second) = Bind(noTransformers);
        Assert.Equal([("transformers", EngineRules.MissingKey)], second.Select(f => (f.KeyPath, f.RuleId)));
    }

    [Fact]
    public void A_missing_nested_key_is_at_its_own_parent()
    {
        var text = Samples.MotorWith("class: C50, burden: 0.3 ohm", "class: C50");
        var missing = Assert.Single(Bind(text).Findings);
        Assert.Equal(EngineRules.MissingKey, missing.RuleId);
        Assert.Equal(Samples.Pos(text, "phase_ct"), (missing.Span.StartLine, missing.Span.StartColumn));
        Assert.Equal("transformers.phase_ct.burden", missing.KeyPath);
    }

    [Fact]
    public void A_missing_top_level_key_is_SL004()
    {
        var missing = Assert.Single(Bind(Samples.MotorWith("title: Test pump\n", "")).Findings);
        Assert.Equal(EngineRules.MissingKey, missing.RuleId);
        Assert.Equal("title", missing.KeyPath);
    }

    [Fact]
    public void A_missing_enabled_flag_is_SL004_at_the_element()
    {
        var text = Samples.MotorWith("    enabled: true\n", "");
        var missing = Assert.Single(Bind(text).Findings);
        Assert.Equal((EngineRules.MissingKey, 26, 3), Where(missing)); // short_circuit
    }

    // SL003 with "did you mean" (optimal string alignment distance).
    [Theory]
    [InlineData("rated_output: 450 hp", "rated_outptu: 450 hp", "rated_outptu", "rated_output")]
    [InlineData("safe_stall_time_hot: 10 s", "safe_stall_time_hto: 10 s", "safe_stall_time_hto", "safe_stall_time_hot")]
    [InlineData("short_circuit:", "shortcircuit:", "shortcircuit", "short_circuit")]
    public void An_unknown_key_is_SL003_with_a_suggestion(string old, string replacement, string key, string suggestion)
    {
        var text = Samples.MotorWith(old, replacement);
        var (_, findings) = Bind(text);
        var unknown = Assert.Single(findings, f => f.RuleId == EngineRules.UnknownKey);
        var (line, column) = Samples.Pos(text, key + ":");
        Assert.Equal(new SourceSpan(line, column, line, column + key.Length), unknown.Span);
        Assert.Contains("did you mean '" + suggestion + "'?", unknown.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void An_unknown_key_without_a_near_one_lists_the_known_keys()
    {
        var text = Samples.MotorWith("  winding_leads: 6\n", "  winding_leads: 6\n  colour: blue\n");
        var unknown = Assert.Single(Bind(text).Findings);
        Assert.Equal(EngineRules.UnknownKey, unknown.RuleId);
        Assert.Contains("known keys here are", unknown.Message, StringComparison.Ordinal);
        Assert.Contains("full_load_current", unknown.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_relay_model_range_binds_as_written()
    {
        var (doc, findings) = Bind(Samples.RelayModel, SchemaSet.RelayModel);
        Assert.Empty(findings);
        var min = Assert.IsType<WrittenValue>(doc["ranges.short_circuit.pickup.min"]);
        Assert.Equal(2, min.Quantity.Number);
        Assert.Equal("xCT", min.Quantity.Unit.Symbol);
    }

    [Fact]
    public void A_relay_model_range_of_an_unknown_setting_is_SL003()
    {
        var text = Samples.Replace(Samples.RelayModel, "short_circuit.pickup:", "short_circuit.pikcup:");
        var finding = Assert.Single(Bind(text, SchemaSet.RelayModel).Findings);
        Assert.Equal(EngineRules.UnknownKey, finding.RuleId);
        Assert.Contains("did you mean 'short_circuit.pickup'", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_bare_number_in_a_relay_model_range_names_the_setting_dimension()
    {
        var text = Samples.Replace(Samples.RelayModel, "min: 2 xCT", "min: 2");
        var finding = Assert.Single(Bind(text, SchemaSet.RelayModel).Findings);
        Assert.Equal(EngineRules.Unit, finding.RuleId);
        Assert.Contains("xCT", finding.Message, StringComparison.Ordinal);
    }

    // --- references and kinds: through the engine, so that resolution is as a run does it ---

    private static CheckResult Check(TempRepo repo) => new Checker(EmptyRuleSet.Instance).Run(new CheckOptions([repo.Root], Parallel: false));

    private static Finding SingleFinding(CheckResult result, string ruleId)
    {
        var finding = Assert.Single(result.Findings);
        Assert.Equal(ruleId, finding.RuleId);
        return finding;
    }

    [Fact]
    public void The_minimal_repository_is_clean()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo);
        var result = Check(repo);
        Assert.Empty(result.Findings);
        Assert.Empty(result.Notifications);
        Assert.Equal(["M-1"], result.Motors.ToArray());
        Assert.Equal(ExitCodes.Clean, result.ExitCode);
    }

    // SL007: a reference outside the repository root is refused before anything is read.
    [Fact]
    public void A_bus_outside_the_root_is_SL007_and_never_read()
    {
        using var repo = new TempRepo();
        // A valid bus just outside the root: were it read, the reference would resolve without a finding.
        repo.WriteOutside("etc/hostname", Samples.Bus);
        var text = Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../../etc/hostname");
        Samples.WriteMinimal(repo, motor: text);
        var finding = SingleFinding(Check(repo), EngineRules.Reference);
        Assert.Equal((EngineRules.Reference, 5, 6), Where(finding));
        Assert.Equal(File, finding.File);
        Assert.Equal("bus", finding.KeyPath);
        Assert.Contains("outside the repository root", finding.Message, StringComparison.Ordinal);
        Assert.Contains("not read", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_bus_reached_through_a_symlinked_folder_out_of_the_root_is_SL007()
    {
        using var repo = new TempRepo();
        repo.WriteOutside("elsewhere/bus.yaml", Samples.Bus);
        Samples.WriteMinimal(repo, motor: Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../linked/bus.yaml"));
        Directory.CreateSymbolicLink(repo.PathOf("linked"), Path.Combine(repo.Outer, "elsewhere"));
        var finding = SingleFinding(Check(repo), EngineRules.Reference);
        Assert.Equal((EngineRules.Reference, 5, 6), Where(finding));
    }

    [Fact]
    public void An_absolute_bus_path_is_SL007()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, motor: Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: " + repo.PathOf("buses/bus-1.yaml")));
        Assert.Contains("absolute", SingleFinding(Check(repo), EngineRules.Reference).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_bus_file_is_SL007()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, motor: Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../buses/bus-9.yaml"));
        var finding = SingleFinding(Check(repo), EngineRules.Reference);
        Assert.Equal((EngineRules.Reference, 5, 6), Where(finding));
        Assert.Contains("does not exist", finding.Message, StringComparison.Ordinal);
        Assert.Contains("buses/bus-9.yaml", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_relay_model_where_a_bus_is_expected_is_SL007_wrong_kind()
    {
        using var repo = new TempRepo();
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        Samples.WriteMinimal(repo, motor: Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../models/relay-a.yaml"));
        var finding = SingleFinding(Check(repo), EngineRules.Reference);
        Assert.Equal((EngineRules.Reference, 5, 6), Where(finding));
        Assert.Contains("is a relay-model file, not a bus file", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_bus_where_a_relay_model_is_expected_is_SL007_wrong_kind()
    {
        using var repo = new TempRepo();
        var text = Samples.MotorWith("bus: ../buses/bus-1.yaml\n", "bus: ../buses/bus-1.yaml\nrelay_model: ../buses/bus-1.yaml\n");
        Samples.WriteMinimal(repo, motor: text);
        var finding = SingleFinding(Check(repo), EngineRules.Reference);
        Assert.Equal((EngineRules.Reference, 6, 14), Where(finding));
        Assert.Contains("is a bus file, not a relay-model file", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_referenced_relay_model_resolves()
    {
        using var repo = new TempRepo();
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        Samples.WriteMinimal(repo, motor: Samples.MotorWith("bus: ../buses/bus-1.yaml\n", "bus: ../buses/bus-1.yaml\nrelay_model: ../models/relay-a.yaml\n"));
        Assert.Empty(Check(repo).Findings);
    }

    [Fact]
    public void A_reference_outside_the_checked_folder_but_inside_the_root_is_read_and_not_reported()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, bus: Samples.Replace(Samples.Bus, "x_over_r: 15", "x_over_r: fifteen"));
        var result = new Checker(EmptyRuleSet.Instance).Run(new CheckOptions([repo.PathOf("motors")]));
        Assert.Empty(result.Findings); // the bus's own SL005 belongs to a run that checks the bus
        Assert.Equal(["M-1"], result.Motors.ToArray());
    }

    [Fact]
    public void A_bus_that_does_not_load_is_SL007_on_the_reference_and_its_own_finding_stays()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, bus: "kind: bus\nformat: [\n");
        var result = Check(repo);
        Assert.Equal(
            [(EngineRules.Syntax, "buses/bus-1.yaml"), (EngineRules.Reference, File)],
            result.Findings.Select(f => (f.RuleId, f.File)));
    }

    // SL009: unknown kind or format.
    [Fact]
    public void An_unknown_kind_is_SL009_at_the_value()
    {
        using var repo = new TempRepo();
        repo.Write("pumps/p.yaml", "kind: pump\nformat: 1\n");
        var finding = SingleFinding(Check(repo), EngineRules.KindOrFormat);
        Assert.Equal(new SourceSpan(1, 7, 1, 11), finding.Span);
        Assert.Contains("'pump'", finding.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("format: 2", 2, 9)]
    [InlineData("format: '1'", 2, 9)]
    [InlineData("format: 1.0", 2, 9)]
    [InlineData("format: one", 2, 9)]
    public void An_unknown_format_is_SL009_at_the_value(string format, int line, int column)
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo, bus: Samples.Replace(Samples.Bus, "format: 1", format));
        // The motor's bus does not bind, so the motor's reference is SL007 as well.
        var result = Check(repo);
        var finding = Assert.Single(result.Findings, f => f.File == "buses/bus-1.yaml");
        Assert.Equal((EngineRules.KindOrFormat, line, column), Where(finding));
        Assert.Equal(EngineRules.Reference, Assert.Single(result.Findings, f => f.File == File).RuleId);
    }

    [Fact]
    public void A_missing_format_is_SL004_at_kind()
    {
        using var repo = new TempRepo();
        repo.Write("b.yaml", Samples.Replace(Samples.Bus, "format: 1\n", ""));
        var finding = SingleFinding(Check(repo), EngineRules.MissingKey);
        Assert.Equal(new SourceSpan(1, 1, 1, 5), finding.Span);
    }

    [Fact]
    public void An_inline_bus_binds()
    {
        using var repo = new TempRepo();
        repo.Write("motors/m-1.yaml", Samples.MotorWith("bus: ../buses/bus-1.yaml",
            "bus: { tag: B-IN, nominal_voltage: 4160 V, fault_current_max: 28 kA, x_over_r: 15, grounding: solid }"));
        var result = Check(repo);
        Assert.Empty(result.Findings);
        Assert.Equal(1, result.FilesChecked);
    }

    [Fact]
    public void An_inline_bus_missing_a_key_is_SL004_at_the_bus()
    {
        using var repo = new TempRepo();
        repo.Write("motors/m-1.yaml", Samples.MotorWith("bus: ../buses/bus-1.yaml",
            "bus: { tag: B-IN, nominal_voltage: 4160 V, fault_current_max: 28 kA, grounding: solid }"));
        var finding = SingleFinding(Check(repo), EngineRules.MissingKey);
        Assert.Equal(5, finding.Span.StartLine);
        Assert.Equal("bus.x_over_r", finding.KeyPath);
    }

    [Fact]
    public void An_inline_bus_with_a_bad_unit_is_SL006_at_the_value()
    {
        using var repo = new TempRepo();
        var text = Samples.MotorWith("bus: ../buses/bus-1.yaml",
            "bus:\n  tag: B-IN\n  nominal_voltage: 4160 s\n  fault_current_max: 28 kA\n  x_over_r: 15\n  grounding: solid");
        repo.Write("motors/m-1.yaml", text);
        var finding = SingleFinding(Check(repo), EngineRules.Unit);
        Assert.Equal((EngineRules.Unit, 7, 20), Where(finding));
        Assert.Equal("bus.nominal_voltage", finding.KeyPath); // the key path in the motor file, for fingerprints
    }

    [Fact]
    public void An_inline_bus_with_a_bare_number_is_SL006_under_bus()
    {
        using var repo = new TempRepo();
        repo.Write("motors/m-1.yaml", Samples.MotorWith("bus: ../buses/bus-1.yaml",
            "bus:\n  tag: B-IN\n  nominal_voltage: 4160\n  fault_current_max: 28 kA\n  x_over_r: 15\n  grounding: solid"));
        var finding = SingleFinding(Check(repo), EngineRules.Unit);
        Assert.Equal((EngineRules.Unit, 7, 20), Where(finding));
        Assert.Equal("bus.nominal_voltage", finding.KeyPath);
    }

    // Rule catalogue SL005: "value outside its domain (negative time, ratio 0, ...)".
    [Theory]
    [InlineData("secondary: 5 A, class", "secondary: 0 A, class", "0 A")]
    [InlineData("primary: 75 A", "primary: 0 A", "0 A")]
    [InlineData("vt: { primary: 4200 V, secondary: 120 V }", "vt: { primary: 4200 V, secondary: 0 V }", "0 V")]
    public void A_zero_transformer_rating_is_SL005_at_the_value(string old, string replacement, string value)
    {
        var text = Samples.MotorWith(old, replacement);
        var (_, findings) = Bind(text);
        var (line, column) = At(text, replacement, value);
        var finding = Assert.Single(findings); // and no second finding on the settings that convert through it
        Assert.Equal((EngineRules.WrongType, line, column), Where(finding));
        Assert.Contains("zero", finding.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("full_load_current: 58 A", "full_load_current: 0 A", "0 A")]
    [InlineData("rated_voltage: 4000 V", "rated_voltage: 0 kV", "0 kV")]
    public void A_zero_motor_base_is_SL005(string old, string replacement, string value)
    {
        var text = Samples.MotorWith(old, replacement);
        var finding = Assert.Single(Bind(text).Findings);
        var (line, column) = At(text, replacement, value);
        Assert.Equal((EngineRules.WrongType, line, column), Where(finding));
    }

    [Fact]
    public void A_zero_setting_is_allowed() =>
        Assert.Equal(0, Si(BindClean(WithProtection("  short_circuit:\n    enabled: true\n    pickup: 7.2 A sec\n    delay: 0 s\n")), "protection.short_circuit.delay"));

    [Theory]
    [InlineData(".inf")]
    [InlineData(".nan")]
    [InlineData("1e400")]
    public void A_plain_number_that_is_not_finite_is_SL005(string value)
    {
        var text = Samples.MotorWith("service_factor: 1.15", "service_factor: " + value);
        var finding = Assert.Single(Bind(text).Findings);
        Assert.Equal((EngineRules.WrongType, 10, 19), Where(finding));
    }

    [Fact]
    public void An_empty_value_is_SL005()
    {
        var text = Samples.MotorWith("title: Test pump", "title:");
        var finding = Assert.Single(Bind(text).Findings);
        Assert.Equal(EngineRules.WrongType, finding.RuleId);
        Assert.Equal(4, finding.Span.StartLine);
    }

    [Fact]
    public void A_bus_that_is_a_number_is_SL005()
    {
        var text = Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: 42");
        var finding = Assert.Single(Bind(text).Findings);
        Assert.Equal((EngineRules.WrongType, 5, 6), Where(finding));
    }

    // IEC 61869-2 rated output at the CT's own rated secondary: 2 VA at 5 A is 0.08 ohm; 15 VA at 1 A is 15 ohm. A ground
    // CT's burden in VA converts through the ground CT's secondary, not the phase CT's.
    [Fact]
    public void A_burden_in_VA_binds_through_its_own_CTs_secondary()
    {
        var doc = BindClean(Samples.Replace(
            Samples.MotorWith("phase_ct: { primary: 75 A, secondary: 5 A, class: C50, burden: 0.3 ohm }",
                "phase_ct: { primary: 75 A, secondary: 5 A, class: 5P20, rated_burden: 15 VA, burden: 2 VA }"),
            "ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }",
            "ground_ct: { connection: core-balance, primary: 50 A, secondary: 1 A, class: 5P10, rated_burden: 2.5 VA, burden: 1 VA }"));
        Assert.Equal(0.08, Si(doc, "transformers.phase_ct.burden"), 12);
        Assert.Equal(0.6, Si(doc, "transformers.phase_ct.rated_burden"), 12);
        Assert.Equal(1.0, Si(doc, "transformers.ground_ct.burden"), 12);
        Assert.Equal(2.5, Si(doc, "transformers.ground_ct.rated_burden"), 12);
    }

    // setting-files contract (additions): a burden in VA needs its CT's secondary rating; without it the value is refused
    // with a finding that names the key it needs, and 50 Hz is a frequency on the bus.
    [Fact]
    public void A_bus_frequency_binds_in_hertz_and_a_class_outside_the_contract_is_refused()
    {
        var (doc, findings) = Bind(Samples.Replace(Samples.Bus, "nominal_voltage: 4160 V", "nominal_voltage: 4160 V\nfrequency: 50 Hz\nmin_voltage: 3950 V"), SchemaSet.Bus);
        Assert.Empty(findings);
        Assert.Equal(50, Si(doc, "frequency"));
        Assert.Equal(3950, Si(doc, "min_voltage"));
        var (_, wrong) = Bind(Samples.Replace(Samples.Bus, "nominal_voltage: 4160 V", "nominal_voltage: 4160 V\nfrequency: 55 Hz"), SchemaSet.Bus);
        Assert.Contains(wrong, f => f.KeyPath == "frequency");
        var (_, px) = Bind(Samples.MotorWith("class: C50", "class: PX"));
        Assert.Contains(px, f => f.KeyPath == "transformers.phase_ct.class");
    }
}

/// <summary>The validator's messages for bounds, against small schemas written here (JSON Schema draft-07 §6.2).</summary>
public sealed class SchemaBoundTests
{
    private static Finding Validate(string schemaJson, string yaml)
    {
        var schema = SchemaNode.Read(schemaJson, "test");
        var loaded = YamlLoader.Load(Encoding.UTF8.GetBytes(yaml), "/r/x.yaml", "x.yaml", LoadLimits.Default);
        var findings = new FindingBuilder("x.yaml");
        SchemaValidator.Validate(Assert.IsType<YMapping>(loaded.Root), schema, findings);
        return Assert.Single(findings.Findings);
    }

    [Theory]
    [InlineData("\"minimum\": 1", "0", "(at least 1)")]
    [InlineData("\"exclusiveMinimum\": 1", "1", "(must be above 1)")]
    [InlineData("\"maximum\": 5", "6", "(at most 5)")]
    [InlineData("\"exclusiveMaximum\": 5", "5", "(must be below 5)")]
    public void A_bound_is_named_the_right_way_round(string bound, string value, string says)
    {
        var finding = Validate("{\"type\":\"object\",\"properties\":{\"n\":{\"type\":\"number\"," + bound + "}}}", "n: " + value + "\n");
        Assert.Equal(EngineRules.WrongType, finding.RuleId);
        Assert.Equal(new SourceSpan(1, 4, 1, 4 + value.Length), finding.Span);
        Assert.Contains(says, finding.Message, StringComparison.Ordinal);
    }
}
