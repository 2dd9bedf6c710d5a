using CsCheck;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>The fixed seeds of the property tests are the same in every process: CI cannot go red by chance.</summary>
public sealed class PropertySeedTests
{
    [Fact]
    public void The_fixed_seeds_depend_only_on_the_test_name_and_the_pinned_ones_run_first()
    {
        var first = SeededSample.FixedSeeds("Some_property", 50, ["a-9pZLpy0oM4"]);
        var again = SeededSample.FixedSeeds("Some_property", 50, ["a-9pZLpy0oM4"]);
        Assert.Equal(first, again);
        Assert.Equal(51, first.Count);
        Assert.Equal("a-9pZLpy0oM4", first[0]);
        Assert.Equal(50, first.Skip(1).Distinct().Count());
        Assert.NotEqual(first.Skip(1), SeededSample.FixedSeeds("Other_property", 50).ToList());
        // Each is a seed CsCheck reads back (the one a failure names, for CsCheck_Seed).
        Assert.All(first, s => Assert.Equal(s, PCG.Parse(s).ToString()));
    }

    [Fact]
    public void A_property_sees_the_same_values_on_every_run()
    {
        if (Environment.GetEnvironmentVariable(SeededSample.ExploreVariable) == "1" || Environment.GetEnvironmentVariable(SeededSample.SeedVariable) is { Length: > 0 })
        {
            return; // exploration or one seed asked for: the values are meant to differ
        }
        var runs = new List<long>[2];
        for (var r = 0; r < 2; r++)
        {
            var seen = new List<long>();
            Gen.Long.SampleSeeded(v => { lock (seen) seen.Add(v); }, iter: 20, testName: "Repeat");
            seen.Sort();
            runs[r] = seen;
        }
        Assert.Equal(20, runs[0].Count);
        Assert.Equal(runs[0], runs[1]);
    }
}
