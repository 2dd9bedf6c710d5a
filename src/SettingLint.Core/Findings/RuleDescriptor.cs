using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>What every output needs to know about a rule that can fire: declared once, rendered everywhere.</summary>
/// <param name="Id">SLnnn.</param>
/// <param name="Name">A PascalCase name, for SARIF's reportingDescriptor.name.</param>
/// <param name="Title">One line: what is wrong when it fires.</param>
/// <param name="Summary">One sentence that explains the check.</param>
/// <param name="HelpMarkdown">Rationale and basis, in markdown.</param>
/// <param name="DefaultLevel">The level before configuration.</param>
/// <param name="Tags">IEEE C37.2 device numbers and families.</param>
public sealed record RuleDescriptor(
    string Id,
    string Name,
    string Title,
    string Summary,
    string HelpMarkdown,
    Level DefaultLevel,
    ImmutableArray<string> Tags)
{
    /// <summary>The help text without markdown, for plain-text consumers.</summary>
    public string HelpText => HelpMarkdown.Replace("**", "", StringComparison.Ordinal).Replace("`", "", StringComparison.Ordinal);

    /// <summary>Where the rule is documented, relative to the tool's information URI.</summary>
    public string HelpPath => "rules/README.md#" + Id.ToLowerInvariant();
}
