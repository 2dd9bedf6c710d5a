namespace SettingLint.Core.Findings;

/// <summary>How serious a finding is; the names and order are SARIF's result levels.</summary>
public enum Level
{
    /// <summary>Not reported (a rule switched off).</summary>
    None = 0,
    Note = 1,
    Warning = 2,
    Error = 3,
}

/// <summary>Parsing and naming of levels as they are written in files and on the command line.</summary>
public static class Levels
{
    /// <summary>The lower-case token of a level (error, warning, note, none).</summary>
    public static string Token(this Level level) => level switch
    {
        Level.Error => "error",
        Level.Warning => "warning",
        Level.Note => "note",
        _ => "none",
    };

    /// <summary>Reads a level token; null when it is not one.</summary>
    public static Level? Parse(string token) => token switch
    {
        "error" => Level.Error,
        "warning" => Level.Warning,
        "note" => Level.Note,
        "none" or "off" => Level.None,
        _ => null,
    };
}
