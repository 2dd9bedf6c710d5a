using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;
using SettingLint.Core.Linting;
using SettingLint.Core.Sources;
using SettingLint.Tests.Support;
using Xunit.Abstractions;

namespace SettingLint.Core.Tests;

/// <summary>Runs alone: the managed heap is a process-wide figure, and tests running beside it would move it.</summary>
[CollectionDefinition(nameof(RetainedHeapCollection), DisableParallelization = true)]
public sealed class RetainedHeapCollection;

/// <summary>
/// A process that lives for days (the language server, an editor host) runs thousands of checks: what stays on the
/// heap after a full collection must not grow with the number of checks. Process-wide state that only grows (a pool of
/// every key path ever typed, a cache per pattern) fails this test, as does a finished check kept reachable.
/// </summary>
[Collection(nameof(RetainedHeapCollection))]
public sealed class RetainedHeapTests(ITestOutputHelper output)
{
    private const string Motor = "motors/m-1.yaml";

    // Out of line, so that no local of the run outlives it on the test's own stack.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static int CheckBuffer(TempRepo repo, int i)
    {
        // An edit a keystroke at a time: the value changes, and every run types a key never seen before (a new key path).
        var buffer = Samples.MotorWith("full_load_current: 58 A", $"full_load_current: {50 + (i % 17)} A") + $"note_{i}: typed\n";
        var source = new OverlaySource(new DiskSource(repo.Root), new Dictionary<string, byte[]> { [Motor] = Encoding.UTF8.GetBytes(buffer) });
        return Linter.Check(new CheckRequest(repo.Root, [Motor]) { Source = source }).Findings.Length;
    }

    private static long Settled()
    {
        for (var i = 0; i < 3; i++)
        {
            GC.Collect(GC.MaxGeneration, GCCollectionMode.Forced, blocking: true, compacting: true);
            GC.WaitForPendingFinalizers();
        }
        return GC.GetTotalMemory(forceFullCollection: true);
    }

    [Fact]
    public void The_heap_left_after_500_checks_is_that_after_50_within_a_bound()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(Motor, Samples.Motor);
        var i = 0;
        // Every check finds the unknown key it typed (SL003 or the like): a check that found nothing would prove little.
        while (i < 50) Assert.True(CheckBuffer(repo, i++) > 0);
        var after50 = Settled();
        while (i < 500) Assert.True(CheckBuffer(repo, i++) > 0);
        var after500 = Settled();
        var growth = after500 - after50;
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"retained heap after 50 checks: {after50 / 1024.0:F0} KiB, after 500: {after500 / 1024.0:F0} KiB, growth {growth / 1024.0:F0} KiB"));
        // Generous against the runtime's own noise, tight against a leak: one check's bound motor document, findings and
        // result are well over 4 KiB, so keeping one per check would be over 1.8 MiB after the 450 checks between the two.
        Assert.True(growth < 1L * 1024 * 1024, string.Create(CultureInfo.InvariantCulture, $"grew {growth / 1024.0:F0} KiB over 450 checks (from {after50 / 1024.0:F0} KiB)"));
    }
}
