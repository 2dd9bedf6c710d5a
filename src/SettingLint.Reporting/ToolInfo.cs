using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>The tool as reports name it: name, version and where to learn more.</summary>
/// <param name="Name">The tool's name.</param>
/// <param name="Version">The tool's version (semantic version).</param>
/// <param name="InformationUri">Where the tool is documented; rule help links are made from it.</param>
public sealed record ToolInfo(string Name, string Version, Uri InformationUri)
{
    /// <summary>The tool's name in every report.</summary>
    public const string ToolName = "SettingLint";

    /// <summary>The information URI: a placeholder until the project has a public home. This is the only place it is written.</summary>
    public const string PlaceholderInformationUri = "https://settinglint.invalid/";

    /// <summary>The tool info of SettingLint at a version, with the placeholder information URI.</summary>
    public static ToolInfo ForVersion(string version) =>
        new(ToolName, version, new Uri(PlaceholderInformationUri, UriKind.Absolute));

    /// <summary>The help link of a rule: the information URI followed by the rule's help path.</summary>
    public Uri HelpUri(RuleDescriptor rule)
    {
        ArgumentNullException.ThrowIfNull(rule);
        var baseUri = InformationUri.OriginalString;
        var separator = baseUri.EndsWith('/') ? "" : "/";
        return new Uri(baseUri + separator + rule.HelpPath, UriKind.Absolute);
    }
}
