namespace SettingLint.Protection;

/// <summary>A range of currents in A; <see cref="Maximum"/> may be positive infinity (open-ended band).</summary>
/// <param name="Minimum">Lowest current in A.</param>
/// <param name="Maximum">Highest current in A, or positive infinity.</param>
public sealed record CurrentRange(double Minimum, double Maximum);
