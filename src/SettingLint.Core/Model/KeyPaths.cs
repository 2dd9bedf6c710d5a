using System.Collections.Concurrent;

namespace SettingLint.Core.Model;

/// <summary>
/// One string for each key path, shared by every document of the process. Thousands of motor files bind the same
/// few hundred paths, and a path string per value and file was a third of what a run keeps of each file.
/// </summary>
/// <remarks>
/// What it buys, measured at 10,000 generated motors (in-process harness, JIT build, 2026-12-05, docs/performance.md):
/// a check allocates 119 KB per file with it and 131 KB without (10 % more work for the collector), and the heap left
/// after a collection peaks at 63 MB against 66 MB. It is process-wide but bounded: it stops taking paths at
/// <see cref="Capacity"/> paths (a few MB at most), so that a long-lived host does not grow with the keys people type.
/// </remarks>
internal static class KeyPaths
{
    // Unknown keys make paths too, so the pool stops growing at a size no schema comes near; later paths are kept as they are.
    private const int Capacity = 8192;

    private static readonly ConcurrentDictionary<string, string> Pool = new(StringComparer.Ordinal);

    // A shared path (by reference: it is one of the pool's strings), then a key below it, to the shared path of both: a
    // path is found without being written out first. Dictionaries of strings only, whose code the runtime has ready at start.
    private static readonly ConcurrentDictionary<string, ConcurrentDictionary<string, string>> Joined = new(ReferenceEqualityComparer.Instance);

    private static int _count;

    [ThreadStatic]
    private static string? t_lastPrefix;

    [ThreadStatic]
    private static ConcurrentDictionary<string, string>? t_lastBelow;

    /// <summary>The shared string equal to a path.</summary>
    public static string Shared(string path)
    {
        if (Pool.TryGetValue(path, out var shared)) return shared;
        if (Volatile.Read(ref _count) >= Capacity) return path;
        shared = Pool.GetOrAdd(path, path);
        if (ReferenceEquals(shared, path)) Interlocked.Increment(ref _count);
        return shared;
    }

    /// <summary>
    /// The shared path of a key below a path (null at the root, where the path is the key itself; below a root key ""
    /// it starts with a dot). Fastest when the prefix is itself a shared path, as every path this returns is.
    /// </summary>
    public static string Join(string? prefix, string key)
    {
        if (prefix is null) return Shared(key);
        // The keys of one mapping come one after another: this thread's last prefix spares the lookup of its keys' table.
        var below = ReferenceEquals(t_lastPrefix, prefix) ? t_lastBelow : Joined.GetValueOrDefault(prefix);
        if (below is not null)
        {
            (t_lastPrefix, t_lastBelow) = (prefix, below);
            if (below.TryGetValue(key, out var found)) return found;
        }
        var joined = Shared(prefix + "." + key);
        // Only shared paths are remembered: a prefix that is not one would never be asked for again by reference.
        if (ReferenceEquals(Shared(prefix), prefix) && Volatile.Read(ref _count) < Capacity)
        {
            below ??= Joined.GetOrAdd(prefix, static _ => new ConcurrentDictionary<string, string>(StringComparer.Ordinal));
            below.TryAdd(key, joined);
        }
        return joined;
    }
}
