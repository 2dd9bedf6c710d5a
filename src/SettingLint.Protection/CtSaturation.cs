namespace SettingLint.Protection;

/// <summary>IEEE C37.110 criterion for a CT to reproduce a fully offset fault current without saturating.</summary>
public static class CtSaturation
{
    /// <summary>Largest criterion value that is still saturation free: 20 (the C-class rating point of 20 x rated current).</summary>
    public const double Limit = 20;

    /// <summary>Criterion (1 + X/R) If Zb, If per unit of CT rating, Zb per unit of standard burden; IEEE C37.110.</summary>
    public static double Criterion(double xOverR, double faultCurrentPerUnit, double burdenPerUnit) =>
        (1 + Guard.NonNegative(xOverR)) * Guard.NonNegative(faultCurrentPerUnit) * Guard.NonNegative(burdenPerUnit);

    /// <summary>Criterion value and whether it exceeds 20 (saturates); IEEE C37.110.</summary>
    public static SaturationCheck Check(double xOverR, double faultCurrentPerUnit, double burdenPerUnit)
    {
        var value = Criterion(xOverR, faultCurrentPerUnit, burdenPerUnit);
        return new SaturationCheck(value, value > Limit);
    }
}
