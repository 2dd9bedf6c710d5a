using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Tables;

/// <summary>One cell as read from a sheet: its text, its row and column in the sheet, and where it stands in the file.</summary>
/// <param name="Row">1-based row of the sheet (the header is row 1).</param>
/// <param name="Column">1-based column.</param>
/// <param name="Text">The cell's text, unescaped; a number of a workbook in its shortest round-trip form.</param>
/// <param name="Region">
/// Where the cell stands in the file, for SARIF: in a CSV its line and character columns; in a workbook, which has no
/// lines, its row and column number (a one-column region).
/// </param>
/// <param name="Quoted">Whether a CSV cell was written in quotes (a spreadsheet quotes a number with a decimal comma).</param>
public sealed record SheetCell(int Row, int Column, string Text, SourceSpan Region, bool Quoted = false)
{
    /// <summary>The spreadsheet's name of the column: A, B, ..., Z, AA.</summary>
    public string ColumnName => ColumnLetters(Column);

    /// <summary>The letters of a 1-based column number.</summary>
    public static string ColumnLetters(int column)
    {
        var s = "";
        for (var c = column; c > 0; c = (c - 1) / 26) s = (char)('A' + ((c - 1) % 26)) + s;
        return s;
    }
}

/// <summary>A sheet as read: the rows in order, each with its cells in column order (empty cells may be absent).</summary>
/// <param name="File">The file it was read from.</param>
/// <param name="Rows">Rows with at least one non-empty cell, in order.</param>
public sealed record SheetTable(string File, ImmutableArray<ImmutableArray<SheetCell>> Rows);

/// <summary>A sheet that could not be read at all (not UTF-8, not a workbook, no such sheet).</summary>
public sealed class SheetReadException(string message) : Exception(message);
