namespace SettingLint.Core.Findings;

/// <summary>A named value of a finding: the text shown in the message, and the number and unit behind it when it has one.</summary>
public sealed record FindingValue(string Text, double? Number = null, string? Unit = null)
{
    public static implicit operator FindingValue(string text) => new(text);

    public override string ToString() => Text;
}
