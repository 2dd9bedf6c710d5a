using System.Runtime.CompilerServices;
using SettingLint.Core.Model;
using SettingLint.Core.Quantities;
using SettingLint.Core.Documents;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Rules;

/// <summary>A compiled expression: its static type and a closure over the evaluation context.</summary>
public sealed record Compiled(ExprType Type, Func<EvalContext, Val> Eval, Expr Source)
{
    /// <summary>Display hint: the value is a fraction best shown in percent (not part of the type).</summary>
    public bool Percent { get; init; }

    /// <summary>For a leaf (a literal, a parameter, a let, a path, a range value): which, so that its value is read without calling Eval.</summary>
    internal LeafKind Leaf { get; init; }

    /// <summary>The parameter or let index of a leaf.</summary>
    internal int LeafIndex { get; init; }

    /// <summary>The path slot of a path leaf.</summary>
    internal PathSlot? LeafSlot { get; init; }

    /// <summary>The value of a literal.</summary>
    internal Val LeafValue { get; init; }

    /// <summary>For a chain of 'and' or of 'or': the operator, so that a chain around it takes its operands over.</summary>
    internal string? Junction { get; init; }

    /// <summary>The operands of the chain, in order.</summary>
    internal Compiled[]? JunctionOperands { get; init; }

    /// <summary>
    /// The expressions this one is computed from (operands, arguments), so that an absent value can be traced to the
    /// absent key paths that made it absent; null for a leaf and for an aggregate over other motors.
    /// </summary>
    internal Compiled[]? Operands { get; init; }

    /// <summary>
    /// The same value as <see cref="Eval"/>: leaves are read in place, since a delegate call costs more than what most
    /// leaves do (an array read), and every operator has leaves below it.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal Val Get(EvalContext ctx) => Leaf == LeafKind.None ? Eval(ctx) : ReadLeaf(ctx);

    private Val ReadLeaf(EvalContext ctx) => Leaf switch
    {
        LeafKind.Literal => LeafValue,
        LeafKind.Let => ctx.Lets[LeafIndex],
        LeafKind.Parameter => Val.Of(ctx.Parameters[LeafIndex]),
        LeafKind.MotorPath => ctx.ReadMotor(LeafSlot!),
        LeafKind.BusPath => ctx.ReadBus(LeafSlot!),
        LeafKind.ItemValue => ctx.Item!.Value,
        LeafKind.ItemMin => ctx.Item!.Min,
        LeafKind.ItemMax => ctx.Item!.Max,
        LeafKind.ItemStep => ctx.Item!.Step,
        _ => Eval(ctx),
    };
}

/// <summary>What a leaf expression reads (None: not a leaf, evaluate it).</summary>
internal enum LeafKind
{
    None,
    Literal,
    Let,
    Parameter,
    MotorPath,
    BusPath,
    ItemValue,
    ItemMin,
    ItemMax,
    ItemStep,
}

/// <summary>What names a rule may use besides model paths: its parameters, its lets so far, and whether it runs per relay range.</summary>
public sealed record Scope(IReadOnlyDictionary<string, (int Index, ExprType Type, bool Percent)> Parameters, IReadOnlyDictionary<string, (int Index, ExprType Type, bool Percent)> Lets, bool HasItem);

/// <summary>Type-checks expressions against the schemas and compiles them into closures; every error carries its offset.</summary>
public sealed class Compiler
{
    private readonly IReadOnlyDictionary<string, FunctionDef> _functions;

    /// <summary>A compiler over the closed function table.</summary>
    public Compiler() : this(Functions.All)
    {
    }

    /// <summary>A compiler over another table: tests give one with a function that fails.</summary>
    internal Compiler(IReadOnlyDictionary<string, FunctionDef> functions) => _functions = functions;

    // Read with System.Text.Json, so that compiling rules does not wait for the validating schemas. Plain dictionaries:
    // a frozen one costs more to make than the few hundred lookups of compiling a pack save, at every start.
    private readonly Dictionary<string, ExprType> _motorPaths = PathTypes(SchemaSet.MotorProtection);
    private readonly Dictionary<string, ExprType> _busPaths = PathTypes(SchemaSet.Bus);
    private readonly HashSet<string> _percentPaths =
        SchemaShapes.Leaves(SchemaSet.MotorProtection).Values.Where(l => l.Dimension == "percent").Select(l => l.Path)
            .Concat(SchemaShapes.Leaves(SchemaSet.Bus).Values.Where(l => l.Dimension == "percent").Select(l => "bus." + l.Path))
            .ToHashSet(StringComparer.Ordinal);

    /// <summary>Every path of the motor schema with its type (for docs and suggestions).</summary>
    public IEnumerable<string> MotorPaths => _motorPaths.Keys;

    private static Dictionary<string, ExprType> PathTypes(string schemaName) =>
        SchemaShapes.Leaves(schemaName).Values.ToDictionary(
            l => l.Path,
            l => l.Dimension is { } d ? ExprType.Num(Dim.Of(Quantities.Dimensions.Parse(d) ?? Quantities.Dimension.None))
                : l.Type == "boolean" ? ExprType.Bool
                : l.Type == "number" ? ExprType.Num(Dim.None)
                : ExprType.Text,
            StringComparer.Ordinal);

    /// <summary>Compiles an expression in a scope.</summary>
    public Compiled Compile(Expr e, Scope scope) => e switch
    {
        NumberLit n => Constant(ExprType.Num(n.Dim), Val.Of(n.Value), e) with { Percent = n.Percent },
        TextLit t => Constant(ExprType.Text, Val.Of(t.Value), e),
        BoolLit b => Constant(ExprType.Bool, Val.Of(b.Value), e),
        PathRef p => CompilePath(p, scope),
        Unary u => CompileUnary(u, scope),
        Binary b => CompileBinary(b, scope),
        Call c => CompileCall(c, scope),
        _ => throw new RuleSyntaxException("Unknown expression.", e.Offset),
    };

    private static Compiled Constant(ExprType type, Val value, Expr e) => new(type, _ => value, e) { Leaf = LeafKind.Literal, LeafValue = value };

    private Compiled CompilePath(PathRef p, Scope scope)
    {
        var path = p.Path;
        if (path.StartsWith("param.", StringComparison.Ordinal))
        {
            var name = path["param.".Length..];
            if (!scope.Parameters.TryGetValue(name, out var prm))
            {
                throw new RuleSyntaxException($"Unknown parameter '{name}'; the rule declares {List(scope.Parameters.Keys)}.", p.Offset);
            }
            var i = prm.Index;
            return new(prm.Type, ctx => Val.Of(ctx.Parameters[i]), p) { Percent = prm.Percent, Leaf = LeafKind.Parameter, LeafIndex = i };
        }
        if (path.StartsWith("item.", StringComparison.Ordinal))
        {
            if (!scope.HasItem) throw new RuleSyntaxException("'item' is only known in a rule with for_each.", p.Offset);
            return path switch
            {
                "item.value" => new(ExprType.Num(Dim.ItemValue), ctx => ctx.Item!.Value, p) { Leaf = LeafKind.ItemValue },
                "item.min" => new(ExprType.Num(Dim.ItemValue), ctx => ctx.Item!.Min, p) { Leaf = LeafKind.ItemMin },
                "item.max" => new(ExprType.Num(Dim.ItemValue), ctx => ctx.Item!.Max, p) { Leaf = LeafKind.ItemMax },
                "item.step" => new(ExprType.Num(Dim.ItemValue), ctx => ctx.Item!.Step, p) { Leaf = LeafKind.ItemStep },
                "item.setting" => new(ExprType.Text, ctx => Val.Of(ctx.Item!.Setting), p),
                _ => throw new RuleSyntaxException($"Unknown '{path}'; a relay range has item.value, item.min, item.max, item.step and item.setting.", p.Offset),
            };
        }
        if (path.StartsWith("config.", StringComparison.Ordinal))
        {
            // The configuration's keys that rules may read; the value is per motor (the configuration of its file).
            return path switch
            {
                "config.electrical_code" => new(ExprType.Text, ctx => ctx.Motor.ElectricalCode is { } code ? Val.Of(code) : Val.Absent, p),
                _ => throw new RuleSyntaxException($"Unknown '{path}'; a rule may read config.electrical_code.", p.Offset),
            };
        }
        if (!path.Contains('.', StringComparison.Ordinal) && path != "tag")
        {
            if (!scope.Lets.TryGetValue(path, out var let))
            {
                throw new RuleSyntaxException($"Unknown name '{path}'; a path has dots (motor.full_load_current), and the lets defined before this are {List(scope.Lets.Keys)}.", p.Offset);
            }
            var i = let.Index;
            return new(let.Type, ctx => ctx.Lets[i], p) { Percent = let.Percent, Leaf = LeafKind.Let, LeafIndex = i };
        }
        if (path.StartsWith("bus.", StringComparison.Ordinal))
        {
            var busPath = path["bus.".Length..];
            if (!_busPaths.TryGetValue(busPath, out var bt)) throw Unknown(p, busPath, _busPaths.Keys, "bus.");
            // A slot instead of the path: the context looks the path up once per motor, however many rules read it.
            var busSlot = PathTable.Bus.Of(busPath);
            return new(bt, ctx => ctx.ReadBus(busSlot), p) { Percent = _percentPaths.Contains(path), Leaf = LeafKind.BusPath, LeafSlot = busSlot };
        }
        if (!_motorPaths.TryGetValue(path, out var mt)) throw Unknown(p, path, _motorPaths.Keys, "");
        var slot = PathTable.Motor.Of(path);
        return new(mt, ctx => ctx.ReadMotor(slot), p) { Percent = _percentPaths.Contains(path), Leaf = LeafKind.MotorPath, LeafSlot = slot };
    }

    private static RuleSyntaxException Unknown(PathRef p, string path, IEnumerable<string> known, string prefix)
    {
        var near = Suggestions.Nearest(path, known);
        return new RuleSyntaxException($"Unknown path '{prefix}{path}'" + (near is null ? "." : $"; did you mean '{prefix}{near}'?"), p.Offset);
    }

    private static string List(IEnumerable<string> names)
    {
        var l = names.OrderBy(n => n, StringComparer.Ordinal).ToList();
        return l.Count == 0 ? "none" : string.Join(", ", l);
    }

    /// <summary>Reads a bound value as a rule sees it: SI number, flag or text; absent when missing.</summary>
    public static Val Read(BoundDocument? doc, string path) => doc?[path] switch
    {
        MeasureValue m => Val.Of(m.Value),
        FlagValue f => Val.Of(f.Value),
        TextValue t => Val.Of(t.Value),
        _ => Val.Absent,
    };

    private Compiled CompileUnary(Unary u, Scope scope)
    {
        var x = Compile(u.Operand, scope);
        if (u.Op == "not")
        {
            if (x.Type.Kind != ValKind.Bool) throw new RuleSyntaxException($"'not' needs true/false, not {x.Type}.", u.Offset);
            return new(ExprType.Bool, ctx => x.Get(ctx) is { IsAbsent: false } v ? Val.Of(!v.Flag) : Val.Absent, u) { Operands = [x] };
        }
        if (x.Type.Kind != ValKind.Number) throw new RuleSyntaxException($"'-' needs a number, not {x.Type}.", u.Offset);
        return new(x.Type, ctx => x.Get(ctx) is { IsAbsent: false } v ? Val.Of(-v.Number) : Val.Absent, u) { Percent = x.Percent, Operands = [x] };
    }

    private Compiled CompileBinary(Binary b, Scope scope)
    {
        var l = Compile(b.Left, scope);
        var r = Compile(b.Right, scope);
        switch (b.Op)
        {
            case "and" or "or":
                if (l.Type.Kind != ValKind.Bool || r.Type.Kind != ValKind.Bool)
                {
                    throw new RuleSyntaxException($"'{b.Op}' joins true/false values, not {l.Type} and {r.Type}.", b.Offset);
                }
            {
                // A chain of one operator (a or b or c) is evaluated as one list, not as nested pairs: the same values in the
                // same order, stopping at the same operand (the first false for 'and', the first true for 'or').
                var operands = Operands(l, b.Op).Concat(Operands(r, b.Op)).ToArray();
                var decisive = b.Op == "or";
                return new(ExprType.Bool, ctx =>
                {
                    var absent = false;
                    foreach (var o in operands)
                    {
                        var v = o.Get(ctx);
                        if (v.IsAbsent) absent = true;
                        else if (v.Flag == decisive) return decisive ? True : False;
                    }
                    return absent ? Val.Absent : decisive ? False : True;
                }, b) { Junction = b.Op, JunctionOperands = operands, Operands = operands };
            }
            case "+" or "-":
                Numbers(l, r, b);
                if (l.Type.Dim != r.Type.Dim) throw new RuleSyntaxException($"'{b.Op}' needs values of one dimension, not {l.Type} and {r.Type}.", b.Offset);
                return b.Op == "+"
                    ? new(l.Type, ctx => Arith(l.Get(ctx), r.Get(ctx), out var x, out var y) ? Val.Of(x + y) : Val.Absent, b) { Percent = l.Percent || r.Percent, Operands = [l, r] }
                    : new(l.Type, ctx => Arith(l.Get(ctx), r.Get(ctx), out var x, out var y) ? Val.Of(x - y) : Val.Absent, b) { Percent = l.Percent || r.Percent, Operands = [l, r] };
            case "*":
                Numbers(l, r, b);
                return new(ExprType.Num(l.Type.Dim * r.Type.Dim), ctx => Arith(l.Get(ctx), r.Get(ctx), out var x, out var y) ? Val.Of(x * y) : Val.Absent, b) { Percent = l.Percent ^ r.Percent && l.Type.Dim == Dim.None && r.Type.Dim == Dim.None, Operands = [l, r] };
            case "/":
                Numbers(l, r, b);
                return new(ExprType.Num(l.Type.Dim / r.Type.Dim), ctx => Arith(l.Get(ctx), r.Get(ctx), out var x, out var y) ? Val.Of(x / y) : Val.Absent, b) { Operands = [l, r] };
            default:
                if (l.Type != r.Type) throw new RuleSyntaxException($"'{b.Op}' compares {l.Type} with {r.Type}.", b.Offset);
                if (l.Type.Kind == ValKind.StartProfile) throw new RuleSyntaxException($"'{b.Op}' cannot compare start profiles; compare what a function reads from them.", b.Offset);
                if (l.Type.Kind != ValKind.Number && b.Op is not ("==" or "!=")) throw new RuleSyntaxException($"'{b.Op}' compares numbers, not {l.Type}.", b.Offset);
                var op = Comparisons.Of(b.Op);
                return new(ExprType.Bool, ctx => Compare(op, l.Get(ctx), r.Get(ctx)), b) { Operands = [l, r] };
        }
    }

    private static Compiled[] Operands(Compiled c, string op) => c.Junction == op ? c.JunctionOperands! : [c];

    private static void Numbers(Compiled l, Compiled r, Binary b)
    {
        if (l.Type.Kind != ValKind.Number || r.Type.Kind != ValKind.Number)
        {
            throw new RuleSyntaxException($"'{b.Op}' needs numbers, not {l.Type} and {r.Type}.", b.Offset);
        }
    }

    private static readonly Val True = Val.Of(true);
    private static readonly Val False = Val.Of(false);

    // Both sides are evaluated before the absence test, as they always were: evaluation order is part of the behaviour.
    private static bool Arith(Val l, Val r, out double x, out double y)
    {
        x = l.Number;
        y = r.Number;
        return !l.IsAbsent && !r.IsAbsent;
    }

    /// <summary>Compares two values; absent when either is.</summary>
    public static Val Compare(string op, Val l, Val r) => Compare(Comparisons.Of(op), l, r);

    /// <summary>Compares two values with an operator decoded when the rule compiled; absent when either is.</summary>
    internal static Val Compare(Comparison op, Val l, Val r)
    {
        if (l.IsAbsent || r.IsAbsent) return Val.Absent;
        if (l.Kind != ValKind.Number)
        {
            var eq = l.Kind == ValKind.Bool ? l.Flag == r.Flag : string.Equals(l.Text, r.Text, StringComparison.Ordinal);
            return Val.Of(op == Comparison.Equal ? eq : !eq);
        }
        // Settings are compared to the precision they are written and converted with, so 1.7 x 400 A equals 680 A.
        const double relative = 1e-9;
        var x = l.Number;
        var y = r.Number;
        // An infinite side ("never trips") is close only to the same infinity: inf - x <= 1e-9 x inf would hold for any x.
        var close = x == y || (double.IsFinite(x) && double.IsFinite(y) && Math.Abs(x - y) <= relative * Math.Max(Math.Abs(x), Math.Abs(y)));
        return Val.Of(op switch
        {
            Comparison.Less => x < y && !close,
            Comparison.LessOrEqual => x <= y || close,
            Comparison.Greater => x > y && !close,
            Comparison.GreaterOrEqual => x >= y || close,
            Comparison.Equal => close,
            _ => !close,
        });
    }

    private Compiled CompileCall(Call c, Scope scope)
    {
        if (!_functions.TryGetValue(c.Name, out var fn))
        {
            var near = Suggestions.Nearest(c.Name, _functions.Keys);
            throw new RuleSyntaxException($"Unknown function '{c.Name}'" + (near is null ? "." : $"; did you mean '{near}'?"), c.Offset);
        }
        if (c.Args.Length < fn.MinArgs || c.Args.Length > fn.MaxArgs)
        {
            var want = fn.MinArgs == fn.MaxArgs ? fn.MinArgs.ToString(System.Globalization.CultureInfo.InvariantCulture)
                : fn.MaxArgs == int.MaxValue ? "at least " + fn.MinArgs.ToString(System.Globalization.CultureInfo.InvariantCulture)
                : fn.MinArgs.ToString(System.Globalization.CultureInfo.InvariantCulture) + " to " + fn.MaxArgs.ToString(System.Globalization.CultureInfo.InvariantCulture);
            throw new RuleSyntaxException($"'{c.Name}' takes {want} arguments, not {c.Args.Length}.", c.Offset);
        }
        if (fn.TakesPath && c.Args.Any(a => a is not PathRef)) throw new RuleSyntaxException($"'{c.Name}' takes a path.", c.Offset);
        // The expression of a function over the other motors sees another motor, so it may use paths and parameters but
        // not this rule's lets.
        var argScope = fn.OverOtherMotors ? scope with { Lets = new Dictionary<string, (int, ExprType, bool)>() } : scope;
        var args = c.Args.Select(a => Compile(a, argScope)).ToArray();
        ExprType type;
        try
        {
            type = fn.Type(args.Select(a => a.Type).ToArray());
        }
        catch (ArgumentException ex)
        {
            throw new RuleSyntaxException($"'{c.Name}': {ex.Message}.", c.Offset);
        }
        var percent = fn.Percent == PercentRule.Always || (fn.Percent == PercentRule.AsFirstArgument && args.Length > 0 && args[0].Percent);
        if (fn.OverOtherMotors) return CompileOverOtherMotors(fn, args, type, c) with { Percent = percent };
        var evals = args;
        var body = fn.Body;
        var takesAbsent = fn.TakesAbsent;
        return new(type, ctx =>
        {
            // The arguments live on the stack: a call allocates nothing unless it has more than ArgBuffer holds.
            var buffer = default(ArgBuffer);
            var values = evals.Length <= ArgBuffer.Size ? ((Span<Val>)buffer)[..evals.Length] : new Val[evals.Length];
            for (var i = 0; i < evals.Length; i++)
            {
                values[i] = evals[i].Get(ctx);
                if (values[i].IsAbsent)
                {
                    if (!takesAbsent) return Val.Absent;
                }
                else if (values[i].Kind == ValKind.Number && !fn.InDomain(i, values[i].Number))
                {
                    // Data outside the function's domain (a zero time constant) is a fault the file checks report.
                    return Val.Absent;
                }
            }
            // An exception from here on is a defect of the tool, not of the data: it is not caught, so that the rule's
            // evaluation reports it, naming the rule and the motor, and the run exits 3.
            var v = Call(fn, body, values);
            return v.Kind == ValKind.Number && double.IsNaN(v.Number) ? Val.Absent : v;
        }, c) { Percent = percent, Operands = args };
    }

    private static Val Call(FunctionDef fn, FunctionBody body, ReadOnlySpan<Val> values)
    {
        try
        {
            return body(values);
        }
        catch (Exception ex) when (ex is not OutOfMemoryException and not FunctionFailedException)
        {
            throw new FunctionFailedException(fn.Name, ex);
        }
    }

    private static Compiled CompileOverOtherMotors(FunctionDef fn, Compiled[] args, ExprType type, Call c)
    {
        // Without an expression each other motor counts as one value (others_count).
        var f = args.Length == 0 ? One : args[0].Eval;
        var body = fn.Body;
        var node = new object();
        return new(type, ctx =>
        {
            var group = ctx.Index.MotorsOnBusOf(ctx.Motor);
            // The expression's value for each motor of a bus is the same for every motor that asks: computed once per bus per run.
            var cached = ctx.Run?.OnBus(node, ctx, group, f);
            var buffer = default(ArgBuffer);
            var values = group.Length <= ArgBuffer.Size ? ((Span<Val>)buffer)[..group.Length] : new Val[group.Length];
            var n = 0;
            for (var j = 0; j < group.Length; j++)
            {
                if (ReferenceEquals(group[j], ctx.Motor)) continue;
                var v = cached is null ? f(ctx.For(group[j])) : cached.Get(j);
                if (!v.IsAbsent) values[n++] = v;
            }
            return Call(fn, body, values[..n]);
        }, c);
    }

    private static readonly Func<EvalContext, Val> One = static _ => Val.Of(1);
}

/// <summary>A function of the rule language threw: a defect of the tool, which the run reports naming the rule, the motor and the function.</summary>
internal sealed class FunctionFailedException(string function, Exception inner)
    : Exception($"the function {function} failed: {inner.Message}", inner)
{
    /// <summary>The function's name as rules write it.</summary>
    public string Function { get; } = function;
}
