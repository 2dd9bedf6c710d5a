using System.Globalization;
using Newtonsoft.Json.Linq;
using NJsonSchema;
using NJsonSchema.Validation;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Validation;

/// <summary>Validates a YAML tree against a JSON Schema and turns each error into an SL003-SL006 finding at the YAML position.</summary>
public static class SchemaValidator
{
    /// <summary>The YAML node a JSON token was made from, with its key path.</summary>
    private sealed record Origin(YNode Node, YScalar? Key, string Path);

    /// <summary>Validates a mapping; findings go to the builder. Extra properties are added to the JSON before validation (an inline bus has no kind).</summary>
    public static void Validate(YMapping root, JsonSchema schema, FindingBuilder findings, string pathPrefix = "", IReadOnlyDictionary<string, object>? synthetic = null)
    {
        var json = (JObject)ToJson(root, null, pathPrefix);
        if (synthetic is not null)
        {
            foreach (var (k, v) in synthetic)
            {
                if (json[k] is null) json[k] = JToken.FromObject(v);
            }
        }
        foreach (var error in Flatten(schema.Validate(json)))
        {
            Report(error, json, findings, pathPrefix);
        }
    }

    private static IEnumerable<ValidationError> Flatten(IEnumerable<ValidationError> errors)
    {
        foreach (var e in errors)
        {
            if (e is ChildSchemaValidationError child && child.Errors.Count > 0)
            {
                // Of the alternatives, the one that came closest explains the problem best.
                var best = child.Errors.Values.OrderBy(v => v.Count).First();
                foreach (var inner in Flatten(best)) yield return inner;
            }
            else
            {
                yield return e;
            }
        }
    }

    private static JToken ToJson(YNode node, YScalar? key, string path)
    {
        JToken token;
        switch (node)
        {
            case YMapping m:
            {
                var obj = new JObject();
                foreach (var entry in m.Entries)
                {
                    var childPath = path.Length == 0 ? entry.Key.Value : path + "." + entry.Key.Value;
                    var prop = new JProperty(entry.Key.Value, ToJson(entry.Value, entry.Key, childPath));
                    prop.AddAnnotation(new Origin(entry.Value, entry.Key, childPath));
                    obj.Add(prop);
                }
                token = obj;
                break;
            }
            case YSequence s:
            {
                var arr = new JArray();
                for (var i = 0; i < s.Items.Length; i++)
                {
                    arr.Add(ToJson(s.Items[i], null, path + "[" + i.ToString(CultureInfo.InvariantCulture) + "]"));
                }
                token = arr;
                break;
            }
            case YScalar sc:
                token = sc.Type switch
                {
                    ScalarType.Null => JValue.CreateNull(),
                    ScalarType.Bool => new JValue(sc.Value is "true" or "True" or "TRUE"),
                    ScalarType.Int when long.TryParse(sc.Value, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var l) => new JValue(l),
                    ScalarType.Int or ScalarType.Float => new JValue(CoreSchema.Number(sc.Value) ?? double.NaN),
                    _ => new JValue(sc.Value),
                };
                break;
            default:
                throw new InvalidOperationException("Unknown node type " + node.GetType().Name);
        }
        token.AddAnnotation(new Origin(node, key, path));
        return token;
    }

    private static void Report(ValidationError error, JObject root, FindingBuilder findings, string prefix)
    {
        var origin = error.Token?.Annotation<Origin>() ?? root.Annotation<Origin>()!;
        var valueSpan = origin.Node.Span;
        // A keyless object is the document itself, or a mapping validated on its own (an inline bus): the latter has a place.
        var keySpan = origin.Key?.Span ?? (prefix.Length > 0 ? SourceSpan.At(valueSpan.StartLine, valueSpan.StartColumn) : SourceSpan.FileStart);
        var path = origin.Path;
        var name = origin.Key?.Value ?? (path.Length > 0 ? path : error.Property ?? "");
        var schema = error.Schema;
        switch (error.Kind)
        {
            case ValidationErrorKind.NoAdditionalPropertiesAllowed:
            {
                var parentSchema = error.Schema;
                var known = parentSchema is null ? [] : SchemaFacts.Keys(parentSchema).ToArray();
                var nearest = Suggestions.Nearest(name, known);
                var where = ParentOf(path);
                if (nearest is not null)
                {
                    findings.Add(EngineRules.UnknownKey, keySpan, path,
                        "Unknown key '{key}'{where}; did you mean '{suggestion}'?",
                        ("key", name), ("where", where.Length == 0 ? "" : " in " + where), ("suggestion", nearest));
                }
                else
                {
                    findings.Add(EngineRules.UnknownKey, keySpan, path,
                        "Unknown key '{key}'{where}; the known keys here are {known}.",
                        ("key", name), ("where", where.Length == 0 ? "" : " in " + where), ("known", string.Join(", ", known)));
                }
                return;
            }
            case ValidationErrorKind.PropertyRequired:
            {
                // The token is the object that lacks the key; place the finding on that object's key.
                var missing = error.Property ?? "";
                var full = path.Length == 0 ? missing : path + "." + missing;
                // The engine reports a missing `format` itself, before validation; once is enough.
                if (findings.Findings.Any(f => f.RuleId == EngineRules.MissingKey && f.KeyPath == full)) return;
                var title = schema is not null && SchemaFacts.Child(schema, missing) is { } ms && !string.IsNullOrEmpty(ms.Title) ? " (" + ms.Title + ")" : "";
                findings.Add(EngineRules.MissingKey, keySpan, full,
                    "The required key '{key}'{title} is missing{where}.",
                    ("key", missing), ("title", title), ("where", path.Length == 0 ? "" : " from " + path));
                return;
            }
        }
        if (findings.HasAt(valueSpan)) return;
        var isQuantity = schema is not null && SchemaFacts.DimensionToken(schema) is not null;
        var shown = Shown(origin.Node);
        if (isQuantity && error.Kind is ValidationErrorKind.StringExpected)
        {
            // A relay-model range ("setting") takes its setting's dimension, which the binder knows: it reports the scalar.
            if (Quantities.Dimensions.Parse(SchemaFacts.DimensionToken(schema!)!) is null && origin.Node is YScalar) return;
            var dim = Quantities.Dimensions.Parse(SchemaFacts.DimensionToken(schema!)!) ?? Quantities.Dimension.None;
            var context = Quantities.UnitContexts.Of(path.StartsWith("ranges.", StringComparison.Ordinal) ? "protection." + path : path);
            var problem = origin.Node is YScalar { Type: ScalarType.Int or ScalarType.Float } number
                ? Quantities.QuantityParser.Explain(new Quantities.QuantityParse(null, Quantities.QuantityError.MissingUnit, null), number.Value, dim, context)
                : "'" + name + "' must be a number and a unit, not " + shown + ".";
            findings.Add(EngineRules.Unit, valueSpan, path, "{problem}", ("problem", problem));
            return;
        }
        var expected = error.Kind switch
        {
            ValidationErrorKind.StringExpected => "text",
            ValidationErrorKind.NumberExpected => "a number",
            ValidationErrorKind.IntegerExpected => "a whole number",
            ValidationErrorKind.BooleanExpected => "true or false",
            ValidationErrorKind.ObjectExpected => "a mapping of keys",
            ValidationErrorKind.ArrayExpected => "a list",
            _ => null,
        };
        if (expected is not null)
        {
            findings.Add(EngineRules.WrongType, valueSpan, path,
                "'{key}' must be {expected}, not {what}.", ("key", name), ("expected", expected), ("what", shown));
            return;
        }
        var detail = error.Kind switch
        {
            ValidationErrorKind.NotInEnumeration => "must be one of " + string.Join(", ", (schema?.Enumeration ?? []).Select(v => Convert.ToString(v, CultureInfo.InvariantCulture))),
            ValidationErrorKind.NumberTooSmall => "is below its smallest allowed value" + Bound(schema?.Minimum ?? schema?.ExclusiveMinimum, schema?.IsExclusiveMinimum == true || schema?.ExclusiveMinimum is not null),
            ValidationErrorKind.NumberTooBig => "is above its largest allowed value" + Bound(schema?.Maximum ?? schema?.ExclusiveMaximum, schema?.IsExclusiveMaximum == true || schema?.ExclusiveMaximum is not null, upper: true),
            ValidationErrorKind.PatternMismatch => "does not have the expected form" + (schema?.Description is { Length: > 0 } d ? " (" + d + ")" : ""),
            ValidationErrorKind.StringTooShort => "must not be empty",
            ValidationErrorKind.TooFewItems => "needs more items",
            _ => "is not valid here (" + error.Kind + ")",
        };
        findings.Add(EngineRules.WrongType, valueSpan, path, "'{key}' {detail}; it is {what}.", ("key", name), ("detail", detail), ("what", shown));
    }

    private static string Bound(decimal? value, bool exclusive, bool upper = false) =>
        value is null ? "" : (upper ? (exclusive ? " (must be below " : " (at most ") : (exclusive ? " (must be above " : " (at least "))
            + value.Value.ToString(CultureInfo.InvariantCulture) + ")";

    private static string ParentOf(string path)
    {
        var i = path.LastIndexOf('.');
        return i < 0 ? "" : path[..i];
    }

    private static string Shown(YNode node) => node switch
    {
        YScalar s when s.Type == ScalarType.Null => "empty",
        YScalar s => "'" + (s.Value.Length > 40 ? s.Value[..40] + "..." : s.Value) + "'",
        _ => node.Describe(),
    };
}
