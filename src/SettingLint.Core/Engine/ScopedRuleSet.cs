using System.Collections.Concurrent;
using System.Collections.Immutable;
using SettingLint.Core.Configuration;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Engine;

/// <summary>
/// The rules of a run where folders configure them: each motor is evaluated by the rules as its folder's configuration
/// sets them (on or off, severity, parameters). Folders that add no rule setting share the root's rule set; each other
/// set of settings gets one rule set for the run, made on first use, with the root's listeners.
/// </summary>
internal sealed class ScopedRuleSet : IRuleSet
{
    private readonly RuleSet _root;
    private readonly ConfigScopes _scopes;
    private readonly ConcurrentDictionary<ImmutableArray<CompiledRule>, RuleSet> _sets = new();

    public ScopedRuleSet(RuleSet root, ConfigScopes scopes)
    {
        ArgumentNullException.ThrowIfNull(root);
        ArgumentNullException.ThrowIfNull(scopes);
        _root = root;
        _scopes = scopes;
        _sets[root.Rules] = root;
        // A folder may switch on a rule the root switched off (back to its default level): the descriptors are those of
        // every loaded rule that is on by default or at the root.
        Descriptors = [.. root.Rules.Where(r => (r.Level == Level.None ? r.Descriptor.DefaultLevel : r.Level) != Level.None).Select(r => r.Descriptor)];
    }

    public ImmutableArray<RuleDescriptor> Descriptors { get; }

    public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify) =>
        For(motor).Evaluate(motor, index, findings, notify);

    private RuleSet For(MotorProtection motor) =>
        _sets.GetOrAdd(_scopes.For(motor.Document.RelativePath).Rules, rules => new RuleSet(rules) { Outcomes = _root.Outcomes, Motors = _root.Motors });
}
