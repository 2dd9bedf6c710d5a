using System.Collections.Immutable;
using System.Runtime.CompilerServices;
using SettingLint.Core.Binding;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Rules;

/// <summary>What a rule found on one motor, passing or not: the numbers the report shows as margins.</summary>
public sealed record RuleOutcome(string RuleId, string MotorFile, string Motor, string Subject, bool Passed, CheckNumbers? Numbers, Level Level)
{
    /// <summary>Every comparison the check requires together (none under an 'or'), evaluated in full: what setting windows are made of.</summary>
    public ImmutableArray<CheckBound> Bounds { get; init; } = [];
}

/// <summary>The compiled rules of a run, applied to every motor.</summary>
public sealed class RuleSet : IRuleSet
{
    private static readonly PathSlot GroundConnection = PathTable.Motor.Of(SchemaPaths.Motor.GroundCtConnection);

    // A context kept per thread between motors, so that evaluating a motor allocates nothing but its findings. With the
    // key-span lists of KeySpans it saves 16 KB of allocation per file (119 against 135 KB at 10,000 motors) and 6 MB of
    // peak heap after a collection (63 against 69 MB); docs/performance.md. Released after each motor, it holds nothing
    // of a run, and there is one per thread.
    [ThreadStatic]
    private static EvalContext? t_spare;

    // Per rule (by position): which lets are evaluated when.
    private readonly LetPlan[] _plans;

    // Per rule (by position): its comparisons' limits in words, for the bounds of a listened-to run (CheckBounds.Labels).
    private readonly ImmutableArray<string>[] _labels;
    private readonly int _maxLets;

    // Every enabled rule, with the paths they read.
    private readonly Stage _all;

    private readonly ConditionalWeakTable<RepositoryIndex, RunCache> _runs = new();

    public RuleSet(ImmutableArray<CompiledRule> rules)
    {
        Rules = rules;
        Descriptors = [.. rules.Where(r => r.Level != Level.None).Select(r => r.Descriptor)];
        _plans = [.. rules.Select(LetPlan.For)];
        _labels = [.. rules.Select(CheckBounds.Labels)];
        _maxLets = rules.IsEmpty ? 0 : rules.Max(r => r.Lets.Length);
        _all = new Stage(rules);
    }

    /// <summary>Which rules run, and the document paths they read, read together at the start of each motor.</summary>
    private sealed class Stage
    {
        public Stage(ImmutableArray<CompiledRule> rules)
        {
            Includes = [.. Enumerable.Range(0, rules.Length).Select(k => rules[k].Level != Level.None)];
            var enabled = Enumerable.Range(0, rules.Length).Where(k => Includes[k]).Select(k => rules[k]).ToList();
            var paths = enabled.SelectMany(RuleExpressions.Paths).Distinct(StringComparer.Ordinal).ToList();
            MotorSlots = [.. paths.Where(p => !p.StartsWith("bus.", StringComparison.Ordinal)).Select(PathTable.Motor.Of)];
            BusSlots = [.. paths.Where(p => p.StartsWith("bus.", StringComparison.Ordinal)).Select(p => PathTable.Bus.Of(p["bus.".Length..]))];
            ForEachRange = enabled.Any(r => r.ForEachRange);
        }

        public bool[] Includes { get; }

        public PathSlot[] MotorSlots { get; }

        public PathSlot[] BusSlots { get; }

        public bool ForEachRange { get; }
    }

    public ImmutableArray<CompiledRule> Rules { get; }

    /// <summary>The rules' descriptors with their own default levels; a repository's levels show on each result instead.</summary>
    public ImmutableArray<RuleDescriptor> Descriptors { get; }

    /// <summary>Receives every outcome, for reports; null when nobody asks.</summary>
    public Action<RuleOutcome>? Outcomes { get; init; }

    /// <summary>Receives every motor before its rules run, for reports that draw it; null when nobody asks.</summary>
    public Action<MotorProtection>? Motors { get; init; }

    public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
    {
        Motors?.Invoke(motor);
        Evaluate(_all, motor, index, findings, notify);
    }

    private void Evaluate(Stage stage, MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
    {
        // One context for all the rules of this motor: each key path is read once, and aggregates share the run's cache.
        // It is this thread's spare one when there is one (taken, so that a nested evaluation makes its own).
        var run = _runs.GetValue(index, static _ => new RunCache());
        var ctx = t_spare ?? new EvalContext(motor, index, [], new Val[_maxLets]);
        t_spare = null;
        ctx.Reset(motor, index, run, _maxLets);
        ctx.Prefetch(stage.MotorSlots, stage.BusSlots, stage.ForEachRange && motor.RelayModel is { } model ? run.Ranges(model) : []);
        try
        {
            EvaluateRules(stage, ctx, findings, notify);
        }
        finally
        {
            ctx.Release();
            t_spare = ctx;
        }
    }

    private void EvaluateRules(Stage stage, EvalContext ctx, FindingBuilder findings, Action<Notification> notify)
    {
        var motor = ctx.Motor;
        for (var k = 0; k < Rules.Length; k++)
        {
            var rule = Rules[k];
            if (!stage.Includes[k]) continue;
            try
            {
                EvaluateRule(rule, k, ctx, findings);
            }
            catch (Exception ex) when (ex is not OutOfMemoryException)
            {
                // One broken rule must not hide the others' findings.
                notify(new Notification(NotificationKind.Internal, $"The rule {rule.Id} failed on {motor.Tag}: {ex.Message}", motor.Document.RelativePath, null, ex.ToString()));
            }
        }
    }

    private void EvaluateRule(CompiledRule rule, int index, EvalContext ctx, FindingBuilder findings)
    {
        var plan = _plans[index];
        var labels = _labels[index];
        ctx.Parameters = rule.ParameterValues;
        ctx.Item = null;
        if (!rule.ForEachRange)
        {
            EvaluateOnce(rule, ctx, null, plan.First, labels, findings);
            return;
        }
        var motor = ctx.Motor;
        if (motor.RelayModel is null)
        {
            // The rule reads the relay's ranges, and the motor names no relay model (or one that is not there).
            findings.AddNotRun(new CheckNotRun(rule.Id, rule.Level, motor.Document.RelativePath, motor.Tag, ["relay_model"]));
            return;
        }
        var ranges = motor.RelayModel.Ranges;
        var infos = ctx.Run!.Ranges(motor.RelayModel);
        var refs = new SettingReferences.ByTransformer();
        for (var k = 0; k < ranges.Length; k++)
        {
            // Shared by position with the other users of the model, unless this motor's ranges differ from theirs.
            var info = k < infos.Length && infos[k].Fits(ranges[k]) ? infos[k] : new RangeInfo(ranges[k]);
            ctx.Item = Resolve(ctx, ranges[k], info, ref refs);
            // The lets that do not read the range keep their value from the first range.
            EvaluateOnce(rule, ctx, info, k == 0 ? plan.First : plan.Again, labels, findings);
        }
    }

    /// <summary>A relay range converted for one motor: xFLC and xCT through its own data.</summary>
    private static RangeItem Resolve(EvalContext ctx, RelayRange range, RangeInfo info, ref SettingReferences.ByTransformer memo)
    {
        // A motor's ranges share the references of the few transformers their settings are measured through.
        var connection = ctx.ReadMotor(GroundConnection) is { Kind: ValKind.Text } g ? g.Text : null;
        var refs = memo.Get(new SettingReferences.DocumentNumbers(ctx.Motor.Document), connection, info.Path.Path, info.Voltage);
        Val Conv(WrittenValue? w, in ConversionReferences r) => w?.Quantity.ToSi(r) is { } v ? Val.Of(v) : Val.Absent;
        return new RangeItem(range.Setting, ctx.ReadMotor(info.Path), Conv(range.Min, refs), Conv(range.Max, refs), Conv(range.Step, refs));
    }

    /// <param name="lets">The lets to evaluate before the guard (the others are still valid from the motor's first range).</param>
    private void EvaluateOnce(CompiledRule rule, EvalContext ctx, RangeInfo? range, bool[] lets, ImmutableArray<string> labels, FindingBuilder findings)
    {
        for (var i = 0; i < rule.Lets.Length; i++)
        {
            if (lets[i]) ctx.Lets[i] = rule.Lets[i].Value.Get(ctx);
        }
        if (rule.When is not null)
        {
            var guard = rule.When.Get(ctx);
            if (guard.IsAbsent)
            {
                NotRun(rule, ctx, rule.When, null, findings);
                return;
            }
            if (!guard.Flag) return;
        }
        var result = Check(rule.Check, ctx, out var numbers);
        if (result.IsAbsent)
        {
            NotRun(rule, ctx, null, rule.Check, findings);
            return;
        }
        var passed = result.Flag;
        // The subject, the bounds and every number shown are made only for a report that listens or for a finding.
        if (Outcomes is not null)
        {
            // Bounds cost a second evaluation of each comparison, so only a report that listens pays for them.
            Outcomes(new RuleOutcome(rule.Id, ctx.Motor.Document.RelativePath, ctx.Motor.Tag, SubjectOf(rule, range), passed, numbers.ToRecord(), rule.Level) { Bounds = CheckBounds.Of(rule, ctx, labels) });
        }
        if (passed) return;
        AddFinding(rule, ctx, range, numbers, findings);
    }

    /// <summary>Records a rule stopped by missing data, with the key paths that are missing; a rule that does not apply is not recorded.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void NotRun(CompiledRule rule, EvalContext ctx, Compiled? when, CheckNode? check, FindingBuilder findings)
    {
        var missing = MissingData.Of(rule, ctx, when, check);
        if (missing.IsEmpty) return;
        findings.AddNotRun(new CheckNotRun(rule.Id, rule.Level, ctx.Motor.Document.RelativePath, ctx.Motor.Tag, missing));
    }

    // Apart from EvaluateOnce, which runs for every rule and motor: most checks pass, and this is what a failed one costs.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void AddFinding(CompiledRule rule, EvalContext ctx, RangeInfo? range, in Numbers numbers, FindingBuilder findings)
    {
        var subject = SubjectOf(rule, range);
        var values = ImmutableSortedDictionary.CreateBuilder<string, FindingValue>(StringComparer.Ordinal);
        var subjectValue = ctx.Motor.Document.Measure(subject);
        var sideRatio = SettingTerms.For(ctx.Motor, subject, subjectValue);
        // A relay range's values have the dimension of the setting they bound, known only per range.
        Dim Shown(Dim d) => d == Dim.ItemValue ? Dim.Of(subjectValue?.Dimension ?? Dimension.None) : d;
        if (numbers.Present)
        {
            var dim = Shown(numbers.Dim);
            values["actual"] = Value(numbers.Actual, dim, numbers.Percent, sideRatio);
            values["limit"] = Value(numbers.Limit, dim, numbers.Percent, sideRatio);
            if (numbers.Margin is { } margin) values["margin"] = Value(margin, dim, numbers.Percent, sideRatio);
            if (numbers.MarginRatio is { } ratio) values["margin_ratio"] = new FindingValue(Formats.Si(ratio, Dimension.Fraction), ratio, "");
        }
        foreach (var p in rule.Parameters)
        {
            var v = rule.ParameterValues[p.Index];
            values[p.Name] = new FindingValue(p.Format(v), v, p.Dim.Plain?.SiSymbol());
        }
        for (var i = 0; i < rule.Lets.Length; i++)
        {
            var (name, c) = rule.Lets[i];
            var v = ctx.Lets[i];
            values[name] = v.Kind switch
            {
                ValKind.Number => Value(v.Number, Shown(c.Type.Dim), c.Percent, c.Type.Dim == Dim.ItemValue ? sideRatio : null),
                ValKind.Bool => new FindingValue(v.Flag ? "true" : "false"),
                ValKind.Text => new FindingValue(v.Text ?? ""),
                ValKind.StartProfile => new FindingValue(v.Profile!.ToString()),
                _ => new FindingValue("(absent)"),
            };
        }
        values["subject"] = subject;
        if (ctx.Item is { } item) values["item.setting"] = item.Setting;
        var span = ctx.Motor.Document.SpanOf(subject);
        findings.Add(new Finding(rule.Id, rule.Level, ctx.Motor.Document.RelativePath, span, subject, rule.Message, values.ToImmutable()));
    }

    private static string SubjectOf(CompiledRule rule, RangeInfo? range) =>
        range is null ? rule.Subject : rule.Subject.Replace("{item.setting}", range.Setting, StringComparison.Ordinal);

    private static FindingValue Value(double v, Dim dim, bool percent, SettingTerms? terms) =>
        new(SettingTerms.Show(v, dim, percent, terms), double.IsFinite(v) ? v : null, dim.Plain is { } p ? (percent ? "" : p.SiSymbol()) : null);

    /// <summary>Evaluates a check; the comparison that decided it gives the numbers.</summary>
    private static Val Check(CheckNode node, EvalContext ctx, out Numbers numbers)
    {
        switch (node)
        {
            case ComparisonNode c:
                return Compared(c, ctx, out numbers);
            case AndNode a:
                // The first false side decides (and gives its numbers); both true: the tighter comparison is shown.
                return Junction(a.Left, a.Right, decisive: false, ctx, out numbers);
            case OrNode o:
                // The first true side decides; both false: the first comparison that has numbers is shown.
                return Junction(o.Left, o.Right, decisive: true, ctx, out numbers);
            case PlainNode p:
                numbers = default;
                return p.Expression.Get(ctx);
            default:
                numbers = default;
                return Val.Absent;
        }
    }

    /// <summary>`and` (decisive false) or `or` (decisive true) of two checks; absent when neither side decides and one is absent.</summary>
    private static Val Junction(CheckNode left, CheckNode right, bool decisive, EvalContext ctx, out Numbers numbers)
    {
        var lv = Check(left, ctx, out var ln);
        if (!lv.IsAbsent && lv.Flag == decisive)
        {
            numbers = ln;
            return lv;
        }
        var rv = Check(right, ctx, out var rn);
        if (!rv.IsAbsent && rv.Flag == decisive)
        {
            numbers = rn;
            return rv;
        }
        if (lv.IsAbsent || rv.IsAbsent)
        {
            numbers = default;
            return Val.Absent;
        }
        numbers = decisive ? (ln.Present ? ln : rn) : Tighter(ln, rn);
        return Val.Of(!decisive);
    }

    private static Val Compared(ComparisonNode c, EvalContext ctx, out Numbers numbers)
    {
        var l = c.Left.Get(ctx);
        var r = c.Right.Get(ctx);
        var code = c.Code;
        var v = Compiler.Compare(code, l, r);
        if (v.IsAbsent || l.Kind != ValKind.Number)
        {
            numbers = default;
            return v;
        }
        double? margin = code switch
        {
            Comparison.Greater or Comparison.GreaterOrEqual => l.Number - r.Number,
            Comparison.Less or Comparison.LessOrEqual => r.Number - l.Number,
            _ => null,
        };
        numbers = new Numbers(c, l.Number, r.Number, margin);
        return v;
    }

    private static Numbers Tighter(Numbers a, Numbers b) =>
        !a.Present ? b : !b.Present ? a : (a.MarginRatio ?? double.MaxValue) <= (b.MarginRatio ?? double.MaxValue) ? a : b;

    /// <summary>
    /// The numbers of a comparison while a check is evaluated: a value, not an object, because most checks pass and
    /// nobody reads them; <see cref="CheckNumbers"/> is made only for a finding's or an outcome's sake.
    /// </summary>
    private readonly record struct Numbers(ComparisonNode? Node, double Actual, double Limit, double? Margin)
    {
        public bool Present => Node is not null;

        public Dim Dim => Node!.Left.Type.Dim;

        public bool Percent => Node!.Left.Percent || Node.Right.Percent;

        public double? MarginRatio => CheckNumbers.Ratio(Margin, Limit);

        public CheckNumbers? ToRecord() => Node is null ? null : new CheckNumbers(Node.Op, Actual, Limit, Margin, Dim, Percent);
    }
}
