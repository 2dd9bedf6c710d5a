using System.Collections.Frozen;
using SettingLint.Protection;

namespace SettingLint.Core.Rules;

/// <summary>One function of the closed table: its arity, how its result type follows from its arguments, and its body.</summary>
/// <param name="Name">As written in rules.</param>
/// <param name="MinArgs">Fewest arguments.</param>
/// <param name="MaxArgs">Most arguments (int.MaxValue for variadic).</param>
/// <param name="Type">Checks argument types and gives the result type, or throws with the problem.</param>
/// <param name="Body">Computes the result from present arguments (absent arguments make the result absent, except for coalesce and present).</param>
/// <param name="OptionalArgs">For a function that takes absent arguments: the positions (from 0) of the arguments whose absence alone never makes the result absent (hot_level's full-load level), so that a missing optional key is not reported as the reason a rule was not run.</param>
internal sealed record FunctionDef(string Name, int MinArgs, int MaxArgs, Func<ExprType[], ExprType> Type, FunctionBody Body, bool TakesAbsent = false, int[]? OptionalArgs = null);

/// <summary>A function's body over its evaluated arguments (a span, so that a call needs no array).</summary>
internal delegate Val FunctionBody(ReadOnlySpan<Val> args);

/// <summary>The closed, explicit table of functions a rule may call. Nothing else is reachable from a rule.</summary>
internal static class Functions
{
    public static FrozenDictionary<string, FunctionDef> All { get; } = Build().ToFrozenDictionary(f => f.Name, StringComparer.Ordinal);

    private static IEnumerable<FunctionDef> Build()
    {
        yield return new("min", 1, int.MaxValue, SameNumbers, Min);
        yield return new("max", 1, int.MaxValue, SameNumbers, Max);
        yield return new("abs", 1, 1, t => Num(t[0], 0), a => Val.Of(Math.Abs(a[0].Number)));
        yield return new("sqrt", 1, 1, t => Plain(t, "sqrt"), a => Val.Of(Math.Sqrt(a[0].Number)));
        yield return new("ln", 1, 1, t => Plain(t, "ln"), a => Val.Of(Math.Log(a[0].Number)));
        yield return new("exp", 1, 1, t => Plain(t, "exp"), a => Val.Of(Math.Exp(a[0].Number)));
        yield return new("present", 1, 1, _ => ExprType.Bool, a => Val.Of(!a[0].IsAbsent), TakesAbsent: true);
        yield return new("coalesce", 1, int.MaxValue, Same, Coalesce, TakesAbsent: true);
        yield return new("lrc_at", 3, 3, t => Expect(t, Dim.Current, Dim.Current, Dim.Voltage, Dim.Voltage),
            a => Val.Of(LockedRotorCodes.ScaleToVoltage(a[0].Number, a[1].Number, a[2].Number)));
        yield return new("code_letter_min", 3, 3, CodeLetterType, a => CodeLetter(a, upper: false));
        yield return new("code_letter_max", 3, 3, CodeLetterType, a => CodeLetter(a, upper: true));
        yield return new("nec_overload_limit", 1, 1, t => Expect(t, Dim.None, Dim.None),
            a => Val.Of(NecOverloadLimit.MaximumFraction(a[0].IsAbsent ? null : a[0].Number)), TakesAbsent: true);
        yield return new("thermal_trip", 4, 4, t => Expect(t, Dim.Time, Dim.Current, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(new ThermalModel(a[1].Number, a[2].Number, a[2].Number).TripTimeFrom(a[0].Number, a[3].Number).Seconds));
        yield return new("hot_level", 2, 3, HotLevelType, HotLevel, TakesAbsent: true, OptionalArgs: [2]);
        yield return new("start_peak", 5, 5, t => Expect(t, Dim.None, Dim.Current, Dim.Time, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(new ThermalModel(a[2].Number, a[3].Number, a[3].Number).CheckStart(new StartPoint(a[0].Number, a[1].Number), a[4].Number).PeakLevel));
        yield return new("start_profile", 6, 6, StartProfileType, StartProfileOf, TakesAbsent: true, OptionalArgs: [2, 3]);
        yield return new("start_longest", 1, 1, t => ProfileFirst(t, Dim.Time), a => Val.Of(a[0].Profile!.LongestDuration));
        yield return new("stall_current", 1, 1, t => ProfileFirst(t, Dim.Current), a => Val.Of(a[0].Profile!.StallCurrent));
        yield return new("stall_time", 2, 2, t => ProfileFirst(t, Dim.Time, Dim.Time), a => Val.Of(a[0].Profile!.StallTime(a[1].Number)));
        yield return new("start_trip", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Trip.Seconds));
        yield return new("start_time", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Point.Duration));
        yield return new("start_current", 4, 4, t => ProfileFirst(t, Dim.Current, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Point.Current));
        yield return new("profile_peak", 4, 4, t => ProfileFirst(t, Dim.None, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(a[0].Profile!.PeakLevel(Model(a[1], a[2], a[2]), a[3].Number)));
        yield return new("restart_level", 3, 3, t => ProfileFirst(t, Dim.None, Dim.Current, Dim.Time),
            a => Val.Of(a[0].Profile!.RestartLevel(Model(a[1], a[2], a[2]))));
        yield return new("restart_interval", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.Time),
            a => Val.Of(a[0].Profile!.TimeBetweenStarts(Model(a[1], a[2], a[3]))));
        yield return new("cooling_time", 3, 3, t => Expect(t, Dim.Time, Dim.None, Dim.None, Dim.Time), CoolingTime);
        yield return new("ct_limit", 2, 4, CtLimitType, CtLimit, TakesAbsent: true, OptionalArgs: [3]);
        yield return new("ct_saturation", 5, 7, CtSaturationType, CtSaturationValue, TakesAbsent: true, OptionalArgs: [6]);
        yield return new("ct_class_complete", 2, 3, CtClassCompleteType, CtClassComplete, TakesAbsent: true, OptionalArgs: [2]);
        yield return new("coverage", 2, 2, t => Expect(t, Dim.None, Dim.Current, Dim.Current), a => Val.Of(GroundFaultCoverage.ProtectedPercent(a[0].Number, a[1].Number) / 100));
        yield return new("asym_factor", 1, 1, t => Expect(t, Dim.None, Dim.None), a => Val.Of(AsymmetricalCurrent.DecayingRmsFactor(a[0].Number)));
        yield return new("asym_factor_at", 3, 3, t => Expect(t, Dim.None, Dim.None, Dim.Of(Quantities.Dimension.Frequency), Dim.Time),
            a => Val.Of(AsymmetricalCurrent.RmsFactorAt(a[0].Number, a[1].Number, a[2].Number)));
        yield return new("curve_time", 4, 4, CurveType, CurveTime);
        yield return new("on_step", 3, 3, OnStepType, OnStep);
        yield return new("choose", 3, 3, ChooseType, a => a[0].Flag ? a[1] : a[2]);
    }

    // Min and Max keep what Enumerable.Min and Max did with NaN: Min returns the first NaN, Max skips NaN unless all are.
    private static Val Min(ReadOnlySpan<Val> a)
    {
        var value = a[0].Number;
        if (double.IsNaN(value)) return Val.Of(value);
        for (var i = 1; i < a.Length; i++)
        {
            var x = a[i].Number;
            if (x < value) value = x;
            else if (double.IsNaN(x)) return Val.Of(x);
        }
        return Val.Of(value);
    }

    private static Val Max(ReadOnlySpan<Val> a)
    {
        var i = 0;
        var value = a[0].Number;
        while (double.IsNaN(value))
        {
            if (++i >= a.Length) return Val.Of(value);
            value = a[i].Number;
        }
        for (i++; i < a.Length; i++)
        {
            var x = a[i].Number;
            if (x > value) value = x;
        }
        return Val.Of(value);
    }

    private static Val Coalesce(ReadOnlySpan<Val> a)
    {
        foreach (var v in a)
        {
            if (!v.IsAbsent) return v;
        }
        return Val.Absent;
    }

    private static ExprType SameNumbers(ExprType[] t)
    {
        foreach (var x in t)
        {
            if (x.Kind != ValKind.Number) throw new ArgumentException("takes numbers, not " + x);
            if (x.Dim != t[0].Dim) throw new ArgumentException($"takes values of one dimension, not {t[0]} and {x}");
        }
        return t[0];
    }

    private static ExprType Same(ExprType[] t)
    {
        foreach (var x in t)
        {
            if (x != t[0]) throw new ArgumentException($"takes values of one type, not {t[0]} and {x}");
        }
        return t[0];
    }

    private static ExprType Num(ExprType t, int index) =>
        t.Kind == ValKind.Number ? t : throw new ArgumentException($"argument {index + 1} must be a number, not {t}");

    private static ExprType Plain(ExprType[] t, string name) =>
        t[0] is { Kind: ValKind.Number } x && x.Dim == Dim.None ? x : throw new ArgumentException($"{name} takes a plain number, not {t[0]}");

    /// <summary>Checks numeric arguments against dimensions; the first dimension given is the result's.</summary>
    private static ExprType Expect(ExprType[] t, Dim result, params Dim[] args)
    {
        for (var i = 0; i < t.Length && i < args.Length; i++)
        {
            if (t[i].Kind != ValKind.Number || t[i].Dim != args[i])
            {
                throw new ArgumentException($"argument {i + 1} must be {args[i]}, not {t[i]}");
            }
        }
        return ExprType.Num(result);
    }

    private static ExprType CodeLetterType(ExprType[] t)
    {
        if (t[0].Kind != ValKind.Text) throw new ArgumentException("argument 1 must be a code letter (text), not " + t[0]);
        if (t[1] != ExprType.Num(Dim.Of(Quantities.Dimension.Power))) throw new ArgumentException("argument 2 must be a power, not " + t[1]);
        if (t[2] != ExprType.Num(Dim.Voltage)) throw new ArgumentException("argument 3 must be a voltage, not " + t[2]);
        return ExprType.Num(Dim.Current);
    }

    private static Val CodeLetter(ReadOnlySpan<Val> a, bool upper)
    {
        if (!LockedRotorCodes.TryParse(a[0].Text, out var letter)) return Val.Absent;
        var range = LockedRotorCodes.LockedRotorCurrentRangeFromWatts(letter, a[1].Number, a[2].Number);
        return Val.Of(upper ? range.Maximum : range.Minimum);
    }

    private static ExprType HotLevelType(ExprType[] t)
    {
        Expect(t.Take(2).ToArray(), Dim.None, Dim.Current, Dim.Current);
        if (t.Length == 3 && t[2] != ExprType.Num(Dim.None)) throw new ArgumentException("argument 3 must be a fraction (full_load_level), not " + t[2]);
        return ExprType.Num(Dim.None);
    }

    private static Val HotLevel(ReadOnlySpan<Val> a)
    {
        if (a[0].IsAbsent || a[1].IsAbsent) return Val.Absent;
        if (a.Length == 3 && !a[2].IsAbsent) return Val.Of(a[2].Number);
        var r = a[0].Number / a[1].Number;
        return Val.Of(r * r);
    }

    private static ExprType StartProfileType(ExprType[] t)
    {
        Expect(t.Take(4).ToArray(), Dim.None, Dim.Current, Dim.Time, Dim.Time, Dim.None);
        if (t[4].Kind != ValKind.Text) throw new ArgumentException("argument 5 must be the starter type (text), not " + t[4]);
        if (t[5] != ExprType.Num(Dim.Current)) throw new ArgumentException("argument 6 must be the soft starter's current limit, not " + t[5]);
        return ExprType.StartProfile;
    }

    /// <summary>
    /// start_profile(lrc, acceleration_time, acceleration_time_max, starting_voltage_min, starter_type, soft_start_current_limit):
    /// absent without LRC or acceleration time, and for a soft starter without its current limit; the longest time,
    /// the voltage and (for other starters) the limit may be absent (the rated-voltage start, no soft start).
    /// </summary>
    private static Val StartProfileOf(ReadOnlySpan<Val> a)
    {
        if (a[0].IsAbsent || a[1].IsAbsent) return Val.Absent;
        double? longest = a[2].IsAbsent ? null : a[2].Number;
        var voltage = a[3].IsAbsent ? 1 : a[3].Number;
        var soft = a[4].Text == "soft-starter";
        // A soft start at an unknown current is not a start at LRC: taking it so would report trips that are not there.
        if (soft && a[5].IsAbsent) return Val.Absent;
        double? limit = soft ? a[5].Number : null;
        return Val.Of(StartProfile.For(a[0].Number, a[1].Number, longest, voltage, limit));
    }

    /// <summary>Checks a start profile first, then numeric arguments against dimensions; the first dimension given is the result's.</summary>
    private static ExprType ProfileFirst(ExprType[] t, Dim result, params Dim[] args)
    {
        if (t[0].Kind != ValKind.StartProfile) throw new ArgumentException("argument 1 must be a start profile (from start_profile), not " + t[0]);
        for (var i = 1; i < t.Length && i - 1 < args.Length; i++)
        {
            if (t[i].Kind != ValKind.Number || t[i].Dim != args[i - 1])
            {
                throw new ArgumentException($"argument {i + 1} must be {args[i - 1]}, not {t[i]}");
            }
        }
        return ExprType.Num(result);
    }

    private static ThermalModel Model(Val pickup, Val tau, Val coolingTau) => new(pickup.Number, tau.Number, coolingTau.Number);

    // start_trip, start_time, start_current (profile, pickup, tau, start level): the start with the least thermal room.
    private static StartTrip Tightest(ReadOnlySpan<Val> a) =>
        a[0].Profile!.Tightest(new ThermalModel(a[1].Number, a[2].Number, a[2].Number), a[3].Number);

    private static Val CoolingTime(ReadOnlySpan<Val> a)
    {
        var t = new ThermalModel(1, 1, a[2].Number).CoolingTime(a[0].Number, a[1].Number);
        return t is { } s ? Val.Of(s) : Val.Of(double.PositiveInfinity);
    }

    private static readonly ExprType Impedance = ExprType.Num(Dim.Of(Quantities.Dimension.Impedance));

    // The optional CT arguments: its rated secondary current and, for an IEC class, its rated burden.
    private static void CtTail(ExprType[] t, int first)
    {
        if (t.Length > first && t[first] != ExprType.Num(Dim.Current)) throw new ArgumentException($"argument {first + 1} must be the CT's rated secondary current, not {t[first]}");
        if (t.Length > first + 1 && t[first + 1] != Impedance) throw new ArgumentException($"argument {first + 2} must be the CT's rated burden (an impedance), not {t[first + 1]}");
    }

    private static ExprType CtLimitType(ExprType[] t)
    {
        if (t[0].Kind != ValKind.Text) throw new ArgumentException("argument 1 must be a CT class such as C100 or 5P20, not " + t[0]);
        if (t[1] != Impedance) throw new ArgumentException("argument 2 must be an impedance, not " + t[1]);
        CtTail(t, 2);
        return ExprType.Num(Dim.Current);
    }

    /// <summary>
    /// The CT's accuracy from its class, rated secondary (5 A when not passed: a C class's reach does not depend on it)
    /// and rated burden (absent is fine for a C class); null when the class cannot be read or an IEC class lacks its data.
    /// </summary>
    private static CtAccuracy? Accuracy(ReadOnlySpan<Val> a, int klass, int first)
    {
        if (a[klass].IsAbsent) return null;
        var secondary = a.Length > first ? a[first] : Val.Of(5);
        if (secondary.IsAbsent) return null;
        double? rated = a.Length > first + 1 && !a[first + 1].IsAbsent ? a[first + 1].Number : null;
        return CtAccuracy.TryParse(a[klass].Text, secondary.Number, rated, out var ct) ? ct : null;
    }

    private static Val CtLimit(ReadOnlySpan<Val> a)
    {
        if (a[1].IsAbsent || a[1].Number <= 0 || Accuracy(a, 0, 2) is not { } ct) return Val.Absent;
        return Val.Of(ct.MaximumSecondaryCurrent(a[1].Number));
    }

    private static ExprType CtSaturationType(ExprType[] t)
    {
        if (t[0] != ExprType.Num(Dim.None)) throw new ArgumentException("argument 1 must be X/R, a plain number, not " + t[0]);
        if (t[1] != ExprType.Num(Dim.Current) || t[2] != ExprType.Num(Dim.Current)) throw new ArgumentException("arguments 2 and 3 must be currents (fault current, CT primary)");
        if (t[3].Kind != ValKind.Text) throw new ArgumentException("argument 4 must be a CT class such as C100 or 5P20, not " + t[3]);
        if (t[4] != Impedance) throw new ArgumentException("argument 5 must be an impedance, not " + t[4]);
        CtTail(t, 5);
        return ExprType.Num(Dim.None);
    }

    private static Val CtSaturationValue(ReadOnlySpan<Val> a)
    {
        for (var i = 0; i < 5; i++)
        {
            if (a[i].IsAbsent) return Val.Absent;
        }
        if (a[4].Number <= 0 || a[2].Number <= 0 || Accuracy(a, 3, 5) is not { } ct) return Val.Absent;
        return Val.Of(ct.CheckSaturation(a[0].Number, a[1].Number / a[2].Number, a[4].Number).Criterion);
    }

    private static ExprType CtClassCompleteType(ExprType[] t)
    {
        if (t[0].Kind != ValKind.Text) throw new ArgumentException("argument 1 must be a CT class such as C100 or 5P20, not " + t[0]);
        CtTail(t, 1);
        return ExprType.Bool;
    }

    // Absent without a class or a secondary (nothing to judge); false when the class cannot give an accuracy (an IEC
    // class without its rated burden), so that the CT checks that would skip it are not skipped in silence.
    private static Val CtClassComplete(ReadOnlySpan<Val> a) =>
        a[0].IsAbsent || a[1].IsAbsent ? Val.Absent : Val.Of(Accuracy(a, 0, 1) is not null);

    private static ExprType ChooseType(ExprType[] t)
    {
        if (t[0] != ExprType.Bool) throw new ArgumentException("argument 1 must be a condition (true or false), not " + t[0]);
        if (t[1] != t[2]) throw new ArgumentException($"arguments 2 and 3 must be of one type, not {t[1]} and {t[2]}");
        return t[1];
    }

    private static ExprType CurveType(ExprType[] t)
    {
        if (t[0].Kind != ValKind.Text) throw new ArgumentException("argument 1 must be a curve token, not " + t[0]);
        if (t[1] != ExprType.Num(Dim.Current)) throw new ArgumentException("argument 2 must be the pickup current, not " + t[1]);
        if (t[2] != ExprType.Num(Dim.None)) throw new ArgumentException("argument 3 must be the time multiplier, a plain number, not " + t[2]);
        if (t[3] != ExprType.Num(Dim.Current)) throw new ArgumentException("argument 4 must be a current, not " + t[3]);
        return ExprType.Num(Dim.Time);
    }

    private static Val CurveTime(ReadOnlySpan<Val> a)
    {
        if (!CurveTokens.TryParse(a[0].Text, out var kind)) return Val.Absent;
        var t = InverseTimeCurves.OperateTime(kind, a[3].Number / a[1].Number, a[2].Number);
        return Val.Of(t.Seconds);
    }

    private static ExprType OnStepType(ExprType[] t)
    {
        if (t[0].Kind != ValKind.Number || t[1] != t[0] || t[2] != t[0]) throw new ArgumentException("takes three numbers of one dimension");
        return ExprType.Bool;
    }

    private static Val OnStep(ReadOnlySpan<Val> a)
    {
        var step = a[2].Number;
        if (step <= 0) return Val.Of(true);
        var k = (a[0].Number - a[1].Number) / step;
        return Val.Of(Math.Abs(k - Math.Round(k)) <= 1e-3);
    }
}
