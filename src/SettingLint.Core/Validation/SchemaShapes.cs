
namespace SettingLint.Core.Validation;

/// <summary>The shape of a leaf key as a rule sees it: its JSON type and, for a quantity, its dimension token.</summary>
internal sealed record LeafShape(string Path, string Type, string? Dimension);

/// <summary>The leaf keys of an embedded schema with their shapes, which rules are type-checked against.</summary>
internal static class SchemaShapes
{
    private static readonly System.Collections.Concurrent.ConcurrentDictionary<string, IReadOnlyDictionary<string, LeafShape>> Cache = new(StringComparer.Ordinal);

    /// <summary>Every leaf path of an embedded schema (dots between keys), with its shape.</summary>
    public static IReadOnlyDictionary<string, LeafShape> Leaves(string schemaName) =>
        Cache.GetOrAdd(schemaName, static n => SchemaFacts.Leaves(SchemaSet.Shared.Get(n))
            .Select(l => new LeafShape(l.Path, TypeOf(l.Schema), l.Schema.Dimension))
            .ToDictionary(l => l.Path, StringComparer.Ordinal));

    private static string TypeOf(SchemaNode s) =>
        s.Dimension is not null ? "string"
        : s.Names(JsonType.Boolean) ? "boolean"
        : s.Names(JsonType.Number) || s.Names(JsonType.Integer) ? "number"
        : "string";
}
