using SettingLint.Core.Validation;
using SettingLint.Sheets.Import;

namespace SettingLint.Sheets.SettingSheets;

/// <summary>
/// A motor list in the form `import` reads: one row per motor, one column per key path (the schema's order) that any of
/// the motors holds, each cell the value exactly as written in the file. `import --update` of it changes no file.
/// </summary>
public static class ImportSheet
{
    /// <summary>The header and rows of the motor files given (full paths), by tag.</summary>
    public static (IReadOnlyList<string> Header, List<IReadOnlyList<SheetColumns.Cell>> Rows) Build(IEnumerable<string> motorFiles)
    {
        ArgumentNullException.ThrowIfNull(motorFiles);
        var keys = ContractKeys.Of(SchemaSet.MotorProtection).All;
        var files = motorFiles.Select(SheetBuilder.Written)
            .OrderBy(v => v.GetValueOrDefault("tag") ?? "", StringComparer.Ordinal)
            .ToList();
        // Only keys of the contract; those with one allowed value (kind, format) are the same in every row, and import writes them.
        var used = keys.Where(k => !k.IsFixed && files.Any(f => f.ContainsKey(k.Path))).Select(k => k.Path).ToList();
        var rows = files.Select(f => (IReadOnlyList<SheetColumns.Cell>)[.. used.Select(p => new SheetColumns.Cell(f.GetValueOrDefault(p) ?? ""))]).ToList();
        return (used, rows);
    }
}
