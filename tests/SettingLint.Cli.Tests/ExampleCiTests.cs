using System.Text.RegularExpressions;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Reporting;

namespace SettingLint.Cli.Tests;

/// <summary>The GitLab CI example writes the reports its job declares, in formats this version has.</summary>
public sealed class ExampleCiTests
{
    [Fact]
    public void The_gitlab_job_uploads_the_files_its_commands_write()
    {
        var file = Path.Combine(RepositoryPaths.Root(), "examples", "ci", "gitlab-ci.yml");
        var loaded = YamlLoader.LoadFile(file, "gitlab-ci.yml", LoadLimits.Default);
        Assert.Empty(loaded.Findings);
        var job = Assert.IsType<YMapping>(Assert.IsType<YMapping>(loaded.Root)["settinglint"]);
        var script = Assert.IsType<YSequence>(job["script"]).Items.Cast<YScalar>().Select(s => s.Value).ToList();
        string OutputOf(string format)
        {
            var line = Assert.Single(script, l => l.Contains("--format " + format + " ", StringComparison.Ordinal));
            Assert.Contains(format, Reporters.Formats);
            return Regex.Match(line, @"--output (\S+)").Groups[1].Value;
        }
        var artifacts = Assert.IsType<YMapping>(job["artifacts"]);
        // GitLab CI/CD YAML reference, artifacts:reports:codequality and artifacts:reports:junit; `when: always`
        // uploads them from a failed job too, which is when they matter.
        Assert.Equal("always", Assert.IsType<YScalar>(artifacts["when"]).Value);
        var reports = Assert.IsType<YMapping>(artifacts["reports"]);
        Assert.Equal(OutputOf("code-quality"), Assert.IsType<YScalar>(reports["codequality"]).Value);
        Assert.Equal(OutputOf("junit"), Assert.IsType<YScalar>(reports["junit"]).Value);
        // The job's result is the gate's exit code, kept from the first run.
        Assert.Equal("exit \"$status\"", script[^1]);
    }
}
