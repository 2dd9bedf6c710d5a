namespace SettingLint.Core.Findings;

/// <summary>The caution every output carries (help, reports, summaries, the rule catalogue): worded here only.</summary>
public static class Caution
{
    /// <summary>What the findings are and are not.</summary>
    public const string Text =
        "These rules screen settings for review; they do not replace a protection study by a qualified engineer. Local codes and licensed practice prevail.";
}
