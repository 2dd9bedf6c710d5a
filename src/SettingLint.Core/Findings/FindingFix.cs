using SettingLint.Core.Documents;

namespace SettingLint.Core.Findings;

/// <summary>
/// A value that clears a finding: the text that replaces the value's region in the file, checked by a second run of
/// the rules before it is offered.
/// </summary>
/// <param name="Region">The characters of the value as written (number and unit, without quotes).</param>
/// <param name="Inserted">What replaces them, in the same unit and side ("44.6 A sec").</param>
/// <param name="Shown">The new value for people, primary and secondary ("669 A pri (44.6 A sec)").</param>
public sealed record FindingFix(SourceSpan Region, string Inserted, string Shown);
