using System.Globalization;

namespace SettingLint.Sheets.SettingSheets;

/// <summary>The columns of a setting sheet and each row's cells: text, or a number a spreadsheet can compute with.</summary>
public static class SheetColumns
{
    /// <summary>A cell: its text, and its number when it is one.</summary>
    public readonly record struct Cell(string Text, double? Number = null);

    /// <summary>The header of a sheet; with a revision, old and new side by side.</summary>
    public static IReadOnlyList<string> Header(bool changes) => changes
        ? ["tag", "element", "setting", "change", "old value", "new value", "old primary", "new primary", "old secondary", "new secondary", "unit", "relay range", "relay step", "findings"]
        : ["tag", "element", "setting", "value as written", "primary", "secondary", "unit", "relay range", "relay step", "findings"];

    /// <summary>The cells of a row, in the order of <see cref="Header"/>.</summary>
    public static IReadOnlyList<Cell> Cells(SheetRow row, bool changes)
    {
        ArgumentNullException.ThrowIfNull(row);
        var findings = new Cell(string.Join("\n", row.Findings));
        return changes
            ?
            [
                new(row.Tag), new(row.Element), new(row.Setting), new(row.Change),
                new(row.Old?.Written ?? ""), new(row.Written),
                Number(row.Old?.Primary), Number(row.Primary), Number(row.Old?.Secondary), Number(row.Secondary),
                new(row.Unit), new(row.Range), new(row.Step), findings,
            ]
            :
            [
                new(row.Tag), new(row.Element), new(row.Setting), new(row.Written),
                Number(row.Primary), Number(row.Secondary), new(row.Unit), new(row.Range), new(row.Step), findings,
            ];
    }

    /// <summary>
    /// A number to six significant figures: the resolution of a relay's settings is far coarser, and more digits would
    /// show the binary rounding of a product (0.45 x 158 A / 40 is 1.7775, not 1.7774999999999999).
    /// </summary>
    public static Cell Number(double? value) => value is { } v && double.IsFinite(v)
        ? new Cell(v.ToString("G6", CultureInfo.InvariantCulture), double.Parse(v.ToString("G6", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture))
        : new Cell("");
}
