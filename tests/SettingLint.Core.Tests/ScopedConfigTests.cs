using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A `.settinglint.yaml` in a folder governs the files below it, a nearer file overriding a farther one key by key:
/// one repository, two invented sites under different codes, each motor checked under its own folder's configuration.
/// </summary>
public sealed class ScopedConfigTests
{
    // The sample motor with its thermal element at 1.3 x FLC: above the 1.25 x FLC that NFPA 70 430.32(A)(1) allows
    // for a service factor of 1.15, so SL801 fires wherever NFPA 70 governs and nowhere else. Its 50P pickup of
    // 7.2 A sec (108 A) lies below its asymmetrical start current (1.7 x 6.2 x 58 A = 611 A, IEEE C37.96 common
    // practice), so SL201 fires wherever it is on.
    private static string Motor(string tag) => Samples.ThermalAbove125Tagged(tag);

    private const string RootConfig = "fail_on: error\nrules:\n  SL201: warning\n";

    // Harbour Works: an invented 50 Hz site under IEC practice, where NFPA 70 430.32 does not apply.
    private const string HarbourConfig = "electrical_code: IEC 60364\nrules:\n  SL201: off\n";

    // Mill Road: an invented 60 Hz site under the NEC, stricter about the 50P than the root.
    private const string MillConfig = "electrical_code: NFPA 70\nrules:\n  SL201:\n    severity: error\n";

    private static TempRepo TwoSites()
    {
        var repo = new TempRepo();
        repo.Write(".settinglint.yaml", RootConfig);
        repo.Write("harbour-works/.settinglint.yaml", HarbourConfig);
        repo.Write("harbour-works/buses/bus-1.yaml", Samples.Replace(Samples.Bus, "nominal_voltage: 4160 V\n", "nominal_voltage: 4160 V\nfrequency: 50 Hz\n"));
        repo.Write("harbour-works/motors/m-1.yaml", Motor("HW-P1"));
        repo.Write("mill-road/.settinglint.yaml", MillConfig);
        repo.Write("mill-road/buses/bus-1.yaml", Samples.Bus);
        repo.Write("mill-road/motors/m-1.yaml", Motor("MR-P1"));
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("motors/m-1.yaml", Motor("RT-P1"));
        return repo;
    }

    private static (Level? Sl201, bool Sl801) Verdict(CheckResult result, string file) => (
        result.Findings.FirstOrDefault(f => f.File == file && f.RuleId == "SL201")?.Level,
        result.Findings.Any(f => f.File == file && f.RuleId == "SL801"));

    [Fact]
    public void Each_site_is_checked_under_its_own_folders_configuration_Nfpa70_430_32_A_1()
    {
        using var repo = TwoSites();
        var session = Session.Open([repo.Root]);
        Assert.Empty(session.Problems);
        var result = session.Check([repo.Root], null, parallel: false);
        Assert.Empty(result.Notifications);
        // IEC site: no NEC limit, and the 50P rule switched off there.
        Assert.Equal((null, false), Verdict(result, "harbour-works/motors/m-1.yaml"));
        // NEC site: the NEC limit applies, and the 50P rule is raised back to error there.
        Assert.Equal((Level.Error, true), Verdict(result, "mill-road/motors/m-1.yaml"));
        // Outside both sites the root alone governs: SL201 lowered to a warning, NFPA 70 by default on a 60 Hz bus.
        Assert.Equal((Level.Warning, true), Verdict(result, "motors/m-1.yaml"));
    }

    [Fact]
    public void The_effective_configuration_of_each_file_names_where_each_value_came_from()
    {
        using var repo = TwoSites();
        var scopes = Session.Open([repo.Root]).Scopes!;

        var harbour = scopes.For("harbour-works/motors/m-1.yaml").Effective;
        Assert.Equal(".settinglint.yaml, harbour-works/.settinglint.yaml", string.Join(", ", harbour.Files));
        Assert.Equal(("IEC 60364", "harbour-works/.settinglint.yaml", 1), (harbour.ElectricalCode!.Value, harbour.ElectricalCode.File, harbour.ElectricalCode.Span.StartLine));
        var off = harbour.Rules["SL201"];
        Assert.Equal((false, "harbour-works/.settinglint.yaml", 3), (off.Enabled!.Value, off.Enabled.File, off.Enabled.Span.StartLine));
        // The root's severity is still there underneath, but switched off wins.
        Assert.Equal((Level.Warning, ".settinglint.yaml"), (off.Severity!.Value, off.Severity.File));
        Assert.Equal(Level.None, harbour.Overrides().For("SL201")!.Level);

        var mill = scopes.For("mill-road/motors/m-1.yaml").Effective;
        Assert.Equal(("NFPA 70", 1), (mill.ElectricalCode!.Value, mill.ElectricalCode.Span.StartLine));
        Assert.Equal((Level.Error, "mill-road/.settinglint.yaml", 4), (mill.Rules["SL201"].Severity!.Value, mill.Rules["SL201"].Severity!.File, mill.Rules["SL201"].Severity!.Span.StartLine));

        var root = scopes.For("motors/m-1.yaml").Effective;
        Assert.Equal(".settinglint.yaml", string.Join(", ", root.Files));
        Assert.Null(root.ElectricalCode);
        // A folder without a file of its own shares its parent's scope.
        Assert.Same(scopes.For("harbour-works/motors/m-1.yaml"), scopes.For("harbour-works/motors/deeper/m-9.yaml"));
    }

    [Fact]
    public void A_rule_parameter_set_in_a_folder_applies_only_there()
    {
        using var repo = TwoSites();
        // SL201's ratio of asymmetrical to symmetrical start current (1.7 by default), set to 1.5 in Mill Road only.
        repo.Write("mill-road/.settinglint.yaml", MillConfig + "    parameters:\n      asymmetry_factor: 1.5\n");
        var session = Session.Open([repo.Root]);
        var mill = session.Scopes!.For("mill-road/motors/m-1.yaml");
        Assert.Empty(mill.Problems);
        var parameter = Assert.Single(mill.Effective.Rules["SL201"].Parameters);
        Assert.Equal(("asymmetry_factor", "1.5", 6), (parameter.Key, parameter.Value.Value, parameter.Value.Span.StartLine));
        static double Factor(SettingLint.Core.Rules.CompiledRule r) => r.ParameterValues[r.Parameters.First(p => p.Name == "asymmetry_factor").Index];
        Assert.Equal(1.5, Factor(mill.Rules.First(r => r.Id == "SL201")));
        Assert.Equal(1.7, Factor(session.Scopes.For("harbour-works/motors/m-1.yaml").Rules.First(r => r.Id == "SL201")));
        Assert.Equal(1.7, Factor(session.Rules.Rules.First(r => r.Id == "SL201")));
    }

    [Theory]
    [InlineData("fail_on: warning\n", 1, "fail_on holds for the whole run")]
    [InlineData("packs: [builtin, ../company-rules]\n", 1, "packs hold for the whole run")]
    [InlineData("rules:\n  SL999: off\n", 2, "the rule SL999 is not in any loaded pack")]
    [InlineData("rules:\n  SL201:\n    parameters:\n      no_such: 3\n", 4, "no parameter 'no_such'")]
    [InlineData("electrical_code: NEC 2023\n", 1, "electrical_code")]
    public void A_folders_file_that_cannot_be_applied_is_a_configuration_problem_at_its_line(string config, int line, string message)
    {
        using var repo = TwoSites();
        repo.Write("company-rules/.keep", "");
        repo.Write("harbour-works/.settinglint.yaml", config);
        var session = Session.Open([repo.Root]);
        Assert.Empty(session.Problems);
        var result = session.Check([repo.Root], null, parallel: false);
        var problem = Assert.Single(result.Notifications);
        Assert.Equal(NotificationKind.Configuration, problem.Kind);
        Assert.Equal(("harbour-works/.settinglint.yaml", line), (problem.File, problem.Span!.Value.StartLine));
        Assert.Contains(message, problem.Message, StringComparison.Ordinal);
        Assert.Equal(2, result.ExitCode);
    }

    [Fact]
    public void A_folder_that_repeats_the_roots_fail_on_and_packs_says_nothing_new_and_is_accepted()
    {
        using var repo = TwoSites();
        repo.Write("harbour-works/.settinglint.yaml", "fail_on: error\npacks: [builtin]\n" + HarbourConfig);
        var result = Session.Open([repo.Root]).Check([repo.Root], null, parallel: false);
        Assert.Empty(result.Notifications);
    }

    [Fact]
    public void Include_and_exclude_of_a_folder_are_relative_to_its_file_and_apply_below_it()
    {
        using var repo = TwoSites();
        repo.Write("mill-road/.settinglint.yaml", MillConfig + "exclude:\n  - motors/*.yaml\n");
        var result = Session.Open([repo.Root]).Check([repo.Root], null, parallel: false);
        Assert.DoesNotContain("mill-road/motors/m-1.yaml", result.CheckedFiles);
        Assert.Contains("harbour-works/motors/m-1.yaml", result.CheckedFiles);
        Assert.Contains("motors/m-1.yaml", result.CheckedFiles);
    }

    [Fact]
    public void The_root_configuration_is_the_outermost_whichever_folder_the_run_starts_from()
    {
        using var repo = TwoSites();
        var session = Session.Open([repo.PathOf("mill-road/motors")]);
        Assert.Equal(".settinglint.yaml", session.Config.File);
        var result = session.Check([repo.PathOf("mill-road")], null, parallel: false);
        Assert.Equal((Level.Error, true), Verdict(result, "mill-road/motors/m-1.yaml"));
    }

    [Fact]
    public void Without_a_root_configuration_each_folders_file_still_governs_its_folder()
    {
        using var repo = TwoSites();
        File.Delete(repo.PathOf(".settinglint.yaml"));
        var result = Session.Open([repo.Root]).Check([repo.Root], null, parallel: false);
        Assert.Empty(result.Notifications);
        Assert.Equal((null, false), Verdict(result, "harbour-works/motors/m-1.yaml"));
        Assert.Equal((Level.Error, true), Verdict(result, "motors/m-1.yaml"));
    }

    // Outside git, a file checked on its own from its folder: the root is the outermost configuration (not the site's,
    // which is nearer), so the motor's bus beside its folder is inside the repository and the site's code applies.
    [Fact]
    public void Outside_git_a_file_checked_from_its_folder_finds_the_root_above_its_sites_configuration()
    {
        using var repo = new TempRepo(git: false);
        repo.Write(".settinglint.yaml", RootConfig);
        repo.Write("harbour-works/.settinglint.yaml", HarbourConfig);
        repo.Write("harbour-works/buses/bus-1.yaml", Samples.Bus);
        repo.Write("harbour-works/motors/m-1.yaml", Motor("HW-P1"));
        var result = Linter.Check(new CheckRequest(repo.PathOf("harbour-works/motors"), ["m-1.yaml"]));
        Assert.Equal(repo.Root, result.RepositoryRoot);
        Assert.Empty(result.Notifications);
        Assert.DoesNotContain(result.Findings, f => f.RuleId == EngineRules.Reference);
        Assert.Equal((null, false), Verdict(result, "harbour-works/motors/m-1.yaml"));
    }

    // A suggested value is found and confirmed under the rules of the motor's folder: with SL201's asymmetry factor
    // at 1.5 in Mill Road, its 50P suggestion is about 1.5/1.7 of the same motor's under the root's 1.7.
    [Fact]
    public void A_suggestion_is_found_under_the_rules_of_the_motors_folder()
    {
        using var repo = TwoSites();
        repo.Write("mill-road/.settinglint.yaml", MillConfig + "    parameters:\n      asymmetry_factor: 1.5\n");
        var fixes = new FixesKept();
        Linter.Check(new CheckRequest(repo.Root, [repo.Root]) { Parallel = false, Suggest = true, Observers = [fixes] });
        var set = fixes.Set!;
        double Suggested(string file) => set.Applied.Single(f => f.MotorFile == file && f.Setting == "protection.short_circuit.pickup").NewSi;
        var (mill, root) = (Suggested("mill-road/motors/m-1.yaml"), Suggested("motors/m-1.yaml"));
        Assert.True(mill < root, $"{mill} < {root}");
        // 1.5 / 1.7 = 0.882, within the rounding of each suggestion to a written step.
        Assert.InRange(mill / root, 0.86, 0.90);
    }

    private sealed class FixesKept : ICheckObserver
    {
        public Fixes.SuggestionSet? Set { get; private set; }

        public void OnFixes(Fixes.SuggestionSet fixes) => Set = fixes;
    }
}
