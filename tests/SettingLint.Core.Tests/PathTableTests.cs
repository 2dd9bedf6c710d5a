using SettingLint.Core.Rules;

namespace SettingLint.Core.Tests;

/// <summary>
/// Key paths are numbered while other threads evaluate motors (a relay range's path is numbered when a run first meets
/// the range): a thread that finds a slot must find its index within the count it sizes its arrays by. Before the count
/// was published ahead of the slot, a context made in that moment threw on the index ("a rule failed on this motor").
/// </summary>
public sealed class PathTableTests
{
    [Fact]
    public void A_slot_found_by_any_thread_lies_within_the_count()
    {
        var table = new PathTable();
        const int Paths = 20_000;
        var outside = 0;
        // Two threads number the same paths in the same order, so that one often finds the slot the other has just made.
        void Number()
        {
            for (var i = 0; i < Paths; i++)
            {
                var slot = table.Of("protection.range_" + i);
                if (slot.Index >= table.Count) Interlocked.Increment(ref outside);
            }
        }
        Parallel.Invoke(Number, Number, Number);

        Assert.Equal(0, outside);
        Assert.Equal(Paths, table.Count);
    }
}
