using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>
/// A rule that applied to a motor but could not be evaluated because input data is missing: "clean" must never
/// silently mean "not checked". A rule whose guard is false (an element out of service, another starter type) is not
/// one of these; only absent inputs are.
/// </summary>
/// <param name="RuleId">The rule that was not run.</param>
/// <param name="Level">The rule's level in this run: what it could have found.</param>
/// <param name="File">The motor file, relative to the repository root.</param>
/// <param name="Motor">The motor's tag.</param>
/// <param name="MissingPaths">
/// The key paths whose absence stopped the rule, sorted: paths of the motor file, <c>bus.</c> paths of its bus file,
/// <c>bus</c> or <c>relay_model</c> when that file is missing altogether.
/// </param>
public sealed record CheckNotRun(string RuleId, Level Level, string File, string Motor, ImmutableArray<string> MissingPaths)
{
    /// <summary>The missing paths as one text, such as "bus.fault_current_min, bus.upstream".</summary>
    public string MissingText => string.Join(", ", MissingPaths);

    /// <summary>One sentence for a person, such as "SL202 was not evaluated on P-101: missing bus.fault_current_min.".</summary>
    public string Sentence => RuleId + " was not evaluated on " + Motor + ": missing " + MissingText + ".";

    /// <summary>The report order: by file, then rule.</summary>
    public static IComparer<CheckNotRun> Order { get; } = Comparer<CheckNotRun>.Create(static (a, b) =>
    {
        var c = string.CompareOrdinal(a.File, b.File);
        return c != 0 ? c : string.CompareOrdinal(a.RuleId, b.RuleId);
    });
}
