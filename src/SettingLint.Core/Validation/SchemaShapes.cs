using System.Collections.Frozen;
using System.Text.Json;

namespace SettingLint.Core.Validation;

/// <summary>The shape of a leaf key as a rule sees it: its JSON type and, for a quantity, its dimension token.</summary>
public sealed record LeafShape(string Path, string Type, string? Dimension);

/// <summary>
/// The leaf keys of a schema read with System.Text.Json, without building NJsonSchema objects: rules compile against
/// these while the validating schemas are still being read on another thread (the start-up of a one-file check).
/// </summary>
public static class SchemaShapes
{
    private static readonly System.Collections.Concurrent.ConcurrentDictionary<string, FrozenDictionary<string, LeafShape>> Cache = new(StringComparer.Ordinal);

    /// <summary>Every leaf path of an embedded schema (dots between keys), with its shape.</summary>
    public static FrozenDictionary<string, LeafShape> Leaves(string schemaName) =>
        Cache.GetOrAdd(schemaName, static n =>
        {
            using var doc = JsonDocument.Parse(SchemaSet.Text(n));
            var leaves = new Dictionary<string, LeafShape>(StringComparer.Ordinal);
            Walk(doc.RootElement, "", leaves);
            return leaves.ToFrozenDictionary(StringComparer.Ordinal);
        });

    private static void Walk(JsonElement schema, string prefix, Dictionary<string, LeafShape> leaves)
    {
        if (!schema.TryGetProperty("properties", out var props) || props.ValueKind != JsonValueKind.Object) return;
        foreach (var p in props.EnumerateObject())
        {
            var path = prefix.Length == 0 ? p.Name : prefix + "." + p.Name;
            var types = TypesOf(p.Value);
            var isObject = types.Contains("object") && !types.Contains("string") && p.Value.TryGetProperty("properties", out var inner) && inner.ValueKind == JsonValueKind.Object;
            if (isObject)
            {
                Walk(p.Value, path, leaves);
                continue;
            }
            var dimension = p.Value.TryGetProperty(SchemaFacts.DimensionKey, out var d) && d.ValueKind == JsonValueKind.String ? d.GetString() : null;
            var type = dimension is not null ? "string"
                : types.Contains("boolean") ? "boolean"
                : types.Contains("number") || types.Contains("integer") ? "number"
                : "string";
            leaves[path] = new LeafShape(path, type, dimension);
        }
    }

    private static List<string> TypesOf(JsonElement schema)
    {
        var list = new List<string>();
        if (!schema.TryGetProperty("type", out var t)) return list;
        if (t.ValueKind == JsonValueKind.String) list.Add(t.GetString()!);
        else if (t.ValueKind == JsonValueKind.Array) list.AddRange(t.EnumerateArray().Where(x => x.ValueKind == JsonValueKind.String).Select(x => x.GetString()!));
        return list;
    }
}
