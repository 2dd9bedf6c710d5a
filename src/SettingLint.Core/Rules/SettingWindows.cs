using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Rules;

/// <summary>One comparison of a check, evaluated: its left side's key path when that is a motor setting, the operator, both numbers and a label for the limit.</summary>
/// <param name="Path">The motor key path on the left (item.value becomes protection.{setting}); null when the left side is computed.</param>
/// <param name="Op">The comparison operator as written.</param>
/// <param name="Actual">The left side, SI.</param>
/// <param name="Limit">The right side, SI.</param>
/// <param name="LimitLabel">The right side in words, from the rule's own names ("asymmetrical start").</param>
/// <param name="Dim">The dimension compared.</param>
/// <param name="Percent">The numbers are best shown in percent.</param>
/// <param name="Holds">The comparison is true.</param>
public sealed record CheckBound(string? Path, string Op, double Actual, double Limit, string LimitLabel, Dim Dim, bool Percent, bool Holds)
{
    /// <summary>A lower bound (the left side must be above the limit).</summary>
    public bool IsLower => Op is ">" or ">=";

    /// <summary>An upper bound (the left side must be below the limit).</summary>
    public bool IsUpper => Op is "<" or "<=";

    /// <summary>The limit itself is excluded.</summary>
    public bool IsStrict => Op is ">" or "<";
}

/// <summary>The comparisons of a check that must all hold: the root and the branches of 'and', never those under 'or' (an alternative is not a bound).</summary>
internal static class CheckBounds
{
    /// <param name="labels">The rule's <see cref="Labels"/>.</param>
    public static ImmutableArray<CheckBound> Of(CompiledRule rule, EvalContext ctx, ImmutableArray<string> labels)
    {
        var found = ImmutableArray.CreateBuilder<CheckBound>();
        var index = 0;
        Collect(rule, rule.Check, ctx, labels, ref index, found);
        return found.ToImmutable();
    }

    /// <summary>
    /// The limit of each comparison of <see cref="Of"/> in words, in the order it visits them: they depend on the rule
    /// alone. Made for every rule and motor, at 10,000 motors they were 3.3 % of a check's CPU (perf, native build), and
    /// made once the check took 4.93 x the parse-only floor's CPU against 5.48 x (docs/performance.md, 2026-12-05).
    /// </summary>
    public static ImmutableArray<string> Labels(CompiledRule rule)
    {
        var labels = ImmutableArray.CreateBuilder<string>();
        void Visit(CheckNode node)
        {
            switch (node)
            {
                case AndNode a:
                    Visit(a.Left);
                    Visit(a.Right);
                    break;
                case ComparisonNode c:
                    labels.Add(Words(rule, c.Right.Source));
                    break;
            }
        }
        Visit(rule.Check);
        return labels.ToImmutable();
    }

    private static void Collect(CompiledRule rule, CheckNode node, EvalContext ctx, ImmutableArray<string> labels, ref int index, ImmutableArray<CheckBound>.Builder found)
    {
        switch (node)
        {
            case AndNode a:
                Collect(rule, a.Left, ctx, labels, ref index, found);
                Collect(rule, a.Right, ctx, labels, ref index, found);
                break;
            case ComparisonNode c:
                var label = labels[index++];
                var l = c.Left.Eval(ctx);
                var r = c.Right.Eval(ctx);
                if (l.Kind != ValKind.Number || r.Kind != ValKind.Number) return;
                var holds = Compiler.Compare(c.Op, l, r) is { IsAbsent: false, Flag: true };
                found.Add(new CheckBound(PathOf(rule, c.Left.Source, ctx), c.Op, l.Number, r.Number, label,
                    c.Left.Type.Dim, c.Left.Percent || c.Right.Percent, holds));
                break;
        }
    }

    /// <summary>The motor key path an expression reads directly (through a let that is only a path), else null.</summary>
    private static string? PathOf(CompiledRule rule, Expr e, EvalContext ctx, int depth = 0)
    {
        if (e is not PathRef p || depth > 8) return null;
        if (p.Path == "item.value") return ctx.Item is { } item ? SchemaPaths.Motor.ProtectionPrefix + item.Setting : null;
        if (p.Path.StartsWith("param.", StringComparison.Ordinal) || p.Path.StartsWith("item.", StringComparison.Ordinal)
            || p.Path.StartsWith("bus.", StringComparison.Ordinal))
        {
            return null;
        }
        if (p.Path.Contains('.', StringComparison.Ordinal)) return p.Path;
        foreach (var (name, value) in rule.Lets)
        {
            if (name == p.Path) return PathOf(rule, value.Source, ctx, depth + 1);
        }
        return null;
    }

    /// <summary>An expression in the rule's own words: names with spaces, x for times; enough to say where a limit comes from.</summary>
    internal static string Words(CompiledRule rule, Expr e) => e switch
    {
        PathRef p when p.Path.StartsWith("param.", StringComparison.Ordinal) => Param(rule, p.Path["param.".Length..]),
        PathRef p when p.Path.StartsWith("item.", StringComparison.Ordinal) => "relay range " + Spaced(p.Path["item.".Length..]),
        PathRef p when p.Path.StartsWith("bus.", StringComparison.Ordinal) => "bus " + Spaced(p.Path["bus.".Length..]),
        PathRef p => Spaced(p.Path.Contains('.', StringComparison.Ordinal) ? p.Path[(p.Path.IndexOf('.', StringComparison.Ordinal) + 1)..] : p.Path),
        NumberLit n => CheckNode.Format(n.Value, n.Dim, n.Percent),
        Binary b => Words(rule, b.Left) + " " + (b.Op == "*" ? "x" : b.Op) + " " + Words(rule, b.Right),
        Unary u => (u.Op == "not" ? "not " : "-") + Words(rule, u.Operand),
        Call c => c.Name + "(" + string.Join(", ", c.Args.Select(a => Words(rule, a))) + ")",
        _ => "",
    };

    // A parameter reads best as its value ("1.1 x longest start"): the number is what a reviewer weighs.
    private static string Param(CompiledRule rule, string name)
    {
        foreach (var p in rule.Parameters)
        {
            if (p.Name == name) return p.Format(rule.ParameterValues[p.Index]);
        }
        return Spaced(name);
    }

    private static string Spaced(string name) => name.Replace('_', ' ').Replace('.', ' ');
}

/// <summary>A limit that a rule sets on a setting, as one side of its window.</summary>
/// <param name="RuleId">The rule.</param>
/// <param name="Op">Its comparison operator.</param>
/// <param name="Limit">The limit, SI.</param>
/// <param name="Label">Where the limit comes from, in the rule's words.</param>
/// <param name="Holds">The setting satisfies it.</param>
public sealed record WindowBound(string RuleId, string Op, double Limit, string Label, bool Holds)
{
    /// <summary>The limit itself is excluded.</summary>
    public bool IsStrict => Op is ">" or "<";
}

/// <summary>
/// The window the rules leave a setting: the highest of its lower bounds and the lowest of its upper bounds,
/// derived from the comparisons whose left side is the setting itself.
/// </summary>
public sealed record SettingWindow(
    string MotorFile,
    string Motor,
    string Setting,
    double Actual,
    Dim Dim,
    bool Percent,
    ImmutableArray<WindowBound> Lower,
    ImmutableArray<WindowBound> Upper)
{
    /// <summary>The lower bound that binds (the highest; a strict one wins a tie).</summary>
    public WindowBound? TightestLower => Lower.IsEmpty ? null
        : Lower.OrderByDescending(b => b.Limit).ThenByDescending(b => b.IsStrict).ThenBy(b => b.RuleId, StringComparer.Ordinal).First();

    /// <summary>The upper bound that binds (the lowest; a strict one wins a tie).</summary>
    public WindowBound? TightestUpper => Upper.IsEmpty ? null
        : Upper.OrderBy(b => b.Limit).ThenByDescending(b => b.IsStrict).ThenBy(b => b.RuleId, StringComparer.Ordinal).First();

    /// <summary>No value satisfies every bound: the rules contradict each other for this motor's data.</summary>
    public bool IsEmpty => TightestLower is { } lo && TightestUpper is { } up
        && (lo.Limit > up.Limit || (lo.Limit == up.Limit && (lo.IsStrict || up.IsStrict)));

    /// <summary>The setting lies inside the window.</summary>
    public bool Holds => Lower.All(b => b.Holds) && Upper.All(b => b.Holds);

    /// <summary>How many different rules bound the setting.</summary>
    public int RuleCount => Lower.Concat(Upper).Select(b => b.RuleId).Distinct(StringComparer.Ordinal).Count();
}

/// <summary>Derives setting windows from rule outcomes, so that no window is written by hand per setting.</summary>
public static class SettingWindows
{
    /// <summary>
    /// The window of every setting that some rule compares directly: only bounds whose left side is the outcome's subject
    /// (a rule on a computed trip time says nothing directly about the time constant it names as subject). Sorted by motor file and setting.
    /// </summary>
    public static ImmutableArray<SettingWindow> Derive(IEnumerable<RuleOutcome> outcomes)
    {
        ArgumentNullException.ThrowIfNull(outcomes);
        var windows = ImmutableArray.CreateBuilder<SettingWindow>();
        var groups = outcomes
            .SelectMany(o => o.Bounds.Where(b => b.Path == o.Subject && (b.IsLower || b.IsUpper)).Select(b => (Outcome: o, Bound: b)))
            .GroupBy(x => (x.Outcome.MotorFile, x.Bound.Path!))
            .OrderBy(g => g.Key.MotorFile, StringComparer.Ordinal).ThenBy(g => g.Key.Item2, StringComparer.Ordinal);
        foreach (var g in groups)
        {
            var items = g.OrderBy(x => x.Outcome.RuleId, StringComparer.Ordinal).ThenBy(x => x.Bound.Limit).ToList();
            WindowBound Side(CheckBound b, string rule) => new(rule, b.Op, b.Limit, b.LimitLabel, b.Holds);
            // A relay range's bounds have a dimension known only per range: prefer a rule that states it.
            var typed = items.FirstOrDefault(x => x.Bound.Dim != Dim.ItemValue).Bound ?? items[0].Bound;
            windows.Add(new SettingWindow(
                g.Key.MotorFile,
                items[0].Outcome.Motor,
                g.Key.Item2,
                items[0].Bound.Actual,
                typed.Dim,
                items.Any(x => x.Bound.Percent),
                [.. items.Where(x => x.Bound.IsLower).Select(x => Side(x.Bound, x.Outcome.RuleId))],
                [.. items.Where(x => x.Bound.IsUpper).Select(x => Side(x.Bound, x.Outcome.RuleId))]));
        }
        return windows.ToImmutable();
    }

    /// <summary>"at least", "above", "at most" or "below" for a bound's operator.</summary>
    public static string Phrase(string op) => op switch
    {
        ">=" => "at least",
        ">" => "above",
        "<=" => "at most",
        "<" => "below",
        _ => op,
    };
}
