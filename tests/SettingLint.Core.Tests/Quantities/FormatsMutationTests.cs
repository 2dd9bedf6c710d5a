using SettingLint.Core.Quantities;

namespace SettingLint.Core.Tests.Quantities;

/// <summary>
/// Pins how SI values are written for people: three significant figures, and the unit an engineer reads at each size,
/// with the switch-over points themselves (1 kA, 1 kV, 1 s, 10 min) on the side they belong to.
/// </summary>
public sealed class FormatsMutationTests
{
    // Three significant figures (common practice for protection settings, which relays set to two or three figures);
    // large values keep all their integer digits; no exponent.
    [Theory]
    [InlineData(1234.6, "1235")]
    [InlineData(-1234.6, "-1235")]
    [InlineData(1000, "1000")]
    [InlineData(999.4, "999")]
    [InlineData(123.456, "123")]
    [InlineData(12.345, "12.3")]
    [InlineData(1.2345, "1.23")]
    [InlineData(0.5123456, "0.512")]
    [InlineData(-0.5123456, "-0.512")]
    [InlineData(0.012345, "0.0123")]
    [InlineData(0.00012345, "0.000123")]
    [InlineData(1.234e-5, "0.000012")]
    [InlineData(1.23e-7, "0")]
    [InlineData(2.5e20, "250000000000000000000")]
    [InlineData(0, "0")]
    public void Numbers_have_three_significant_figures(double value, string expected) =>
        Assert.Equal(expected, Formats.Number(value));

    // Values that are not numbers are named, not printed as symbols.
    [Fact]
    public void Non_finite_values_are_named()
    {
        Assert.Equal("NaN", Formats.Number(double.NaN));
        Assert.Equal("infinity", Formats.Number(double.PositiveInfinity));
        Assert.Equal("-infinity", Formats.Number(double.NegativeInfinity));
    }

    // SI prefixes k = 10^3 and m = 10^-3 (BIPM SI Brochure, Table 7); 1 min = 60 s (Table 8). The unit switches at
    // 1 kA, 1 kV, below 1 s and from 10 min (common practice: a 9 min time constant reads as 540 s, 15 min as 15 min).
    [Theory]
    [InlineData(1500, Dimension.Current, "1.5 kA")]
    [InlineData(1000, Dimension.Current, "1 kA")]
    [InlineData(999, Dimension.Current, "999 A")]
    [InlineData(-1500, Dimension.Current, "-1.5 kA")]
    [InlineData(4160, Dimension.Voltage, "4.16 kV")]
    [InlineData(1000, Dimension.Voltage, "1 kV")]
    [InlineData(480, Dimension.Voltage, "480 V")]
    [InlineData(-4160, Dimension.Voltage, "-4.16 kV")]
    [InlineData(0.05, Dimension.Time, "50 ms")]
    [InlineData(-0.05, Dimension.Time, "-50 ms")]
    [InlineData(0, Dimension.Time, "0 s")]
    [InlineData(1, Dimension.Time, "1 s")]
    [InlineData(540, Dimension.Time, "540 s")]
    [InlineData(599, Dimension.Time, "599 s")]
    [InlineData(600, Dimension.Time, "10 min")]
    [InlineData(900, Dimension.Time, "15 min")]
    [InlineData(-900, Dimension.Time, "-15 min")]
    [InlineData(335_564.9424, Dimension.Power, "336 kW")]
    [InlineData(0.2, Dimension.Fraction, "20 %")]
    [InlineData(0.0123, Dimension.Fraction, "1.23 %")]
    [InlineData(0.3, Dimension.Impedance, "0.3 ohm")]
    [InlineData(50, Dimension.Frequency, "50 Hz")]
    [InlineData(1.15, Dimension.None, "1.15")]
    public void Si_values_are_written_in_the_usual_unit(double value, Dimension dimension, string expected) =>
        Assert.Equal(expected, Formats.Si(value, dimension));

    // IEEE C57.13: secondary = primary / ratio; 600 A through 600:5 (ratio 120) is 5 A sec.
    [Fact]
    public void Secondary_divides_by_the_ratio() =>
        Assert.Equal("5 A sec", Formats.Secondary(600, 120, "A sec"));
}
