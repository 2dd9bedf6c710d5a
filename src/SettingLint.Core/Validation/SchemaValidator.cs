using System.Globalization;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Validation;

/// <summary>
/// Validates a YAML tree against a schema read from our JSON Schema files and turns each error into an SL003-SL006
/// finding at the YAML position. It walks the YAML nodes themselves (no JSON copy of the document), which is what
/// makes validation cheap; its verdicts are compared with a general-purpose JSON Schema library in the tests.
/// </summary>
internal static class SchemaValidator
{
    private enum Problem
    {
        UnknownKey,
        MissingKey,
        WrongType,
        NotInEnum,
        TooSmall,
        TooBig,
        Pattern,
        TooShort,
        TooFewItems,
    }

    /// <summary>One schema error: the node it is about, its key and path, the schema that failed, and what failed.</summary>
    private readonly record struct Error(Problem Kind, YNode Node, YScalar? Key, string Path, SchemaNode Schema, string? Name = null, double Limit = 0, bool Exclusive = false);

    /// <summary>The schema verdicts on a document, as (problem, key path) pairs in the order found: for the tests.</summary>
    internal static IEnumerable<(string Problem, string Path)> Verdicts(YMapping root, SchemaNode schema)
    {
        var errors = new List<Error>();
        Check(root, null, "", schema, errors, null);
        return errors.Select(e => (e.Kind.ToString(), e.Kind == Problem.MissingKey ? Join(e.Path, e.Name!) : e.Path));
    }

    /// <summary>Validates a mapping; findings go to the builder. Implied keys count as present (an inline bus has no kind or format of its own).</summary>
    public static void Validate(YMapping root, SchemaNode schema, FindingBuilder findings, string pathPrefix = "", IReadOnlySet<string>? implied = null)
    {
        var errors = new List<Error>();
        Check(root, null, pathPrefix, schema, errors, implied);
        foreach (var error in errors)
        {
            Report(error, findings, pathPrefix);
        }
    }

    /// <summary>The JSON type a YAML node stands for under the core schema.</summary>
    internal static JsonType TypeOf(YNode node) => node switch
    {
        YMapping => JsonType.Object,
        YSequence => JsonType.Array,
        YScalar { Type: ScalarType.Null } => JsonType.Null,
        YScalar { Type: ScalarType.Bool } => JsonType.Boolean,
        // An integer too long for 64 bits is still a number, but not one a count could hold.
        YScalar { Type: ScalarType.Int } s when long.TryParse(s.Value, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out _) => JsonType.Integer,
        YScalar { Type: ScalarType.Int or ScalarType.Float } => JsonType.Number,
        _ => JsonType.String,
    };

    private static void Check(YNode node, YScalar? key, string path, SchemaNode schema, List<Error> errors, IReadOnlySet<string>? implied)
    {
        var type = TypeOf(node);
        // A value of the wrong type is reported once; the keywords of the type it is not do not apply to it.
        if (!schema.Allows(type))
        {
            errors.Add(new Error(Problem.WrongType, node, key, path, schema));
            return;
        }
        if (schema.Enum is { } members && !members.Any(m => Equal(m, node)))
        {
            errors.Add(new Error(Problem.NotInEnum, node, key, path, schema));
        }
        switch (node)
        {
            case YScalar s when type == JsonType.String:
                // Draft-07 §6.3.2: the length counts characters (code points), not UTF-16 units.
                if (schema.MinLength is { } min && s.Value.EnumerateRunes().Count() < min) errors.Add(new Error(Problem.TooShort, node, key, path, schema));
                else if (schema.Pattern is { } pattern && !pattern.IsMatch(s.Value)) errors.Add(new Error(Problem.Pattern, node, key, path, schema));
                break;
            case YScalar s when type is JsonType.Integer or JsonType.Number:
                CheckBounds(CoreSchema.Number(s.Value) ?? double.NaN, node, key, path, schema, errors);
                break;
            case YMapping m:
                CheckObject(m, key, path, schema, errors, implied);
                break;
            case YSequence q:
                if (schema.MinItems is { } minItems && q.Items.Length < minItems) errors.Add(new Error(Problem.TooFewItems, node, key, path, schema));
                if (schema.Items is { } items)
                {
                    for (var i = 0; i < q.Items.Length; i++)
                    {
                        Check(q.Items[i], null, path + "[" + i.ToString(CultureInfo.InvariantCulture) + "]", items, errors, null);
                    }
                }
                break;
        }
    }

    private static void CheckBounds(double n, YNode node, YScalar? key, string path, SchemaNode schema, List<Error> errors)
    {
        if (schema.Minimum is { } min && n < min) errors.Add(new Error(Problem.TooSmall, node, key, path, schema, Limit: min));
        else if (schema.ExclusiveMinimum is { } xmin && n <= xmin) errors.Add(new Error(Problem.TooSmall, node, key, path, schema, Limit: xmin, Exclusive: true));
        if (schema.Maximum is { } max && n > max) errors.Add(new Error(Problem.TooBig, node, key, path, schema, Limit: max));
        else if (schema.ExclusiveMaximum is { } xmax && n >= xmax) errors.Add(new Error(Problem.TooBig, node, key, path, schema, Limit: xmax, Exclusive: true));
    }

    private static void CheckObject(YMapping m, YScalar? key, string path, SchemaNode schema, List<Error> errors, IReadOnlySet<string>? implied)
    {
        foreach (var name in schema.Required)
        {
            if (m.Find(name) is null && implied?.Contains(name) != true) errors.Add(new Error(Problem.MissingKey, m, key, path, schema, name));
        }
        foreach (var entry in m.Entries)
        {
            var childPath = Join(path, entry.Key.Value);
            var matched = false;
            if (schema.Properties.TryGetValue(entry.Key.Value, out var named))
            {
                matched = true;
                Check(entry.Value, entry.Key, childPath, named, errors, null);
            }
            // Draft-07 §6.5.5: every pattern that matches applies, as well as a named property.
            foreach (var (pattern, patterned) in schema.PatternProperties)
            {
                if (!pattern.IsMatch(entry.Key.Value)) continue;
                matched = true;
                Check(entry.Value, entry.Key, childPath, patterned, errors, null);
            }
            if (matched) continue;
            if (schema.Additional is { } additional) Check(entry.Value, entry.Key, childPath, additional, errors, null);
            else if (!schema.AdditionalAllowed) errors.Add(new Error(Problem.UnknownKey, entry.Value, entry.Key, childPath, schema));
        }
    }

    // JSON Schema equality (draft-07 §4.2.2): a string equals a string, a number a number of the same value.
    private static bool Equal(EnumValue member, YNode node) => node switch
    {
        YScalar s when TypeOf(s) == JsonType.String => member.Text == s.Value,
        YScalar { Type: ScalarType.Int or ScalarType.Float } s => member.Number is { } n && CoreSchema.Number(s.Value) == n,
        _ => false,
    };

    private static string Join(string path, string key) => path.Length == 0 ? key : path + "." + key;

    private static void Report(Error error, FindingBuilder findings, string prefix)
    {
        var valueSpan = error.Node.Span;
        // A keyless object is the document itself, or a mapping validated on its own (an inline bus): the latter has a place.
        var keySpan = error.Key?.Span ?? (prefix.Length > 0 ? SourceSpan.At(valueSpan.StartLine, valueSpan.StartColumn) : SourceSpan.FileStart);
        var path = error.Path;
        var name = error.Key?.Value ?? path;
        var schema = error.Schema;
        switch (error.Kind)
        {
            case Problem.UnknownKey:
            {
                var known = schema.PropertyList.Select(p => p.Name).ToArray();
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
            case Problem.MissingKey:
            {
                // The node is the mapping that lacks the key; place the finding on that mapping's key.
                var missing = error.Name!;
                var full = Join(path, missing);
                // The engine reports a missing `format` itself, before validation; once is enough.
                if (findings.Findings.Any(f => f.RuleId == EngineRules.MissingKey && f.KeyPath == full)) return;
                var title = schema.Child(missing) is { Title: { Length: > 0 } t } ? " (" + t + ")" : "";
                findings.Add(EngineRules.MissingKey, keySpan, full,
                    "The required key '{key}'{title} is missing{where}.",
                    ("key", missing), ("title", title), ("where", path.Length == 0 ? "" : " from " + path));
                return;
            }
        }
        if (findings.HasAt(valueSpan)) return;
        var shown = Shown(error.Node);
        var expectedType = error.Kind == Problem.WrongType ? schema.FirstType : null;
        if (schema.Dimension is { } token && expectedType == JsonType.String)
        {
            // A relay-model range ("setting") takes its setting's dimension, which the binder knows: it reports the scalar.
            var dimension = Quantities.Dimensions.Parse(token);
            if (dimension is null && error.Node is YScalar) return;
            var context = Quantities.UnitContexts.Of(path.StartsWith("ranges.", StringComparison.Ordinal) ? "protection." + path : path);
            var problem = error.Node is YScalar { Type: ScalarType.Int or ScalarType.Float } number
                ? Quantities.QuantityParser.Explain(new Quantities.QuantityParse(null, Quantities.QuantityError.MissingUnit, null), number.Value, dimension ?? Quantities.Dimension.None, context)
                : "'" + name + "' must be a number and a unit, not " + shown + ".";
            findings.Add(EngineRules.Unit, valueSpan, path, "{problem}", ("problem", problem));
            return;
        }
        if (expectedType is { } expected)
        {
            var wanted = expected switch
            {
                JsonType.String => "text",
                JsonType.Number => "a number",
                JsonType.Integer => "a whole number",
                JsonType.Boolean => "true or false",
                JsonType.Object => "a mapping of keys",
                JsonType.Array => "a list",
                _ => "empty",
            };
            findings.Add(EngineRules.WrongType, valueSpan, path,
                "'{key}' must be {expected}, not {what}.", ("key", name), ("expected", wanted), ("what", shown));
            return;
        }
        var detail = error.Kind switch
        {
            Problem.NotInEnum => "must be one of " + string.Join(", ", schema.Enum ?? []),
            Problem.TooSmall => "is below its smallest allowed value" + Bound(error.Limit, error.Exclusive, upper: false),
            Problem.TooBig => "is above its largest allowed value" + Bound(error.Limit, error.Exclusive, upper: true),
            Problem.Pattern => "does not have the expected form" + (schema.Description is { Length: > 0 } d ? " (" + d + ")" : ""),
            Problem.TooShort => "must not be empty",
            _ => "needs more items",
        };
        findings.Add(EngineRules.WrongType, valueSpan, path, "'{key}' {detail}; it is {what}.", ("key", name), ("detail", detail), ("what", shown));
    }

    private static string Bound(double value, bool exclusive, bool upper) =>
        (upper ? (exclusive ? " (must be below " : " (at most ") : (exclusive ? " (must be above " : " (at least "))
            + value.ToString(CultureInfo.InvariantCulture) + ")";

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
