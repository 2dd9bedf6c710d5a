using System.Globalization;
using System.IO.Compression;
using System.Text;

namespace SettingLint.Sheets.SettingSheets;

/// <summary>
/// Writes a workbook of one sheet (ECMA-376 Part 1, SpreadsheetML, in the zip package of Part 2) with the least a
/// spreadsheet program needs: the package and workbook relationships, the workbook, and the sheet's cells, text as inline
/// strings and numbers as numbers. Why not a library: see <see cref="Tables.XlsxTableReader"/>.
/// </summary>
internal static class XlsxWriter
{
    private const string Main = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
    private const string Relationships = "http://schemas.openxmlformats.org/package/2006/relationships";
    private const string OfficeRelationships = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";

    // Every entry carries this time, so that the same sheet gives the same bytes (the zip format's earliest date).
    private static readonly DateTimeOffset Stamp = new(1980, 1, 1, 0, 0, 0, TimeSpan.Zero);

    /// <summary>Writes the rows to a new workbook at the path; the sheet's name is the title, made valid.</summary>
    public static void Write(string path, IEnumerable<IReadOnlyList<SheetColumns.Cell>> rows, string title)
    {
        using var file = File.Create(path);
        using var zip = new ZipArchive(file, ZipArchiveMode.Create);
        Entry(zip, "[Content_Types].xml",
            "<Types xmlns=\"http://schemas.openxmlformats.org/package/2006/content-types\">"
            + "<Default Extension=\"rels\" ContentType=\"application/vnd.openxmlformats-package.relationships+xml\"/>"
            + "<Default Extension=\"xml\" ContentType=\"application/xml\"/>"
            + "<Override PartName=\"/xl/workbook.xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml\"/>"
            + "<Override PartName=\"/xl/worksheets/sheet1.xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml\"/>"
            + "</Types>");
        Entry(zip, "_rels/.rels",
            $"<Relationships xmlns=\"{Relationships}\"><Relationship Id=\"rId1\" Type=\"{OfficeRelationships}/officeDocument\" Target=\"xl/workbook.xml\"/></Relationships>");
        Entry(zip, "xl/workbook.xml",
            $"<workbook xmlns=\"{Main}\" xmlns:r=\"{OfficeRelationships}\"><sheets><sheet name=\"{Escape(SheetName(title), attribute: true)}\" sheetId=\"1\" r:id=\"rId1\"/></sheets></workbook>");
        Entry(zip, "xl/_rels/workbook.xml.rels",
            $"<Relationships xmlns=\"{Relationships}\"><Relationship Id=\"rId1\" Type=\"{OfficeRelationships}/worksheet\" Target=\"worksheets/sheet1.xml\"/></Relationships>");
        var sheet = new StringBuilder($"<worksheet xmlns=\"{Main}\"><sheetData>");
        var r = 0;
        foreach (var cells in rows)
        {
            r++;
            sheet.Append(CultureInfo.InvariantCulture, $"<row r=\"{r}\">");
            for (var c = 0; c < cells.Count; c++)
            {
                var cell = cells[c];
                var reference = Tables.SheetCell.ColumnLetters(c + 1) + r.ToString(CultureInfo.InvariantCulture);
                if (cell.Number is { } n && double.IsFinite(n))
                {
                    sheet.Append(CultureInfo.InvariantCulture, $"<c r=\"{reference}\"><v>{n.ToString("R", CultureInfo.InvariantCulture)}</v></c>");
                }
                else if (cell.Text.Length > 0)
                {
                    sheet.Append(CultureInfo.InvariantCulture, $"<c r=\"{reference}\" t=\"inlineStr\"><is><t xml:space=\"preserve\">{Escape(cell.Text, attribute: false)}</t></is></c>");
                }
            }
            sheet.Append("</row>");
        }
        Entry(zip, "xl/worksheets/sheet1.xml", sheet.Append("</sheetData></worksheet>").ToString());
    }

    /// <summary>A sheet's name as a spreadsheet program accepts it (18.2.19): 1 to 31 characters, none of []:*?/\.</summary>
    internal static string SheetName(string title)
    {
        var name = new string([.. title.Select(ch => ch is '[' or ']' or ':' or '*' or '?' or '/' or '\\' ? '-' : char.IsControl(ch) ? ' ' : ch)]).Trim('\'');
        if (name.Length > 31) name = name[..31];
        return name.Length == 0 ? "Sheet1" : name;
    }

    /// <summary>
    /// Text as XML character data. A character XML cannot carry (controls other than tab and line feed; a carriage return,
    /// which XML turns into a line feed) is written _xHHHH_ (Part 1, 22.9.2.19, ST_Xstring), and an underscore that would
    /// read as the start of such an escape is written _x005F_.
    /// </summary>
    internal static string Escape(string text, bool attribute)
    {
        var sb = new StringBuilder(text.Length);
        for (var i = 0; i < text.Length; i++)
        {
            var ch = text[i];
            switch (ch)
            {
                case '&': sb.Append("&amp;"); break;
                case '<': sb.Append("&lt;"); break;
                case '>': sb.Append("&gt;"); break;
                case '"' when attribute: sb.Append("&quot;"); break;
                case '_' when LooksEscaped(text, i): sb.Append("_x005F_"); break;
                case '\t' or '\n' when !attribute: sb.Append(ch); break;
                case < ' ' or '\uFFFE' or '\uFFFF':
                    sb.Append("_x").Append(((int)ch).ToString("X4", CultureInfo.InvariantCulture)).Append('_');
                    break;
                default:
                    // A lone surrogate is not a character XML can carry; a pair is one character.
                    if (char.IsHighSurrogate(ch) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1])) sb.Append(ch).Append(text[++i]);
                    else if (char.IsSurrogate(ch)) sb.Append("_x").Append(((int)ch).ToString("X4", CultureInfo.InvariantCulture)).Append('_');
                    else sb.Append(ch);
                    break;
            }
        }
        return sb.ToString();
    }

    private static bool LooksEscaped(string text, int i) =>
        i + 6 < text.Length && text[i + 1] == 'x' && text[i + 6] == '_' && !text.AsSpan(i + 2, 4).ContainsAnyExcept("0123456789ABCDEFabcdef");

    private static void Entry(ZipArchive zip, string name, string xml)
    {
        var entry = zip.CreateEntry(name, CompressionLevel.Optimal);
        entry.LastWriteTime = Stamp;
        using var stream = entry.Open();
        var bytes = Encoding.UTF8.GetBytes("<?xml version=\"1.0\" encoding=\"UTF-8\" standalone=\"yes\"?>\n" + xml);
        stream.Write(bytes);
    }
}
