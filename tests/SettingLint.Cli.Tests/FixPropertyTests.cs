using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using CsCheck;
using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Tests.Shared;

namespace SettingLint.Cli.Tests;

/// <summary>
/// Random settings of the demo's motors (one setting scaled by a random factor, in memory): whatever `fix` writes leaves
/// no finding on the setting it fixed, and a second `fix` changes nothing. Fixed seeds (tests/Shared/Properties/SeededSample.cs).
/// </summary>
public sealed class FixPropertyTests
{
    private static readonly string Examples = Path.Combine(RepositoryPaths.Root(), "examples");

    private static readonly string[] Motors = [.. Directory.GetFiles(Path.Combine(Examples, "motors"), "*.yaml").Select(f => "motors/" + Path.GetFileName(f)).Order(StringComparer.Ordinal)];

    // The settings the rules bound by a number: element and key under protection.
    private static readonly (string Element, string Key)[] Settings =
    [
        ("short_circuit", "pickup"), ("ground_fault", "pickup"), ("acceleration", "time"), ("unbalance", "trip_pickup"), ("unbalance", "alarm_pickup"),
        ("undervoltage", "pickup"), ("undervoltage", "delay"), ("overvoltage", "pickup"), ("thermal", "pickup"), ("undercurrent", "pickup"),
        ("short_circuit", "delay"), ("ground_fault", "delay"),
    ];

    [Fact]
    [Trait("Category", "Property")]
    public void Fix_then_check_leaves_no_finding_on_the_fixed_setting_and_a_second_fix_changes_nothing()
    {
        Gen.Select(Gen.Int[0, Motors.Length - 1], Gen.Int[0, Settings.Length - 1], Gen.Double[0.05, 4]).SampleSeeded((m, s, factor) =>
        {
            var file = Motors[m];
            var text = File.ReadAllText(Path.Combine(Examples, file));
            if (Scale(text, Settings[s].Element, Settings[s].Key, factor) is not { } mutated) return;
            var first = Fixes(new Dictionary<string, byte[]>(StringComparer.Ordinal) { [file] = Encoding.UTF8.GetBytes(mutated) });
            var contents = first.NewTexts().ToImmutableDictionary(t => t.File, t => t.Old.Encode(t.New), StringComparer.Ordinal);
            if (contents.IsEmpty) return;
            var merged = new Dictionary<string, byte[]>(StringComparer.Ordinal) { [file] = Encoding.UTF8.GetBytes(mutated) };
            foreach (var (k, v) in contents) merged[k] = v;
            var after = Linter.Check(new CheckRequest(Examples, [Examples]) { Root = Examples, Source = new OverlaySource(new DiskSource(Examples), merged), Parallel = false });
            foreach (var fix in first.Applied)
            {
                var left = after.Findings.Where(f => f.File == fix.MotorFile && f.KeyPath == fix.Setting && f.Suppression is null).ToList();
                Assert.True(left.Count == 0, $"{fix.MotorFile} {fix.Setting} {fix.OldWritten} -> {fix.Written} still gets {string.Join("; ", left.Select(f => f.RuleId + ": " + f.Message))}");
            }
            var second = Fixes(merged);
            Assert.True(second.Applied.IsEmpty, "a second fix changes " + string.Join("; ", second.Applied.Select(f => $"{f.MotorFile} {f.Setting} {f.OldWritten} -> {f.Written}")));
        }, iter: 25);
    }

    private static SuggestionSet Fixes(IReadOnlyDictionary<string, byte[]> overlay)
    {
        var kept = new Kept();
        Linter.Check(new CheckRequest(Examples, [Examples])
        {
            Root = Examples, Source = new OverlaySource(new DiskSource(Examples), overlay), Parallel = false, Suggest = true, Observers = [kept],
        });
        return kept.Set ?? SuggestionSet.None;
    }

    /// <summary>The text with the number of protection.ELEMENT.KEY multiplied by a factor (two decimals), or null when the motor has no such number.</summary>
    private static string? Scale(string text, string element, string key, double factor)
    {
        var lines = text.Split('\n');
        var start = Array.FindIndex(lines, l => l.StartsWith("  " + element + ":", StringComparison.Ordinal));
        if (start < 0) return null;
        for (var i = start + 1; i < lines.Length && lines[i].StartsWith("    ", StringComparison.Ordinal); i++)
        {
            var prefix = "    " + key + ": ";
            if (!lines[i].StartsWith(prefix, StringComparison.Ordinal)) continue;
            var rest = lines[i][prefix.Length..];
            var end = rest.IndexOf(' ', StringComparison.Ordinal);
            if (end <= 0 || !double.TryParse(rest[..end], NumberStyles.Float, CultureInfo.InvariantCulture, out var value) || value <= 0) return null;
            var scaled = Math.Round(value * factor, 2);
            if (scaled <= 0) return null;
            lines[i] = prefix + scaled.ToString("0.##", CultureInfo.InvariantCulture) + rest[end..];
            return string.Join('\n', lines);
        }
        return null;
    }

    private sealed class Kept : ICheckObserver
    {
        public SuggestionSet? Set { get; private set; }

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }
}
