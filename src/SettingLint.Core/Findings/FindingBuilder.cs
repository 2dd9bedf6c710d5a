using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Findings;

/// <summary>Collects the findings of one file; the only place engine findings are made.</summary>
public sealed class FindingBuilder(string file)
{
    private readonly List<Finding> _findings = [];

    public string File { get; } = file;

    public IReadOnlyList<Finding> Findings => _findings;

    public bool HasAny => _findings.Count > 0;

    /// <summary>Adds an engine finding with its named values, given as name/value pairs.</summary>
    public void Add(string ruleId, SourceSpan span, string keyPath, string template, params (string Name, FindingValue Value)[] values)
    {
        var dict = ImmutableSortedDictionary.CreateRange(
            StringComparer.Ordinal,
            values.Select(v => KeyValuePair.Create(v.Name, v.Value)));
        _findings.Add(new Finding(ruleId, EngineRules.Get(ruleId).DefaultLevel, File, span, keyPath, template, dict));
    }

    /// <summary>Adds a finding made elsewhere (a rule's).</summary>
    public void Add(Finding finding) => _findings.Add(finding);

    /// <summary>Whether a finding of a rule is already recorded at a span (avoids reporting one fault twice).</summary>
    public bool Has(string ruleId, SourceSpan span) => _findings.Exists(f => f.RuleId == ruleId && f.Span == span);

    /// <summary>Whether any finding is recorded at a span.</summary>
    public bool HasAt(SourceSpan span) => _findings.Exists(f => f.Span == span);
}
