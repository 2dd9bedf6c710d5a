namespace SettingLint.Protection;

/// <summary>Largest motor overload trip rating allowed by NFPA 70 (NEC) 430.32(A)(1), as a share of nameplate FLC.</summary>
public static class NecOverloadLimit
{
    /// <summary>1.25 for service factor 1.15 or more or marked temperature rise 40 K (deg C) or less, else 1.15 (no service factor marked included); NFPA 70 430.32(A)(1).</summary>
    /// <param name="serviceFactor">Marked service factor, e.g. 1.0 or 1.15; null when none is marked (IEC motors).</param>
    /// <param name="temperatureRise">Marked temperature rise in K (equal to deg C rise), or null when not marked.</param>
    public static double MaximumFraction(double? serviceFactor, double? temperatureRise = null)
    {
        if (serviceFactor is { } sf)
        {
            Guard.Positive(sf);
        }

        if (temperatureRise is { } rise)
        {
            Guard.NonNegative(rise);
        }

        return serviceFactor >= 1.15 || temperatureRise <= 40 ? 1.25 : 1.15;
    }
}
