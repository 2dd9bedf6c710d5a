using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Findings;

/// <summary>Collects the findings of one file; the only place engine findings are made.</summary>
public sealed class FindingBuilder(string file)
{
    private readonly List<Finding> _findings = [];

    // Few: only rules stopped by missing data; made on first use.
    private List<CheckNotRun>? _notRun;

    public string File { get; } = file;

    public IReadOnlyList<Finding> Findings => _findings;

    public bool HasAny => _findings.Count > 0;

    /// <summary>Adds a finding of an engine rule: its message by id, and the values that fill the message's holes.</summary>
    public void Add(EngineMessage message, SourceSpan span, string keyPath, params (string Name, FindingValue Value)[] values)
    {
        var dict = ImmutableSortedDictionary.CreateRange(
            StringComparer.Ordinal,
            values.Select(v => KeyValuePair.Create(v.Name, v.Value)));
        _findings.Add(new Finding(message.RuleId, EngineRules.Get(message.RuleId).DefaultLevel, File, span, keyPath, message.Template, dict) { MessageId = message.Id });
    }

    /// <summary>Adds a finding made elsewhere (a rule's).</summary>
    public void Add(Finding finding) => _findings.Add(finding);

    /// <summary>The rules not evaluated on this file's motor for missing data, one entry per rule.</summary>
    public IReadOnlyList<CheckNotRun> NotRun => (IReadOnlyList<CheckNotRun>?)_notRun ?? [];

    /// <summary>Records a rule not evaluated for missing data; a rule stopped again (at another relay range) adds its paths to its entry.</summary>
    public void AddNotRun(CheckNotRun notRun)
    {
        ArgumentNullException.ThrowIfNull(notRun);
        _notRun ??= [];
        var at = _notRun.FindIndex(n => n.RuleId == notRun.RuleId);
        if (at < 0)
        {
            _notRun.Add(notRun);
            return;
        }
        var merged = _notRun[at].MissingPaths.Union(notRun.MissingPaths, StringComparer.Ordinal).Order(StringComparer.Ordinal);
        _notRun[at] = _notRun[at] with { MissingPaths = [.. merged] };
    }

    /// <summary>Whether a finding of a rule is already recorded at a span (avoids reporting one fault twice).</summary>
    public bool Has(string ruleId, SourceSpan span) => _findings.Exists(f => f.RuleId == ruleId && f.Span == span);

    /// <summary>Whether any finding is recorded at a span.</summary>
    public bool HasAt(SourceSpan span) => _findings.Exists(f => f.Span == span);
}
