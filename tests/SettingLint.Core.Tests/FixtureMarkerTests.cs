using SettingLint.Core.Findings;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Tests;

/// <summary>Markers with named values: `# expect: SL201 limit=858 A actual=750 A`.</summary>
public sealed class FixtureMarkerTests
{
    [Fact]
    public void Ids_and_values_are_read_in_order()
    {
        var parsed = FixtureMarker.Parse("SL201 limit=1.76 kA actual=750 A, SL203 SL805 margin_ratio=-1.4 %", out var problem);
        Assert.Null(problem);
        Assert.Equal(["SL201", "SL203", "SL805"], parsed.Select(p => p.Id));
        var sl201 = parsed[0].Values;
        Assert.Equal(["limit", "actual"], sl201.Select(v => v.Name));
        Assert.Equal(1760, sl201[0].Si);
        Assert.Equal(5, sl201[0].Tolerance, 9);     // 1.76 kA: half of 0.01 kA
        Assert.Equal(750, sl201[1].Si);
        Assert.Equal(0.5, sl201[1].Tolerance, 9);
        Assert.Empty(parsed[1].Values);
        Assert.Equal(-0.014, parsed[2].Values[0].Si!.Value, 12);
        Assert.Equal(0.0005, parsed[2].Values[0].Tolerance, 12);
    }

    [Theory]
    [InlineData(857.6, true)]
    [InlineData(858.49, true)]
    [InlineData(858.51, false)]
    [InlineData(857.49, false)]
    public void Numbers_match_to_the_precision_written(double found, bool matches)
    {
        var v = FixtureMarker.Parse("SL201 limit=858 A", out _)[0].Values[0];
        Assert.Equal(matches, v.Matches(new FindingValue("x", found, "A")));
    }

    [Fact]
    public void A_unit_of_another_dimension_does_not_match()
    {
        var v = FixtureMarker.Parse("SL201 limit=858 A", out _)[0].Values[0];
        Assert.False(v.Matches(new FindingValue("858 s", 858, "s")));
    }

    [Fact]
    public void Text_values_compare_as_written()
    {
        var v = FixtureMarker.Parse("SL205 margin=never", out _)[0].Values[0];
        Assert.True(v.Matches(new FindingValue("never")));
        Assert.False(v.Matches(new FindingValue("0.3 s", 0.3, "s")));
    }

    [Fact]
    public void Secondary_units_and_values_before_an_id_are_problems()
    {
        FixtureMarker.Parse("SL201 limit=46 A sec", out var sec);
        Assert.Contains("cannot compare", sec);
        FixtureMarker.Parse("limit=46 A SL201", out var first);
        Assert.Contains("before any rule id", first);
    }
}
