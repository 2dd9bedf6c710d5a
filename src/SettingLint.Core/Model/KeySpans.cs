using SettingLint.Core.Documents;

namespace SettingLint.Core.Model;

/// <summary>
/// What <see cref="BoundDocument.SpanOf"/> needs of a document's tree once the tree is gone: the span of every key a
/// dotted key path can reach, and the span of each scalar written there that has no bound value.
/// </summary>
internal sealed class KeySpans
{
    private readonly record struct Entry(string Path, SourceSpan Span);

    private static readonly Comparison<Entry> ByPath = static (a, b) => string.CompareOrdinal(a.Path, b.Path);

    // Lists kept per thread, cleared after each use (so they hold no document): with RuleSet's spare context they save
    // 16 KB of allocation per file at 10,000 motors (119 against 135 KB); docs/performance.md.
    [ThreadStatic]
    private static List<Entry>? t_keys;

    [ThreadStatic]
    private static List<Entry>? t_scalars;

    private readonly Entry[] _keys;

    // Scalars that did not bind (a wrong type, an empty value): a bound one gives its value's span itself.
    private readonly Entry[] _unboundScalars;

    // Both arrays are sorted by path when first searched: most documents never are, since a bound value has its own span.
    private volatile bool _sorted;

    private KeySpans(Entry[] keys, Entry[] unboundScalars, bool sorted)
    {
        _keys = keys;
        _unboundScalars = unboundScalars;
        _sorted = sorted || (keys.Length <= 1 && unboundScalars.Length <= 1);
    }

    // The lock is the keys array, which is this object's own (an empty one is never locked: it is sorted from the start).
    private void EnsureSorted()
    {
        if (_sorted) return;
        lock (_keys)
        {
            if (_sorted) return;
            Array.Sort(_keys, ByPath);
            Array.Sort(_unboundScalars, ByPath);
            _sorted = true;
        }
    }

    /// <summary>Reads the key spans of a tree; a path that is bound takes the bound value's path string, any other the shared one.</summary>
    public static KeySpans Of(YMapping root, IReadOnlyDictionary<string, BoundValue> values)
    {
        // Lists kept per thread: a document's arrays are allocated once, at their size.
        var keys = t_keys ??= new List<Entry>(256);
        var scalars = t_scalars ??= new List<Entry>(16);
        try
        {
            Walk(root, null, values, keys, scalars);
            return new KeySpans(keys.ToArray(), scalars.ToArray(), sorted: false);
        }
        finally
        {
            keys.Clear();
            scalars.Clear();
        }
    }

    // Only mappings are walked: a path goes through keys, never into a list. A key with a dot in it cannot be
    // named by a dotted path, so neither it nor anything below it is kept. The root's prefix is null, not empty:
    // below a root key "" the paths start with a dot, as the path's parts say.
    private static void Walk(YMapping mapping, string? prefix, IReadOnlyDictionary<string, BoundValue> values, List<Entry> keys, List<Entry> scalars)
    {
        foreach (var e in mapping.Entries)
        {
            if (e.Key.Value.Contains('.', StringComparison.Ordinal)) continue;
            var path = KeyPaths.Join(prefix, e.Key.Value);
            // Only scalars bind: a bound one gives its value's span and its path string (so that both share one).
            if (e.Value is YScalar)
            {
                if (values.TryGetValue(path, out var v) && v.Path == path) path = v.Path;
                else scalars.Add(new Entry(path, e.Value.Span));
            }
            keys.Add(new Entry(path, e.Key.Span));
            if (e.Value is YMapping child) Walk(child, path, values, keys, scalars);
        }
    }

    /// <summary>
    /// The span for a path that has no bound value: a scalar written there, else the key there (of a mapping or list),
    /// else the deepest key on the way (whose value has no such child), else the file's start.
    /// </summary>
    public SourceSpan SpanOf(string path)
    {
        EnsureSorted();
        if (Find(_unboundScalars, path) is { } scalar) return scalar;
        if (Find(_keys, path) is { } key) return key;
        var prefix = path.AsSpan();
        for (var dot = prefix.LastIndexOf('.'); dot >= 0; dot = prefix.LastIndexOf('.'))
        {
            prefix = prefix[..dot];
            if (Find(_keys, prefix) is { } on) return on;
        }
        return SourceSpan.FileStart;
    }

    private static SourceSpan? Find(Entry[] entries, ReadOnlySpan<char> path)
    {
        int lo = 0, hi = entries.Length - 1;
        while (lo <= hi)
        {
            var mid = lo + ((hi - lo) / 2);
            var c = path.SequenceCompareTo(entries[mid].Path);
            if (c == 0) return entries[mid].Span;
            if (c < 0) hi = mid - 1;
            else lo = mid + 1;
        }
        return null;
    }
}
