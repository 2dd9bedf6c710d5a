using System.IO.Compression;
using System.Text;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Spreadsheet;
using DocumentFormat.OpenXml.Validation;
using SettingLint.Sheets.SettingSheets;
using SettingLint.Sheets.Tables;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>
/// The XLSX reader and writer against the Open XML SDK as oracle, and against workbooks written by hand the way other
/// spreadsheet programs write them. Element and clause references are to ECMA-376 Part 1 (5th edition), SpreadsheetML;
/// the clause numbers are from memory.
/// </summary>
public sealed class XlsxTests
{
    private static readonly string[] Awkward =
    [
        "a & b < c > d \"q\" 'p'",
        "  leading and trailing spaces  ",
        "line one\nline two",
        "carriage\r\nreturn",
        "bell\u0007 and tab\t",
        "_x0041_ typed as text",
        "motor \U0001F4A1 lamp",
        "Ω µ ° ±",
    ];

    [Fact]
    public void A_written_sheet_is_valid_to_the_Open_XML_SDK_and_reads_back_cell_for_cell()
    {
        using var repo = new TempRepo();
        var path = repo.PathOf("s.xlsx");
        SheetWriters.Write(path, "Caution: a caution", ["tag", "value"],
            [.. Awkward.Select((t, i) => (IReadOnlyList<SheetColumns.Cell>)[new(t), SheetColumns.Number(i + 0.1)])], "Setting sheet: motors [all]");

        using (var doc = SpreadsheetDocument.Open(path, false))
        {
            // The SDK's schema and semantic validation of the package (Part 2) and its parts (Part 1).
            var errors = new OpenXmlValidator().Validate(doc).Select(e => e.Description + " at " + e.Path?.XPath).ToList();
            Assert.Empty(errors);
            var sheet = Assert.Single(doc.WorkbookPart!.Workbook.Sheets!.Elements<Sheet>());
            // 18.2.19: a sheet's name has none of []:*?/\ and at most 31 characters.
            Assert.Equal("Setting sheet- motors -all-", sheet.Name!.Value);
            var cells = ((WorksheetPart)doc.WorkbookPart.GetPartById(sheet.Id!)).Worksheet.Descendants<Cell>().ToList();
            Assert.Equal("A1", cells[0].CellReference!.Value);
            Assert.Equal("Caution: a caution", cells[0].InlineString!.InnerText);
            Assert.Equal(CellValues.InlineString, cells[3].DataType!.Value);
            Assert.Equal(Awkward[0], cells[3].InlineString!.InnerText);
            Assert.Equal("B3", cells[4].CellReference!.Value);
            Assert.Null(cells[4].DataType);
            Assert.Equal("0.1", cells[4].CellValue!.Text);
            // Spaces kept (xml:space="preserve" on the text, 18.4.12).
            Assert.Equal(Awkward[1], cells[5].InlineString!.InnerText);
        }

        var table = XlsxTableReader.Read(path);
        Assert.Equal("Caution: a caution", table.Rows[0][0].Text);
        Assert.Equal(["tag", "value"], table.Rows[1].Select(c => c.Text));
        for (var i = 0; i < Awkward.Length; i++)
        {
            Assert.Equal(Awkward[i], table.Rows[i + 2][0].Text);
            Assert.Equal((i + 0.1).ToString("R", System.Globalization.CultureInfo.InvariantCulture), table.Rows[i + 2][1].Text);
            Assert.Equal((i + 3, 2), (table.Rows[i + 2][1].Row, table.Rows[i + 2][1].Column));
        }
    }

    [Fact]
    public void Characters_XML_cannot_carry_are_escaped_as_ST_Xstring_and_an_underscore_that_looks_like_an_escape_is_escaped_itself()
    {
        // 22.9.2.19 ST_Xstring: _xHHHH_ for a character XML cannot carry; a literal "_x0041_" is written "_x005F_x0041_".
        Assert.Equal("bell_x0007_", XlsxWriter.Escape("bell\u0007", attribute: false));
        Assert.Equal("_x000D_\n", XlsxWriter.Escape("\r\n", attribute: false));
        Assert.Equal("_x005F_x0041_ and _x not an escape_", XlsxWriter.Escape("_x0041_ and _x not an escape_", attribute: false));
        Assert.Equal("a&amp;b&lt;c&gt;\"", XlsxWriter.Escape("a&b<c>\"", attribute: false));
        Assert.Equal("&quot;", XlsxWriter.Escape("\"", attribute: true));
        Assert.Equal("A_x", XlsxTableReader.Unescape("_x0041__x"));
        Assert.Equal("_x0041_", XlsxTableReader.Unescape("_x005F_x0041_"));
    }

    [Fact]
    public void The_same_sheet_gives_the_same_bytes()
    {
        using var repo = new TempRepo();
        IReadOnlyList<SheetColumns.Cell>[] rows = [[new("P-101"), SheetColumns.Number(58)]];
        SheetWriters.Write(repo.PathOf("a.xlsx"), null, ["tag", "flc"], rows, "Motors");
        Thread.Sleep(2100); // past the zip format's two-second time resolution
        SheetWriters.Write(repo.PathOf("b.xlsx"), null, ["tag", "flc"], rows, "Motors");
        Assert.Equal(File.ReadAllBytes(repo.PathOf("a.xlsx")), File.ReadAllBytes(repo.PathOf("b.xlsx")));
    }

    [Fact]
    public void A_workbook_as_other_programs_write_it_is_read_rich_text_phonetics_booleans_formulas_and_cells_without_references()
    {
        using var repo = new TempRepo();
        var path = repo.PathOf("other.xlsx");
        const string main = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
        const string rel = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
        WriteZip(path, new()
        {
            ["[Content_Types].xml"] = "<Types xmlns=\"http://schemas.openxmlformats.org/package/2006/content-types\"/>",
            // The workbook part where the package relationships say, not at xl/workbook.xml.
            ["_rels/.rels"] = $"<Relationships xmlns=\"http://schemas.openxmlformats.org/package/2006/relationships\"><Relationship Id=\"R1\" Type=\"{rel}/officeDocument\" Target=\"/book/main.xml\"/></Relationships>",
            ["book/main.xml"] = $"<x:workbook xmlns:x=\"{main}\" xmlns:rr=\"{rel}\"><!-- a comment --><x:sheets><x:sheet name=\"Cover\" sheetId=\"1\" rr:id=\"a\"/><x:sheet name=\"Motors\" sheetId=\"2\" rr:id=\"b\"/></x:sheets></x:workbook>",
            ["book/_rels/main.xml.rels"] = "<Relationships xmlns=\"http://schemas.openxmlformats.org/package/2006/relationships\">"
                + $"<Relationship Id=\"a\" Type=\"{rel}/worksheet\" Target=\"sheets/one.xml\"/>"
                + $"<Relationship Id=\"b\" Type=\"{rel}/worksheet\" Target=\"../book/sheets/two.xml\"/>"
                + $"<Relationship Id=\"s\" Type=\"{rel}/sharedStrings\" Target=\"/book/strings.xml\"/>"
                + $"<Relationship Id=\"h\" Type=\"{rel}/hyperlink\" Target=\"https://example.invalid/\" TargetMode=\"External\"/></Relationships>",
            // 18.4.8 si: plain text; rich text runs (18.4.4 r) whose texts join; a phonetic run (18.4.6 rPh) that is not shown.
            ["book/strings.xml"] = $"<sst xmlns=\"{main}\"><si><t>tag</t></si><si><r><rPr><b/></rPr><t>P-</t></r><r><t xml:space=\"preserve\">101 </t></r></si>"
                + "<si><t>Pump</t><rPh sb=\"0\" eb=\"1\"><t>PHONETIC</t></rPh></si><si/></sst>",
            // A relationship may name a part in another case than its entry (part names compare without regard to case).
            ["book/sheets/One.xml"] = $"<worksheet xmlns=\"{main}\"><sheetData><row r=\"1\"><c r=\"A1\"><v>1</v></c></row></sheetData></worksheet>",
            // 18.3.1.73 row and 18.3.1.4 c: references may be left out; t is s, inlineStr, b, str (a formula's text), e or n.
            ["book/sheets/two.xml"] = $"<worksheet xmlns=\"{main}\"><sheetData>"
                + "<row r=\"2\"><c t=\"s\"><v>0</v></c><c t=\"s\"><v>1</v></c><c t=\"s\"><v>2</v></c><c t=\"s\"><v>3</v></c></row>"
                + "<row><c r=\"B3\" t=\"b\"><v>1</v></c><c t=\"str\"><f>A2&amp;\"x\"</f><v>tagx</v></c><c t=\"inlineStr\"><is><r><t>in</t></r><r><t>line</t></r></is></c>"
                + "<c><v>0.14999999999999999</v></c><c r=\"H3\" t=\"e\"><v>#DIV/0!</v></c><c r=\"I3\"/></row>"
                + "<row r=\"5\"/></sheetData></worksheet>",
        });

        var table = XlsxTableReader.Read(path, "Motors");
        Assert.Equal(3, table.Rows.Length);
        Assert.Empty(table.Rows[0]);
        Assert.Equal([(2, 1, "tag"), (2, 2, "P-101 "), (2, 3, "Pump")], table.Rows[1].Select(c => (c.Row, c.Column, c.Text)));
        Assert.Equal([(3, 2, "true"), (3, 3, "tagx"), (3, 4, "inline"), (3, 5, "0.15"), (3, 8, "#DIV/0!")], table.Rows[2].Select(c => (c.Row, c.Column, c.Text)));
        Assert.Equal("1", XlsxTableReader.Read(path).Rows[0][0].Text);
        var missing = Assert.Throws<SheetReadException>(() => XlsxTableReader.Read(path, "Pumps"));
        Assert.EndsWith("has no sheet named 'Pumps'; its sheets are: 'Cover', 'Motors'.", missing.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void What_is_not_a_workbook_is_reported_as_such_and_a_DTD_is_refused()
    {
        using var repo = new TempRepo();
        var text = repo.Write("list.xlsx", "tag,flc\nP-101,58\n");
        Assert.Contains("is not an XLSX workbook that can be read", Assert.Throws<SheetReadException>(() => XlsxTableReader.Read(text)).Message, StringComparison.Ordinal);

        var empty = repo.PathOf("empty.xlsx");
        WriteZip(empty, new() { ["readme.txt"] = "nothing" });
        Assert.EndsWith("has no workbook part.", Assert.Throws<SheetReadException>(() => XlsxTableReader.Read(empty)).Message, StringComparison.Ordinal);

        // An entity in a DTD could read another file or expand without bound: the reader prohibits DTDs.
        var dtd = repo.PathOf("dtd.xlsx");
        WriteZip(dtd, new()
        {
            ["xl/workbook.xml"] = "<!DOCTYPE w [<!ENTITY e \"x\">]><workbook xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\"><sheets/></workbook>",
        });
        Assert.Contains("is not an XLSX workbook that can be read", Assert.Throws<SheetReadException>(() => XlsxTableReader.Read(dtd)).Message, StringComparison.Ordinal);
    }

    private static void WriteZip(string path, Dictionary<string, string> entries)
    {
        using var zip = ZipFile.Open(path, ZipArchiveMode.Create);
        foreach (var (name, xml) in entries)
        {
            using var stream = zip.CreateEntry(name).Open();
            stream.Write(Encoding.UTF8.GetBytes(xml));
        }
    }
}
