namespace SettingLint.Tests.Support;

/// <summary>What of a set of objects, held weakly, a full collection leaves alive.</summary>
public static class Heap
{
    /// <summary>Collects fully (finalizers included) and counts the references still alive.</summary>
    public static int Alive(IEnumerable<WeakReference> objects)
    {
        GC.Collect();
        GC.WaitForPendingFinalizers();
        GC.Collect();
        return objects.Count(w => w.IsAlive);
    }
}
