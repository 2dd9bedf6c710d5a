namespace SettingLint.Core.Rules;

/// <summary>
/// When each let of a rule is evaluated. Lets are pure, so a let's value does not depend on when it is computed; what
/// changes is only how often: a let that the guard and the check do not read is needed only for a finding's values, and a
/// let of a for_each rule that does not read the range has one value per motor.
/// </summary>
internal sealed class LetPlan
{
    private LetPlan(bool[] first, bool[] again, bool[] late)
    {
        First = first;
        Again = again;
        Late = late;
        AnyLate = Array.IndexOf(late, true) >= 0;
    }

    /// <summary>Evaluated before the guard, at a rule's only evaluation or at the first range of a for_each rule.</summary>
    public bool[] First { get; }

    /// <summary>Evaluated before the guard at the second and later ranges: the lets of <see cref="First"/> that read the range.</summary>
    public bool[] Again { get; }

    /// <summary>Evaluated only when the rule makes a finding, after its check failed.</summary>
    public bool[] Late { get; }

    public bool AnyLate { get; }

    public static LetPlan For(CompiledRule rule)
    {
        var n = rule.Lets.Length;
        var index = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < n; i++) index[rule.Lets[i].Name] = i;

        // The lets that the guard and the check read, directly or through other lets.
        var needed = new bool[n];
        var pending = new Stack<int>();
        var known = true;
        void Reads(Expr? e)
        {
            if (e is null) return;
            known &= Names(e, name =>
            {
                if (index.TryGetValue(name, out var i) && !needed[i])
                {
                    needed[i] = true;
                    pending.Push(i);
                }
            });
        }
        Reads(rule.When?.Source);
        foreach (var e in RuleExpressions.Check(rule.Check)) Reads(e);
        // An aggregate evaluates its expression for other motors, where a range value is not there and reading one throws:
        // such a let stays up front, so that a rule fails on the same motors as when every let was evaluated first.
        for (var i = 0; i < n; i++)
        {
            if (!needed[i] && RuleExpressions.HasAggregate(rule.Lets[i].Value.Source))
            {
                needed[i] = true;
                pending.Push(i);
            }
        }
        while (pending.TryPop(out var i)) Reads(rule.Lets[i].Value.Source);
        // An expression this analysis does not know might read any let: then every let is evaluated up front, as written.
        if (!known) Array.Fill(needed, true);

        var readsItem = new bool[n];
        var itemByName = new Dictionary<string, bool>(StringComparer.Ordinal);
        for (var i = 0; i < n; i++)
        {
            readsItem[i] = !rule.ForEachRange ? false : ReadsItem(rule.Lets[i].Value.Source, itemByName);
            itemByName[rule.Lets[i].Name] = readsItem[i];
        }
        var first = needed;
        var again = new bool[n];
        var late = new bool[n];
        for (var i = 0; i < n; i++)
        {
            again[i] = needed[i] && readsItem[i];
            late[i] = !needed[i];
        }
        return new LetPlan(first, again, late);
    }

    /// <summary>Calls back with every bare name (a let) an expression reads; false when the expression has a form not known here.</summary>
    private static bool Names(Expr e, Action<string> name)
    {
        switch (e)
        {
            case NumberLit or TextLit or BoolLit:
                return true;
            case PathRef p:
                if (!p.Path.Contains('.', StringComparison.Ordinal)) name(p.Path);
                return true;
            case Unary u:
                return Names(u.Operand, name);
            case Binary b:
                return Names(b.Left, name) & Names(b.Right, name);
            case Call c when c.Name.Length > 0:
                var ok = true;
                foreach (var a in c.Args) ok &= Names(a, name);
                return ok;
            default:
                return false;
        }
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
    /// <summary>The sides of a check's comparisons and its plain expressions; an unknown kind of node gives an expression no analysis knows.</summary>
    public static IEnumerable<Expr> Check(CheckNode node) => node switch
    {
        ComparisonNode c => [c.Left.Source, c.Right.Source],
        AndNode a => Check(a.Left).Concat(Check(a.Right)),
        OrNode o => Check(o.Left).Concat(Check(o.Right)),
        PlainNode p => [p.Expression.Source],
        _ => [new Call(0, "", [])],
    };

    /// <summary>The motor and bus key paths a rule reads (bus ones with their "bus." prefix), in its lets, guard and check.</summary>
    public static IEnumerable<string> Paths(CompiledRule rule) =>
        All(rule).SelectMany(Paths).Where(p => p.Contains('.', StringComparison.Ordinal)
            && !p.StartsWith("param.", StringComparison.Ordinal) && !p.StartsWith("item.", StringComparison.Ordinal));

    /// <summary>Whether a rule reads other motors (an aggregate over its bus) in its lets, guard or check.</summary>
    public static bool ReadsOtherMotors(CompiledRule rule) => All(rule).Any(HasAggregate);

    /// <summary>Whether an expression has an aggregate in it; the expression that stands for an unknown check counts as one.</summary>
    public static bool HasAggregate(Expr e) => e switch
    {
        Call c => c.Name.Length == 0 || (Functions.All.TryGetValue(c.Name, out var fn) && fn.OverOtherMotors) || c.Args.Any(HasAggregate),
        Unary u => HasAggregate(u.Operand),
        Binary b => HasAggregate(b.Left) || HasAggregate(b.Right),
        _ => false,
    };

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
