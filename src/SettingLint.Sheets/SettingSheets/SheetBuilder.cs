using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Validation;
using SettingLint.Sheets.Import;

namespace SettingLint.Sheets.SettingSheets;

/// <summary>
/// The rows of a setting sheet: for each motor, each relay setting its file holds (the keys under `protection` in the
/// schema's order), with the engine's primary and secondary values, the relay model's range and the findings on it.
/// </summary>
public static class SheetBuilder
{
    private const string Protection = SchemaPaths.Motor.ProtectionPrefix;

    /// <summary>The rows of the motors, by tag and then in the schema's order.</summary>
    /// <param name="motors">The checked motors.</param>
    /// <param name="result">The check's findings.</param>
    /// <param name="read">Reads a motor file's bytes from the source the check read (a revision); null reads the disk.</param>
    public static ImmutableArray<SheetRow> Rows(IEnumerable<MotorProtection> motors, CheckResult result, Func<string, byte[]?>? read = null)
    {
        ArgumentNullException.ThrowIfNull(motors);
        ArgumentNullException.ThrowIfNull(result);
        var keys = ContractKeys.Of(SchemaSet.MotorProtection).All.Where(k => k.Path.StartsWith(Protection, StringComparison.Ordinal)).ToList();
        var schema = SchemaSet.Shared.Get(SchemaSet.MotorProtection);
        var findings = result.Findings.ToLookup(f => (f.File, f.KeyPath));
        var rows = ImmutableArray.CreateBuilder<SheetRow>();
        foreach (var motor in motors.OrderBy(m => m.Tag, StringComparer.Ordinal).ThenBy(m => m.Document.RelativePath, StringComparer.Ordinal))
        {
            var written = read?.Invoke(motor.Document.RelativePath) is { } bytes
                ? Written(YamlLoader.Load(bytes, motor.Document.Path, motor.Document.RelativePath, LoadLimits.Default))
                : Written(motor.Document.Path);
            foreach (var key in keys)
            {
                if (written.GetValueOrDefault(key.Path) is not { } text) continue;
                var element = key.Path[..key.Path.LastIndexOf('.')];
                var setting = key.Path[(element.Length + 1)..];
                var title = SchemaFacts.ResolvePath(schema, element)?.Title ?? element[Protection.Length..];
                var value = motor.Document[key.Path] as MeasureValue;
                var (primary, unit) = Primary(value);
                var range = motor.RelayModel?.RangeOf(element[Protection.Length..] + "." + setting);
                var on = findings[(motor.Document.RelativePath, key.Path)]
                    .Concat(setting == "enabled" ? findings[(motor.Document.RelativePath, element)] : [])
                    .Select(f => f.RuleId + " " + f.Level.Token() + ": " + f.Message)
                    .ToList();
                rows.Add(new SheetRow(motor.Tag, motor.Document.RelativePath, title, setting, key.Path, text, primary,
                    value is { Dimension: Dimension.Current or Dimension.Voltage } ? value.Secondary : null, unit,
                    range is null ? "" : range.Min.Quantity + " to " + range.Max.Quantity,
                    range?.Step?.Quantity.ToString() ?? "", on));
            }
        }
        return rows.ToImmutable();
    }

    /// <summary>Every scalar of a file as written (after YAML unescaping), by key path: what the technician reads in the file.</summary>
    public static Dictionary<string, string> Written(string path) => Written(YamlLoader.LoadFile(path, path, LoadLimits.Default));

    private static Dictionary<string, string> Written(LoadedFile loaded)
    {
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        if (loaded.Root is YMapping root) Walk(root, "", values);
        return values;
    }

    private static void Walk(YMapping mapping, string prefix, Dictionary<string, string> values)
    {
        foreach (var entry in mapping.Entries)
        {
            var path = prefix.Length == 0 ? entry.Key.Value : prefix + "." + entry.Key.Value;
            if (entry.Value is YMapping child) Walk(child, path, values);
            else if (entry.Value is YScalar scalar) values[path] = scalar.Value;
        }
    }

    /// <summary>A bound number in the unit a sheet shows it in: A and V primary, s, % for shares, plain numbers as they are.</summary>
    private static (double? Value, string Unit) Primary(MeasureValue? value) => value switch
    {
        null => (null, ""),
        { Dimension: Dimension.Fraction } => (value.Value * 100, "%"),
        { Dimension: Dimension.None } => (value.Value, ""),
        _ => (value.Value, value.Dimension.SiSymbol()),
    };

    /// <summary>The settings that differ from a revision's, old beside new; a setting only on one side is new or removed.</summary>
    public static ImmutableArray<SheetRow> Changes(ImmutableArray<SheetRow> now, ImmutableArray<SheetRow> before)
    {
        var old = before.ToDictionary(r => (r.Tag, r.Path));
        var rows = ImmutableArray.CreateBuilder<SheetRow>();
        foreach (var row in now)
        {
            if (!old.Remove((row.Tag, row.Path), out var was)) rows.Add(row with { Change = "new" });
            else if (was.Written != row.Written) rows.Add(row with { Old = was, Change = "changed" });
        }
        foreach (var gone in old.Values)
        {
            rows.Add(gone with { Old = gone, Written = "", Primary = null, Secondary = null, Findings = [], Change = "removed" });
        }
        return [.. rows.OrderBy(r => r.Tag, StringComparer.Ordinal).ThenBy(r => Order(r.Path))];
    }

    private static int Order(string path) =>
        ContractKeys.Of(SchemaSet.MotorProtection).Find(path)?.Order ?? int.MaxValue;
}
