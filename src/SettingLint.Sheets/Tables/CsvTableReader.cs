using System.Collections.Immutable;
using System.Text;
using nietras.SeparatedValues;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Tables;

/// <summary>
/// Reads a CSV file (RFC 4180, comma or semicolon found from the header, UTF-8 with or without a byte-order mark, LF or
/// CRLF) with Sep. The file is read twice by the library: once unescaped for the values, once as written for the place of
/// each cell (its line and column), so that no quoting rule is reimplemented here.
/// </summary>
public static class CsvTableReader
{
    /// <summary>Reads a CSV file; throws <see cref="SheetReadException"/> when it is not UTF-8 or not CSV.</summary>
    public static SheetTable Read(string path)
    {
        string text;
        try
        {
            // Strict: a sheet saved in a legacy code page would otherwise turn every accented letter into U+FFFD silently.
            text = new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(File.ReadAllBytes(path));
        }
        catch (DecoderFallbackException)
        {
            throw new SheetReadException($"{path} is not UTF-8; save it as \"CSV UTF-8\" (comma or semicolon delimited).");
        }
        if (text.Length > 0 && text[0] == '\uFEFF') text = text[1..];
        return Parse(text, path);
    }

    /// <summary>Reads CSV text (without its byte-order mark).</summary>
    public static SheetTable Parse(string text, string path)
    {
        if (text.Trim().Length == 0) return new SheetTable(path, []);
        try
        {
            var values = Records(text, unescape: true);
            var raw = Records(text, unescape: false);
            var rows = ImmutableArray.CreateBuilder<ImmutableArray<SheetCell>>();
            for (var r = 0; r < values.Count; r++)
            {
                var (line, fields) = raw[r];
                var cells = ImmutableArray.CreateBuilder<SheetCell>(fields.Length);
                var column = 1;
                for (var c = 0; c < fields.Length; c++)
                {
                    var written = fields[c];
                    // The end of the cell: its written text may span lines (a quoted line break).
                    var endLine = line;
                    var endColumn = column + written.Length;
                    var lastBreak = written.LastIndexOf('\n');
                    if (lastBreak >= 0)
                    {
                        endLine = line + written.Count(ch => ch == '\n');
                        endColumn = written.Length - lastBreak;
                    }
                    var value = values[r].Fields[c];
                    cells.Add(new SheetCell(r + 1, c + 1, value, new SourceSpan(line, column, endLine, endColumn), written.StartsWith('"')));
                    line = endLine;
                    column = endColumn + 1; // the separator
                }
                if (cells.Any(cell => cell.Text.Trim().Length > 0)) rows.Add(cells.ToImmutable());
                else rows.Add([]);
            }
            // Blank lines keep their row number but hold nothing.
            return new SheetTable(path, rows.ToImmutable());
        }
        catch (Exception ex) when (ex is InvalidDataException or ArgumentException or NotSupportedException)
        {
            throw new SheetReadException($"{path} is not a CSV file that can be read: {ex.Message}");
        }
    }

    private static List<(int Line, string[] Fields)> Records(string text, bool unescape)
    {
        var list = new List<(int, string[])>();
        using var reader = Sep.Reader(o => o with { HasHeader = false, Unescape = unescape, DisableColCountCheck = true }).FromText(text);
        foreach (var row in reader)
        {
            var fields = new string[row.ColCount];
            for (var i = 0; i < fields.Length; i++) fields[i] = row[i].ToString();
            // The row's first line from its last: Sep 0.18 gives the first row of a file without header a LineNumberFrom
            // of 2, while LineNumberToExcl is right for every row (tested by the import tests against the text itself).
            list.Add((row.LineNumberToExcl - 1 - row.Span.Count('\n'), fields));
        }
        return list;
    }
}
