using System.Numerics;

namespace SettingLint.Protection;

/// <summary>Fortescue symmetrical components of three phase phasors, with a = 1 at 120 degrees.</summary>
public static class SymmetricalComponents
{
    /// <summary>The operator a = 1 at 120 degrees, -1/2 + j sqrt(3)/2; Fortescue, common practice.</summary>
    public static Complex RotationOperator => new(-0.5, Math.Sqrt(3) / 2);

    /// <summary>Phasor from magnitude and angle in degrees (angle in degrees because nameplates and meters use them); common practice.</summary>
    public static Complex FromPolarDegrees(double magnitude, double angleDegrees) =>
        Complex.FromPolarCoordinates(Guard.Finite(magnitude), Guard.Finite(angleDegrees) * Math.PI / 180);

    /// <summary>I0, I1 and I2 of phase phasors Ia, Ib, Ic (ABC rotation); Fortescue, common practice.</summary>
    public static SequenceComponents Decompose(Complex phaseA, Complex phaseB, Complex phaseC)
    {
        var a = RotationOperator;
        var a2 = a * a;
        var zero = (phaseA + phaseB + phaseC) / 3;
        var positive = (phaseA + (a * phaseB) + (a2 * phaseC)) / 3;
        var negative = (phaseA + (a2 * phaseB) + (a * phaseC)) / 3;
        return new SequenceComponents(zero, positive, negative);
    }
}
