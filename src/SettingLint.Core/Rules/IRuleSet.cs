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

/// <summary>
/// A rule set that can evaluate a motor in two steps: the rules that need only the motor, its bus and its relay model as
/// soon as the motor is bound, and the rules over the other motors of its bus once every motor is bound. Between the
/// two, a run keeps of each motor only the values the second step reads, so that its memory does not grow with the
/// size of every motor file. Both steps together give the findings of <see cref="IRuleSet.Evaluate"/>.
/// </summary>
internal interface IStagedRuleSet : IRuleSet
{
    /// <summary>
    /// The key paths of a motor's own document that <see cref="EvaluateAcrossBus"/> reads, for its values and for the
    /// places of its findings; null when it needs the whole document.
    /// </summary>
    IReadOnlySet<string>? LaterPaths { get; }

    /// <summary>Evaluates the rules that read nothing of other motors.</summary>
    /// <param name="motor">The motor, with its whole document.</param>
    /// <param name="run">
    /// One index for every motor of this step of a run, which these rules never ask for other motors (it may be empty):
    /// what a rule set works out once per run, such as the relay models' ranges, is kept with it.
    /// </param>
    /// <param name="findings">The motor file's findings.</param>
    /// <param name="notify">Receives a rule's failure.</param>
    void EvaluateOwn(MotorProtection motor, RepositoryIndex run, FindingBuilder findings, Action<Notification> notify);

    /// <summary>Evaluates the rules that read the other motors of the bus, through the index of every motor.</summary>
    void EvaluateAcrossBus(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify);
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
