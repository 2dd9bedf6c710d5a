using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Binding;

/// <summary>
/// Binds a validated YAML tree into key-path values in SI units, reading each key's type and dimension off its schema.
/// Relative units (A sec, xFLC, xCT, xVT, % of rated voltage, a CT burden in VA) are converted through the element's own transformer.
/// </summary>
public sealed class DocumentBinder
{
    private readonly FindingBuilder _findings;
    private readonly SchemaSet _schemas;
    // Key paths are the process's shared strings (KeyPaths), so that the document keeps them as they are.
    private readonly Dictionary<string, BoundValue> _values;
    private readonly List<(string Path, YScalar Node, Quantity Quantity)> _relative = [];
    private readonly HashSet<string> _failed = new(StringComparer.Ordinal);

    private readonly string _reportPrefix;

    // An inline bus is a bus file's keys without its own kind and format: those come from the motor file.
    private static readonly IReadOnlySet<string> InlineBusImplied = new HashSet<string>(StringComparer.Ordinal) { "kind", "format" };

    private DocumentBinder(FindingBuilder findings, SchemaSet schemas, string reportPrefix = "", int capacity = 0)
    {
        _findings = findings;
        _schemas = schemas;
        _reportPrefix = reportPrefix;
        _values = new Dictionary<string, BoundValue>(capacity, StringComparer.Ordinal);
    }

    // The values a tree can bind at most, so that the dictionary of a document is made once at its size.
    private static int CountScalars(YMapping mapping)
    {
        var n = 0;
        foreach (var e in mapping.Entries)
        {
            n += e.Value switch { YScalar => 1, YMapping m => CountScalars(m), _ => 0 };
        }
        return n;
    }

    /// <summary>Validates and binds a document of a known kind.</summary>
    public static BoundDocument Bind(string kind, string path, string relativePath, YMapping root, FindingBuilder findings, SchemaSet schemas)
    {
        var schema = schemas.Get(kind);
        SchemaValidator.Validate(root, schema, findings);
        var binder = new DocumentBinder(findings, schemas, capacity: CountScalars(root));
        binder.Walk(root, schema, null, kind);
        binder.ResolveRelative();
        return BoundDocument.OfBinder(kind, path, relativePath, root, binder._values);
    }

    /// <summary>Validates and binds a bus written inline in a motor file.</summary>
    public static BoundDocument BindInlineBus(string path, string relativePath, YMapping busNode, FindingBuilder findings, SchemaSet schemas)
    {
        var schema = schemas.Get(SchemaSet.Bus);
        SchemaValidator.Validate(busNode, schema, findings, "bus", InlineBusImplied);
        var binder = new DocumentBinder(findings, schemas, "bus", CountScalars(busNode));
        binder.Walk(busNode, schema, null, SchemaSet.Bus);
        return BoundDocument.OfBinder(SchemaSet.Bus, path, relativePath, busNode, binder._values);
    }

    private void Walk(YMapping mapping, SchemaNode schema, string? prefix, string kind)
    {
        foreach (var entry in mapping.Entries)
        {
            if (schema.Child(entry.Key.Value) is not { } child) continue; // SL003 already
            var path = KeyPaths.Join(prefix, entry.Key.Value);
            if (_findings.HasAt(entry.Value.Span))
            {
                _failed.Add(path);
                continue;
            }
            switch (entry.Value)
            {
                case YMapping m when kind == SchemaSet.RelayModel && prefix == "ranges":
                    BindRange(entry.Key, m, path);
                    break;
                case YMapping m:
                    Walk(m, child, path, kind);
                    break;
                case YScalar s:
                    BindLeaf(s, child, path);
                    break;
            }
        }
    }

    private void BindLeaf(YScalar node, SchemaNode schema, string path)
    {
        if (SchemaFacts.DimensionOf(schema) is { } dimension)
        {
            var context = UnitContexts.Of(path);
            var parse = QuantityParser.Parse(node.Value, dimension, context);
            if (!parse.Ok)
            {
                _findings.Add(EngineMessages.UnitProblem, node.Span, Reported(path), ("problem", QuantityParser.Explain(parse, node.Value, dimension, context)));
                _failed.Add(path);
                return;
            }
            var q = parse.Value!.Value;
            if (q.Number < 0)
            {
                _failed.Add(path);
                _findings.Add(EngineMessages.NegativeHereCannot, node.Span, Reported(path),
                    ("value", node.Value), ("dimension", dimension.Token()));
                return;
            }
            if (q.Number == 0 && IsBase(path))
            {
                _failed.Add(path);
                _findings.Add(EngineMessages.ZeroBaseRatioRelative, node.Span, Reported(path),
                    ("value", node.Value));
                return;
            }
            if (q.Unit.Basis is UnitBasis.Absolute or UnitBasis.Primary)
            {
                _values[path] = new MeasureValue(path, node.Span, q.Number * q.Unit.Factor, dimension, q, null);
            }
            else
            {
                _relative.Add((path, node, q));
            }
            return;
        }
        switch (node.Type)
        {
            case ScalarType.Bool:
                _values[path] = new FlagValue(path, node.Span, node.Value is "true" or "True" or "TRUE");
                break;
            case ScalarType.Int or ScalarType.Float:
                var n = CoreSchema.Number(node.Value) ?? double.NaN;
                if (!double.IsFinite(n))
                {
                    _findings.Add(EngineMessages.NotFiniteNumber, node.Span, Reported(path), ("value", node.Value));
                    return;
                }
                _values[path] = new MeasureValue(path, node.Span, n, Dimension.None, null, null);
                break;
            case ScalarType.Null:
                break;
            default:
                _values[path] = new TextValue(path, node.Span, node.Value);
                break;
        }
    }

    // Transformer ratings and the motor's FLC and rated voltage: the bases of A sec, V sec, xCT, xFLC and %.
    private static bool IsBase(string path) =>
        path is SchemaPaths.Motor.FullLoadCurrent or SchemaPaths.Motor.RatedVoltage
        || (path.StartsWith(SchemaPaths.Motor.TransformersPrefix, StringComparison.Ordinal) && (path.EndsWith(".primary", StringComparison.Ordinal) || path.EndsWith(".secondary", StringComparison.Ordinal)));

    // Finding key paths are the paths in the file; an inline bus is bound on its own but lives under `bus`.
    private string Reported(string path) => _reportPrefix.Length == 0 ? path : _reportPrefix + "." + path;

    private void BindRange(YScalar key, YMapping range, string path)
    {
        var setting = key.Value;
        var motorSchema = _schemas.Get(SchemaSet.MotorProtection);
        var settingSchema = SchemaFacts.ResolvePath(motorSchema, SchemaPaths.Motor.ProtectionPrefix + setting);
        if (settingSchema is null || SchemaFacts.DimensionOf(settingSchema) is not { } dimension)
        {
            var known = SchemaFacts.Leaves(motorSchema).Where(l => l.Path.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal) && SchemaFacts.DimensionOf(l.Schema) is not null)
                .Select(l => l.Path[SchemaPaths.Motor.ProtectionPrefix.Length..]);
            var near = Suggestions.Nearest(setting, known);
            _findings.Add(EngineMessages.ProtectionSettingWithUnit, key.Span, path, ("key", setting), ("hint", near is null ? "" : "; did you mean '" + near + "'?"));
            return;
        }
        foreach (var entry in range.Entries)
        {
            if (entry.Value is not YScalar s || _findings.HasAt(s.Span)) continue;
            var p = KeyPaths.Join(path, entry.Key.Value);
            var parse = QuantityParser.Parse(s.Value, dimension, UnitContext.Setting);
            if (!parse.Ok)
            {
                _findings.Add(EngineMessages.UnitProblem, s.Span, p, ("problem", QuantityParser.Explain(parse, s.Value, dimension, UnitContext.Setting)));
                continue;
            }
            _values[p] = new WrittenValue(p, s.Span, parse.Value!.Value);
        }
    }

    private void ResolveRelative()
    {
        foreach (var (path, node, q) in _relative)
        {
            var voltage = q.Unit.Dimension == Dimension.Voltage;
            var refs = References(path, voltage);
            var si = q.ToSi(refs);
            if (si is null)
            {
                // A reference that is present but wrong has its own finding; a second one here would be noise.
                if (ReferencePaths(path, q.Unit.Basis, voltage).Any(p => _failed.Contains(p) || IsReportedMissing(p))) continue;
                _findings.Add(EngineMessages.CannotBeConverted, node.Span, path,
                    ("value", node.Value), ("missing", MissingReference(path, q.Unit.Basis, voltage)));
                continue;
            }
            var dimension = q.Unit.Dimension;
            _values[path] = new MeasureValue(path, node.Span, si.Value, dimension, q, dimension is Dimension.Current or Dimension.Voltage ? refs.SideRatio : null);
        }
        // Absolute settings through a transformer still get its ratio, so reports can show the secondary value.
        List<MeasureValue>? withRatio = null;
        foreach (var (path, v) in _values)
        {
            if (v is MeasureValue { SideRatio: null, Dimension: Dimension.Current or Dimension.Voltage } m && path.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal))
            {
                var refs = References(path, m.Dimension == Dimension.Voltage);
                if (refs.SideRatio is not null) (withRatio ??= []).Add(m with { SideRatio = refs.SideRatio });
            }
        }
        foreach (var m in withRatio ?? [])
        {
            _values[m.Path] = m;
        }
    }

    // A required reference that is absent already has its SL004 (on the key itself or on a mapping that holds it).
    private bool IsReportedMissing(string path) =>
        _findings.Findings.Any(f => f.RuleId == EngineRules.MissingKey && (f.KeyPath == path || path.StartsWith(f.KeyPath + ".", StringComparison.Ordinal)));

    /// <summary>
    /// Which CT a protection setting (a key path such as protection.ground_fault.pickup) is measured through: the ground
    /// CT for a ground-fault setting unless it is residually connected, else the phase CT.
    /// </summary>
    /// A CT's own keys (a burden in VA) refer to that CT.
    public static string CtOf(string settingPath, string? groundConnection) =>
        settingPath.StartsWith(SchemaPaths.Motor.GroundCt + ".", StringComparison.Ordinal)
        || (settingPath.StartsWith(SchemaPaths.Motor.GroundFault + ".", StringComparison.Ordinal) && groundConnection != "residual")
            ? SettingReferences.GroundCt : SettingReferences.PhaseCt;

    // Looked up once the values are bound, once per transformer, for every setting that converts through it.
    private SettingReferences.ByTransformer _references;

    private ConversionReferences References(string path, bool voltage) =>
        _references.Get(new Values(_values), (_values.GetValueOrDefault(SchemaPaths.Motor.GroundCtConnection) as TextValue)?.Value, path, voltage);

    private readonly struct Values(Dictionary<string, BoundValue> values) : SettingReferences.INumbers
    {
        public double? Get(string path) => (values.GetValueOrDefault(path) as MeasureValue)?.Value;
    }

    private IEnumerable<string> ReferencePaths(string path, UnitBasis basis, bool voltage)
    {
        var ct = CtOf(path, (_values.GetValueOrDefault(SchemaPaths.Motor.GroundCtConnection) as TextValue)?.Value);
        return basis switch
        {
            UnitBasis.FullLoadCurrent => [SchemaPaths.Motor.FullLoadCurrent],
            UnitBasis.CtRating => [ct + ".primary"],
            UnitBasis.RatedVoltage => [SchemaPaths.Motor.RatedVoltage],
            UnitBasis.VtRating => [SchemaPaths.Motor.VtPrimary],
            UnitBasis.CtSecondaryPower => [ct + ".secondary"],
            UnitBasis.Secondary when voltage => [SchemaPaths.Motor.VtPrimary, SchemaPaths.Motor.VtSecondary],
            _ => [ct + ".primary", ct + ".secondary"],
        };
    }

    private string MissingReference(string path, UnitBasis basis, bool voltage)
    {
        var ct = CtOf(path, (_values.GetValueOrDefault(SchemaPaths.Motor.GroundCtConnection) as TextValue)?.Value);
        return basis switch
        {
            UnitBasis.FullLoadCurrent => $"xFLC needs {SchemaPaths.Motor.FullLoadCurrent} in amperes",
            UnitBasis.CtRating => "xCT needs " + ct + ".primary",
            UnitBasis.RatedVoltage => $"% needs {SchemaPaths.Motor.RatedVoltage}",
            UnitBasis.VtRating => $"xVT needs {SchemaPaths.Motor.VtPrimary}",
            UnitBasis.CtSecondaryPower => "a burden in VA needs " + ct + ".secondary (Z = VA / I^2)",
            UnitBasis.Secondary when voltage => $"a secondary voltage needs {SchemaPaths.Motor.Vt} with primary and secondary",
            UnitBasis.Secondary => "a secondary current needs " + ct + " with primary and secondary",
            _ => "its reference is missing",
        };
    }
}
