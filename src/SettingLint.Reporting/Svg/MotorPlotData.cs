using System.Collections.Immutable;
using SettingLint.Core.Model;
using SettingLint.Protection;
using SettingLint.Core.Documents;

namespace SettingLint.Reporting.Svg;

/// <summary>One step of a start as a time-current plot draws it: the motor draws this current until this time after switching on.</summary>
/// <param name="Current">The current of the step, A primary.</param>
/// <param name="Until">The time from switching on at which the step ends, s.</param>
public readonly record struct StartStep(double Current, double Until);

/// <summary>
/// The numbers a motor's plots are drawn from, in SI (A primary, s), read once from the bound model; absent values
/// and disabled elements are null, so that a plot draws what is there and says what is not.
/// </summary>
public sealed record MotorPlotData
{
    /// <summary>The motor's tag.</summary>
    public required string Motor { get; init; }

    /// <summary>Full-load current, A.</summary>
    public double? FullLoadCurrent { get; init; }

    /// <summary>Locked-rotor current at rated voltage, A.</summary>
    public double? LockedRotorCurrent { get; init; }

    /// <summary>Acceleration time at rated voltage, s.</summary>
    public double? AccelerationTime { get; init; }

    /// <summary>Longest expected acceleration time (acceleration_time_max), s, when it is given.</summary>
    public double? AccelerationTimeMax { get; init; }

    /// <summary>
    /// The start at rated conditions as steps of (current, time since switching on), in time order; after the last step the
    /// motor runs at FLC. Empty: the start is drawn at LRC for the acceleration time.
    /// </summary>
    public ImmutableArray<StartStep> StartSteps { get; init; } = [];

    /// <summary>The longest start (acceleration_time_max) as steps; empty: at LRC for acceleration_time_max.</summary>
    public ImmutableArray<StartStep> LongestStartSteps { get; init; } = [];

    /// <summary>What the start steps are, for the legend ("current limit, then FLC"); null for a start at LRC.</summary>
    public string? StartKind { get; init; }

    /// <summary>The asymmetrical first-cycle start current that the short-circuit element must stay above (SL201's limit), A.</summary>
    public double? AsymmetricalStartCurrent { get; init; }

    /// <summary>The factor between the asymmetrical and the symmetrical start current behind <see cref="AsymmetricalStartCurrent"/>.</summary>
    public double? AsymmetryFactor { get; init; }

    /// <summary>The bus's grounding, as written (solid, low-resistance, high-resistance, ungrounded).</summary>
    public string? Grounding { get; init; }

    /// <summary>The neutral resistor's let-through current of a resistance-grounded bus (bus.ground_fault_current), A.</summary>
    public double? GroundFaultCurrent { get; init; }

    /// <summary>Safe stall time from cold, s.</summary>
    public double? SafeStallTimeCold { get; init; }

    /// <summary>Safe stall time from hot, s.</summary>
    public double? SafeStallTimeHot { get; init; }

    /// <summary>The thermal element (49) as an IEC 60255-149 model, when enabled and complete.</summary>
    public ThermalModel? Thermal { get; init; }

    /// <summary>Acceleration timer (48), s, when enabled.</summary>
    public double? AccelerationTimer { get; init; }

    /// <summary>Short-circuit (50P) pickup, A primary, when enabled.</summary>
    public double? ShortCircuitPickup { get; init; }

    /// <summary>Short-circuit delay, s.</summary>
    public double? ShortCircuitDelay { get; init; }

    /// <summary>Current above which the short-circuit element is blocked, A.</summary>
    public double? ShortCircuitBlockedAbove { get; init; }

    /// <summary>Ground-fault (50G/50N) pickup, A primary, when enabled.</summary>
    public double? GroundFaultPickup { get; init; }

    /// <summary>Ground-fault delay, s.</summary>
    public double? GroundFaultDelay { get; init; }

    /// <summary>The bus's weakest three-phase fault current, A.</summary>
    public double? FaultCurrentMin { get; init; }

    /// <summary>The bus's strongest three-phase fault current, A.</summary>
    public double? FaultCurrentMax { get; init; }

    /// <summary>Interrupting rating of the device the relay trips, A.</summary>
    public double? InterruptingRating { get; init; }

    /// <summary>The bus's upstream time-overcurrent protection, when the bus gives it.</summary>
    public OvercurrentSetting? Upstream { get; init; }

    /// <summary>The bus's tag, for labels.</summary>
    public string? BusTag { get; init; }

    /// <summary>Phase CT primary per secondary, for secondary values on hover.</summary>
    public double? PhaseCtRatio { get; init; }

    /// <summary>The longest start the rules assume: acceleration_time_max, else acceleration_time.</summary>
    public double? LongestAccelerationTime => AccelerationTimeMax ?? AccelerationTime;

    /// <summary>The thermal level a hot start begins at (the set full-load level, else (FLC / pickup)^2); null without thermal model or FLC.</summary>
    public double? HotStartLevel => Thermal is { } t && FullLoadCurrent is { } flc ? t.HotStartLevel(flc) : null;

    /// <summary>The ratio of SL201's default: the first-cycle RMS of a fully offset start over its symmetrical RMS, about 1.7 (common practice).</summary>
    public const double DefaultAsymmetryFactor = 1.7;

    /// <summary>The steps a start is drawn with: the given ones, else LRC for the acceleration time.</summary>
    public ImmutableArray<StartStep> StartOrLockedRotor(bool longest)
    {
        var steps = longest ? LongestStartSteps : StartSteps;
        if (!steps.IsEmpty) return steps;
        var time = longest ? AccelerationTimeMax : AccelerationTime;
        return LockedRotorCurrent is { } l && time is { } t ? [new StartStep(l, t)] : [];
    }

    /// <summary>Reads the plot numbers of a bound motor.</summary>
    public static MotorPlotData From(MotorProtection motor)
    {
        ArgumentNullException.ThrowIfNull(motor);
        var d = motor.Document;
        double? Num(string path) => d.Measure(path)?.Value is { } v && double.IsFinite(v) ? v : null;
        double? Positive(string path) => Num(path) is { } v && v > 0 ? v : null;
        double? NonNegative(string path) => Num(path) is { } v && v >= 0 ? v : null;
        double? BusNum(string path) => motor.Bus?.Document.Measure(path)?.Value is { } v && double.IsFinite(v) && v > 0 ? v : null;
        var flc = Positive(SchemaPaths.Motor.FullLoadCurrent);
        var thermalOn = motor.IsEnabled(SchemaPaths.Motor.ThermalEnabled);
        var scOn = motor.IsEnabled(SchemaPaths.Motor.ShortCircuitEnabled);
        var gfOn = motor.IsEnabled(SchemaPaths.Motor.GroundFaultEnabled);
        var lrc = Positive(SchemaPaths.Motor.LockedRotorCurrent);
        var acc = Positive(SchemaPaths.Motor.AccelerationTime);
        var accMax = Positive(SchemaPaths.Motor.AccelerationTimeMax);
        var grounding = motor.Bus?.Grounding;
        // The start the thermal rules check, from the protection library's one start profile: a soft start at its
        // current limit, a reduced-voltage start at its lowest voltage for acceleration_time_max, else the locked-rotor start.
        var limit = d.Text(SchemaPaths.Motor.StarterType) == "soft-starter" ? Positive(SchemaPaths.Motor.SoftStartCurrentLimit) : null;
        var voltage = Positive(SchemaPaths.Motor.StartingVoltageMin) ?? 1;
        var profile = lrc is { } lr && acc is { } a && (limit is not null || d.Text(SchemaPaths.Motor.StarterType) != "soft-starter")
            ? StartProfile.For(lr, a, accMax, Math.Min(1, voltage), limit)
            : null;
        ImmutableArray<StartStep> Steps(StartPoint? p) => p is null ? [] : [new StartStep(p.Current, p.Duration)];
        var reduced = profile is { IsSoftStart: false } && voltage < 1 && profile.Points.Count > 1;
        var shaped = profile is not null && (profile.IsSoftStart || reduced);
        return new MotorPlotData
        {
            Motor = motor.Tag,
            FullLoadCurrent = flc,
            LockedRotorCurrent = lrc,
            AccelerationTime = acc,
            AccelerationTimeMax = accMax,
            StartSteps = shaped ? Steps(profile!.Points[0]) : [],
            LongestStartSteps = shaped ? Steps(profile!.Points[^1]) : [],
            StartKind = profile is { IsSoftStart: true } ? "soft-start limit" : reduced ? "reduced-voltage start" : null,
            AsymmetricalStartCurrent = AsymmetricalStart(lrc, Positive(SchemaPaths.Motor.RatedVoltage), BusNum(SchemaPaths.Bus.MaxVoltage)),
            AsymmetryFactor = lrc is null ? null : DefaultAsymmetryFactor,
            Grounding = grounding,
            GroundFaultCurrent = grounding is "low-resistance" or "high-resistance" ? BusNum(SchemaPaths.Bus.GroundFaultCurrent) : null,
            SafeStallTimeCold = Positive(SchemaPaths.Motor.SafeStallTimeCold),
            SafeStallTimeHot = Positive(SchemaPaths.Motor.SafeStallTimeHot),
            Thermal = thermalOn ? ThermalOf(Positive(SchemaPaths.Motor.ThermalPickup), Positive(SchemaPaths.Motor.ThermalTimeConstant),
                Positive(SchemaPaths.Motor.ThermalCoolingTimeConstant), Num(SchemaPaths.Motor.ThermalFullLoadLevel)) : null,
            AccelerationTimer = motor.IsEnabled(SchemaPaths.Motor.AccelerationEnabled) ? Positive(SchemaPaths.Motor.AccelerationTimer) : null,
            ShortCircuitPickup = scOn ? Positive(SchemaPaths.Motor.ShortCircuitPickup) : null,
            ShortCircuitDelay = scOn ? NonNegative(SchemaPaths.Motor.ShortCircuitDelay) : null,
            ShortCircuitBlockedAbove = scOn ? Positive(SchemaPaths.Motor.ShortCircuitBlockedAbove) : null,
            GroundFaultPickup = gfOn ? Positive(SchemaPaths.Motor.GroundFaultPickup) : null,
            GroundFaultDelay = gfOn ? NonNegative(SchemaPaths.Motor.GroundFaultDelay) : null,
            FaultCurrentMin = BusNum(SchemaPaths.Bus.FaultCurrentMin),
            FaultCurrentMax = BusNum(SchemaPaths.Bus.FaultCurrentMax),
            InterruptingRating = Positive(SchemaPaths.Motor.InterruptingRating),
            Upstream = UpstreamOf(motor.Bus),
            BusTag = motor.Bus?.Tag,
            PhaseCtRatio = Positive(SchemaPaths.Motor.PhaseCtPrimary) is { } p && Positive(SchemaPaths.Motor.PhaseCtSecondary) is { } s ? p / s : null,
        };
    }

    /// <summary>
    /// SL201's limit with its default factor: the locked-rotor current scaled to the bus's highest steady voltage (the
    /// rated voltage when the bus gives none), times 1.7; a report of a run replaces it with the rule's own limit.
    /// </summary>
    private static double? AsymmetricalStart(double? lrc, double? rated, double? busMax) =>
        lrc is { } l ? DefaultAsymmetryFactor * (rated is { } r && busMax is { } m ? LockedRotorCodes.ScaleToVoltage(l, r, m) : l) : null;

    private static ThermalModel? ThermalOf(double? pickup, double? tau, double? coolingTau, double? fullLoadLevel)
    {
        if (pickup is not { } k || tau is not { } t) return null;
        // A level outside [0, 1) is a data error the rules report; the plot then shows the IEC hot curve instead.
        var level = fullLoadLevel is >= 0 and < 1 ? fullLoadLevel : null;
        return new ThermalModel(k, t, coolingTau ?? t, level);
    }

    private static OvercurrentSetting? UpstreamOf(Bus? bus)
    {
        if (bus is null) return null;
        var d = bus.Document;
        if (!CurveTokens.TryParse(d.Text(SchemaPaths.Bus.UpstreamCurve), out var curve)) return null;
        var pickup = d.Measure(SchemaPaths.Bus.UpstreamPickup)?.Value;
        var tms = d.Measure(SchemaPaths.Bus.UpstreamTimeMultiplier)?.Value;
        if (pickup is not { } ip || !(ip > 0) || tms is not { } m || !double.IsFinite(m)) return null;
        if (curve == CurveKind.DefiniteTime ? m < 0 : m <= 0) return null;
        var inst = d.Measure(SchemaPaths.Bus.UpstreamInstantaneous)?.Value;
        return new OvercurrentSetting(curve, ip, m, inst is { } i && i > 0 ? i : null);
    }
}
