namespace SettingLint.Sheets.SettingSheets;

/// <summary>One setting of one motor as a technician keys it in.</summary>
/// <param name="Tag">The motor's tag.</param>
/// <param name="File">The motor's file, relative to the repository root.</param>
/// <param name="Element">The protection element, by its schema title (Short circuit (50P)).</param>
/// <param name="Setting">The setting's key within its element (pickup).</param>
/// <param name="Path">The setting's key path.</param>
/// <param name="Written">The value as written in the file.</param>
/// <param name="Primary">The engine's value on the primary side (A, V), or in its SI unit (s, %), when it is a number.</param>
/// <param name="Secondary">The engine's value on the relay's side of its CT or VT (A, V), when the setting is measured through one.</param>
/// <param name="Unit">The unit of Primary and Secondary.</param>
/// <param name="Range">The relay model's range of the setting, as written there.</param>
/// <param name="Step">The relay model's step of the setting, as written there.</param>
/// <param name="Findings">The findings on the setting (rule, level, message), one per line.</param>
public sealed record SheetRow(
    string Tag,
    string File,
    string Element,
    string Setting,
    string Path,
    string Written,
    double? Primary,
    double? Secondary,
    string Unit,
    string Range,
    string Step,
    IReadOnlyList<string> Findings)
{
    /// <summary>With --changed-since: the same setting at the revision; null when it was not there.</summary>
    public SheetRow? Old { get; init; }

    /// <summary>With --changed-since: whether the setting is new, changed or removed ("" when the sheet compares nothing).</summary>
    public string Change { get; init; } = "";
}
