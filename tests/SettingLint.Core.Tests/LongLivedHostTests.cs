using System.Runtime.CompilerServices;
using System.Text;
using SettingLint.Core.Linting;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A host that lives for days (the language server) runs thousands of checks in one process: nothing of a finished
/// check may stay reachable from process-wide state (interned paths, path tables, per-thread spares). The shared
/// pools themselves are bounded (KeyPaths stops at its capacity; the glob cache is emptied past 256 patterns); they
/// are not filled here, since other tests of this process share them.
/// </summary>
public sealed class LongLivedHostTests
{
    private const string Motor = "motors/m-1.yaml";

    private sealed class Keeper : ICheckObserver
    {
        public List<WeakReference> Seen { get; } = [];

        public void OnMotor(MotorProtection motor)
        {
            lock (Seen)
            {
                Seen.Add(new WeakReference(motor));
                Seen.Add(new WeakReference(motor.Document));
            }
        }

        public void OnOutcome(RuleOutcome outcome)
        {
        }
    }

    // Out of line, so that no local of the run outlives it on the test's own stack.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static int CheckBuffer(TempRepo repo, string buffer, Keeper keeper)
    {
        var source = new OverlaySource(new DiskSource(repo.Root), new Dictionary<string, byte[]> { [Motor] = Encoding.UTF8.GetBytes(buffer) });
        return Linter.Check(new CheckRequest(repo.Root, [Motor]) { Source = source, Observers = [keeper] }).Findings.Length;
    }

    [Fact]
    public void No_motor_or_document_of_a_finished_check_stays_alive_after_many_edits()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(Motor, Samples.Motor);
        var keeper = new Keeper();
        for (var i = 0; i < 300; i++)
        {
            // An edit a keystroke at a time: the value changes, and now and then an unknown key is typed.
            var buffer = Samples.MotorWith("full_load_current: 58 A", $"full_load_current: {50 + (i % 17)} A")
                + (i % 3 == 0 ? $"note_{i}: typed\n" : "");
            CheckBuffer(repo, buffer, keeper);
        }
        Assert.Equal(600, keeper.Seen.Count);
        Assert.Equal(0, Heap.Alive(keeper.Seen));
    }
}
