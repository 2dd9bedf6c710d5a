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

    [ThreadStatic]
    private static List<Entry>? t_keys;

    [ThreadStatic]
    private static List<Entry>? t_scalars;

    private readonly Entry[] _keys;

    // Scalars that did not bind (a wrong type, an empty value): a bound one gives its value's span itself.
    private readonly Entry[] _unboundScalars;

    private KeySpans(Entry[] keys, Entry[] unboundScalars)
    {
        _keys = keys;
        _unboundScalars = unboundScalars;
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
            var k = keys.ToArray();
            var s = scalars.ToArray();
            Array.Sort(k, ByPath);
            Array.Sort(s, ByPath);
            return new KeySpans(k, s);
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
            var bound = values.TryGetValue(path, out var v) && v.Path == path;
            if (bound) path = v!.Path;
            keys.Add(new Entry(path, e.Key.Span));
            if (e.Value is YScalar && !bound) scalars.Add(new Entry(path, e.Value.Span));
            if (e.Value is YMapping child) Walk(child, path, values, keys, scalars);
        }
    }

    /// <summary>
    /// The key spans that <see cref="SpanOf"/> reads for these paths: a scalar at one of them, and the keys at each of
    /// them and on the way to each.
    /// </summary>
    public KeySpans Restrict(IReadOnlySet<string> paths)
    {
        var onTheWay = new HashSet<string>(StringComparer.Ordinal);
        foreach (var p in paths)
        {
            onTheWay.Add(p);
            for (var dot = p.LastIndexOf('.'); dot >= 0; dot = p.LastIndexOf('.', dot - 1))
            {
                onTheWay.Add(p[..dot]);
                if (dot == 0) break;
            }
        }
        // Both arrays are sorted already, and a subset of a sorted array in its order is sorted.
        return new KeySpans(
            [.. _keys.Where(e => onTheWay.Contains(e.Path))],
            [.. _unboundScalars.Where(e => paths.Contains(e.Path))]);
    }

    /// <summary>
    /// The span for a path that has no bound value: a scalar written there, else the key there (of a mapping or list),
    /// else the deepest key on the way (whose value has no such child), else the file's start.
    /// </summary>
    public SourceSpan SpanOf(string path)
    {
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
