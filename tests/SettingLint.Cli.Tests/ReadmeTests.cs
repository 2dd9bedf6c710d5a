using System.Text.RegularExpressions;
using SettingLint.Core.Engine;

namespace SettingLint.Cli.Tests;

/// <summary>The configuration example in the README is a configuration this version accepts.</summary>
public sealed class ReadmeTests
{
    [Fact]
    public void The_readme_configuration_example_loads_without_problems()
    {
        var readme = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "README.md"));
        var block = Regex.Match(readme, "```yaml\n(fail_on:.*?)```", RegexOptions.Singleline);
        Assert.True(block.Success, "the README has a ```yaml block starting with fail_on:");
        var repo = Path.Combine(Path.GetTempPath(), "settinglint-readme-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path.Combine(repo, ".git"));
        Directory.CreateDirectory(Path.Combine(repo, "company-rules"));
        File.WriteAllText(Path.Combine(repo, ".settinglint.yaml"), block.Groups[1].Value);
        try
        {
            var session = Session.Open([repo]);
            Assert.Empty(session.Problems.Select(p => $"{p.File}:{p.Span}: {p.Message}"));
            Assert.Contains(session.Rules.Rules, r => r.Id == "SL302" && Math.Abs(r.ParameterValues[r.Parameters.Single(p => p.Name == "max_share").Index] - 0.15) < 1e-12);
            Assert.DoesNotContain(session.Rules.Descriptors, d => d.Id == "SL110");
        }
        finally
        {
            Directory.Delete(repo, recursive: true);
        }
    }
}
