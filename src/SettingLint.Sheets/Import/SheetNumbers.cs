using System.Text.RegularExpressions;

namespace SettingLint.Sheets.Import;

/// <summary>Numbers as spreadsheets write them.</summary>
public static partial class SheetNumbers
{
    /// <summary>
    /// The value with a decimal point, when it starts with a number written with a decimal comma ("1,15", "0,45 xFLC");
    /// null otherwise. A spreadsheet in a locale with a decimal comma writes numbers so, and quotes them in a
    /// comma-separated file: read as text they would be a wrong value, so they are refused with this in the message.
    /// </summary>
    public static string? DecimalComma(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var m = Comma().Match(text.Trim());
        return m.Success ? m.Groups[1].Value + "." + m.Groups[2].Value + m.Groups[3].Value : null;
    }

    [GeneratedRegex(@"^([+-]?\d+),(\d+)(\s.*)?$", RegexOptions.Singleline)]
    private static partial Regex Comma();
}
