namespace SettingLint.Protection;

/// <summary>
/// Locked-rotor kVA per horsepower band of a code letter: lower bound included, upper bound
/// excluded; the upper bound of letter V is positive infinity.
/// </summary>
/// <param name="Lower">Lowest kVA/hp of the band (included).</param>
/// <param name="Upper">kVA/hp where the next letter starts (excluded).</param>
public sealed record KvaPerHorsepowerRange(double Lower, double Upper);
