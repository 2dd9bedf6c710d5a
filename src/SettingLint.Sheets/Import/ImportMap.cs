using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Sheets.Tables;

namespace SettingLint.Sheets.Import;

/// <summary>
/// A --map file: the sheet's own headers to key paths, in YAML.
/// <code>
/// columns:
///   Pump no.: tag
///   FLC: motor.full_load_current [A]
///   Remarks: ignore
/// </code>
/// </summary>
public sealed class ImportMap
{
    /// <summary>The word that makes a column ignored.</summary>
    public const string Ignore = "ignore";

    private readonly Dictionary<string, string> _targets;

    private ImportMap(Dictionary<string, string> targets) => _targets = targets;

    /// <summary>A map that maps nothing: every header names its key path itself.</summary>
    public static ImportMap None { get; } = new(new Dictionary<string, string>(StringComparer.Ordinal));

    /// <summary>What a header maps to (`key.path [unit]` or `ignore`), when the map names it; headers match without surrounding spaces.</summary>
    public string? Target(string header) => _targets.GetValueOrDefault(header.Trim());

    /// <summary>Reads a map file; throws <see cref="SheetReadException"/> with the place of the problem.</summary>
    public static ImportMap Read(string path)
    {
        var loaded = YamlLoader.Load(File.ReadAllBytes(path), path, path, LoadLimits.Default);
        if (loaded.Findings.Count > 0)
        {
            var f = loaded.Findings[0];
            throw new SheetReadException($"{path}:{f.Span.StartLine}:{f.Span.StartColumn}: {f.Message}");
        }
        if ((loaded.Root as YMapping)?["columns"] is not YMapping columns)
        {
            throw new SheetReadException($"{path}: a map has a 'columns' mapping of the sheet's headers to key paths (such as 'FLC: motor.full_load_current [A]') or to 'ignore'.");
        }
        var targets = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var entry in columns.Entries)
        {
            if (entry.Value is not YScalar { Type: ScalarType.String } target)
            {
                throw new SheetReadException($"{path}:{entry.Value.Span.StartLine}:{entry.Value.Span.StartColumn}: the header '{entry.Key.Value}' maps to {entry.Value.Describe()}; write a key path (with its unit in brackets when the cells are bare numbers) or 'ignore'.");
            }
            targets[entry.Key.Value.Trim()] = target.Value.Trim();
        }
        return new ImportMap(targets);
    }
}
