namespace SettingLint.Protection;

/// <summary>
/// Constants of the inverse-time form t = TMS (A / (M^P - 1) + B), with the reset constant of
/// t_r = TMS tr / (1 - M^2) where one is defined. IEC curves have B = 0 and A = k, P = alpha.
/// </summary>
/// <param name="A">Numerator constant (IEC k, IEEE A), s.</param>
/// <param name="B">Added constant (IEEE B), s; 0 for IEC curves.</param>
/// <param name="P">Exponent (IEC alpha, IEEE p).</param>
/// <param name="ResetConstant">Reset constant tr in s, or null where the curve defines no timed reset.</param>
public sealed record CurveConstants(double A, double B, double P, double? ResetConstant);
