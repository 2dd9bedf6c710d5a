namespace SettingLint.Protection;

/// <summary>Time-overcurrent characteristic; file tokens are given by <see cref="CurveTokens"/>.</summary>
public enum CurveKind
{
    /// <summary>IEC standard inverse, token "iec-standard-inverse" (k 0.14, a 0.02).</summary>
    IecStandardInverse,

    /// <summary>IEC very inverse, token "iec-very-inverse" (k 13.5, a 1).</summary>
    IecVeryInverse,

    /// <summary>IEC extremely inverse, token "iec-extremely-inverse" (k 80, a 2).</summary>
    IecExtremelyInverse,

    /// <summary>IEC long-time inverse, token "iec-long-time-inverse" (k 120, a 1).</summary>
    IecLongTimeInverse,

    /// <summary>IEEE moderately inverse, token "ieee-moderately-inverse".</summary>
    IeeeModeratelyInverse,

    /// <summary>IEEE very inverse, token "ieee-very-inverse".</summary>
    IeeeVeryInverse,

    /// <summary>IEEE extremely inverse, token "ieee-extremely-inverse".</summary>
    IeeeExtremelyInverse,

    /// <summary>Definite time, token "definite-time": the multiplier is the delay in s.</summary>
    DefiniteTime,
}
