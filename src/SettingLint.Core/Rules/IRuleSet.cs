using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;

namespace SettingLint.Core.Rules;

/// <summary>A compiled set of rules that the engine applies to every motor after binding.</summary>
internal interface IRuleSet
{
    /// <summary>The rules that can fire, for the outputs' metadata.</summary>
    ImmutableArray<RuleDescriptor> Descriptors { get; }

    /// <summary>Evaluates every rule on one motor; findings go to the motor's builder.</summary>
    void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify);
}

/// <summary>No rules beyond the engine's own file checks.</summary>
internal sealed class EmptyRuleSet : IRuleSet
{
    public static EmptyRuleSet Instance { get; } = new();

    public ImmutableArray<RuleDescriptor> Descriptors => [];

    public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
    {
    }
}
