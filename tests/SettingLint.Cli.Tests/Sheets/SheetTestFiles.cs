using System.Globalization;
using System.Text.Json;
using DocumentFormat.OpenXml;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Spreadsheet;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>Workbooks and SARIF read-outs for the import and sheet tests.</summary>
internal static class SheetTestFiles
{
    /// <summary>
    /// Writes a workbook as a spreadsheet program does: shared strings for text, numbers as numbers (cells that parse as
    /// one), cell references on every cell, and the sheet's name.
    /// </summary>
    public static void WriteXlsx(string path, string sheetName, IReadOnlyList<IReadOnlyList<string>> rows, string? firstSheet = null)
    {
        using var doc = SpreadsheetDocument.Create(path, SpreadsheetDocumentType.Workbook);
        var book = doc.AddWorkbookPart();
        book.Workbook = new Workbook();
        var strings = book.AddNewPart<SharedStringTablePart>();
        strings.SharedStringTable = new SharedStringTable();
        var index = new Dictionary<string, int>(StringComparer.Ordinal);
        var sheets = book.Workbook.AppendChild(new DocumentFormat.OpenXml.Spreadsheet.Sheets());
        uint id = 1;
        if (firstSheet is not null)
        {
            var other = book.AddNewPart<WorksheetPart>();
            other.Worksheet = new Worksheet(new SheetData(new Row(new Cell { CellReference = "A1", CellValue = new CellValue(1), DataType = CellValues.Number }) { RowIndex = 1 }));
            sheets.Append(new Sheet { Id = book.GetIdOfPart(other), SheetId = id++, Name = firstSheet });
        }
        var part = book.AddNewPart<WorksheetPart>();
        var data = new SheetData();
        for (var r = 0; r < rows.Count; r++)
        {
            var row = new Row { RowIndex = (uint)(r + 1) };
            for (var c = 0; c < rows[r].Count; c++)
            {
                var text = rows[r][c];
                if (text.Length == 0) continue;
                var reference = Letters(c + 1) + (r + 1).ToString(CultureInfo.InvariantCulture);
                if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var number) && !text.Contains(' ', StringComparison.Ordinal))
                {
                    row.Append(new Cell { CellReference = reference, CellValue = new CellValue(number), DataType = CellValues.Number });
                }
                else
                {
                    if (!index.TryGetValue(text, out var i))
                    {
                        i = index.Count;
                        index[text] = i;
                        strings.SharedStringTable.Append(new SharedStringItem(new Text(text)));
                    }
                    row.Append(new Cell { CellReference = reference, CellValue = new CellValue(i), DataType = CellValues.SharedString });
                }
            }
            data.Append(row);
        }
        part.Worksheet = new Worksheet(data);
        sheets.Append(new Sheet { Id = book.GetIdOfPart(part), SheetId = id, Name = sheetName });
    }

    private static string Letters(int column)
    {
        var s = "";
        for (var c = column; c > 0; c = (c - 1) / 26) s = (char)('A' + ((c - 1) % 26)) + s;
        return s;
    }

    /// <summary>(rule, artifact uri, start line, start column, message) of every SARIF result.</summary>
    public static (string Rule, string Uri, int Line, int Column, string Message)[] SarifResults(string sarif)
    {
        using var doc = JsonDocument.Parse(sarif);
        return [.. doc.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().Select(r =>
        {
            var location = r.GetProperty("locations")[0].GetProperty("physicalLocation");
            var region = location.GetProperty("region");
            return (r.GetProperty("ruleId").GetString()!, location.GetProperty("artifactLocation").GetProperty("uri").GetString()!,
                region.GetProperty("startLine").GetInt32(), region.GetProperty("startColumn").GetInt32(), r.GetProperty("message").GetProperty("text").GetString()!);
        })];
    }
}
