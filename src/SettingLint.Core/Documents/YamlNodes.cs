using System.Collections.Immutable;

namespace SettingLint.Core.Documents;

/// <summary>A node of a loaded YAML document; every node keeps its source span.</summary>
public abstract class YNode
{
    private protected YNode(SourceSpan span) => Span = span;

    /// <summary>Where the node stands in its file.</summary>
    public SourceSpan Span { get; }

    /// <summary>A short name of the node's kind, for messages: "a mapping", "a list", "text".</summary>
    public abstract string Describe();
}

/// <summary>How a scalar was written, which decides how it resolves.</summary>
public enum ScalarStyle
{
    Plain,
    Quoted,
    Block,
}

/// <summary>The YAML 1.2 core-schema type a scalar resolves to.</summary>
public enum ScalarType
{
    Null,
    Bool,
    Int,
    Float,
    String,
}

/// <summary>A scalar: its text as written (after YAML unescaping), how it was written, and its resolved type.</summary>
public sealed class YScalar : YNode
{
    public YScalar(string value, ScalarStyle style, SourceSpan span, bool explicitStringTag = false)
        : base(span)
    {
        Value = value;
        Style = style;
        Type = style == ScalarStyle.Plain && !explicitStringTag ? CoreSchema.Resolve(value) : ScalarType.String;
    }

    public string Value { get; }

    public ScalarStyle Style { get; }

    public ScalarType Type { get; }

    public override string Describe() => Type switch
    {
        ScalarType.Null => "empty",
        ScalarType.Bool => "true/false",
        ScalarType.Int or ScalarType.Float => "a bare number",
        _ => "text",
    };
}

/// <summary>One key and its value in a mapping.</summary>
public sealed record YEntry(YScalar Key, YNode Value);

/// <summary>A mapping whose keys are scalars, in source order, without duplicates (they are findings instead).</summary>
public sealed class YMapping : YNode
{
    public YMapping(ImmutableArray<YEntry> entries, SourceSpan span)
        : base(span) => Entries = entries;

    public ImmutableArray<YEntry> Entries { get; }

    /// <summary>The entry of a key, when present.</summary>
    public YEntry? Find(string key)
    {
        foreach (var e in Entries)
        {
            if (e.Key.Value == key) return e;
        }
        return null;
    }

    /// <summary>The value of a key, when present.</summary>
    public YNode? this[string key] => Find(key)?.Value;

    public override string Describe() => "a mapping";
}

/// <summary>A sequence.</summary>
internal sealed class YSequence : YNode
{
    public YSequence(ImmutableArray<YNode> items, SourceSpan span)
        : base(span) => Items = items;

    public ImmutableArray<YNode> Items { get; }

    public override string Describe() => "a list";
}
