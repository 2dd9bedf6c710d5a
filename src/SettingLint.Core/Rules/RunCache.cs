using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Runtime.CompilerServices;
using System.Runtime.ExceptionServices;
using SettingLint.Core.Model;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Rules;

/// <summary>
/// What a rule set computes once per run (one repository index) instead of once per motor: the value of an aggregate's
/// expression for each motor of a bus, and what a relay range needs besides the motor.
/// </summary>
internal sealed class RunCache
{
    private readonly ConcurrentDictionary<BusKey, BusValues> _buses = new();
    // By relay-model document: every motor gets its own RelayRange objects, but they are read from one shared document.
    private readonly ConcurrentDictionary<BoundDocument, RangeInfo[]> _models = new();

    /// <summary>
    /// The value of an aggregate's expression for each motor of a group, in the group's order, or null when the group is
    /// not worth caching. The parameters are part of the key: a repository's overrides give one compiled expression other values.
    /// </summary>
    public BusValues? OnBus(object node, EvalContext ctx, ImmutableArray<MotorProtection> group, Func<EvalContext, Val> f)
    {
        if (group.Length < 2) return null;
        var key = new BusKey(node, ctx.Parameters, group[0]);
        var values = _buses.GetOrAdd(key, static (_, arg) => BusValues.Compute(arg.ctx, arg.group, arg.f), (ctx, group, f));
        // The key names the group by its first motor; a different group behind it would be a change in the index, so check.
        return values.Matches(group) ? values : null;
    }

    /// <summary>What the ranges of a relay model need, by position, shared by the motors that use the model.</summary>
    public RangeInfo[] Ranges(RelayModel model) =>
        _models.GetOrAdd(model.Document, static (_, m) => [.. m.Ranges.Select(r => new RangeInfo(r))], model);

    private readonly record struct BusKey(object Node, double[] Parameters, MotorProtection First) : IEquatable<BusKey>
    {
        public bool Equals(BusKey other) =>
            ReferenceEquals(Node, other.Node) && ReferenceEquals(Parameters, other.Parameters) && ReferenceEquals(First, other.First);

        public override int GetHashCode() =>
            HashCode.Combine(RuntimeHelpers.GetHashCode(Node), RuntimeHelpers.GetHashCode(Parameters), RuntimeHelpers.GetHashCode(First));
    }
}

/// <summary>An aggregate's expression evaluated for every motor of a bus; a motor whose evaluation threw rethrows when read.</summary>
internal sealed class BusValues
{
    private readonly MotorProtection[] _group;
    private readonly Val[] _values;
    private readonly ExceptionDispatchInfo?[] _errors;

    private BusValues(MotorProtection[] group, Val[] values, ExceptionDispatchInfo?[] errors)
    {
        _group = group;
        _values = values;
        _errors = errors;
    }

    public static BusValues Compute(EvalContext ctx, ImmutableArray<MotorProtection> group, Func<EvalContext, Val> f)
    {
        var values = new Val[group.Length];
        var errors = new ExceptionDispatchInfo?[group.Length];
        for (var i = 0; i < group.Length; i++)
        {
            try
            {
                values[i] = f(ctx.For(group[i]));
            }
            catch (Exception ex) when (ex is not OutOfMemoryException)
            {
                // Kept, not thrown: only a motor that reads this value fails, as when each motor evaluated it itself.
                errors[i] = ExceptionDispatchInfo.Capture(ex);
            }
        }
        return new BusValues([.. group], values, errors);
    }

    /// <summary>The value for the motor at a position of the group.</summary>
    public Val Get(int i)
    {
        _errors[i]?.Throw();
        return _values[i];
    }

    public bool Matches(ImmutableArray<MotorProtection> group)
    {
        if (group.Length != _group.Length) return false;
        for (var i = 0; i < group.Length; i++)
        {
            if (!ReferenceEquals(group[i], _group[i])) return false;
        }
        return true;
    }
}

/// <summary>What evaluating a relay range needs besides the motor, worked out once per range per run.</summary>
internal sealed class RangeInfo(RelayRange range)
{
    /// <summary>The protection key path it bounds below "protection.", such as short_circuit.pickup.</summary>
    public string Setting { get; } = range.Setting;

    /// <summary>The motor key path the range bounds, such as protection.short_circuit.pickup.</summary>
    public PathSlot Path { get; } = PathTable.Motor.Of(SchemaPaths.Motor.ProtectionPrefix + range.Setting);

    /// <summary>The range is of a voltage setting (its references are the VT's).</summary>
    public bool Voltage { get; } = range.Min.Quantity.Unit.Dimension == Quantities.Dimension.Voltage;

    /// <summary>This was worked out from a range like this one: everything above follows from its setting and dimension.</summary>
    public bool Fits(RelayRange range) =>
        string.Equals(range.Setting, Setting, StringComparison.Ordinal) && (range.Min.Quantity.Unit.Dimension == Quantities.Dimension.Voltage) == Voltage;
}
