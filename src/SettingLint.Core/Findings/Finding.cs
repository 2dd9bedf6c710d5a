using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Findings;

/// <summary>One finding: a rule, a level, a place, and a message made from a template and named values.</summary>
/// <param name="RuleId">The rule's id, such as SL201.</param>
/// <param name="Level">The effective level after configuration.</param>
/// <param name="File">The file, relative to the repository root, with forward slashes.</param>
/// <param name="Span">Where in the file.</param>
/// <param name="KeyPath">The YAML key path of the subject (dots between keys); stable when lines move.</param>
/// <param name="Template">The message template with {name} holes.</param>
/// <param name="Values">The named values; every hole of the template has one.</param>
public sealed record Finding(
    string RuleId,
    Level Level,
    string File,
    SourceSpan Span,
    string KeyPath,
    string Template,
    ImmutableSortedDictionary<string, FindingValue> Values)
{
    /// <summary>
    /// Which message of its rule this is: an engine rule has several (<see cref="EngineMessages"/>), a data rule has its
    /// one message, "default".
    /// </summary>
    public string MessageId { get; init; } = DefaultMessageId;

    /// <summary>The id of a data rule's one message.</summary>
    public const string DefaultMessageId = "default";

    /// <summary>The message with its holes filled.</summary>
    public string Message => MessageTemplate.Render(Template, Values);

    /// <summary>A suppression that applies to this finding, when there is one.</summary>
    public Suppression? Suppression { get; init; }

    /// <summary>A checked value that clears the finding, when the rules on its setting leave one.</summary>
    public FindingFix? Fix { get; init; }

    /// <summary>How the finding compares with the baseline of the run; null when the run has none.</summary>
    public BaselineState? BaselineState { get; init; }

    /// <summary>The fingerprint that stays the same when lines move: file, rule and key path.</summary>
    public string Fingerprint => Fingerprints.Of(File, RuleId, KeyPath);

    /// <summary>Orders findings by file, line, column, rule, key path and message, so output is stable.</summary>
    public static IComparer<Finding> Order { get; } = Comparer<Finding>.Create(static (a, b) =>
    {
        var c = string.CompareOrdinal(a.File, b.File);
        if (c == 0) c = a.Span.StartLine.CompareTo(b.Span.StartLine);
        if (c == 0) c = a.Span.StartColumn.CompareTo(b.Span.StartColumn);
        if (c == 0) c = string.CompareOrdinal(a.RuleId, b.RuleId);
        if (c == 0) c = string.CompareOrdinal(a.KeyPath, b.KeyPath);
        if (c == 0) c = string.CompareOrdinal(a.Message, b.Message);
        return c;
    });
}

/// <summary>A finding against the baseline, with SARIF's names (new, unchanged, absent).</summary>
public enum BaselineState
{
    /// <summary>Not in the baseline: it counts against the gate.</summary>
    New,

    /// <summary>In the baseline: reported, but it does not fail the gate.</summary>
    Unchanged,

    /// <summary>In the baseline but no longer found.</summary>
    Absent,
}

/// <summary>Why a finding is accepted in the source: a reason written by a person.</summary>
public sealed record Suppression(string Justification, string File, SourceSpan Span);
