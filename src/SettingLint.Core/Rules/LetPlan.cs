namespace SettingLint.Core.Rules;

/// <summary>
/// When each let of a rule is evaluated: every let before the guard, in order; at the second and later ranges of a
/// for_each rule, only the lets that read the range (the others keep the motor's one value). Lets are pure, so this
/// changes how often a let is computed, never its value.
/// </summary>
/// <remarks>
/// A let that only a finding's message reads was once left until a finding was made. Measured at 10,000 generated
/// motors (in-process harness, JIT build, 2026-12-05, docs/performance.md) that bought nothing: 119.1 KB allocated per
/// file with it, 119.6 KB without, and check CPU within the noise. It was removed with the analysis it needed.
/// </remarks>
internal sealed class LetPlan
{
    private LetPlan(bool[] first, bool[] again)
    {
        First = first;
        Again = again;
    }

    /// <summary>Evaluated before the guard, at a rule's only evaluation or at the first range of a for_each rule: every let.</summary>
    public bool[] First { get; }

    /// <summary>Evaluated before the guard at the second and later ranges: the lets that read the range.</summary>
    public bool[] Again { get; }

    public static LetPlan For(CompiledRule rule)
    {
        var n = rule.Lets.Length;
        var first = new bool[n];
        Array.Fill(first, true);
        var again = new bool[n];
        var itemByName = new Dictionary<string, bool>(StringComparer.Ordinal);
        for (var i = 0; i < n; i++)
        {
            again[i] = rule.ForEachRange && ReadsItem(rule.Lets[i].Value.Source, itemByName);
            itemByName[rule.Lets[i].Name] = again[i];
        }
        return new LetPlan(first, again);
    }

    // Conservative: anything not known to be free of the range counts as reading it.
    private static bool ReadsItem(Expr e, Dictionary<string, bool> lets) => e switch
    {
        NumberLit or TextLit or BoolLit => false,
        PathRef p when p.Path.StartsWith("item.", StringComparison.Ordinal) => true,
        PathRef p when !p.Path.Contains('.', StringComparison.Ordinal) && p.Path != "tag" => !lets.TryGetValue(p.Path, out var v) || v,
        PathRef => false,
        Unary u => ReadsItem(u.Operand, lets),
        Binary b => ReadsItem(b.Left, lets) || ReadsItem(b.Right, lets),
        Call c => c.Args.Any(a => ReadsItem(a, lets)),
        _ => true,
    };
}

/// <summary>The expressions a rule is made of, and the document paths they read.</summary>
internal static class RuleExpressions
{
    /// <summary>The sides of a check's comparisons and its plain expressions.</summary>
    public static IEnumerable<Expr> Check(CheckNode node) => node switch
    {
        ComparisonNode c => [c.Left.Source, c.Right.Source],
        AndNode a => Check(a.Left).Concat(Check(a.Right)),
        OrNode o => Check(o.Left).Concat(Check(o.Right)),
        PlainNode p => [p.Expression.Source],
        _ => [],
    };

    /// <summary>The motor and bus key paths a rule reads (bus ones with their "bus." prefix), in its lets, guard and check.</summary>
    public static IEnumerable<string> Paths(CompiledRule rule) =>
        All(rule).SelectMany(Paths).Where(p => p.Contains('.', StringComparison.Ordinal)
            && !p.StartsWith("param.", StringComparison.Ordinal) && !p.StartsWith("item.", StringComparison.Ordinal));

    private static IEnumerable<Expr> All(CompiledRule rule)
    {
        var exprs = rule.Lets.Select(l => l.Value.Source).Concat(Check(rule.Check));
        return rule.When is null ? exprs : exprs.Append(rule.When.Source);
    }

    private static IEnumerable<string> Paths(Expr e) => e switch
    {
        PathRef p => [p.Path],
        Unary u => Paths(u.Operand),
        Binary b => Paths(b.Left).Concat(Paths(b.Right)),
        Call c => c.Args.SelectMany(Paths),
        _ => [],
    };
}
