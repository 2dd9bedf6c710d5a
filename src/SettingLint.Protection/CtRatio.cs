namespace SettingLint.Protection;

/// <summary>Current transformer ratio, rated primary to rated secondary current (e.g. 600 A : 5 A).</summary>
public sealed record CtRatio
{
    /// <summary>Creates a ratio from rated primary and secondary currents in A; IEEE C57.13 ratings.</summary>
    public CtRatio(double primaryRating, double secondaryRating)
    {
        PrimaryRating = Guard.Positive(primaryRating);
        SecondaryRating = Guard.Positive(secondaryRating);
    }

    /// <summary>Rated primary current in A.</summary>
    public double PrimaryRating { get; }

    /// <summary>Rated secondary current in A (usually 5 or 1).</summary>
    public double SecondaryRating { get; }

    /// <summary>Turns ratio, primary / secondary.</summary>
    public double Ratio => PrimaryRating / SecondaryRating;

    /// <summary>Secondary current in A for a primary current, ideal ratio; common practice.</summary>
    public double ToSecondary(double primaryCurrent) => Guard.Finite(primaryCurrent) * SecondaryRating / PrimaryRating;

    /// <summary>Primary current in A for a secondary current, ideal ratio; common practice.</summary>
    public double ToPrimary(double secondaryCurrent) => Guard.Finite(secondaryCurrent) * PrimaryRating / SecondaryRating;
}
