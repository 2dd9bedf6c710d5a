using System.Collections.Immutable;
using SettingLint.Core.Binding;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>What a rule found on one motor, passing or not: the numbers the report shows as margins.</summary>
public sealed record RuleOutcome(string RuleId, string MotorFile, string Motor, string Subject, bool Passed, CheckNumbers? Numbers, Level Level)
{
    /// <summary>Every comparison the check requires together (none under an 'or'), evaluated in full: what setting windows are made of.</summary>
    public ImmutableArray<CheckBound> Bounds { get; init; } = [];
}

/// <summary>The compiled rules of a run, applied to every motor.</summary>
public sealed class RuleSet(ImmutableArray<CompiledRule> rules) : IRuleSet
{
    public ImmutableArray<CompiledRule> Rules { get; } = rules;

    /// <summary>The rules' descriptors with their own default levels; a repository's levels show on each result instead.</summary>
    public ImmutableArray<RuleDescriptor> Descriptors { get; } = [.. rules.Where(r => r.Level != Level.None).Select(r => r.Descriptor)];

    /// <summary>Receives every outcome, for reports; null when nobody asks.</summary>
    public Action<RuleOutcome>? Outcomes { get; init; }

    /// <summary>Receives every motor before its rules run, for reports that draw it; null when nobody asks.</summary>
    public Action<MotorProtection>? Motors { get; init; }

    public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
    {
        Motors?.Invoke(motor);
        foreach (var rule in Rules)
        {
            if (rule.Level == Level.None) continue;
            try
            {
                EvaluateRule(rule, motor, index, findings);
            }
            catch (Exception ex) when (ex is not OutOfMemoryException)
            {
                // One broken rule must not hide the others' findings.
                notify(new Notification(NotificationKind.Internal, $"The rule {rule.Id} failed on {motor.Tag}: {ex.Message}", motor.Document.RelativePath, null, ex.ToString()));
            }
        }
    }

    private void EvaluateRule(CompiledRule rule, MotorProtection motor, RepositoryIndex index, FindingBuilder findings)
    {
        if (!rule.ForEachRange)
        {
            EvaluateOnce(rule, new EvalContext(motor, index, rule.ParameterValues, new Val[rule.Lets.Length]), rule.Subject, findings);
            return;
        }
        if (motor.RelayModel is null) return;
        foreach (var range in motor.RelayModel.Ranges)
        {
            var item = Resolve(motor, range);
            var ctx = new EvalContext(motor, index, rule.ParameterValues, new Val[rule.Lets.Length]) { Item = item };
            EvaluateOnce(rule, ctx, rule.Subject.Replace("{item.setting}", range.Setting, StringComparison.Ordinal), findings);
        }
    }

    /// <summary>A relay range converted for one motor: xFLC and xCT through its own data.</summary>
    private static RangeItem Resolve(MotorProtection motor, RelayRange range)
    {
        var path = "protection." + range.Setting;
        var refs = SettingReferences.For(motor.Document, path, range.Min.Quantity.Unit.Dimension == Dimension.Voltage);
        Val Conv(WrittenValue? w) => w?.Quantity.ToSi(refs) is { } v ? Val.Of(v) : Val.Absent;
        return new RangeItem(range.Setting, Compiler.Read(motor.Document, path), Conv(range.Min), Conv(range.Max), Conv(range.Step));
    }

    private void EvaluateOnce(CompiledRule rule, EvalContext ctx, string subject, FindingBuilder findings)
    {
        for (var i = 0; i < rule.Lets.Length; i++) ctx.Lets[i] = rule.Lets[i].Value.Eval(ctx);
        if (rule.When is not null && rule.When.Eval(ctx) is not { IsAbsent: false, Flag: true }) return;
        var (result, numbers) = Check(rule.Check, ctx);
        if (result.IsAbsent) return;
        var passed = result.Flag;
        // Bounds cost a second evaluation of each comparison, so only a report that listens pays for them.
        Outcomes?.Invoke(new RuleOutcome(rule.Id, ctx.Motor.Document.RelativePath, ctx.Motor.Tag, subject, passed, numbers, rule.Level) { Bounds = CheckBounds.Of(rule, ctx) });
        if (passed) return;
        var values = ImmutableSortedDictionary.CreateBuilder<string, FindingValue>(StringComparer.Ordinal);
        var subjectValue = ctx.Motor.Document.Measure(subject);
        var sideRatio = subjectValue is { SideRatio: { } r } && subjectValue.Dimension is Dimension.Current or Dimension.Voltage ? r : (double?)null;
        // A relay range's values have the dimension of the setting they bound, known only per range.
        Dim Shown(Dim d) => d == Dim.ItemValue ? Dim.Of(subjectValue?.Dimension ?? Dimension.None) : d;
        if (numbers is not null)
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
                _ => new FindingValue("(absent)"),
            };
        }
        values["subject"] = subject;
        if (ctx.Item is { } item) values["item.setting"] = item.Setting;
        var span = ctx.Motor.Document.SpanOf(subject);
        findings.Add(new Finding(rule.Id, rule.Level, ctx.Motor.Document.RelativePath, span, subject, rule.Message, values.ToImmutable()));
    }

    private static FindingValue Value(double v, Dim dim, bool percent, double? sideRatio)
    {
        var text = CheckNode.Format(v, dim, percent);
        if (sideRatio is { } r && dim == Dim.Current && double.IsFinite(v)) text = text + " pri (" + Formats.Number(v / r) + " A sec)";
        return new FindingValue(text, double.IsFinite(v) ? v : null, dim.Plain is { } p ? (percent ? "" : p.SiSymbol()) : null);
    }

    /// <summary>Evaluates a check; the comparison that decided it gives the numbers.</summary>
    private static (Val Result, CheckNumbers? Numbers) Check(CheckNode node, EvalContext ctx)
    {
        switch (node)
        {
            case ComparisonNode c:
            {
                var l = c.Left.Eval(ctx);
                var r = c.Right.Eval(ctx);
                var v = Compiler.Compare(c.Op, l, r);
                if (v.IsAbsent || l.Kind != ValKind.Number) return (v, null);
                double? margin = c.Op switch
                {
                    ">" or ">=" => l.Number - r.Number,
                    "<" or "<=" => r.Number - l.Number,
                    _ => null,
                };
                return (v, new CheckNumbers(c.Op, l.Number, r.Number, margin, c.Left.Type.Dim, c.Left.Percent || c.Right.Percent));
            }
            case AndNode a:
            {
                var (lv, ln) = Check(a.Left, ctx);
                if (lv is { IsAbsent: false, Flag: false }) return (lv, ln);
                var (rv, rn) = Check(a.Right, ctx);
                if (rv is { IsAbsent: false, Flag: false }) return (rv, rn);
                if (lv.IsAbsent || rv.IsAbsent) return (Val.Absent, null);
                return (Val.Of(true), Tighter(ln, rn));
            }
            case OrNode o:
            {
                var (lv, ln) = Check(o.Left, ctx);
                if (lv is { IsAbsent: false, Flag: true }) return (lv, ln);
                var (rv, rn) = Check(o.Right, ctx);
                if (rv is { IsAbsent: false, Flag: true }) return (rv, rn);
                if (lv.IsAbsent || rv.IsAbsent) return (Val.Absent, null);
                return (Val.Of(false), ln ?? rn);
            }
            case PlainNode p:
                return (p.Expression.Eval(ctx), null);
            default:
                return (Val.Absent, null);
        }
    }

    private static CheckNumbers? Tighter(CheckNumbers? a, CheckNumbers? b) =>
        a is null ? b : b is null ? a : (a.MarginRatio ?? double.MaxValue) <= (b.MarginRatio ?? double.MaxValue) ? a : b;
}
