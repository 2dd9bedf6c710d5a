using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Tests.Shared;

namespace SettingLint.Cli.Tests.Hardness;

/// <summary>
/// The public YAML test suite's inputs (MIT licence; shared/corpora/yaml-test-suite, one folder per case, an `error`
/// file marks invalid YAML) checked as one repository: every invalid case gives SL001 with a position, every valid
/// case loads or is skipped as not a setting file, and nothing crashes or hangs.
/// </summary>
public sealed class YamlTestSuiteTests
{
    // Where YamlDotNet 18.1.0 disagrees with the suite. Each entry: case, and why.
    private static readonly Dictionary<string, string> KnownDisagreements = new(StringComparer.Ordinal)
    {
        ["DK95-01"] = "a tab at the start of a quoted scalar's continuation line: YamlDotNet takes it as white space",
        ["MUS6-00"] = "'%YAML 1.1#...': YamlDotNet does not require white space before a comment after a directive",
        ["Y79Y-003"] = "a tab indenting a flow sequence's continuation line: YamlDotNet accepts it",
        ["Y79Y-004"] = "a tab after a block sequence indicator before a nested one ('-\\t-'): YamlDotNet accepts it",
        ["Y79Y-005"] = "the same with a space first ('- \\t-'): YamlDotNet accepts it",
        ["Y79Y-006"] = "a tab after an explicit key indicator before a block sequence: YamlDotNet accepts it",
        ["Y79Y-008"] = "a tab after an explicit key indicator before a block mapping: YamlDotNet accepts it",
        ["Y79Y-009"] = "a tab after an explicit value indicator before a block mapping: YamlDotNet accepts it",
        // Valid YAML that YamlDotNet rejects (we report SL001, which is safe: the file is not read at all).
        ["4MUZ-02"] = "valid: a flow mapping's ':' on the line after its key; YamlDotNet expects ',' or '}'",
        ["VJP3-01"] = "valid: the same across several lines of a flow mapping",
        ["DK95-04"] = "valid: a line holding only a tab between two keys; YamlDotNet calls it bad indentation",
        ["JEF9-01"] = "valid: a keep-chomped literal block whose only line is spaces; YamlDotNet rejects the extra spaces",
        ["UKK6-00"] = "valid: '- :' (a sequence entry that is a mapping with an empty key); YamlDotNet rejects it",
    };

    [YamlCorpusFact]
    public void Every_case_loads_or_gives_a_positioned_syntax_finding()
    {
        var corpus = YamlTestSuiteCorpus.Require();
        var repo = Path.Combine(Path.GetTempPath(), "settinglint-yts-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path.Combine(repo, ".git"));
        var invalid = new HashSet<string>(StringComparer.Ordinal);
        try
        {
            foreach (var input in Directory.EnumerateFiles(corpus, "in.yaml", SearchOption.AllDirectories))
            {
                var caseDir = Path.GetDirectoryName(input)!;
                var name = Path.GetRelativePath(corpus, caseDir).Replace(Path.DirectorySeparatorChar, '-');
                File.Copy(input, Path.Combine(repo, name + ".yaml"));
                if (File.Exists(Path.Combine(caseDir, "error"))) invalid.Add(name + ".yaml");
            }
            var result = new Checker(EmptyRuleSet.Instance).Run(new CheckOptions([repo]));
            Assert.DoesNotContain(result.Notifications, n => n.Kind == NotificationKind.Internal);
            var byFile = result.Findings.GroupBy(f => f.File).ToDictionary(g => g.Key, g => g.ToList(), StringComparer.Ordinal);
            var missed = new List<string>();
            var wrong = new List<string>();
            foreach (var file in Directory.EnumerateFiles(repo, "*.yaml").Select(Path.GetFileName).OfType<string>().Order(StringComparer.Ordinal))
            {
                var name = file[..^".yaml".Length];
                var findings = byFile.GetValueOrDefault(file, []);
                Assert.All(findings, f => Assert.True(f.Span.StartLine >= 1 && f.Span.StartColumn >= 1, file + ": finding without a position"));
                var syntax = findings.Any(f => f.RuleId is "SL001" or "SL002" or "SL008");
                if (invalid.Contains(file) && !syntax && !KnownDisagreements.ContainsKey(name)) missed.Add(name);
                if (!invalid.Contains(file) && findings.Any(f => f.RuleId == "SL001") && !KnownDisagreements.ContainsKey(name)) wrong.Add(name + ": " + findings.First(f => f.RuleId == "SL001").Message);
            }
            Assert.True(missed.Count == 0, "Invalid cases that loaded without SL001: " + string.Join(", ", missed));
            Assert.True(wrong.Count == 0, "Valid cases reported as SL001: " + string.Join(" | ", wrong));
            Assert.True(invalid.Count > 80, "the corpus has about 95 invalid cases; found " + invalid.Count);
        }
        finally
        {
            Directory.Delete(repo, recursive: true);
        }
    }
}
