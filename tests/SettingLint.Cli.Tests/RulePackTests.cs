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
    public void Every_rule_fixture_passes()
    {
        var (results, problems) = FixtureRunner.Run(Path.Combine(RepositoryPaths.Root(), "rules"));
        Assert.Empty(problems.Select(p => $"{p.File}:{p.Span}: {p.Message}"));
        var failures = results.Where(r => !r.Passed)
            .Select(r => r.RuleId + ": " + string.Join("; ", r.Missed.Select(m => "missed " + m).Concat(r.Unexpected.Select(u => "unexpected " + u)).Concat(r.Problems)))
            .ToList();
        Assert.Empty(failures);
        Assert.Equal(RuleLoader.BuiltIn().Count, results.Length);
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
