using SettingLint.Core.Documents;

namespace SettingLint.Core.Model;

/// <summary>One bound setting file: its kind, its place, and its values by key path (dots between keys).</summary>
/// <remarks>
/// It keeps no YAML tree: a run holds every document until its rules have run, and the trees of thousands of files
/// are most of a run's memory. What findings still need of the tree, the spans of keys, is taken when it is made.
/// </remarks>
public sealed class BoundDocument
{
    private readonly Dictionary<string, BoundValue> _values;
    private readonly KeySpans _keys;

    /// <summary>A document bound from a tree; the tree is read here for its key spans and not kept.</summary>
    public BoundDocument(string kind, string path, string relativePath, YMapping root, IReadOnlyDictionary<string, BoundValue> values)
    {
        ArgumentNullException.ThrowIfNull(root);
        ArgumentNullException.ThrowIfNull(values);
        Kind = kind;
        Path = path;
        RelativePath = relativePath;
        // Each value gets the process's one string of its path, so that the document keeps only what is its own.
        _values = new Dictionary<string, BoundValue>(values.Count, StringComparer.Ordinal);
        foreach (var (key, value) in values)
        {
            var shared = KeyPaths.Shared(key);
            _values[shared] = value.Path == key && !ReferenceEquals(value.Path, shared) ? value with { Path = shared } : value;
        }
        _keys = KeySpans.Of(root, _values);
    }

    /// <summary>
    /// A document made of a binder's own dictionary, whose keys and value paths are already the shared strings of
    /// <see cref="KeyPaths"/>: it is kept as it is, not copied.
    /// </summary>
    internal static BoundDocument OfBinder(string kind, string path, string relativePath, YMapping root, Dictionary<string, BoundValue> values) =>
        new(kind, path, relativePath, values, KeySpans.Of(root, values));

    private BoundDocument(string kind, string path, string relativePath, Dictionary<string, BoundValue> values, KeySpans keys)
    {
        Kind = kind;
        Path = path;
        RelativePath = relativePath;
        _values = values;
        _keys = keys;
    }

    /// <summary>motor-protection, bus or relay-model.</summary>
    public string Kind { get; }

    /// <summary>Absolute path.</summary>
    public string Path { get; }

    /// <summary>Relative to the repository root, forward slashes.</summary>
    public string RelativePath { get; }

    /// <summary>Every bound value by key path.</summary>
    public IReadOnlyDictionary<string, BoundValue> Values => _values;

    /// <summary>The value at a key path, when present and bound.</summary>
    public BoundValue? this[string path] => _values.GetValueOrDefault(path);

    /// <summary>A dimensioned or plain number at a key path.</summary>
    public MeasureValue? Measure(string path) => this[path] as MeasureValue;

    /// <summary>A text at a key path.</summary>
    public string? Text(string path) => (this[path] as TextValue)?.Value;

    /// <summary>A flag at a key path.</summary>
    public bool? Flag(string path) => (this[path] as FlagValue)?.Value;

    /// <summary>The equipment tag, or the file name when the tag is missing.</summary>
    public string Tag => Text("tag") ?? System.IO.Path.GetFileNameWithoutExtension(RelativePath);

    /// <summary>
    /// The span of the node at a key path, for placing findings: its bound value, else a scalar written there,
    /// else the key of the mapping or list there, else the deepest key on the way, else the file's start.
    /// </summary>
    public SourceSpan SpanOf(string path) => _values.TryGetValue(path, out var v) ? v.Span : _keys.SpanOf(path);
}
