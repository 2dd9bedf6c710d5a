using System.Numerics;

namespace SettingLint.Protection.Tests;

public sealed class SymmetricalComponentsTests
{
    // Fortescue (common practice): a balanced ABC set is pure positive sequence.
    [Fact]
    public void Balanced_HasNoNegativeOrZeroSequence_CommonPractice()
    {
        var parts = SymmetricalComponents.Decompose(
            SymmetricalComponents.FromPolarDegrees(100, 0),
            SymmetricalComponents.FromPolarDegrees(100, -120),
            SymmetricalComponents.FromPolarDegrees(100, 120));
        Assert.Equal(100, parts.Positive.Magnitude, 1e-9);
        Assert.Equal(0, parts.Negative.Magnitude, 1e-9);
        Assert.Equal(0, parts.Zero.Magnitude, 1e-9);
        Assert.Equal(0, parts.NegativeToPositiveRatio!.Value, 1e-12);
    }

    // Common practice: single phasing Ia = 0, Ib = -Ic gives |I2| = |I1| and NEMA unbalance 100 %.
    [Fact]
    public void SinglePhasing_RatioOne_Nema100Percent_CommonPractice()
    {
        var ib = SymmetricalComponents.FromPolarDegrees(86.6, -90);
        var parts = SymmetricalComponents.Decompose(Complex.Zero, ib, -ib);
        Assert.Equal(1.0, parts.NegativeToPositiveRatio!.Value, 1e-12);
        Assert.Equal(0, parts.Zero.Magnitude, 1e-12);
        Assert.Equal(1.0, NemaUnbalance.FromPhasors(Complex.Zero, ib, -ib), 1e-12);
    }

    // Textbook unbalanced set, worked by hand in rectangular form (not with the library's formula):
    // Ia = 100 + j0, Ib = -50 - j80, Ic = -40 + j90; a = -0.5 + j0.8660254, a^2 = -0.5 - j0.8660254.
    // I0 = (10 + j10) / 3 = 3.3333 + j3.3333, |I0| = 4.7140.
    // a Ib = (25 + 69.2820) + j(40 - 43.3013) = 94.2820 - j3.3013
    // a^2 Ic = (20 + 77.9423) + j(-45 + 34.6410) = 97.9423 - j10.3590
    // I1 = (292.2243 - j13.6603) / 3 = 97.4081 - j4.5534, |I1| = 97.5145
    // a^2 Ib = (25 - 69.2820) + j(40 + 43.3013) = -44.2820 + j83.3013
    // a Ic = (20 - 77.9423) + j(-45 - 34.6410) = -57.9423 - j79.6410
    // I2 = (-2.2243 + j3.6603) / 3 = -0.7414 + j1.2201, |I2| = 1.4277; I2 / I1 = 0.01464.
    [Fact]
    public void TextbookSet_WorkedByHand_CommonPractice()
    {
        var parts = SymmetricalComponents.Decompose(new Complex(100, 0), new Complex(-50, -80), new Complex(-40, 90));
        Assert.Equal(3.3333, parts.Zero.Real, 0.0001);
        Assert.Equal(3.3333, parts.Zero.Imaginary, 0.0001);
        Assert.Equal(97.4081, parts.Positive.Real, 0.0001);
        Assert.Equal(-4.5534, parts.Positive.Imaginary, 0.0001);
        Assert.Equal(-0.7414, parts.Negative.Real, 0.0001);
        Assert.Equal(1.2201, parts.Negative.Imaginary, 0.0001);
        Assert.Equal(97.5145, parts.Positive.Magnitude, 0.0001);
        Assert.Equal(1.4277, parts.Negative.Magnitude, 0.0001);
        Assert.Equal(0.01464, parts.NegativeToPositiveRatio!.Value, 0.00001);
    }

    // Fortescue (common practice): the components rebuild the phases, Ib = I0 + a^2 I1 + a I2.
    [Fact]
    public void Components_RebuildPhases_CommonPractice()
    {
        var ib = new Complex(-50, -80);
        var parts = SymmetricalComponents.Decompose(new Complex(100, 0), ib, new Complex(-40, 90));
        var a = SymmetricalComponents.RotationOperator;
        var rebuilt = parts.Zero + (a * a * parts.Positive) + (a * parts.Negative);
        Assert.Equal(0, (rebuilt - ib).Magnitude, 1e-9);
    }

    // Common practice: with no positive sequence the ratio is undefined (null), not a number.
    [Fact]
    public void NoPositiveSequence_RatioIsNull_CommonPractice()
    {
        var parts = SymmetricalComponents.Decompose(
            SymmetricalComponents.FromPolarDegrees(10, 0),
            SymmetricalComponents.FromPolarDegrees(10, 0),
            SymmetricalComponents.FromPolarDegrees(10, 0));
        Assert.Null(parts.NegativeToPositiveRatio);
    }
}
