namespace SettingLint.Protection;

/// <summary>Conversion between SI watts and the mechanical horsepower of motor nameplates.</summary>
public static class PowerUnits
{
    /// <summary>Watts in one mechanical horsepower (550 ft lbf/s), exact by definition of the units.</summary>
    public const double WattsPerHorsepower = 745.699872;

    /// <summary>Horsepower from watts, W / 745.699872; exact unit definition.</summary>
    public static double HorsepowerFromWatts(double watts) => Guard.Finite(watts) / WattsPerHorsepower;
}
