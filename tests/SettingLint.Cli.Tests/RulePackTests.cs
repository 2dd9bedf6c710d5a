using SettingLint.Core.Linting;
using SettingLint.Core.Rules;

namespace SettingLint.Cli.Tests;

/// <summary>The built-in pack: every rule loads, has basis, rationale and fixtures that pass, and the catalogue is current.</summary>
public sealed class RulePackTests
{
    [Fact]
    public void Built_in_pack_loads_without_problems()
    {
        // Validated here against schema/rule.schema.json, since a run trusts the embedded files and skips it.
        var loaded = new RuleLoader(Core.Validation.SchemaSet.Shared).Load(RuleLoader.BuiltIn().Select(s => s with { Trusted = false }));
        Assert.Empty(loaded.Problems.Select(p => $"{p.File}:{p.Span}: {p.Message}"));
        Assert.True(loaded.Rules.Length >= 40, "the catalogue has more than 40 rules; found " + loaded.Rules.Length);
        Assert.All(loaded.Rules, r =>
        {
            Assert.NotEmpty(r.Basis);
            Assert.False(string.IsNullOrWhiteSpace(r.Descriptor.HelpMarkdown));
        });
    }

    [Fact]
    public void No_error_rests_on_a_value_from_memory_alone()
    {
        // An error stops a merge: it must stand on a published source or a fact of the trade, not only on a recalled
        // rule of thumb (SL502 was an error on "from memory (rule of thumb)").
        var loaded = new RuleLoader(Core.Validation.SchemaSet.Shared).Load(RuleLoader.BuiltIn());
        var offenders = loaded.Rules
            .Where(r => r.Level == Core.Findings.Level.Error && r.Basis.All(b => b.Contains("from memory", StringComparison.OrdinalIgnoreCase)))
            .Select(r => r.Id);
        Assert.Empty(offenders);
        Assert.Equal(Core.Findings.Level.Warning, loaded.Rules.Single(r => r.Id == "SL502").Level);
    }

    [Fact]
    public void Every_rule_fixture_passes()
    {
        var (results, problems) = FixtureRunner.Run(Path.Combine(RepositoryPaths.Root(), "rules"));
        Assert.Empty(problems.Select(p => $"{p.File}:{p.Span}: {p.Message}"));
        var failures = results.Where(r => !r.Passed)
            .Select(r => r.RuleId + ": " + string.Join("; ", r.Missed.Select(m => "missed " + m).Concat(r.Unexpected.Select(u => "unexpected " + u)).Concat(r.WrongValues).Concat(r.WrongNotRun).Concat(r.Problems)))
            .ToList();
        Assert.Empty(failures);
        Assert.Equal(RuleLoader.BuiltIn().Count, results.Length);
    }

    [Fact]
    public void Every_built_in_rule_has_a_marker_whose_values_are_checked()
    {
        // An id-only marker proves that a rule fires, not that it fires with the right numbers: each built-in rule
        // needs at least one marker whose named values, worked by hand in the fixture's header, the runner compared.
        var (results, _) = FixtureRunner.Run(Path.Combine(RepositoryPaths.Root(), "rules"));
        Assert.Equal(RuleLoader.BuiltIn().Count, results.Length);
        Assert.Empty(results.Where(r => r.OwnCheckedValues == 0).Select(r => r.RuleId));
    }

    [Fact]
    public void Values_of_another_rule_do_not_count_as_the_folder_rule_s_own()
    {
        // SL805's fixtures mark SL805 with values and SL806 by id only; with SL805's values taken off and one given to
        // SL806, the folder still passes and checks a value, but none of its own rule.
        var pack = Path.Combine(Path.GetTempPath(), "sl-own-values-" + Guid.NewGuid().ToString("N"));
        try
        {
            // SL806 is copied too, so that the marker names a known rule.
            foreach (var id in new[] { "SL805", "SL806" })
            {
                var rule = Path.Combine(pack, id);
                Directory.CreateDirectory(Path.Combine(rule, "fixtures"));
                var source = Path.Combine(RepositoryPaths.Root(), "rules", id);
                File.Copy(Path.Combine(source, "rule.yaml"), Path.Combine(rule, "rule.yaml"));
                foreach (var f in Directory.GetFiles(Path.Combine(source, "fixtures")))
                {
                    // Every SL805 marker loses its values; the one that also names SL806 gives SL806 a value instead.
                    var lines = File.ReadAllLines(f).Select(l => l.Contains("# expect: SL805 ", StringComparison.Ordinal)
                        ? l[..(l.IndexOf("# expect:", StringComparison.Ordinal) + "# expect: SL805".Length)] + (l.EndsWith(" SL806", StringComparison.Ordinal) ? " SL806 actual=5.87 s" : "")
                        : l);
                    File.WriteAllLines(Path.Combine(rule, "fixtures", Path.GetFileName(f)), lines);
                }
            }
            var (results, problems) = FixtureRunner.Run(pack);
            Assert.Empty(problems);
            var result = Assert.Single(results, r => r.RuleId == "SL805");
            Assert.True(result.Passed, string.Join("; ", result.WrongValues.Concat(result.Problems)));
            // IEC 60255-149 hot trip at LRC, 174 s x ln(27.121 / 26.221) = 5.87 s (worked in the fixture's header).
            Assert.Equal(1, result.CheckedValues);
            Assert.Equal(0, result.OwnCheckedValues);
            // SL806's own fixtures, untouched: 5 + 5 + 3 values on its three failing fixtures.
            Assert.Equal(13, results.Single(r => r.RuleId == "SL806").OwnCheckedValues);
        }
        finally
        {
            Directory.Delete(pack, true);
        }
    }

    [Fact]
    public void A_marker_value_that_differs_from_the_finding_fails_the_fixture()
    {
        // SL805's fixture: IEC 60255-149 cold trip at LRC, 174 s x ln(27.221 / 26.221) = 6.51 s (worked in the fixture's header).
        var pack = Path.Combine(Path.GetTempPath(), "sl-marker-" + Guid.NewGuid().ToString("N"));
        try
        {
            var rule = Path.Combine(pack, "SL805");
            Directory.CreateDirectory(Path.Combine(rule, "fixtures"));
            var source = Path.Combine(RepositoryPaths.Root(), "rules", "SL805");
            File.Copy(Path.Combine(source, "rule.yaml"), Path.Combine(rule, "rule.yaml"));
            foreach (var f in Directory.GetFiles(Path.Combine(source, "fixtures")))
            {
                var text = File.ReadAllText(f).Replace("actual=6.51 s", "actual=6.53 s", StringComparison.Ordinal);
                File.WriteAllText(Path.Combine(rule, "fixtures", Path.GetFileName(f)), text);
            }
            var (results, problems) = FixtureRunner.Run(rule);
            Assert.Empty(problems);
            var result = Assert.Single(results, r => r.RuleId == "SL805");
            Assert.False(result.Passed);
            Assert.Contains(result.WrongValues, w => w.Contains("actual expected 6.53 s, found 6.51 s", StringComparison.Ordinal));
        }
        finally
        {
            Directory.Delete(pack, true);
        }
    }

    [Theory]
    [InlineData("# not-run: SL202 bus.fault_current_min\n", "", "SL202 was not run for missing bus.fault_current_min")]
    [InlineData("# not-run: SL202 bus.fault_current_min\n", "# not-run: SL202 bus.fault_current_max\n", "SL202 expected not run for bus.fault_current_max, found bus.fault_current_min")]
    public void A_check_not_run_must_match_its_marker(string marker, string replacement, string expected)
    {
        // SL202's fixture of a bus without its minimum fault current: the rule cannot be evaluated (no silent pass).
        var pack = Path.Combine(Path.GetTempPath(), "sl-not-run-" + Guid.NewGuid().ToString("N"));
        try
        {
            var rule = Path.Combine(pack, "SL202");
            Directory.CreateDirectory(Path.Combine(rule, "fixtures"));
            var source = Path.Combine(RepositoryPaths.Root(), "rules", "SL202");
            File.Copy(Path.Combine(source, "rule.yaml"), Path.Combine(rule, "rule.yaml"));
            foreach (var f in Directory.GetFiles(Path.Combine(source, "fixtures")))
            {
                File.WriteAllText(Path.Combine(rule, "fixtures", Path.GetFileName(f)), File.ReadAllText(f).Replace(marker, replacement, StringComparison.Ordinal));
            }
            var (results, problems) = FixtureRunner.Run(rule);
            Assert.Empty(problems);
            var result = Assert.Single(results, r => r.RuleId == "SL202");
            Assert.False(result.Passed);
            Assert.Contains(result.WrongNotRun, w => w.Contains(expected, StringComparison.Ordinal));
        }
        finally
        {
            Directory.Delete(pack, true);
        }
    }

    [Fact]
    public void Catalogue_is_current()
    {
        var rules = new RuleLoader(Core.Validation.SchemaSet.Shared).Load(RuleLoader.BuiltIn()).Rules;
        var expected = Catalogue.Render(rules);
        var path = Path.Combine(RepositoryPaths.Root(), "rules", "README.md");
        Assert.True(File.Exists(path), "rules/README.md is missing: run `settinglint rules catalogue > rules/README.md`.");
        Assert.True(expected == File.ReadAllText(path), "rules/README.md is stale: run `dotnet run --project src/SettingLint.Cli -- rules catalogue > rules/README.md`.");
    }
}
