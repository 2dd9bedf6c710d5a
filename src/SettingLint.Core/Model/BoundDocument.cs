using System.Collections.Frozen;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Model;

/// <summary>One bound setting file: its kind, its place, and its values by key path (dots between keys).</summary>
public sealed class BoundDocument(string kind, string path, string relativePath, YMapping root, FrozenDictionary<string, BoundValue> values)
{
    /// <summary>motor-protection, bus or relay-model.</summary>
    public string Kind { get; } = kind;

    /// <summary>Absolute path.</summary>
    public string Path { get; } = path;

    /// <summary>Relative to the repository root, forward slashes.</summary>
    public string RelativePath { get; } = relativePath;

    /// <summary>The YAML tree, for spans of keys that have no bound value.</summary>
    public YMapping Root { get; } = root;

    /// <summary>Every bound value by key path.</summary>
    public FrozenDictionary<string, BoundValue> Values { get; } = values;

    /// <summary>The value at a key path, when present and bound.</summary>
    public BoundValue? this[string path] => Values.GetValueOrDefault(path);

    /// <summary>A dimensioned or plain number at a key path.</summary>
    public MeasureValue? Measure(string path) => this[path] as MeasureValue;

    /// <summary>A text at a key path.</summary>
    public string? Text(string path) => (this[path] as TextValue)?.Value;

    /// <summary>A flag at a key path.</summary>
    public bool? Flag(string path) => (this[path] as FlagValue)?.Value;

    /// <summary>The equipment tag, or the file name when the tag is missing.</summary>
    public string Tag => Text("tag") ?? System.IO.Path.GetFileNameWithoutExtension(RelativePath);

    /// <summary>The span of the node at a key path (a key's value, or the key of a mapping), for placing findings.</summary>
    public SourceSpan SpanOf(string path)
    {
        if (Values.TryGetValue(path, out var v)) return v.Span;
        YNode node = Root;
        YScalar? key = null;
        foreach (var part in path.Split('.'))
        {
            if (node is not YMapping m || m.Find(part) is not { } e) return key?.Span ?? SourceSpan.FileStart;
            key = e.Key;
            node = e.Value;
        }
        return node is YScalar ? node.Span : key?.Span ?? SourceSpan.FileStart;
    }
}
