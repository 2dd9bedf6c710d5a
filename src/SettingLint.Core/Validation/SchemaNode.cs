using System.Collections.Immutable;
using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;

namespace SettingLint.Core.Validation;

/// <summary>The JSON types of JSON Schema's `type` keyword.</summary>
public enum JsonType
{
    Null,
    Boolean,
    Integer,
    Number,
    String,
    Array,
    Object,
}

/// <summary>An `enum` member: a string or a number (the only kinds our schemas list).</summary>
/// <remarks>A class, not a struct: generic code over reference types is precompiled (ReadyToRun), over our own structs it is compiled at start-up.</remarks>
public sealed record EnumValue(string? Text, double? Number)
{
    public override string ToString() => Text ?? Number!.Value.ToString(CultureInfo.InvariantCulture);
}

/// <summary>
/// One node of a JSON Schema (draft-07), read once from the embedded schema files with System.Text.Json.
/// Only the keywords the validator enforces are accepted; a schema that uses any other keyword is refused when it is read,
/// so a schema author can never rely on a check that silently does not happen.
/// </summary>
public sealed class SchemaNode
{
    /// <summary>Keywords that only annotate: they never make a value invalid.</summary>
    private static readonly HashSet<string> Annotations = new(StringComparer.Ordinal)
    {
        "$schema", "$id", "$comment", "title", "description", "default", "examples",
    };

    /// <summary>The annotation key that marks a dimensioned string value.</summary>
    public const string DimensionKey = "x-dimension";

    private SchemaNode()
    {
    }

    public string? Title { get; private init; }

    public string? Description { get; private init; }

    /// <summary>The allowed types as bits (1 &lt;&lt; JsonType); zero when the schema has no `type` and allows any.</summary>
    private int TypeMask { get; init; }

    /// <summary>The first type written, which names what was expected in a message; null when any type is allowed.</summary>
    public JsonType? FirstType { get; private init; }

    /// <summary>True when `type` names this type itself (integer is not named by number here).</summary>
    public bool Names(JsonType type) => (TypeMask & (1 << (int)type)) != 0;

    /// <summary>Named properties, in the order written.</summary>
    public ImmutableArray<(string Name, SchemaNode Schema)> PropertyList { get; private init; } = [];

    // A plain dictionary: building a frozen one for each of some 150 small nodes cost more at start-up than it saves.
    public IReadOnlyDictionary<string, SchemaNode> Properties { get; private init; } = new Dictionary<string, SchemaNode>();

    public ImmutableArray<(Regex Pattern, SchemaNode Schema)> PatternProperties { get; private init; } = [];

    /// <summary>False for `additionalProperties: false`.</summary>
    public bool AdditionalAllowed { get; private init; } = true;

    /// <summary>The schema of keys that neither a property nor a pattern names, when one is given.</summary>
    public SchemaNode? Additional { get; private init; }

    public ImmutableArray<string> Required { get; private init; } = [];

    public ImmutableArray<EnumValue>? Enum { get; private init; }

    public Regex? Pattern { get; private init; }

    public int? MinLength { get; private init; }

    public double? Minimum { get; private init; }

    public double? ExclusiveMinimum { get; private init; }

    public double? Maximum { get; private init; }

    public double? ExclusiveMaximum { get; private init; }

    public SchemaNode? Items { get; private init; }

    public int? MinItems { get; private init; }

    /// <summary>The dimension token of a quantity (current, voltage, ..., or "setting"); null for other values.</summary>
    public string? Dimension { get; private init; }

    /// <summary>The dimension the token names, read once with the schema: the binder asks for it at every value.</summary>
    public Quantities.Dimension? ParsedDimension { get; private init; }

    /// <summary>True when the node allows the type (no `type` keyword allows all).</summary>
    public bool Allows(JsonType type) => TypeMask == 0 || Names(type) || (type == JsonType.Integer && Names(JsonType.Number));

    /// <summary>The schema of a key of an object schema, by its properties or else its pattern properties.</summary>
    public SchemaNode? Child(string key)
    {
        if (Properties.TryGetValue(key, out var named)) return named;
        foreach (var (pattern, schema) in PatternProperties)
        {
            if (pattern.IsMatch(key)) return schema;
        }
        return Additional;
    }

    /// <summary>Reads a schema document; throws <see cref="InvalidOperationException"/> for a keyword the validator does not enforce.</summary>
    public static SchemaNode Read(string json, string name)
    {
        using var doc = JsonDocument.Parse(json);
        return Read(doc.RootElement, name, "#");
    }

    private static SchemaNode Read(JsonElement e, string name, string where)
    {
        if (e.ValueKind != JsonValueKind.Object) throw Refuse(name, where, "a schema must be an object");
        var typeMask = 0;
        JsonType? firstType = null;
        var properties = ImmutableArray.CreateBuilder<(string, SchemaNode)>();
        var patterns = ImmutableArray.CreateBuilder<(Regex, SchemaNode)>();
        var additionalAllowed = true;
        SchemaNode? additional = null;
        ImmutableArray<string> required = [];
        ImmutableArray<EnumValue>? enumValues = null;
        Regex? pattern = null;
        int? minLength = null, minItems = null;
        double? minimum = null, exclusiveMinimum = null, maximum = null, exclusiveMaximum = null;
        SchemaNode? items = null;
        string? title = null, description = null, dimension = null;
        foreach (var p in e.EnumerateObject())
        {
            var at = where + "/" + p.Name;
            switch (p.Name)
            {
                case "title": title = p.Value.GetString(); break;
                case "description": description = p.Value.GetString(); break;
                case DimensionKey: dimension = p.Value.GetString(); break;
                case "type":
                    foreach (var t in p.Value.ValueKind == JsonValueKind.Array ? [.. p.Value.EnumerateArray()] : (JsonElement[])[p.Value])
                    {
                        var type = TypeOf(t, name, at);
                        firstType ??= type;
                        typeMask |= 1 << (int)type;
                    }
                    break;
                case "properties":
                    foreach (var child in p.Value.EnumerateObject())
                    {
                        properties.Add((child.Name, Read(child.Value, name, at + "/" + child.Name)));
                    }
                    break;
                case "patternProperties":
                    foreach (var child in p.Value.EnumerateObject())
                    {
                        patterns.Add((Compile(child.Name), Read(child.Value, name, at + "/" + child.Name)));
                    }
                    break;
                case "additionalProperties":
                    if (p.Value.ValueKind is JsonValueKind.True or JsonValueKind.False) additionalAllowed = p.Value.GetBoolean();
                    else additional = Read(p.Value, name, at);
                    break;
                case "required":
                    var names = new List<string>();
                    foreach (var r in p.Value.EnumerateArray()) names.Add(r.GetString()!);
                    required = [.. names];
                    break;
                case "enum":
                    var members = new List<EnumValue>();
                    foreach (var v in p.Value.EnumerateArray())
                    {
                        members.Add(v.ValueKind switch
                        {
                            JsonValueKind.String => new EnumValue(v.GetString(), null),
                            JsonValueKind.Number => new EnumValue(null, v.GetDouble()),
                            _ => throw Refuse(name, at, "enum members must be strings or numbers"),
                        });
                    }
                    enumValues = [.. members];
                    break;
                case "pattern": pattern = Compile(p.Value.GetString()!); break;
                case "minLength": minLength = p.Value.GetInt32(); break;
                case "minItems": minItems = p.Value.GetInt32(); break;
                case "minimum": minimum = p.Value.GetDouble(); break;
                case "exclusiveMinimum": exclusiveMinimum = Bound(p.Value, name, at); break;
                case "maximum": maximum = p.Value.GetDouble(); break;
                case "exclusiveMaximum": exclusiveMaximum = Bound(p.Value, name, at); break;
                case "items": items = Read(p.Value, name, at); break;
                default:
                    if (!Annotations.Contains(p.Name)) throw Refuse(name, at, "the keyword '" + p.Name + "' is not enforced by SettingLint's validator");
                    break;
            }
        }
        var named = properties.ToImmutable();
        var byName = new Dictionary<string, SchemaNode>(named.Length, StringComparer.Ordinal);
        foreach (var (key, schema) in named) byName[key] = schema;
        return new SchemaNode
        {
            Title = title,
            Description = description,
            Dimension = dimension,
            ParsedDimension = dimension is null ? null : Quantities.Dimensions.Parse(dimension),
            TypeMask = typeMask,
            FirstType = firstType,
            PropertyList = named,
            Properties = byName,
            PatternProperties = patterns.ToImmutable(),
            AdditionalAllowed = additionalAllowed,
            Additional = additional,
            Required = required,
            Enum = enumValues,
            Pattern = pattern,
            MinLength = minLength,
            MinItems = minItems,
            Minimum = minimum,
            ExclusiveMinimum = exclusiveMinimum,
            Maximum = maximum,
            ExclusiveMaximum = exclusiveMaximum,
            Items = items,
        };
    }

    // Draft-07 §6.2.3: exclusiveMinimum is a number; draft 4's boolean form would change its meaning silently.
    private static double Bound(JsonElement v, string name, string at) =>
        v.ValueKind == JsonValueKind.Number ? v.GetDouble() : throw Refuse(name, at, "exclusive bounds are numbers (draft-07), not the draft-4 boolean");

    private static JsonType TypeOf(JsonElement t, string name, string at) => t.GetString() switch
    {
        "null" => JsonType.Null,
        "boolean" => JsonType.Boolean,
        "integer" => JsonType.Integer,
        "number" => JsonType.Number,
        "string" => JsonType.String,
        "array" => JsonType.Array,
        "object" => JsonType.Object,
        var other => throw Refuse(name, at, "unknown type '" + other + "'"),
    };

    // Schema patterns are ECMA 262 regular expressions, unanchored (draft-07 §4.3); ours stay within the common subset.
    private static Regex Compile(string pattern) =>
        new(pattern, RegexOptions.CultureInvariant | RegexOptions.ECMAScript, TimeSpan.FromSeconds(1));

    private static InvalidOperationException Refuse(string name, string at, string why) =>
        new("The schema " + name + " cannot be used at " + at + ": " + why + ".");
}
