using System.Runtime.CompilerServices;
using CsCheck;

namespace SettingLint.Tests.Shared;

/// <summary>
/// Property tests that cannot fail by chance. <c>dotnet test</c> (and so <c>.ci/run</c>) runs each property on a fixed
/// list of seeds: the i-th is CsCheck's generator on stream i, started from a hash of the test's name, so the list is
/// the same on every machine and every run. Random exploration is a separate command (<c>bash .ci/explore</c>): with
/// <c>SETTINGLINT_EXPLORE=1</c> the property runs on CsCheck's own random seeds and a failure names its seed. With
/// <c>CsCheck_Seed=SEED</c> only that seed runs, to reproduce a failure found either way.
/// </summary>
public static class SeededSample
{
    /// <summary>Set to 1 for random seeds (what <c>.ci/explore</c> does).</summary>
    public const string ExploreVariable = "SETTINGLINT_EXPLORE";

    /// <summary>CsCheck's own variable: run this one seed.</summary>
    public const string SeedVariable = "CsCheck_Seed";

    /// <summary>The seeds a property runs on under <c>dotnet test</c>: the pinned ones (failures found once, kept), then <paramref name="count"/> derived from the test's name.</summary>
    public static IReadOnlyList<string> FixedSeeds(string testName, long count, IEnumerable<string>? pinned = null)
    {
        var start = Fnv1a(testName);
        var seeds = new List<string>(pinned ?? []);
        for (var i = 0L; i < count; i++) seeds.Add(new PCG((uint)i, start).ToString());
        return seeds;
    }

    /// <summary>Runs <paramref name="assert"/> on the values of <paramref name="gen"/> for every fixed seed (or as the environment asks); the first failing seed, in list order, is reported with the value.</summary>
    public static void SampleSeeded<T>(this Gen<T> gen, Action<T> assert, long iter = 100, string[]? pinned = null, [CallerMemberName] string testName = "")
    {
        var one = Environment.GetEnvironmentVariable(SeedVariable);
        if (!string.IsNullOrWhiteSpace(one))
        {
            gen.Sample(assert, seed: one.Trim(), iter: 1, threads: 1);
            return;
        }
        if (Environment.GetEnvironmentVariable(ExploreVariable) == "1")
        {
            // CsCheck's message on a failure starts "Set seed: "..."", which .ci/explore prints.
            gen.Sample(assert, iter: iter);
            return;
        }
        var seeds = FixedSeeds(testName, iter, pinned);
        var failures = new Exception?[seeds.Count];
        Parallel.For(0, seeds.Count, i =>
        {
            var value = default(T);
            try
            {
                value = gen.Generate(PCG.Parse(seeds[i]), null!, out _);
                assert(value);
            }
            catch (Exception e)
            {
                failures[i] = new CsCheckException("Fixed seed " + (i + 1) + " of " + seeds.Count + " failed. Reproduce with " + SeedVariable + "=" + seeds[i] + "\n" + Check.Print(value!), e);
            }
        });
        if (failures.FirstOrDefault(f => f is not null) is { } first) throw first;
    }

    public static void SampleSeeded<T1, T2>(this Gen<(T1, T2)> gen, Action<T1, T2> assert, long iter = 100, string[]? pinned = null, [CallerMemberName] string testName = "") =>
        gen.SampleSeeded(t => assert(t.Item1, t.Item2), iter, pinned, testName);

    public static void SampleSeeded<T1, T2, T3>(this Gen<(T1, T2, T3)> gen, Action<T1, T2, T3> assert, long iter = 100, string[]? pinned = null, [CallerMemberName] string testName = "") =>
        gen.SampleSeeded(t => assert(t.Item1, t.Item2, t.Item3), iter, pinned, testName);

    public static void SampleSeeded<T1, T2, T3, T4>(this Gen<(T1, T2, T3, T4)> gen, Action<T1, T2, T3, T4> assert, long iter = 100, string[]? pinned = null, [CallerMemberName] string testName = "") =>
        gen.SampleSeeded(t => assert(t.Item1, t.Item2, t.Item3, t.Item4), iter, pinned, testName);

    // FNV-1a, 64 bits: a hash that is the same in every process (string.GetHashCode is randomised per process).
    private static ulong Fnv1a(string text)
    {
        var hash = 14695981039346656037UL;
        foreach (var c in text)
        {
            hash = (hash ^ c) * 1099511628211UL;
        }
        return hash;
    }
}
