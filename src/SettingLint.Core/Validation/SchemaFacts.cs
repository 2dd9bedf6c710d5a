using SettingLint.Core.Quantities;

namespace SettingLint.Core.Validation;

/// <summary>What the binder and the rule compiler read off a schema: dimensions, child schemas and leaf paths.</summary>
public static class SchemaFacts
{
    /// <summary>The dimension of a schema node, when it is a quantity of a fixed dimension.</summary>
    public static Dimension? DimensionOf(SchemaNode schema) => schema.ParsedDimension;

    /// <summary>The schema of a dotted key path below a schema.</summary>
    public static SchemaNode? ResolvePath(SchemaNode root, string path)
    {
        SchemaNode? s = root;
        foreach (var part in path.Split('.'))
        {
            s = s?.Child(part);
        }
        return s;
    }

    /// <summary>Every leaf path of a schema (dots between keys), in the order written: a mapping of named keys is walked, anything else is a leaf.</summary>
    public static IEnumerable<(string Path, SchemaNode Schema)> Leaves(SchemaNode schema, string prefix = "")
    {
        foreach (var (key, s) in schema.PropertyList)
        {
            var path = prefix.Length == 0 ? key : prefix + "." + key;
            if (s.PropertyList.Length > 0 && s.Allows(JsonType.Object) && !s.Allows(JsonType.String))
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
