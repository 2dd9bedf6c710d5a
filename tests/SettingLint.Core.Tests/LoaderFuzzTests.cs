using System.Text;
using CsCheck;
using SettingLint.Tests.Shared;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Tests;

/// <summary>
/// Random YAML-like text: the loader never throws (setting-files contract: "never a crash"), and every position it
/// reports lies inside the file.
/// </summary>
public sealed class LoaderFuzzTests
{
    private const string Alphabet = "ab1.: -[]{},&*!|>'\"#?%@`\\~\n\n\n  \t\r\u00e9\u0000\u0085\u2028\uFEFF";

    private static readonly Gen<string> Text =
        Gen.Char[Alphabet].Array[0, 80].Select(chars => new string(chars));

    // More iterations on demand: SETTINGLINT_FUZZ_ITER=200000 dotnet test --filter LoaderFuzzTests.
    private static readonly int Iterations = int.TryParse(Environment.GetEnvironmentVariable("SETTINGLINT_FUZZ_ITER"), out var n) ? n : 3000;

    private static readonly LoadLimits Tight = LoadLimits.Default with { MaxNodes = 50, MaxAliasExpansion = 20, MaxDepth = 6 };

    private static string Codes(string text) =>
        string.Concat(text.Select(c => ((int)c).ToString("X4", System.Globalization.CultureInfo.InvariantCulture) + " "));

    // The parser may point one line past the last line break (the end of the stream).
    private static void Within(string text, SourceSpan span)
    {
        var lines = text.Replace("\r\n", "\n", StringComparison.Ordinal).Split('\n', '\r').Length + 1; // YAML 1.2.2 spec 5.4
        var ok = span.StartLine >= 1 && span.StartLine <= lines && span.EndLine >= span.StartLine && span.EndLine <= lines && span.StartColumn >= 1;
        Assert.True(ok, span + " for " + Codes(text));
    }

    [Trait("Category", "Property")]
    [Fact]
    public void The_loader_never_throws_and_positions_are_inside_the_file() =>
        Text.SampleSeeded(text =>
        {
            foreach (var limits in (LoadLimits[])[LoadLimits.Default, Tight])
            {
                var file = YamlLoader.Load(Encoding.UTF8.GetBytes(text), "/r/f.yaml", "f.yaml", limits);
                foreach (var f in file.Findings)
                {
                    Assert.StartsWith("SL00", f.RuleId, StringComparison.Ordinal);
                    Within(text, f.Span);
                    Assert.All(MessageTemplate.Holes(f.Template), hole => Assert.True(f.Values.ContainsKey(hole), hole));
                }
                if (file.Root is { } root) Walk(root, n => Within(text, n.Span));
                Assert.True(file.Root is not null || file.Findings.Count > 0 || IsBlank(text), "no tree and no finding: " + Codes(text));
            }
        }, iter: Iterations);

    [Trait("Category", "Property")]
    [Fact]
    public void Random_bytes_never_throw() =>
        Gen.Byte.Array[0, 64].SampleSeeded(bytes =>
        {
            var file = YamlLoader.Load(bytes, "/r/f.yaml", "f.yaml", LoadLimits.Default);
            Assert.All(file.Findings, f => Assert.True(f.RuleId is EngineRules.Syntax or EngineRules.DuplicateKey or EngineRules.SecondDocument or EngineRules.KeyNotPlain or EngineRules.Limit, f.RuleId));
        }, iter: 3000);

    private static bool IsBlank(string text)
    {
        // Empty streams: only white space, comments, directives and document end markers (YAML 1.2.2 spec 9.1).
        foreach (var line in text.Replace("\r", "\n", StringComparison.Ordinal).Split('\n'))
        {
            var t = line.Trim(' ', '\t', '\uFEFF');
            // YamlDotNet ignores a directive that no document follows (YAML 1.2.2 spec 6.8 would want `---` after it).
            var marker = t == "..." || t.StartsWith("... ", StringComparison.Ordinal) || t.StartsWith("...\t", StringComparison.Ordinal);
            if (t.Length > 0 && !t.StartsWith('#') && !t.StartsWith('%') && !marker) return false;
        }
        return true;
    }

    private static void Walk(YNode node, Action<YNode> visit)
    {
        visit(node);
        switch (node)
        {
            case YMapping m:
                foreach (var e in m.Entries)
                {
                    visit(e.Key);
                    Walk(e.Value, visit);
                }
                break;
            case YSequence s:
                foreach (var i in s.Items) Walk(i, visit);
                break;
        }
    }
}
