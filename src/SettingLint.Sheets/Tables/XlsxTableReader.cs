using System.Collections.Immutable;
using System.Globalization;
using System.IO.Compression;
using System.Xml;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Tables;

/// <summary>
/// Reads one sheet of an XLSX workbook (ECMA-376 Part 1, SpreadsheetML, in the zip package of Part 2): the first sheet, or
/// the one named. Only what a motor list needs is read: the cells' values, as text.
/// </summary>
/// <remarks>
/// The package is read with the runtime's zip and XML readers rather than a spreadsheet library: the one library that both
/// read and wrote XLSX without trim warnings (the Open XML SDK) made the native executable 32.2 MB instead of 13.3, and
/// NativeAOT rehydrates an executable's type data at every start: with it, a one-file check took 1.5 x a hello world
/// (docs/performance.md). The SDK is still the tests' oracle: it writes the workbooks they import and validates the ones
/// the sheet command writes.
/// </remarks>
public static class XlsxTableReader
{
    private const string RelationshipsTypePrefix = "/relationships/";

    /// <summary>Reads a sheet; throws <see cref="SheetReadException"/> when the file is not a workbook or has no such sheet.</summary>
    public static SheetTable Read(string path, string? sheetName = null)
    {
        ZipArchive zip;
        try
        {
            zip = ZipFile.OpenRead(path);
        }
        catch (Exception ex) when (ex is IOException or InvalidDataException or UnauthorizedAccessException)
        {
            throw new SheetReadException($"{path} is not an XLSX workbook that can be read: {ex.Message}");
        }
        using (zip)
        {
            try
            {
                return Read(zip, path, sheetName);
            }
            catch (Exception ex) when (ex is XmlException or InvalidDataException or IOException)
            {
                throw new SheetReadException($"{path} is not an XLSX workbook that can be read: {ex.Message}");
            }
        }
    }

    private static SheetTable Read(ZipArchive zip, string path, string? sheetName)
    {
        // The package's relationships name the workbook part (Part 2, 9.3); xl/workbook.xml is where every writer puts it.
        var workbookPart = Relationships(zip, "").FirstOrDefault(r => r.Type.EndsWith(RelationshipsTypePrefix + "officeDocument", StringComparison.Ordinal)).Target
            ?? "xl/workbook.xml";
        if (Entry(zip, workbookPart) is null) throw new SheetReadException($"{path} has no workbook part.");
        var sheets = Sheets(zip, workbookPart);
        var at = sheetName is not null ? sheets.FindIndex(s => s.Name == sheetName) : sheets.Count > 0 ? 0 : -1;
        var parts = Relationships(zip, workbookPart);
        var sheetPart = at < 0 ? null : parts.FirstOrDefault(r => r.Id == sheets[at].RelationshipId).Target;
        if (sheetPart is null || Entry(zip, sheetPart) is not { } sheetEntry)
        {
            throw new SheetReadException(sheetName is null
                ? $"{path} has no sheet."
                : $"{path} has no sheet named '{sheetName}'; its sheets are: {string.Join(", ", sheets.Select(s => "'" + s.Name + "'"))}.");
        }
        var sharedPart = parts.FirstOrDefault(r => r.Type.EndsWith(RelationshipsTypePrefix + "sharedStrings", StringComparison.Ordinal)).Target;
        var shared = sharedPart is not null && Entry(zip, sharedPart) is { } sharedEntry ? SharedStrings(sharedEntry) : [];
        return new SheetTable(path, Cells(sheetEntry, shared));
    }

    /// <summary>The relationships of a part ("" for the package's own): id, type and the target's entry name.</summary>
    private static List<(string Id, string Type, string? Target)> Relationships(ZipArchive zip, string part)
    {
        var folder = part.Contains('/', StringComparison.Ordinal) ? part[..(part.LastIndexOf('/') + 1)] : "";
        var name = folder + "_rels/" + part[folder.Length..] + ".rels";
        var found = new List<(string, string, string?)>();
        if (Entry(zip, name) is not { } entry) return found;
        using var xml = Open(entry);
        while (xml.Read())
        {
            if (xml.NodeType != XmlNodeType.Element || xml.LocalName != "Relationship" || xml.GetAttribute("TargetMode") == "External") continue;
            if (xml.GetAttribute("Id") is { } id && xml.GetAttribute("Type") is { } type && xml.GetAttribute("Target") is { } target)
            {
                found.Add((id, type, Resolve(folder, target)));
            }
        }
        return found;
    }

    /// <summary>A relationship's target as an entry name: absolute from the package root, or relative to the source part's folder.</summary>
    private static string Resolve(string folder, string target)
    {
        var segments = new List<string>();
        foreach (var segment in (target.StartsWith('/') ? target[1..] : folder + target).Split('/'))
        {
            if (segment == "..") { if (segments.Count > 0) segments.RemoveAt(segments.Count - 1); }
            else if (segment is not ("." or "")) segments.Add(Uri.UnescapeDataString(segment));
        }
        return string.Join('/', segments);
    }

    /// <summary>The workbook's sheets in order: name and relationship id.</summary>
    private static List<(string Name, string RelationshipId)> Sheets(ZipArchive zip, string workbookPart)
    {
        var sheets = new List<(string, string)>();
        using var xml = Open(Entry(zip, workbookPart)!);
        while (xml.Read())
        {
            if (xml.NodeType != XmlNodeType.Element || xml.LocalName != "sheet") continue;
            string? id = null;
            // r:id, in the transitional or the strict relationships namespace.
            for (var more = xml.MoveToFirstAttribute(); more; more = xml.MoveToNextAttribute())
            {
                if (xml.LocalName == "id" && xml.NamespaceURI.EndsWith("relationships", StringComparison.Ordinal)) id = xml.Value;
            }
            xml.MoveToElement();
            if (xml.GetAttribute("name") is { } name && id is not null) sheets.Add((name, id));
        }
        return sheets;
    }

    /// <summary>The shared string table: each item's text, its phonetic runs left out.</summary>
    private static string[] SharedStrings(ZipArchiveEntry entry)
    {
        var strings = new List<string>();
        using var xml = Open(entry);
        while (xml.Read())
        {
            if (xml.NodeType == XmlNodeType.Element && xml.LocalName == "si") strings.Add(StringItem(xml));
        }
        return [.. strings];
    }

    /// <summary>
    /// The text of the string item the reader is on (si or is): its t elements, plain or in runs, not in rPh. Leaves the
    /// reader on the item's end (or on the item, when it is empty).
    /// </summary>
    private static string StringItem(XmlReader xml)
    {
        if (xml.IsEmptyElement) return "";
        var depth = xml.Depth;
        var text = new System.Text.StringBuilder();
        xml.Read();
        while (!xml.EOF && xml.Depth > depth)
        {
            if (xml.NodeType == XmlNodeType.Element && xml.LocalName == "rPh") xml.Skip();
            else if (xml.NodeType == XmlNodeType.Element && xml.LocalName == "t") text.Append(xml.ReadElementContentAsString());
            else xml.Read();
        }
        return Unescape(text.ToString());
    }

    private static ImmutableArray<ImmutableArray<SheetCell>> Cells(ZipArchiveEntry entry, string[] shared)
    {
        var byRow = new SortedDictionary<int, ImmutableArray<SheetCell>>();
        var nextRow = 1;
        using var xml = Open(entry);
        while (xml.Read())
        {
            if (xml.NodeType != XmlNodeType.Element || xml.LocalName != "row") continue;
            var r = int.TryParse(xml.GetAttribute("r"), NumberStyles.None, CultureInfo.InvariantCulture, out var index) ? index : nextRow;
            nextRow = r + 1;
            var cells = ImmutableArray.CreateBuilder<SheetCell>();
            var nextColumn = 1;
            if (!xml.IsEmptyElement)
            {
                var depth = xml.Depth;
                while (xml.Read() && xml.Depth > depth)
                {
                    if (xml.NodeType != XmlNodeType.Element || xml.LocalName != "c") continue;
                    var c = xml.GetAttribute("r") is { } reference ? ColumnOf(reference) : nextColumn;
                    nextColumn = c + 1;
                    var text = CellText(xml, shared);
                    if (text.Length > 0) cells.Add(new SheetCell(r, c, text, new SourceSpan(r, c, r, c + 1)));
                }
            }
            if (cells.Count > 0) byRow[r] = cells.ToImmutable();
        }
        // Rows are indexed by their sheet row; the ones a workbook leaves out are empty.
        var last = byRow.Count == 0 ? 0 : byRow.Keys.Max();
        var rows = ImmutableArray.CreateBuilder<ImmutableArray<SheetCell>>(last);
        for (var r = 1; r <= last; r++) rows.Add(byRow.TryGetValue(r, out var cells) ? cells : []);
        return rows.ToImmutable();
    }

    /// <summary>
    /// The text of the cell the reader is on (18.3.1.4): shared and inline strings as they are, booleans as true/false,
    /// numbers in their shortest round-trip form; a formula's cached value, not the formula.
    /// </summary>
    private static string CellText(XmlReader xml, string[] shared)
    {
        var type = xml.GetAttribute("t") ?? "n";
        string? value = null;
        var inline = "";
        if (!xml.IsEmptyElement)
        {
            // Left on the cell's end: each branch moves past what it read.
            var depth = xml.Depth;
            xml.Read();
            while (!xml.EOF && xml.Depth > depth)
            {
                if (xml.NodeType == XmlNodeType.Element && xml.LocalName == "v") value = xml.ReadElementContentAsString();
                else if (xml.NodeType == XmlNodeType.Element && xml.LocalName == "is") { inline = StringItem(xml); xml.Read(); }
                else xml.Read();
            }
        }
        value ??= "";
        switch (type)
        {
            case "s":
                return int.TryParse(value, NumberStyles.Integer, CultureInfo.InvariantCulture, out var i) && i >= 0 && i < shared.Length ? shared[i] : "";
            case "inlineStr":
                return inline;
            case "b":
                return value == "1" ? "true" : value == "0" ? "false" : value;
            case "str" or "e" or "d":
                return Unescape(value);
            default:
                // A number: some writers store 17 significant digits (0.14999999999999999 for 0.15); the shortest form that reads back the same is what was typed.
                return double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out var d)
                    ? d.ToString("R", CultureInfo.InvariantCulture)
                    : value;
        }
    }

    /// <summary>
    /// Undoes the escape of characters that XML cannot carry (ECMA-376 Part 1, 22.9.2.19, ST_Xstring): _xHHHH_ is the
    /// character HHHH, so _x005F_ is an underscore.
    /// </summary>
    internal static string Unescape(string text)
    {
        if (!text.Contains("_x", StringComparison.Ordinal)) return text;
        var sb = new System.Text.StringBuilder(text.Length);
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == '_' && i + 6 < text.Length && text[i + 1] == 'x' && text[i + 6] == '_'
                && int.TryParse(text.AsSpan(i + 2, 4), NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture, out var code))
            {
                sb.Append((char)code);
                i += 6;
            }
            else
            {
                sb.Append(text[i]);
            }
        }
        return sb.ToString();
    }

    /// <summary>
    /// A part by name. Part names compare without regard to ASCII case (ECMA-376 Part 2, 9.1.1.1; from memory), and a
    /// relationship may name "xl/Workbook.xml" for the entry "xl/workbook.xml".
    /// </summary>
    private static ZipArchiveEntry? Entry(ZipArchive zip, string name) =>
        zip.GetEntry(name) ?? zip.Entries.FirstOrDefault(e => string.Equals(e.FullName, name, StringComparison.OrdinalIgnoreCase));

    // No DTD (a workbook has none, and one could expand without bound), no comments.
    private static XmlReader Open(ZipArchiveEntry entry) =>
        XmlReader.Create(entry.Open(), new XmlReaderSettings { DtdProcessing = DtdProcessing.Prohibit, IgnoreComments = true, IgnoreProcessingInstructions = true, CloseInput = true });

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
