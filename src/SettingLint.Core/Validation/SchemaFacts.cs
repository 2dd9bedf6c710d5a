using NJsonSchema;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Validation;

/// <summary>What the binder reads off a schema node: its dimension annotation and its child schemas.</summary>
public static class SchemaFacts
{
    /// <summary>The annotation key that marks a dimensioned string value.</summary>
    public const string DimensionKey = "x-dimension";

    /// <summary>The dimension token of a schema node (current, voltage, ..., or "setting"); null for non-quantities.</summary>
    public static string? DimensionToken(JsonSchema schema)
    {
        var s = schema.ActualSchema;
        if (s.ExtensionData is { } ext && ext.TryGetValue(DimensionKey, out var v) && v is string token) return token;
        if (schema.ExtensionData is { } ext2 && ext2.TryGetValue(DimensionKey, out var v2) && v2 is string token2) return token2;
        return null;
    }

    /// <summary>The dimension of a schema node, when it is a quantity of a fixed dimension.</summary>
    public static Dimension? DimensionOf(JsonSchema schema) =>
        DimensionToken(schema) is { } t ? Dimensions.Parse(t) : null;

    /// <summary>The schema of a key of an object schema, by its properties or pattern properties.</summary>
    public static JsonSchema? Child(JsonSchema parent, string key)
    {
        var p = parent.ActualSchema;
        if (p.ActualProperties.TryGetValue(key, out var prop)) return prop.ActualSchema;
        foreach (var (pattern, schema) in p.PatternProperties)
        {
            if (System.Text.RegularExpressions.Regex.IsMatch(key, pattern, System.Text.RegularExpressions.RegexOptions.None, TimeSpan.FromSeconds(1)))
            {
                return schema.ActualSchema;
            }
        }
        return null;
    }

    /// <summary>The known keys of an object schema, for "did you mean".</summary>
    public static IEnumerable<string> Keys(JsonSchema schema) => schema.ActualSchema.ActualProperties.Keys;

    /// <summary>Every leaf path of a schema with its dimension token (null for non-quantities), for rule compilation.</summary>
    public static IEnumerable<(string Path, JsonSchema Schema)> Leaves(JsonSchema schema, string prefix = "")
    {
        foreach (var (key, prop) in schema.ActualSchema.ActualProperties)
        {
            var path = prefix.Length == 0 ? key : prefix + "." + key;
            var s = prop.ActualSchema;
            if (s.ActualProperties.Count > 0 && s.Type.HasFlag(JsonObjectType.Object) && !s.Type.HasFlag(JsonObjectType.String))
            {
                foreach (var leaf in Leaves(s, path)) yield return leaf;
            }
            else
            {
                yield return (path, s);
            }
        }
    }
}
