using System.Collections.Immutable;
using SettingLint.Core.Model;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Rules;

/// <summary>
/// Traces a rule's absent guard or check back to the absent key paths behind it, and tells a gap in the data (a rule that
/// applies but cannot be evaluated) from a rule that does not apply.
/// </summary>
/// <remarks>
/// Not a gap: an absent value that an expression does without (coalesce with a value present, present(), an optional
/// argument), a setting of an element that is absent or out of service (the element's own rules, SL204, SL305 and
/// SL808, report a missing element where it leaves the motor unprotected), a relay range the motor does not set, and an
/// aggregate over the other motors of a bus that has none. A rule for which an absent input is normal says so in its
/// guard with present(...), which makes the guard false rather than absent.
/// </remarks>
internal static class MissingData
{
    /// <summary>What an absent leaf says about the rule.</summary>
    private enum Kind
    {
        /// <summary>A key path is missing: the rule applies and could not be evaluated.</summary>
        Gap,

        /// <summary>The rule does not apply (an element not in service, a relay range the motor does not set).</summary>
        NotApplicable,
    }

    /// <summary>The missing key paths that stopped a rule, sorted; empty when the rule does not apply or nothing missing explains it.</summary>
    /// <param name="rule">The rule, for its lets.</param>
    /// <param name="ctx">The context the guard or check was evaluated in (its lets are still set).</param>
    /// <param name="when">The guard, when that is what was absent.</param>
    /// <param name="check">The check, when that is what was absent.</param>
    public static ImmutableArray<string> Of(CompiledRule rule, EvalContext ctx, Compiled? when, CheckNode? check)
    {
        var found = new List<(Kind Kind, string Path)>();
        if (when is not null) Trace(when, rule, ctx, found, 0);
        if (check is not null) TraceCheck(check, rule, ctx, found);
        if (found.Count == 0 || found.Exists(f => f.Kind == Kind.NotApplicable)) return [];
        return [.. found.Select(f => f.Path).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal)];
    }

    private static void TraceCheck(CheckNode node, CompiledRule rule, EvalContext ctx, List<(Kind, string)> found)
    {
        switch (node)
        {
            case ComparisonNode c:
                Trace(c.Left, rule, ctx, found, 0);
                Trace(c.Right, rule, ctx, found, 0);
                break;
            case AndNode a:
                TraceCheck(a.Left, rule, ctx, found);
                TraceCheck(a.Right, rule, ctx, found);
                break;
            case OrNode o:
                TraceCheck(o.Left, rule, ctx, found);
                TraceCheck(o.Right, rule, ctx, found);
                break;
            case PlainNode p:
                Trace(p.Expression, rule, ctx, found, 0);
                break;
        }
    }

    // Only absent values are followed: a present operand did not stop anything. Lets are followed into their expressions.
    private static void Trace(Compiled c, CompiledRule rule, EvalContext ctx, List<(Kind, string)> found, int depth)
    {
        // Lets refer only to earlier lets, so the depth is bounded by the rule; the bound is a guard against a cycle all the same.
        if (depth > 64 || !c.Get(ctx).IsAbsent) return;
        switch (c.Leaf)
        {
            case LeafKind.MotorPath:
                found.Add(MotorPath(ctx.Motor, c.LeafSlot!.Path));
                return;
            case LeafKind.BusPath:
                found.Add((Kind.Gap, BusPath(ctx.Motor, c.LeafSlot!.Path)));
                return;
            case LeafKind.Let:
                Trace(rule.Lets[c.LeafIndex].Value, rule, ctx, found, depth + 1);
                return;
            case LeafKind.ItemValue:
                // The motor does not set what the relay model can set: nothing to check.
                found.Add((Kind.NotApplicable, ""));
                return;
            case LeafKind.ItemMin or LeafKind.ItemMax or LeafKind.ItemStep:
                // A range bound that could not be converted for this motor (a multiple of a transformer it does not give).
                found.Add((Kind.Gap, "relay_model.ranges." + ctx.Item!.Setting));
                return;
        }
        if (c.Operands is not { } operands) return;
        var optional = c.Source is Call call && Functions.All.TryGetValue(call.Name, out var fn) ? fn.OptionalArgs : null;
        for (var i = 0; i < operands.Length; i++)
        {
            if (optional is null || Array.IndexOf(optional, i) < 0) Trace(operands[i], rule, ctx, found, depth + 1);
        }
    }

    /// <summary>A missing motor path: a gap, unless it is a setting of an element that is absent or out of service.</summary>
    private static (Kind, string) MotorPath(MotorProtection motor, string path)
    {
        const string protection = SchemaPaths.Motor.ProtectionPrefix;
        if (path.StartsWith(protection, StringComparison.Ordinal))
        {
            var dot = path.IndexOf('.', protection.Length);
            var element = dot < 0 ? path : path[..dot];
            if (motor.Document.Flag(element + ".enabled") != true) return (Kind.NotApplicable, path);
        }
        return (Kind.Gap, Highest(motor.Document, path, ""));
    }

    /// <summary>A missing bus path, written as the rules write it (bus.x); just "bus" when the motor's bus is not there at all.</summary>
    private static string BusPath(MotorProtection motor, string path) =>
        motor.Bus is { } bus ? Highest(bus.Document, path, "bus.") : "bus";

    /// <summary>The highest missing key on the way to a path: "bus.upstream" rather than its three keys when the bus gives no upstream protection.</summary>
    private static string Highest(BoundDocument doc, string path, string prefix)
    {
        var highest = path;
        for (var dot = path.LastIndexOf('.'); dot > 0; dot = path.LastIndexOf('.', dot - 1))
        {
            var parent = path[..dot];
            if (Has(doc, parent)) break;
            highest = parent;
        }
        return prefix + highest;
    }

    private static bool Has(BoundDocument doc, string prefix)
    {
        foreach (var key in doc.Values.Keys)
        {
            if (key.Length > prefix.Length && key[prefix.Length] == '.' && key.StartsWith(prefix, StringComparison.Ordinal)) return true;
        }
        return false;
    }
}
