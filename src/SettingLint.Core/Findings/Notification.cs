namespace SettingLint.Core.Findings;

/// <summary>A message about the run rather than the settings: a bad configuration or rule file, or an internal error.</summary>
/// <param name="Kind">Configuration problems exit 2; internal errors exit 3.</param>
/// <param name="Message">What happened, for a person.</param>
/// <param name="File">The file concerned, relative to the repository root, when there is one.</param>
/// <param name="Span">Where in that file, when known.</param>
/// <param name="Exception">The exception text of an internal error, for the SARIF notification.</param>
public sealed record Notification(
    NotificationKind Kind,
    string Message,
    string? File = null,
    Documents.SourceSpan? Span = null,
    string? Exception = null)
{
    /// <summary>The engine rule of a configuration or rule file problem found as a finding (SL001, SL015, ...); null otherwise.</summary>
    public string? RuleId { get; init; }

    /// <summary>The finding's named values, when the notification was one; empty otherwise.</summary>
    public System.Collections.Immutable.ImmutableSortedDictionary<string, FindingValue> Values { get; init; } =
        System.Collections.Immutable.ImmutableSortedDictionary<string, FindingValue>.Empty;
}

/// <summary>The two kinds of run notification.</summary>
public enum NotificationKind
{
    /// <summary>The configuration or a rule file is wrong: exit 2.</summary>
    Configuration,

    /// <summary>The tool itself failed: exit 3.</summary>
    Internal,
}
