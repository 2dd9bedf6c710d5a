using System.Collections.Immutable;
using System.Globalization;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Spreadsheet;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Tables;

/// <summary>Reads one sheet of an XLSX workbook with the Open XML SDK: the first sheet, or the one named.</summary>
public static class XlsxTableReader
{
    /// <summary>Reads a sheet; throws <see cref="SheetReadException"/> when the file is not a workbook or has no such sheet.</summary>
    public static SheetTable Read(string path, string? sheetName = null)
    {
        SpreadsheetDocument document;
        try
        {
            document = SpreadsheetDocument.Open(path, false);
        }
        catch (Exception ex) when (ex is IOException or InvalidDataException or DocumentFormat.OpenXml.Packaging.OpenXmlPackageException or System.Xml.XmlException)
        {
            throw new SheetReadException($"{path} is not an XLSX workbook that can be read: {ex.Message}");
        }
        using (document)
        {
            var book = document.WorkbookPart ?? throw new SheetReadException($"{path} has no workbook part.");
            var sheets = book.Workbook?.Sheets?.Elements<Sheet>().ToList() ?? [];
            var sheet = sheetName is null ? sheets.FirstOrDefault() : sheets.FirstOrDefault(s => s.Name?.Value == sheetName);
            if (sheet?.Id?.Value is not { } id)
            {
                throw new SheetReadException(sheetName is null
                    ? $"{path} has no sheet."
                    : $"{path} has no sheet named '{sheetName}'; its sheets are: {string.Join(", ", sheets.Select(s => "'" + s.Name?.Value + "'"))}.");
            }
            var part = (WorksheetPart)book.GetPartById(id);
            var shared = book.SharedStringTablePart?.SharedStringTable?.Elements<SharedStringItem>().Select(i => i.InnerText).ToArray() ?? [];
            var byRow = new SortedDictionary<int, ImmutableArray<SheetCell>>();
            var nextRow = 1;
            foreach (var row in part.Worksheet?.GetFirstChild<SheetData>()?.Elements<Row>() ?? [])
            {
                var r = row.RowIndex?.Value is { } index ? (int)index : nextRow;
                nextRow = r + 1;
                var cells = ImmutableArray.CreateBuilder<SheetCell>();
                var nextColumn = 1;
                foreach (var cell in row.Elements<Cell>())
                {
                    var c = cell.CellReference?.Value is { } reference ? ColumnOf(reference) : nextColumn;
                    nextColumn = c + 1;
                    var text = TextOf(cell, shared);
                    if (text.Length == 0) continue;
                    cells.Add(new SheetCell(r, c, text, new SourceSpan(r, c, r, c + 1)));
                }
                if (cells.Count > 0) byRow[r] = cells.ToImmutable();
            }
            // Rows are indexed by their sheet row; the ones a workbook leaves out are empty.
            var last = byRow.Count == 0 ? 0 : byRow.Keys.Max();
            var rows = ImmutableArray.CreateBuilder<ImmutableArray<SheetCell>>(last);
            for (var r = 1; r <= last; r++) rows.Add(byRow.TryGetValue(r, out var cells) ? cells : []);
            return new SheetTable(path, rows.ToImmutable());
        }
    }

    /// <summary>The text of a cell: shared and inline strings as they are, booleans as true/false, numbers in their shortest round-trip form.</summary>
    private static string TextOf(Cell cell, string[] shared)
    {
        var type = cell.DataType?.Value;
        var value = cell.CellValue?.Text ?? "";
        if (type == CellValues.SharedString)
        {
            return int.TryParse(value, NumberStyles.Integer, CultureInfo.InvariantCulture, out var i) && i >= 0 && i < shared.Length ? shared[i] : "";
        }
        if (type == CellValues.InlineString) return cell.InlineString?.InnerText ?? "";
        if (type == CellValues.Boolean) return value == "1" ? "true" : value == "0" ? "false" : value;
        if (type == CellValues.String || type == CellValues.Error) return value;
        // A number: some writers store 17 significant digits (0.15000000000000002); the shortest form is what was typed.
        return double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out var d)
            ? d.ToString("R", CultureInfo.InvariantCulture)
            : value;
    }

    /// <summary>The 1-based column of a reference such as "C12".</summary>
    private static int ColumnOf(string reference)
    {
        var column = 0;
        foreach (var ch in reference)
        {
            if (ch is >= 'A' and <= 'Z') column = column * 26 + (ch - 'A' + 1);
            else if (ch is >= 'a' and <= 'z') column = column * 26 + (ch - 'a' + 1);
            else break;
        }
        return column;
    }
}
