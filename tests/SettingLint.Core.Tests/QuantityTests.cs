using CsCheck;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Tests;

/// <summary>Quantities: "number space unit" (setting-files contract, Quantities table) and SI conversion.</summary>
public sealed class QuantityTests
{
    private static readonly UnitContext[] Contexts = [UnitContext.Data, UnitContext.MotorData, UnitContext.Setting];

    private static readonly Dimension[] DimensionsWithUnits =
        [Dimension.Current, Dimension.Voltage, Dimension.Time, Dimension.Power, Dimension.Fraction, Dimension.Impedance, Dimension.Frequency];

    /// <summary>Every (dimension, context, unit) that the format accepts; a unit listed as accepted must exist in Unit.All.</summary>
    private static readonly (Dimension Dimension, UnitContext Context, string Symbol)[] Accepted =
        [.. DimensionsWithUnits.SelectMany(d => Contexts.SelectMany(c => AcceptedUnits.For(d, c).Select(u => (d, c, u))))];

    private static double Si(string text, Dimension dimension, UnitContext context, ConversionReferences refs = default)
    {
        var parse = QuantityParser.Parse(text, dimension, context);
        Assert.True(parse.Ok, text + ": " + parse.Error);
        var si = parse.Value!.Value.ToSi(refs);
        Assert.NotNull(si);
        return si.Value;
    }

    [Fact]
    public void Every_accepted_unit_is_a_known_unit()
    {
        Assert.NotEmpty(Accepted);
        foreach (var (_, _, symbol) in Accepted) Assert.True(Unit.All.ContainsKey(symbol), symbol);
    }

    // Common practice for a text format: what the tool writes, it reads back unchanged.
    [Fact]
    public void ToString_parses_back_to_an_equal_quantity() =>
        Gen.Select(Gen.Double.Where(double.IsFinite), Gen.Int[0, Accepted.Length - 1]).Sample((number, index) =>
        {
            var (dimension, context, symbol) = Accepted[index];
            var first = QuantityParser.Parse(number.ToString("R", System.Globalization.CultureInfo.InvariantCulture) + " " + symbol, dimension, context);
            Assert.True(first.Ok, symbol + " in " + context + ": " + first.Error);
            var written = first.Value!.Value.ToString();
            var again = QuantityParser.Parse(written, dimension, context);
            Assert.True(again.Ok, "'" + written + "': " + again.Error);
            Assert.Equal(first.Value, again.Value);
            Assert.Equal(number, again.Value!.Value.Number);
        });

    [Fact]
    public void Round_trip_also_holds_for_everyday_setting_sizes() =>
        Gen.Select(Gen.Double[0, 1e5], Gen.Int[0, Accepted.Length - 1]).Sample((number, index) =>
        {
            var (dimension, context, symbol) = Accepted[index];
            var q = QuantityParser.Parse(number.ToString("R", System.Globalization.CultureInfo.InvariantCulture) + " " + symbol, dimension, context).Value!.Value;
            Assert.Equal(q, QuantityParser.Parse(q.ToString(), dimension, context).Value);
        });

    // IEEE C57.13: a CT's ratio is primary over secondary rating; secondary amperes times the ratio are primary amperes.
    [Fact]
    public void A_sec_converts_through_the_CT_ratio() =>
        Assert.Equal(108, Si("7.2 A sec", Dimension.Current, UnitContext.Setting, new(75.0 / 5.0, 58, 75, 4000)), 9);

    // setting-files contract: xFLC is a multiple of the motor's full-load current.
    [Fact]
    public void XFLC_is_a_multiple_of_full_load_current()
    {
        Assert.Equal(359.6, Si("6.2 xFLC", Dimension.Current, UnitContext.MotorData, new(null, 58, null, null)), 9);
        Assert.Equal(359.6, Si("6.2 xFLC", Dimension.Current, UnitContext.Setting, new(15, 58, 75, 4000)), 9);
    }

    // setting-files contract: xCT is a multiple of that CT's primary rating.
    [Fact]
    public void XCT_is_a_multiple_of_the_CT_primary() =>
        Assert.Equal(1500, Si("20 xCT", Dimension.Current, UnitContext.Setting, new(15, 58, 75, 4000)), 9);

    // setting-files contract: % on a voltage element is percent of the motor's rated voltage.
    [Fact]
    public void Percent_on_a_voltage_setting_is_percent_of_rated_voltage() =>
        Assert.Equal(3600, Si("90 %", Dimension.Voltage, UnitContext.Setting, new(35, 58, null, 4000)), 9);

    // VT ratio 4200:120 = 35 (IEEE C57.13): 102.857 V sec is 3600 V primary.
    [Fact]
    public void V_sec_converts_through_the_VT_ratio() =>
        Assert.Equal(3600, Si("102.85714285714286 V sec", Dimension.Voltage, UnitContext.Setting, new(4200.0 / 120.0, 58, null, 4000)), 6);

    // SI (BIPM SI Brochure, non-SI units accepted for use with the SI): 1 min = 60 s, 1 h = 3600 s.
    [Theory]
    [InlineData("9 min", 540)]
    [InlineData("27 min", 1620)]
    [InlineData("50 ms", 0.05)]
    [InlineData("1 h", 3600)]
    [InlineData("4.5 s", 4.5)]
    public void Times_convert_to_seconds(string text, double seconds) =>
        Assert.Equal(seconds, Si(text, Dimension.Time, UnitContext.Setting), 9);

    // NIST SP 811 B.9: 1 hp (550 ft lbf/s) = 745.699872 W; 450 hp = 335.565 kW.
    [Fact]
    public void Horsepower_converts_to_watts()
    {
        Assert.Equal(335_564.9424, Si("450 hp", Dimension.Power, UnitContext.MotorData), 6);
        Assert.Equal(335.565, Si("450 hp", Dimension.Power, UnitContext.MotorData) / 1000, 3);
        Assert.Equal(250_000, Si("250 kW", Dimension.Power, UnitContext.MotorData), 9);
    }

    [Theory]
    [InlineData("8 kA", Dimension.Current, UnitContext.Data, 8000)]
    [InlineData("4.16 kV", Dimension.Voltage, UnitContext.Data, 4160)]
    [InlineData("5 A pri", Dimension.Current, UnitContext.Setting, 5)]
    [InlineData("1.2 kA pri", Dimension.Current, UnitContext.Setting, 1200)]
    [InlineData("3.9 kV pri", Dimension.Voltage, UnitContext.Setting, 3900)]
    [InlineData("20 %", Dimension.Fraction, UnitContext.Setting, 0.2)]
    [InlineData("0.3 ohm", Dimension.Impedance, UnitContext.Data, 0.3)]
    public void Absolute_units_convert_by_their_factor(string text, Dimension dimension, UnitContext context, double si) =>
        Assert.Equal(si, Si(text, dimension, context), 9);

    // setting-files contract, Quantities: `1e3` is a number; YAML 1.2.2 10.2.1.4 float grammar.
    [Theory]
    [InlineData("1e3 V", 1000)]
    [InlineData("1E3 V", 1000)]
    [InlineData("1.5e-1 kV", 150)]
    [InlineData(".5 kV", 500)]
    [InlineData("4000. V", 4000)]
    [InlineData("+4000 V", 4000)]
    [InlineData("  4000   V  ", 4000)]
    public void Numbers_follow_the_YAML_float_grammar(string text, double volts) =>
        Assert.Equal(volts, Si(text, Dimension.Voltage, UnitContext.Data), 9);

    // setting-files contract: `1_000` is not a number (YAML 1.1 allowed `_`, 1.2 does not).
    [Theory]
    [InlineData("1_000 V")]
    [InlineData("0x10 V")]
    [InlineData("0o10 V")]
    [InlineData(".inf V")]
    [InlineData("1,000 V")]
    [InlineData("four V")]
    public void Non_numbers_are_rejected(string text)
    {
        var parse = QuantityParser.Parse(text, Dimension.Voltage, UnitContext.Data);
        Assert.Equal(QuantityError.NotANumber, parse.Error);
        Assert.Null(parse.Value);
    }

    [Fact]
    public void A_number_glued_to_its_unit_needs_a_space()
    {
        var parse = QuantityParser.Parse("6.2xFLC", Dimension.Current, UnitContext.MotorData);
        Assert.Equal(QuantityError.NotANumber, parse.Error);
        Assert.Equal("xFLC", parse.UnitText);
        var message = QuantityParser.Explain(parse, "6.2xFLC", Dimension.Current, UnitContext.MotorData);
        Assert.Contains("needs a space", message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("58A", "A")]
    [InlineData("4.5s", "s")]
    [InlineData("1e3V", "V")]
    [InlineData("7.2A sec", "A sec")]
    public void Other_glued_units_also_need_a_space(string text, string unit)
    {
        var dimension = Unit.All[unit].Dimension;
        var parse = QuantityParser.Parse(text, dimension, UnitContext.Setting);
        Assert.Equal(QuantityError.NotANumber, parse.Error);
        Assert.Equal(unit, parse.UnitText);
    }

    // setting-files contract: "A bare number where a unit is needed is an error, never a guess" (SL006).
    [Fact]
    public void A_bare_number_has_no_unit()
    {
        var parse = QuantityParser.Parse("58", Dimension.Current, UnitContext.Data);
        Assert.Equal(QuantityError.MissingUnit, parse.Error);
        Assert.Contains("has no unit", QuantityParser.Explain(parse, "58", Dimension.Current, UnitContext.Data), StringComparison.Ordinal);
    }

    // setting-files contract: plain `A` in protection is an error: say which side.
    [Theory]
    [InlineData("7.2 A", Dimension.Current)]
    [InlineData("1.2 kA", Dimension.Current)]
    [InlineData("3600 V", Dimension.Voltage)]
    [InlineData("3.6 kV", Dimension.Voltage)]
    public void Plain_amperes_or_volts_in_protection_need_a_side(string text, Dimension dimension)
    {
        var parse = QuantityParser.Parse(text, dimension, UnitContext.Setting);
        Assert.Equal(QuantityError.NeedsSide, parse.Error);
        Assert.Contains("which side", QuantityParser.Explain(parse, text, dimension, UnitContext.Setting), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("5 s", Dimension.Current, UnitContext.Setting)]
    [InlineData("5 s", Dimension.Current, UnitContext.Data)]
    [InlineData("58 A", Dimension.Time, UnitContext.Setting)]
    [InlineData("450 hp", Dimension.Voltage, UnitContext.Data)]
    [InlineData("10 %", Dimension.Voltage, UnitContext.Data)]
    [InlineData("10 %", Dimension.Time, UnitContext.Setting)]
    public void A_unit_of_another_dimension_is_wrong(string text, Dimension dimension, UnitContext context)
    {
        var parse = QuantityParser.Parse(text, dimension, context);
        Assert.Equal(QuantityError.WrongDimension, parse.Error);
        Assert.StartsWith("'" + parse.UnitText + "' is a unit of ", QuantityParser.Explain(parse, text, dimension, context), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("58 A pri", Dimension.Current, UnitContext.Data)]
    [InlineData("58 A sec", Dimension.Current, UnitContext.MotorData)]
    [InlineData("6 xFLC", Dimension.Current, UnitContext.Data)]
    [InlineData("2 xCT", Dimension.Current, UnitContext.MotorData)]
    [InlineData("120 V sec", Dimension.Voltage, UnitContext.Data)]
    public void Side_and_relative_units_are_refused_in_data(string text, Dimension dimension, UnitContext context) =>
        Assert.Equal(QuantityError.NotAccepted, QuantityParser.Parse(text, dimension, context).Error);

    [Theory]
    [InlineData("58 amps")]
    [InlineData("58 a")]
    [InlineData("58 A  secondary")]
    public void An_unknown_unit_is_named(string text)
    {
        var parse = QuantityParser.Parse(text, Dimension.Current, UnitContext.Setting);
        Assert.Equal(QuantityError.UnknownUnit, parse.Error);
        Assert.NotNull(parse.UnitText);
    }

    [Fact]
    public void Internal_white_space_of_a_unit_is_normalised() =>
        Assert.Equal(108, Si("7.2 A    sec", Dimension.Current, UnitContext.Setting, new(15, 58, 75, 4000)), 9);

    [Fact]
    public void A_relative_unit_without_its_reference_does_not_convert()
    {
        var q = QuantityParser.Parse("7.2 A sec", Dimension.Current, UnitContext.Setting).Value!.Value;
        Assert.Null(q.ToSi(new ConversionReferences(null, 58, null, 4000)));
        var x = QuantityParser.Parse("2 xFLC", Dimension.Current, UnitContext.Setting).Value!.Value;
        Assert.Null(x.ToSi(default));
    }

    [Fact]
    public void Huge_numbers_that_overflow_are_not_finite() =>
        Assert.Equal(QuantityError.NotFinite, QuantityParser.Parse("1e999 V", Dimension.Voltage, UnitContext.Data).Error);

    // setting-files contract (additions): xVT is a multiple of the VT's primary rating; 0.9 xVT of a 4200 V VT is 3780 V.
    [Fact]
    public void xVT_converts_through_the_VT_primary() =>
        Assert.Equal(3780, Si("0.9 xVT", Dimension.Voltage, UnitContext.Setting, new(35, 58, null, 4000, VtPrimary: 4200)), 9);

    // IEC 61869-2 rated output: a burden in VA is at the CT's rated secondary current, Z = VA / I^2; 2 VA at 5 A is 0.08 ohm.
    [Fact]
    public void A_burden_in_VA_converts_through_the_CT_secondary()
    {
        Assert.Equal(0.08, Si("2 VA", Dimension.Impedance, UnitContext.Data, new(null, null, null, null, CtSecondary: 5)), 12);
        Assert.Equal(15, Si("15 VA", Dimension.Impedance, UnitContext.Data, new(null, null, null, null, CtSecondary: 1)), 12);
        Assert.Null(QuantityParser.Parse("2 VA", Dimension.Impedance, UnitContext.Data).Value!.Value.ToSi(default));
    }

    // setting-files contract (additions): the bus frequency is 50 Hz or 60 Hz; xVT is a setting unit, not a data unit.
    [Fact]
    public void Frequency_is_in_hertz_and_xVT_only_in_settings()
    {
        Assert.Equal(50, Si("50 Hz", Dimension.Frequency, UnitContext.Data), 12);
        Assert.Equal(QuantityError.NotAccepted, QuantityParser.Parse("0.9 xVT", Dimension.Voltage, UnitContext.Data).Error);
        Assert.Equal(QuantityError.WrongDimension, QuantityParser.Parse("50 Hz", Dimension.Time, UnitContext.Data).Error);
    }

    // English: "an impedance", not "a impedance".
    [Fact]
    public void Messages_use_an_before_impedance()
    {
        var parse = QuantityParser.Parse("0.3", Dimension.Impedance, UnitContext.Data);
        var message = QuantityParser.Explain(parse, "0.3", Dimension.Impedance, UnitContext.Data);
        Assert.Contains("an impedance", message, StringComparison.Ordinal);
        Assert.DoesNotContain("a impedance", message, StringComparison.Ordinal);
    }
}
