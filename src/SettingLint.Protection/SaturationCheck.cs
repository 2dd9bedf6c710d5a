namespace SettingLint.Protection;

/// <summary>Result of the IEEE C37.110 CT saturation-free check.</summary>
/// <param name="Criterion">(1 + X/R) If Zb, If and Zb per unit; the CT stays free of saturation at 20 or less.</param>
/// <param name="Saturates">True when the criterion exceeds 20.</param>
public sealed record SaturationCheck(double Criterion, bool Saturates);
