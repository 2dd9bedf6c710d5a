namespace SettingLint.Protection;

/// <summary>Voltage transformer ratio, rated primary to rated secondary voltage (e.g. 4200 V : 120 V).</summary>
public sealed record VtRatio
{
    /// <summary>Creates a ratio from rated primary and secondary voltages in V; IEEE C57.13 ratings.</summary>
    public VtRatio(double primaryRating, double secondaryRating)
    {
        PrimaryRating = Guard.Positive(primaryRating);
        SecondaryRating = Guard.Positive(secondaryRating);
    }

    /// <summary>Rated primary voltage in V.</summary>
    public double PrimaryRating { get; }

    /// <summary>Rated secondary voltage in V (usually 120 or 115).</summary>
    public double SecondaryRating { get; }

    /// <summary>Ratio, primary / secondary.</summary>
    public double Ratio => PrimaryRating / SecondaryRating;

    /// <summary>Secondary voltage in V for a primary voltage, ideal ratio; common practice.</summary>
    public double ToSecondary(double primaryVoltage) => Guard.Finite(primaryVoltage) * SecondaryRating / PrimaryRating;

    /// <summary>Primary voltage in V for a secondary voltage, ideal ratio; common practice.</summary>
    public double ToPrimary(double secondaryVoltage) => Guard.Finite(secondaryVoltage) * PrimaryRating / SecondaryRating;
}
