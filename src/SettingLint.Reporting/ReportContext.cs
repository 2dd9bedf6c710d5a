namespace SettingLint.Reporting;

/// <summary>What a reporter needs to know besides the result: where the user stands, what to leave out, who made it.</summary>
/// <param name="CurrentDirectory">Absolute path of the current directory; text paths are relative to it.</param>
/// <param name="Timestamps">Whether to write the start and end times (off by default so that output is reproducible).</param>
/// <param name="OmitSuppressed">Whether to leave suppressed findings out of the report (they are still counted).</param>
/// <param name="Tool">The tool's name, version and information URI.</param>
public sealed record ReportContext(string CurrentDirectory, bool Timestamps, bool OmitSuppressed, ToolInfo Tool)
{
    /// <summary>When the run started; written only with <see cref="Timestamps"/>.</summary>
    public DateTimeOffset? StartTimeUtc { get; init; }

    /// <summary>How messages name this tool's commands: <see cref="ToolCommand.Installed"/> unless the CLI knows better.</summary>
    public string Command { get; init; } = ToolCommand.Installed;

    /// <summary>Text: list each accepted finding rather than one line per rule.</summary>
    public bool ShowAccepted { get; init; }

    /// <summary>When the run ended; written only with <see cref="Timestamps"/>.</summary>
    public DateTimeOffset? EndTimeUtc { get; init; }
}
