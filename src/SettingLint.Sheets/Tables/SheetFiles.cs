using System.Text.RegularExpressions;
using SettingLint.Core.Validation;

namespace SettingLint.Sheets.Tables;

/// <summary>Which reader a sheet file takes, and how a tag becomes a file name.</summary>
public static partial class SheetFiles
{
    /// <summary>Reads a CSV (.csv, .txt) or an XLSX workbook (.xlsx) by its extension.</summary>
    public static SheetTable Read(string path, string? sheet = null)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (!File.Exists(path)) throw new SheetReadException($"{path} does not exist.");
        var ext = Path.GetExtension(path).ToLowerInvariant();
        if (ext == ".xlsx") return XlsxTableReader.Read(path, sheet);
        if (sheet is not null) throw new SheetReadException("--sheet names a sheet of an XLSX workbook; a CSV file has one.");
        if (ext is ".csv" or ".txt") return CsvTableReader.Read(path);
        throw new SheetReadException($"{path}: import reads .csv and .xlsx files.");
    }

    /// <summary>The file name of a tag: lower case, runs of other characters than letters, digits, '.', '_' and '-' made one '-'; null when nothing is left.</summary>
    public static string? FileName(string tag)
    {
        ArgumentNullException.ThrowIfNull(tag);
        var name = Unsafe().Replace(tag.Trim().ToLowerInvariant(), "-").Trim('-', '.');
        return name.Length == 0 || !name.Any(char.IsAsciiLetterOrDigit) ? null : name + ".yaml";
    }

    /// <summary>
    /// The kind of file a top-level key refers to, read off the names of the kinds (a key named like a kind, with '_'
    /// for '-', such as bus and relay_model), so that no list of reference keys is kept here.
    /// </summary>
    public static string? ReferencedKind(string path) =>
        path.Contains('.', StringComparison.Ordinal) ? null : SchemaSet.SettingKinds.FirstOrDefault(k => k != SchemaSet.MotorProtection && k.Replace('-', '_') == path);

    [GeneratedRegex("[^a-z0-9._-]+")]
    private static partial Regex Unsafe();
}
