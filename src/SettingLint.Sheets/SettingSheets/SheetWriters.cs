using System.Net;
using System.Text;
using nietras.SeparatedValues;

namespace SettingLint.Sheets.SettingSheets;

/// <summary>Writes tables of text and numbers as CSV (Sep), XLSX (<see cref="XlsxWriter"/>) or an HTML page.</summary>
public static class SheetWriters
{
    /// <summary>The formats by file extension.</summary>
    public static readonly string[] Extensions = [".csv", ".xlsx", ".html"];

    /// <summary>Writes a table; the caution, when given, stands above the header (in its own row of a CSV or workbook).</summary>
    public static void Write(string path, string? caution, IReadOnlyList<string> header, IEnumerable<IReadOnlyList<SheetColumns.Cell>> rows, string title)
    {
        ArgumentNullException.ThrowIfNull(path);
        var dir = System.IO.Path.GetDirectoryName(System.IO.Path.GetFullPath(path));
        if (dir is not null) Directory.CreateDirectory(dir);
        switch (System.IO.Path.GetExtension(path).ToLowerInvariant())
        {
            case ".xlsx": Xlsx(path, caution, header, rows, title); break;
            case ".html" or ".htm": File.WriteAllText(path, Html(caution, header, rows, title), new UTF8Encoding(false)); break;
            default: File.WriteAllText(path, Csv(caution, header, rows), new UTF8Encoding(false)); break;
        }
    }

    /// <summary>RFC 4180 text with CRLF line ends, every cell quoted where it needs to be.</summary>
    public static string Csv(string? caution, IReadOnlyList<string> header, IEnumerable<IReadOnlyList<SheetColumns.Cell>> rows)
    {
        ArgumentNullException.ThrowIfNull(header);
        ArgumentNullException.ThrowIfNull(rows);
        using var writer = Sep.Writer(o => o with { Sep = new Sep(','), WriteHeader = false, Escape = true, DisableColCountCheck = true }).ToText();
        void Row(IEnumerable<string> cells)
        {
            using var row = writer.NewRow();
            var i = 0;
            foreach (var cell in cells) row[i++].Set(cell);
        }
        // The caution's row has as many cells as the header: a reader that finds the separator from the first line
        // (as Sep does, by count) then sees commas, not the semicolon of the caution's text.
        if (caution is not null) Row([caution, .. Enumerable.Repeat("", header.Count - 1)]);
        Row(header);
        foreach (var cells in rows) Row(cells.Select(c => c.Text));
        return writer.ToString();
    }

    private static void Xlsx(string path, string? caution, IReadOnlyList<string> header, IEnumerable<IReadOnlyList<SheetColumns.Cell>> rows, string title)
    {
        IEnumerable<IReadOnlyList<SheetColumns.Cell>> Lines()
        {
            if (caution is not null) yield return [new SheetColumns.Cell(caution)];
            yield return [.. header.Select(h => new SheetColumns.Cell(h))];
            foreach (var cells in rows) yield return cells;
        }
        XlsxWriter.Write(path, Lines(), title);
    }

    private static string Html(string? caution, IReadOnlyList<string> header, IEnumerable<IReadOnlyList<SheetColumns.Cell>> rows, string title)
    {
        static string E(string s) => WebUtility.HtmlEncode(s).Replace("\n", "<br>", StringComparison.Ordinal);
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>").Append(E(title)).Append("</title>\n")
            .Append("<style>body{font-family:sans-serif;margin:1.5em}table{border-collapse:collapse}th,td{border:1px solid #999;padding:.25em .5em;vertical-align:top}")
            .Append("td.n{text-align:right}.caution{border-left:4px solid #c60;padding:.5em 1em;background:#fff4e5}@media print{.caution{break-inside:avoid}}</style>\n</head>\n<body>\n")
            .Append("<h1>").Append(E(title)).Append("</h1>\n");
        if (caution is not null) sb.Append("<p class=\"caution\">").Append(E(caution)).Append("</p>\n");
        sb.Append("<table>\n<thead><tr>");
        foreach (var h in header) sb.Append("<th>").Append(E(h)).Append("</th>");
        sb.Append("</tr></thead>\n<tbody>\n");
        foreach (var cells in rows)
        {
            sb.Append("<tr>");
            foreach (var c in cells) sb.Append(c.Number is null ? "<td>" : "<td class=\"n\">").Append(E(c.Text)).Append("</td>");
            sb.Append("</tr>\n");
        }
        sb.Append("</tbody>\n</table>\n");
        if (caution is not null) sb.Append("<p class=\"caution\">").Append(E(caution)).Append("</p>\n");
        return sb.Append("</body>\n</html>\n").ToString();
    }
}
