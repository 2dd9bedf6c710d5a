namespace SettingLint.Protection;

/// <summary>
/// Result of checking a start against the thermal element. Levels are shares of the trip level
/// and are computed as if the element did not trip, so they stay meaningful for reporting.
/// </summary>
/// <param name="Fits">True when the level stays below 1 for the whole start.</param>
/// <param name="EndLevel">Level at the end of the profile.</param>
/// <param name="PeakLevel">Highest level during the profile.</param>
/// <param name="Headroom">1 - peak level; negative when the start does not fit.</param>
public sealed record StartFit(bool Fits, double EndLevel, double PeakLevel, double Headroom);
