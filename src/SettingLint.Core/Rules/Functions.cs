using System.Collections.Frozen;
using SettingLint.Protection;

namespace SettingLint.Core.Rules;

/// <summary>The closed, explicit table of functions a rule may call. Nothing else is reachable from a rule.</summary>
internal static class Functions
{
    /// <summary>The functions in the order of the reference table.</summary>
    public static IReadOnlyList<FunctionDef> Ordered { get; }

    public static FrozenDictionary<string, FunctionDef> All { get; }

    // Built in a static constructor rather than in the property initializers: Stryker.NET marks what a static
    // constructor runs as built once per process and tests its mutants with every test, whereas from an initializer
    // it credits the table to whichever test happened to touch it first (DEVELOPERS.md, "Mutation testing").
    static Functions()
    {
        Ordered = [.. Build()];
        All = Ordered.ToFrozenDictionary(f => f.Name, StringComparer.Ordinal);
    }

    // The order here is the order of the table in docs/rule-language.md (`settinglint rules functions` prints it).
    private static IEnumerable<FunctionDef> Build()
    {
        const ArgDomain Any = ArgDomain.Any, Finite = ArgDomain.Finite, NonNeg = ArgDomain.NonNegative, Pos = ArgDomain.Positive;
        yield return new("min", 1, int.MaxValue, SameNumbers, Min)
        { Signature = "min(a, b, ...)", Result = "as args", Meaning = "smallest (same dimension)", Percent = PercentRule.AsFirstArgument };
        yield return new("max", 1, int.MaxValue, SameNumbers, Max)
        { Signature = "max(a, b, ...)", Result = "as args", Meaning = "largest (same dimension)", Percent = PercentRule.AsFirstArgument };
        yield return new("abs", 1, 1, t => Num(t[0], 0), a => Val.Of(Math.Abs(a[0].Number)))
        { Signature = "abs(x)", Result = "as x", Meaning = "absolute value", Percent = PercentRule.AsFirstArgument };
        yield return new("sqrt", 1, 1, t => Plain(t, "sqrt"), a => Val.Of(Math.Sqrt(a[0].Number)))
        { Signature = "sqrt(x)", Result = "number", Meaning = "square root of a plain number (absent below 0)" };
        yield return new("ln", 1, 1, t => Plain(t, "ln"), a => Val.Of(Math.Log(a[0].Number)))
        { Signature = "ln(x)", Result = "number", Meaning = "natural logarithm of a plain number (absent below 0)" };
        yield return new("exp", 1, 1, t => Plain(t, "exp"), a => Val.Of(Math.Exp(a[0].Number)))
        { Signature = "exp(x)", Result = "number", Meaning = "e to the power of a plain number" };
        yield return new("present", 1, 1, _ => ExprType.Bool, a => Val.Of(!a[0].IsAbsent))
        { Signature = "present(path)", Result = "bool", Meaning = "the path has a value (takes a path, not an expression)", TakesAbsent = true, TakesPath = true };
        yield return new("coalesce", 1, int.MaxValue, Same, Coalesce)
        { Signature = "coalesce(a, b, ...)", Result = "as args", Meaning = "the first present argument", TakesAbsent = true, Percent = PercentRule.AsFirstArgument };
        yield return new("lrc_at", 3, 3, t => Expect(t, Dim.Current, Dim.Current, Dim.Voltage, Dim.Voltage),
            a => Val.Of(LockedRotorCodes.ScaleToVoltage(a[0].Number, a[1].Number, a[2].Number)))
        {
            Signature = "lrc_at(lrc, from_voltage, to_voltage)", Result = "current", Meaning = "locked-rotor current scaled in proportion to voltage",
            Domain = [NonNeg, Pos, NonNeg],
        };
        yield return new("code_letter_min", 3, 3, CodeLetterType, a => CodeLetter(a, upper: false))
        {
            Signature = "code_letter_min(letter, power, voltage)", Result = "current",
            Meaning = "NEMA MG 1 code-letter LRC lower bound (included); absent for a text that is no code letter", Domain = [Any, Pos, Pos],
        };
        yield return new("code_letter_max", 3, 3, CodeLetterType, a => CodeLetter(a, upper: true))
        {
            Signature = "code_letter_max(letter, power, voltage)", Result = "current",
            Meaning = "NEMA MG 1 code-letter LRC upper bound (excluded; infinite for V)", Domain = [Any, Pos, Pos],
        };
        yield return new("nec_overload_limit", 1, 1, t => Expect(t, Dim.None, Dim.None),
            a => Val.Of(NecOverloadLimit.MaximumFraction(a[0].IsAbsent ? null : a[0].Number)))
        {
            Signature = "nec_overload_limit(service_factor)", Result = "number",
            Meaning = "1.25 for SF >= 1.15, else 1.15, also when the service factor is absent (none marked) (NFPA 70 430.32(A)(1))",
            TakesAbsent = true, Domain = [Pos],
        };
        yield return new("thermal_trip", 4, 4, t => Expect(t, Dim.Time, Dim.Current, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(new ThermalModel(a[1].Number, a[2].Number, a[2].Number).TripTimeFrom(a[0].Number, a[3].Number).Seconds))
        {
            Signature = "thermal_trip(current, pickup, tau, start_level)", Result = "time", Meaning = "IEC 60255-149 trip time; infinite when it never trips",
            Domain = [NonNeg, Pos, Pos, NonNeg],
        };
        yield return new("hot_level", 2, 3, HotLevelType, HotLevel)
        {
            Signature = "hot_level(flc, pickup, full_load_level?)", Result = "number",
            Meaning = "the hot starting level: `full_load_level` when present, else (FLC / pickup)^2", TakesAbsent = true, OptionalArgs = [2],
            // A share of the trip level, shown as the full-load level is written (55 %).
            Percent = PercentRule.Always,
        };
        yield return new("start_peak", 5, 5, t => Expect(t, Dim.None, Dim.Current, Dim.Time, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(new ThermalModel(a[2].Number, a[3].Number, a[3].Number).CheckStart(new StartPoint(a[0].Number, a[1].Number), a[4].Number).PeakLevel))
        {
            Signature = "start_peak(lrc, acceleration_time, pickup, tau, start_level)", Result = "number",
            Meaning = "thermal level at the end of a start at LRC (1 = trip)", Domain = [Pos, NonNeg, Pos, Pos, NonNeg],
        };
        yield return new("start_profile", 6, 6, StartProfileType, StartProfileOf)
        {
            Signature = "start_profile(lrc, acceleration_time, acceleration_time_max, starting_voltage_min, starter_type, soft_start_current_limit)",
            Result = "start profile", Meaning = "the motor's starts and the stall a start may turn into, worked out once (below); the last four may be absent",
            TakesAbsent = true, OptionalArgs = [2, 3], Domain = [Pos, NonNeg, NonNeg, Pos],
        };
        yield return new("start_longest", 1, 1, t => ProfileFirst(t, Dim.Time), a => Val.Of(a[0].Profile!.LongestDuration))
        { Signature = "start_longest(profile)", Result = "time", Meaning = "the longest start of the profile" };
        yield return new("stall_current", 1, 1, t => ProfileFirst(t, Dim.Current), a => Val.Of(a[0].Profile!.StallCurrent))
        {
            Signature = "stall_current(profile)", Result = "current",
            Meaning = "the current of a stall during the longest start: V x LRC at the lowest starting voltage V, or the soft starter's limit",
        };
        yield return new("stall_time", 2, 2, t => ProfileFirst(t, Dim.Time, Dim.Time), a => Val.Of(a[0].Profile!.StallTime(a[1].Number)))
        {
            Signature = "stall_time(profile, safe_stall_time)", Result = "time",
            Meaning = "the stall time allowed at that current, safe stall time x (LRC / I)^2 (constant I^2 t, common practice)", Domain = [Any, NonNeg],
        };
        yield return new("start_trip", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Trip.Seconds))
        {
            Signature = "start_trip(profile, pickup, tau, start_level)", Result = "time",
            Meaning = "IEC 60255-149 trip time over the start with the least room (the smallest trip time / duration)", Domain = [Any, Pos, Pos, NonNeg],
        };
        yield return new("start_time", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Point.Duration))
        { Signature = "start_time(profile, pickup, tau, start_level)", Result = "time", Meaning = "the duration of that start", Domain = [Any, Pos, Pos, NonNeg] };
        yield return new("start_current", 4, 4, t => ProfileFirst(t, Dim.Current, Dim.Current, Dim.Time, Dim.None), a => Val.Of(Tightest(a).Point.Current))
        { Signature = "start_current(profile, pickup, tau, start_level)", Result = "current", Meaning = "the current of that start", Domain = [Any, Pos, Pos, NonNeg] };
        yield return new("profile_peak", 4, 4, t => ProfileFirst(t, Dim.None, Dim.Current, Dim.Time, Dim.None),
            a => Val.Of(a[0].Profile!.PeakLevel(Model(a[1], a[2], a[2]), a[3].Number)))
        {
            Signature = "profile_peak(profile, pickup, tau, start_level)", Result = "number",
            Meaning = "the highest thermal level a start of the profile ends at (1 = trip)", Domain = [Any, Pos, Pos, NonNeg],
        };
        yield return new("restart_level", 3, 3, t => ProfileFirst(t, Dim.None, Dim.Current, Dim.Time),
            a => Val.Of(a[0].Profile!.RestartLevel(Model(a[1], a[2], a[2]))))
        {
            Signature = "restart_level(profile, pickup, tau)", Result = "number",
            Meaning = "the highest level from which every start of the profile fits, least of (1 - p) exp(t / tau)", Domain = [Any, Pos, Pos],
        };
        yield return new("restart_interval", 4, 4, t => ProfileFirst(t, Dim.Time, Dim.Current, Dim.Time, Dim.Time),
            a => Val.Of(a[0].Profile!.TimeBetweenStarts(Model(a[1], a[2], a[3]))))
        {
            Signature = "restart_interval(profile, pickup, tau, cooling_tau)", Result = "time",
            Meaning = "start-to-start time a further start needs after a start from cold: a start's duration plus the cooling to `restart_level`, for the start that needs longest; infinite when a start does not fit from cold",
            Domain = [Any, Pos, Pos, Pos],
        };
        yield return new("cooling_time", 3, 3, t => Expect(t, Dim.Time, Dim.None, Dim.None, Dim.Time), CoolingTime)
        {
            Signature = "cooling_time(from_level, to_level, cooling_tau)", Result = "time", Meaning = "time to cool from one level to another while stopped",
            Domain = [NonNeg, Finite, Pos],
        };
        yield return new("ct_limit", 2, 4, CtLimitType, CtLimit)
        {
            Signature = "ct_limit(class, burden, secondary?, rated_burden?)", Result = "current",
            Meaning = "secondary current a CT reproduces within its class at its connected burden, V_al / Zb: V_al is a C class's voltage (IEEE C57.13) or ALF x I_sn x Z_rated of a 5P/10P class (IEC 61869-2, which needs `secondary` and `rated_burden`; the CT's winding resistance is left out). Absent when the class cannot be read",
            TakesAbsent = true, OptionalArgs = [3],
        };
        yield return new("ct_saturation", 5, 7, CtSaturationType, CtSaturationValue)
        {
            Signature = "ct_saturation(x_over_r, fault_current, ct_primary, class, burden, secondary?, rated_burden?)", Result = "number",
            Meaning = "IEEE C37.110 criterion (1 + X/R) If Zb with Zb per unit of the burden that holds 20 x I_sn (C class: V / (20 I_sn), so V/100 at 5 A and V/20 at 1 A; P class: ALF / 20 x Z_rated); saturates above 20. `secondary` is 5 A when not passed",
            TakesAbsent = true, OptionalArgs = [6], Domain = [NonNeg, NonNeg],
        };
        yield return new("ct_class_complete", 2, 3, CtClassCompleteType, CtClassComplete)
        {
            Signature = "ct_class_complete(class, secondary, rated_burden?)", Result = "bool",
            Meaning = "the CT's class and data give its accuracy limit (false for an IEC class without `rated_burden`); absent without a class or secondary",
            TakesAbsent = true, OptionalArgs = [2],
        };
        yield return new("asym_factor_at", 3, 3, t => Expect(t, Dim.None, Dim.None, Dim.Of(Quantities.Dimension.Frequency), Dim.Time),
            a => Val.Of(AsymmetricalCurrent.RmsFactorAt(a[0].Number, a[1].Number, a[2].Number)))
        {
            Signature = "asym_factor_at(x_over_r, frequency, time)", Result = "number",
            Meaning = "RMS of a fully offset current over its symmetrical RMS after `time`: sqrt(1 + 2 exp(-2 t / T)), T = (X/R) / (2 pi f) (IEC 60909-0 decay); sqrt(3) at 0 s",
            Domain = [NonNeg, Pos, NonNeg],
        };
        yield return new("coverage", 2, 2, t => Expect(t, Dim.None, Dim.Current, Dim.Current), a => Val.Of(GroundFaultCoverage.ProtectedPercent(a[0].Number, a[1].Number) / 100))
        {
            Signature = "coverage(pickup, available)", Result = "number", Meaning = "share of a wye winding protected, 1 - pickup / available",
            Percent = PercentRule.Always, Domain = [NonNeg, Pos],
        };
        yield return new("asym_factor", 1, 1, t => Expect(t, Dim.None, Dim.None), a => Val.Of(AsymmetricalCurrent.DecayingRmsFactor(a[0].Number)))
        { Signature = "asym_factor(x_over_r)", Result = "number", Meaning = "sqrt(1 + 2 exp(-2 pi / (X/R)))", Domain = [NonNeg] };
        yield return new("curve_time", 4, 4, CurveType, CurveTime)
        {
            Signature = "curve_time(curve, pickup, multiplier, current)", Result = "time",
            Meaning = "trip time of an IEC 60255-151 / IEEE C37.112 curve token (or `definite-time`); infinite below pickup; absent for a multiplier of 0 on an inverse curve",
            Domain = [Any, Pos, NonNeg, NonNeg],
        };
        yield return new("on_step", 3, 3, OnStepType, OnStep)
        { Signature = "on_step(value, min, step)", Result = "bool", Meaning = "the value is min + k x step (to 0.1 % of a step)" };
        yield return new("choose", 3, 3, ChooseType, a => a[0].Flag ? a[1] : a[2])
        { Signature = "choose(condition, a, b)", Result = "as a, b", Meaning = "`a` when the condition is true, else `b` (both of one type; for wording a message)" };
        yield return new("others_max", 1, 1, OthersType, a => Fold(a, Math.Max, Val.Absent))
        {
            Signature = "others_max(expr)", Result = "as expr",
            Meaning = "the largest value of `expr` over the other motors on the same bus, evaluated for each (absent values skipped; absent when there is none)",
            OverOtherMotors = true, Percent = PercentRule.AsFirstArgument,
        };
        yield return new("others_min", 1, 1, OthersType, a => Fold(a, Math.Min, Val.Absent))
        {
            Signature = "others_min(expr)", Result = "as expr", Meaning = "the smallest, as `others_max`",
            OverOtherMotors = true, Percent = PercentRule.AsFirstArgument,
        };
        yield return new("others_count", 0, 0, _ => ExprType.Num(Dim.None), a => Val.Of(a.Length))
        { Signature = "others_count()", Result = "number", Meaning = "how many other motors share the bus", OverOtherMotors = true };
    }

    private static ExprType OthersType(ExprType[] t) =>
        t[0].Kind == ValKind.Number ? t[0] : throw new ArgumentException("takes a number expression, evaluated for each other motor on the bus, not " + t[0]);

    // Math.Max and Math.Min over the values in order, as the aggregates always folded them (a NaN stays NaN).
    private static Val Fold(ReadOnlySpan<Val> a, Func<double, double, double> combine, Val none)
    {
        if (a.Length == 0) return none;
        var best = a[0].Number;
        for (var i = 1; i < a.Length; i++) best = combine(best, a[i].Number);
        return Val.Of(best);
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
        // The limit is read only for a soft starter, so its domain is checked here and not in the table.
        if (soft && !(double.IsFinite(a[5].Number) && a[5].Number > 0)) return Val.Absent;
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
        // An inverse curve's multiplier must be above 0 (IEC 60255-151, IEEE C37.112); definite time takes a delay of 0.
        if (kind != CurveKind.DefiniteTime && a[2].Number <= 0) return Val.Absent;
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
