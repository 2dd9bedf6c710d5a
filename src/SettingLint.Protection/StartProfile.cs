namespace SettingLint.Protection;

/// <summary>
/// The starts a motor may make and the stall that a start may turn into, worked out once from the motor, its starter
/// and the starting voltage (<see cref="For"/>), so that every check reads the same profile.
/// </summary>
/// <remarks>
/// A stall during a start draws the start's current, not necessarily the locked-rotor current: at a reduced voltage
/// V (a share of rated) the locked rotor draws V x LRC, and behind a soft starter it draws the starter's current limit
/// until the ramp ends. The maker's safe stall times are given at LRC; at a lower current the same heat (constant
/// I^2 t) takes (LRC / I)^2 times as long; common practice. A stall at full voltage, after a soft starter's ramp or in
/// a direct-on-line start, is still at LRC: that is the thermal element's stall check, not this profile's stall point.
/// </remarks>
public sealed record StartProfile
{
    private StartProfile(double lockedRotorCurrent, IReadOnlyList<StartPoint> points, double stallCurrent, bool softStart)
    {
        LockedRotorCurrent = lockedRotorCurrent;
        Points = points;
        StallCurrent = stallCurrent;
        IsSoftStart = softStart;
    }

    /// <summary>Locked-rotor current at rated voltage, A.</summary>
    public double LockedRotorCurrent { get; }

    /// <summary>The starts to allow for, highest voltage first: each must fit the thermal element and the acceleration timer.</summary>
    public IReadOnlyList<StartPoint> Points { get; }

    /// <summary>Current of a stall during the longest start (at the lowest starting voltage, or at the soft starter's limit), A.</summary>
    public double StallCurrent { get; }

    /// <summary>Whether the start is held at a soft starter's current limit.</summary>
    public bool IsSoftStart { get; }

    /// <summary>The longest of the starts, s.</summary>
    public double LongestDuration
    {
        get
        {
            var longest = 0.0;
            foreach (var p in Points)
            {
                longest = Math.Max(longest, p.Duration);
            }

            return longest;
        }
    }

    /// <summary>Ratio of the allowed stall time at <see cref="StallCurrent"/> to the safe stall time at LRC, (LRC / I)^2; common practice (constant I^2 t).</summary>
    public double StallTimeFactor
    {
        get
        {
            var r = LockedRotorCurrent / StallCurrent;
            return r * r;
        }
    }

    /// <summary>Allowed time of a stall during the longest start: the safe stall time at LRC x (LRC / I)^2; common practice (constant I^2 t).</summary>
    public double StallTime(double safeStallTime) => Guard.NonNegative(safeStallTime) * StallTimeFactor;

    /// <summary>
    /// The start profile of a motor: one pure function of the motor's locked-rotor current and acceleration times, its
    /// lowest starting voltage and its starter.
    /// <list type="bullet">
    /// <item>Direct-on-line at rated voltage (no lower voltage given): LRC for the longest acceleration time.</item>
    /// <item>Direct-on-line down to a lower voltage V: LRC for the acceleration time at rated voltage, and V x LRC for
    /// the longest acceleration time (given at that voltage); the locked-rotor current is in proportion to the voltage.</item>
    /// <item>Soft starter with a current limit: the limit (at most V x LRC, all the motor can draw at that voltage) for
    /// the longest acceleration time.</item>
    /// </list>
    /// Common practice throughout.
    /// </summary>
    /// <param name="lockedRotorCurrent">LRC at rated voltage, A.</param>
    /// <param name="accelerationTime">Acceleration time at rated voltage, s.</param>
    /// <param name="longestAccelerationTime">Longest acceleration time (at the lowest starting voltage, or along a soft starter's ramp), s; null when it is the rated-voltage one.</param>
    /// <param name="startingVoltage">Lowest terminal voltage during a start, a share of rated voltage (1 = rated).</param>
    /// <param name="softStartCurrentLimit">A soft starter's current limit, A; null for a starter that applies the voltage at once.</param>
    public static StartProfile For(double lockedRotorCurrent, double accelerationTime, double? longestAccelerationTime = null, double startingVoltage = 1, double? softStartCurrentLimit = null)
    {
        Guard.Positive(lockedRotorCurrent);
        Guard.NonNegative(accelerationTime);
        Guard.Positive(startingVoltage);
        var longest = Math.Max(accelerationTime, longestAccelerationTime is { } l ? Guard.NonNegative(l) : accelerationTime);
        var lowVoltageCurrent = lockedRotorCurrent * startingVoltage;
        if (softStartCurrentLimit is { } limit)
        {
            // The starter cannot make the motor draw more than its locked-rotor current at the voltage there is.
            var current = Math.Min(Guard.Positive(limit), lowVoltageCurrent);
            return new StartProfile(lockedRotorCurrent, [new StartPoint(current, longest)], current, softStart: true);
        }

        if (startingVoltage >= 1)
        {
            // Every start is at or above rated voltage: one start, the longest, at the current of the lowest voltage.
            return new StartProfile(lockedRotorCurrent, [new StartPoint(lowVoltageCurrent, longest)], lowVoltageCurrent, softStart: false);
        }

        if (longestAccelerationTime is null)
        {
            // A lower voltage without a start time there: the rated-voltage start is the only one known, and its stall
            // is taken at LRC (the allowed stall time is not lengthened on a start whose length is not known).
            return new StartProfile(lockedRotorCurrent, [new StartPoint(lockedRotorCurrent, longest)], lockedRotorCurrent, softStart: false);
        }

        return new StartProfile(
            lockedRotorCurrent,
            [new StartPoint(lockedRotorCurrent, accelerationTime), new StartPoint(lowVoltageCurrent, longest)],
            lowVoltageCurrent,
            softStart: false);
    }

    /// <summary>
    /// The start with the least thermal room: the point whose trip time, from a start level, is the smallest multiple
    /// of its duration. "The start fits" means that multiple is at least the margin at every point; IEC 60255-149
    /// operate-time equation, common practice for the margin.
    /// </summary>
    public StartTrip Tightest(ThermalModel model, double startLevel)
    {
        ArgumentNullException.ThrowIfNull(model);
        StartTrip? tightest = null;
        foreach (var point in Points)
        {
            var trip = new StartTrip(point, model.TripTimeFrom(point.Current, startLevel));
            if (tightest is null || trip.Ratio < tightest.Ratio) tightest = trip;
        }

        return tightest!;
    }

    /// <summary>Highest level any start of the profile ends at, from a start level; IEC 60255-149 thermal model.</summary>
    public double PeakLevel(ThermalModel model, double startLevel)
    {
        ArgumentNullException.ThrowIfNull(model);
        var peak = 0.0;
        foreach (var point in Points)
        {
            peak = Math.Max(peak, model.CheckStart(point, startLevel).PeakLevel);
        }

        return peak;
    }

    /// <summary>
    /// Highest level from which every start of the profile still fits: a start of current I for t from level h ends at
    /// h d + p, with d = exp(-t / tau) and p = x (1 - d), which stays below 1 for h below (1 - p) / d; the least of
    /// these over the starts. IEC 60255-149 thermal model.
    /// </summary>
    public double RestartLevel(ThermalModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        var level = double.PositiveInfinity;
        foreach (var point in Points)
        {
            var p = model.CheckStart(point, 0).PeakLevel;
            level = Math.Min(level, (1 - p) * Math.Exp(point.Duration / model.HeatingTimeConstant));
        }

        return level;
    }

    /// <summary>
    /// Shortest time from the beginning of one start to the beginning of the next that lets the next fit, with the motor
    /// stopped in between: over each start from cold, its duration plus the cooling from where it ends to
    /// <see cref="RestartLevel"/>; the longest of these. Infinite when some start does not fit even from cold.
    /// IEC 60255-149 thermal model with the cooling time constant.
    /// </summary>
    public double TimeBetweenStarts(ThermalModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        var restart = RestartLevel(model);
        var needed = 0.0;
        foreach (var point in Points)
        {
            var end = model.CheckStart(point, 0).EndLevel;
            var cooling = model.CoolingTime(end, restart);
            needed = Math.Max(needed, cooling is { } c ? point.Duration + c : double.PositiveInfinity);
        }

        return needed;
    }

    /// <summary>The profile written out, e.g. "1960 A for 7 s; 1568 A for 12 s"; for messages.</summary>
    public override string ToString() =>
        string.Join("; ", Points.Select(p => FormattableString.Invariant($"{p.Current:0.###} A for {p.Duration:0.###} s")));
}

/// <summary>A start point with the thermal element's trip time over it.</summary>
/// <param name="Point">The start.</param>
/// <param name="Trip">The trip time at the start's current from the start level.</param>
public sealed record StartTrip(StartPoint Point, TripTime Trip)
{
    /// <summary>Trip time over the start's duration; infinite when the element never trips or the start takes no time.</summary>
    public double Ratio => Point.Duration > 0 ? Trip.Seconds / Point.Duration : double.PositiveInfinity;
}
