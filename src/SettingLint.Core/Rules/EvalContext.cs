using SettingLint.Core.Model;

namespace SettingLint.Core.Rules;

/// <summary>What an expression is evaluated against: one motor, its repository, the rule's parameters and lets, and a relay range.</summary>
public sealed class EvalContext(MotorProtection motor, RepositoryIndex index, double[] parameters, Val[] lets)
{
    public MotorProtection Motor { get; } = motor;

    public RepositoryIndex Index { get; } = index;

    public double[] Parameters { get; } = parameters;

    public Val[] Lets { get; } = lets;

    /// <summary>The relay range of a for_each rule: value, min, max, step in SI for this motor.</summary>
    public RangeItem? Item { get; init; }

    /// <summary>The same context for another motor (aggregates), with fresh lets.</summary>
    public EvalContext For(MotorProtection other) => new(other, Index, Parameters, new Val[Lets.Length]);
}

/// <summary>One relay range resolved for a motor.</summary>
public sealed record RangeItem(string Setting, Val Value, Val Min, Val Max, Val Step);
