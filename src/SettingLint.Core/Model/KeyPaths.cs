using System.Collections.Concurrent;

namespace SettingLint.Core.Model;

/// <summary>
/// One string for each key path, shared by every document of the process. Thousands of motor files bind the same
/// few hundred paths, and a path string per value and file was a third of what a run keeps of each file.
/// </summary>
internal static class KeyPaths
{
    // Unknown keys make paths too, so the pool stops growing at a size no schema comes near; later paths are kept as they are.
    private const int Capacity = 8192;

    private static readonly ConcurrentDictionary<string, string> Pool = new(StringComparer.Ordinal);

    private static int _count;

    /// <summary>The shared string equal to a path.</summary>
    public static string Shared(string path)
    {
        if (Pool.TryGetValue(path, out var shared)) return shared;
        if (Volatile.Read(ref _count) >= Capacity) return path;
        shared = Pool.GetOrAdd(path, path);
        if (ReferenceEquals(shared, path)) Interlocked.Increment(ref _count);
        return shared;
    }
}
