using SettingLint.Core.Documents;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A run keeps its files' paths and tags packed (KeptFiles) and the result lists them packed (RunFiles): the lists read the
/// same as lists of strings would, in ordinal order, and a reused tag is told on every file but the first in path order.
/// </summary>
public sealed class PackedResultTests
{
    [Fact]
    public void A_result_s_files_and_motors_read_back_sorted_with_their_names_and_buses()
    {
        var files = RunFiles.Of(
            ["relays/r.yaml", "motors/b.yaml", "buses/x.yaml"],
            [("motors/b.yaml", "P-2", "buses/x.yaml"), ("motors/a.yaml", "P-1", null), ("motors/\u00e9.yaml", "P-\u03a9", "buses/x.yaml")]);

        Assert.Equal(["buses/x.yaml", "motors/a.yaml", "motors/b.yaml", "motors/\u00e9.yaml", "relays/r.yaml"], files.Files().ToArray());
        Assert.Equal(5, files.Count);
        Assert.Equal(3, files.MotorCount);
        Assert.Equal(["motors/a.yaml", "motors/b.yaml", "motors/\u00e9.yaml"], Enumerable.Range(0, 3).Select(files.MotorFile));
        Assert.Equal([null, "buses/x.yaml", "buses/x.yaml"], Enumerable.Range(0, 3).Select(files.MotorBus));
        Assert.Equal(["P-1", "P-2", "P-\u03a9"], files.MotorNames().ToArray());
        Assert.Equal(2, files.IndexOf("motors/b.yaml"));
        Assert.True(files.IndexOf("motors/c.yaml") < 0);
        Assert.Equal(~3, files.IndexOf("motors/c.yaml"));
        Assert.Equal(1, files.MotorIndexOf("motors/b.yaml"));
        Assert.Equal(-1, files.MotorIndexOf("buses/x.yaml"));
        Assert.Equal(-1, files.MotorIndexOf("motors/none.yaml"));
        Assert.True(files.Contains("relays/r.yaml"));
        Assert.False(files.Contains("relays"));
    }

    [Fact]
    public void Every_file_but_the_first_in_path_order_is_told_of_a_reused_tag()
    {
        var span = new SourceSpan(3, 6, 3, 9);
        // In the order of keeping, not of path; one file twice (a changed-files run may bind a file as well as report it).
        var tags = TagList.Of([
            new("motors/b.yaml", "M-1", span), new("motors/a.yaml", "M-1", span), new("motors/c.yaml", "M-2", span),
            new("motors/d.yaml", "M-1", span), new("motors/c.yaml", "M-2", span), new("motors/\u00e9.yaml", "M-3", span)]);

        var reused = tags.Reused();

        Assert.Equal(["motors/b.yaml", "motors/c.yaml", "motors/d.yaml"], reused.Keys.Order(StringComparer.Ordinal));
        var b = Assert.Single(reused["motors/b.yaml"].Findings);
        Assert.Equal(EngineRules.DuplicateTag, b.RuleId);
        Assert.Equal("motors/a.yaml", b.Values["other"].Text);
        Assert.Equal("M-1", b.Values["tag"].Text);
        Assert.Equal(span, b.Span);
        Assert.Equal("motors/a.yaml", Assert.Single(reused["motors/d.yaml"].Findings).Values["other"].Text);
        Assert.Equal("motors/c.yaml", Assert.Single(reused["motors/c.yaml"].Findings).Values["other"].Text);
    }

    [Fact]
    public void A_check_lists_files_with_other_than_ASCII_names_in_ordinal_order_and_tells_their_reused_tags()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        // U+FF21 sorts after the surrogate pair of U+1F600 in UTF-16 (ordinal) order, before it by code point.
        string[] motors = ["motors/m-\uFF21.yaml", "motors/m-\U0001F600.yaml", "motors/m-a.yaml", "motors/m-\u00e9.yaml"];
        foreach (var m in motors) repo.Write(m, Samples.Motor.Replace("tag: M-1", "tag: P-\u00e9", StringComparison.Ordinal));

        var result = Linter.Check(new CheckRequest(repo.Root, []) { Suggest = false });

        Assert.Equal(motors.Order(StringComparer.Ordinal), result.CheckedFiles.Where(f => f.StartsWith("motors/", StringComparison.Ordinal)));
        Assert.Equal(["motors/m-a.yaml", "motors/m-\u00e9.yaml", "motors/m-\U0001F600.yaml", "motors/m-\uFF21.yaml"], result.CheckedFiles.Where(f => f.StartsWith("motors/", StringComparison.Ordinal)));
        var reused = result.Findings.Where(f => f.RuleId == EngineRules.DuplicateTag).ToList();
        Assert.Equal(["motors/m-\u00e9.yaml", "motors/m-\U0001F600.yaml", "motors/m-\uFF21.yaml"], reused.Select(f => f.File));
        Assert.All(reused, f => Assert.Equal("motors/m-a.yaml", f.Values["other"].Text));
        Assert.All(reused, f => Assert.Equal("P-\u00e9", f.Values["tag"].Text));
        Assert.Equal(4, result.MotorCount);
        Assert.Equal(["P-\u00e9", "P-\u00e9", "P-\u00e9", "P-\u00e9"], result.Motors.ToArray());
    }
}
