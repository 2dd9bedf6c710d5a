using SettingLint.Core.Quantities;

namespace SettingLint.Core.Tests.Quantities;

/// <summary>
/// Pins what the quantity reader gives back beyond the happy path: the example each message suggests (which must itself
/// be accepted where it is suggested), the units and text each message names, the glued-number cases, and which
/// references each unit basis needs.
/// </summary>
public sealed class QuantityParserMutationTests
{
    public static TheoryData<Dimension, UnitContext> Places => new()
    {
        { Dimension.Current, UnitContext.Setting },
        { Dimension.Current, UnitContext.MotorData },
        { Dimension.Current, UnitContext.Data },
        { Dimension.Voltage, UnitContext.Setting },
        { Dimension.Voltage, UnitContext.Data },
        { Dimension.Time, UnitContext.Setting },
        { Dimension.Power, UnitContext.MotorData },
        { Dimension.Fraction, UnitContext.Setting },
        { Dimension.Impedance, UnitContext.Data },
        { Dimension.Frequency, UnitContext.Data },
    };

    private static string ExampleIn(string message)
    {
        const string marker = "for example '";
        var start = message.IndexOf(marker, StringComparison.Ordinal);
        Assert.True(start >= 0, message);
        start += marker.Length;
        return message[start..message.IndexOf('\'', start)];
    }

    // setting-files contract, Quantities: "A bare number where a unit is needed is an error"; the message then shows a
    // value written as the contract wants it in that place, and that value must be accepted there.
    [Theory]
    [MemberData(nameof(Places))]
    public void The_suggested_example_is_accepted_where_it_is_suggested(Dimension dimension, UnitContext context)
    {
        var parse = QuantityParser.Parse("7", dimension, context);
        Assert.Equal(QuantityError.MissingUnit, parse.Error);
        var message = QuantityParser.Explain(parse, "7", dimension, context);
        var example = ExampleIn(message);
        Assert.True(QuantityParser.Parse(example, dimension, context).Ok, example + " in " + dimension + "/" + context);
        foreach (var unit in AcceptedUnits.For(dimension, context)) Assert.Contains("'" + unit + "'", message, StringComparison.Ordinal);
        Assert.Contains(dimension.Token(), message, StringComparison.Ordinal);
    }

    // The examples are the contract's own sizes (setting-files contract, Quantities and its worked examples).
    [Theory]
    [InlineData(Dimension.Current, UnitContext.Setting, "7.2 A sec")]
    [InlineData(Dimension.Current, UnitContext.Data, "58 A")]
    [InlineData(Dimension.Voltage, UnitContext.Setting, "90 %")]
    [InlineData(Dimension.Voltage, UnitContext.Data, "4000 V")]
    [InlineData(Dimension.Time, UnitContext.Setting, "4.5 s")]
    [InlineData(Dimension.Power, UnitContext.MotorData, "450 hp")]
    [InlineData(Dimension.Fraction, UnitContext.Setting, "10 %")]
    [InlineData(Dimension.Impedance, UnitContext.Data, "0.3 ohm")]
    [InlineData(Dimension.Frequency, UnitContext.Data, "50 Hz")]
    public void The_example_of_each_place(Dimension dimension, UnitContext context, string expected) =>
        Assert.Equal(expected, ExampleIn(QuantityParser.Explain(QuantityParser.Parse("7", dimension, context), "7", dimension, context)));

    [Fact]
    public void A_text_that_is_no_number_names_the_form_and_the_units()
    {
        var parse = QuantityParser.Parse("four A", Dimension.Current, UnitContext.Data);
        Assert.Equal(QuantityError.NotANumber, parse.Error);
        Assert.Null(parse.UnitText);
        var message = QuantityParser.Explain(parse, "four A", Dimension.Current, UnitContext.Data);
        Assert.StartsWith("'four A' is not a number followed by a unit", message, StringComparison.Ordinal);
        Assert.Contains("'58 A'", message, StringComparison.Ordinal);
        Assert.Contains("'A', 'kA'", message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_glued_number_gets_an_example_with_a_space()
    {
        var parse = QuantityParser.Parse("58A", Dimension.Current, UnitContext.Data);
        var message = QuantityParser.Explain(parse, "58A", Dimension.Current, UnitContext.Data);
        Assert.StartsWith("'58A' needs a space", message, StringComparison.Ordinal);
        Assert.Equal("58 A", ExampleIn(message));
    }

    // Glued forms by the YAML 1.2 float grammar (signs, exponent in either case, a leading point); a glued unit that is
    // not known is no glued quantity, and a text that starts with a letter has no number to glue. A run of number
    // characters that is no number by that grammar ("1.2.3", "1e") is no glued number either, with or without a unit
    // after it: the message must not suggest a space that would not make it a quantity.
    [Theory]
    [InlineData("1.2.3 A", null)]
    [InlineData("1.2.3A", null)]
    [InlineData("1.2.3", null)]
    [InlineData("1e", null)]
    [InlineData("-", null)]
    [InlineData("-5A", "A")]
    [InlineData("+5A", "A")]
    [InlineData("1E3V", "V")]
    [InlineData(".5kV", "kV")]
    [InlineData("58amps", null)]
    [InlineData("A58", null)]
    [InlineData("5.A", "A")]
    public void Glued_forms(string text, string? unit)
    {
        var parse = QuantityParser.Parse(text, Unit.All.TryGetValue(unit ?? "A", out var u) ? u.Dimension : Dimension.Current, UnitContext.Data);
        Assert.Equal(QuantityError.NotANumber, parse.Error);
        Assert.Equal(unit, parse.UnitText);
    }

    [Fact]
    public void Other_errors_name_the_text_the_unit_and_what_is_accepted()
    {
        var huge = QuantityParser.Parse("1e999 V", Dimension.Voltage, UnitContext.Data);
        Assert.Equal("V", huge.UnitText);
        Assert.Equal("'1e999 V' is not a finite number.", QuantityParser.Explain(huge, "1e999 V", Dimension.Voltage, UnitContext.Data));

        var unknown = QuantityParser.Parse("58 amps", Dimension.Current, UnitContext.Data);
        Assert.Equal("amps", unknown.UnitText);
        var unknownMessage = QuantityParser.Explain(unknown, "58 amps", Dimension.Current, UnitContext.Data);
        Assert.StartsWith("'amps' is not a known unit", unknownMessage, StringComparison.Ordinal);
        Assert.Contains("'A', 'kA'", unknownMessage, StringComparison.Ordinal);

        var wrong = QuantityParser.Parse("5 s", Dimension.Current, UnitContext.Data);
        var wrongMessage = QuantityParser.Explain(wrong, "5 s", Dimension.Current, UnitContext.Data);
        Assert.StartsWith("'s' is a unit of time", wrongMessage, StringComparison.Ordinal);
        Assert.Contains("a current", wrongMessage, StringComparison.Ordinal);

        var side = QuantityParser.Parse("7.2 A", Dimension.Current, UnitContext.Setting);
        var sideMessage = QuantityParser.Explain(side, "7.2 A", Dimension.Current, UnitContext.Setting);
        Assert.StartsWith("'7.2 A' does not say which side", sideMessage, StringComparison.Ordinal);
        Assert.Contains("'A pri', 'A sec', 'kA pri', 'xFLC', 'xCT'", sideMessage, StringComparison.Ordinal);

        var refused = QuantityParser.Parse("6 xFLC", Dimension.Current, UnitContext.Data);
        Assert.Equal(QuantityError.NotAccepted, refused.Error);
        var refusedMessage = QuantityParser.Explain(refused, "6 xFLC", Dimension.Current, UnitContext.Data);
        Assert.StartsWith("'xFLC' is not accepted here", refusedMessage, StringComparison.Ordinal);
        Assert.Contains("'A', 'kA'", refusedMessage, StringComparison.Ordinal);

        Assert.Equal("'7 A' is not a valid current.", QuantityParser.Explain(default, "7 A", Dimension.Current, UnitContext.Data));
    }

    // A tab or several spaces inside a unit are read as one space; the number may be followed by any white space.
    [Theory]
    [InlineData("7.2 A\tsec")]
    [InlineData("7.2\tA sec")]
    [InlineData("7.2 A \t sec")]
    public void White_space_inside_a_unit_is_one_space(string text)
    {
        var parse = QuantityParser.Parse(text, Dimension.Current, UnitContext.Setting);
        Assert.True(parse.Ok, text + ": " + parse.Error);
        Assert.Equal("A sec", parse.Value!.Value.Unit.Symbol);
        Assert.Equal("A sec", parse.UnitText);
    }

    // YAML 1.2.2 10.3.2 (core schema): .nan, .NaN, .inf, .Inf, .INF are floats, but no setting is infinite or NaN;
    // an empty text is no number.
    [Theory]
    [InlineData(".nan")]
    [InlineData(".NaN")]
    [InlineData(".NAN")]
    [InlineData(".Inf")]
    [InlineData("-.INF")]
    [InlineData("")]
    public void Special_floats_and_empty_text_are_not_numbers(string text) =>
        Assert.False(QuantityParser.TryNumber(text, out _));

    [Theory]
    [InlineData("0", 0)]
    [InlineData("-1.5", -1.5)]
    [InlineData("2E-3", 0.002)]
    [InlineData("12", 12)]
    public void Plain_numbers_are_numbers(string text, double expected)
    {
        Assert.True(QuantityParser.TryNumber(text, out var value));
        Assert.Equal(expected, value);
    }

    // setting-files contract: % on a voltage element is percent of the motor's rated voltage.
    [Fact]
    public void Percent_of_rated_voltage_is_its_own_unit()
    {
        var unit = QuantityParser.PercentOfRated;
        Assert.Equal(new Unit("%", Dimension.Voltage, 0.01, UnitBasis.RatedVoltage), unit);
        Assert.Equal(unit, QuantityParser.Parse("90 %", Dimension.Voltage, UnitContext.Setting).Value!.Value.Unit);
    }

    // Each relative unit needs its own reference and no other (setting-files contract; IEC 61869-2 for VA).
    [Theory]
    [InlineData("2 A sec", Dimension.Current, UnitContext.Setting)]
    [InlineData("2 xFLC", Dimension.Current, UnitContext.Setting)]
    [InlineData("2 xCT", Dimension.Current, UnitContext.Setting)]
    [InlineData("90 %", Dimension.Voltage, UnitContext.Setting)]
    [InlineData("0.9 xVT", Dimension.Voltage, UnitContext.Setting)]
    [InlineData("2 VA", Dimension.Impedance, UnitContext.Data)]
    public void A_relative_unit_needs_its_own_reference(string text, Dimension dimension, UnitContext context)
    {
        var q = QuantityParser.Parse(text, dimension, context).Value!.Value;
        Assert.Null(q.ToSi(default));
        var own = q.Unit.Basis switch
        {
            UnitBasis.Secondary => new ConversionReferences(10, null, null, null),
            UnitBasis.FullLoadCurrent => new ConversionReferences(null, 10, null, null),
            UnitBasis.CtRating => new ConversionReferences(null, null, 10, null),
            UnitBasis.RatedVoltage => new ConversionReferences(null, null, null, 10),
            UnitBasis.VtRating => new ConversionReferences(null, null, null, null, VtPrimary: 10),
            _ => new ConversionReferences(null, null, null, null, CtSecondary: 10),
        };
        var others = new ConversionReferences(own.SideRatio is null ? 7 : null, own.FullLoadCurrent is null ? 7 : null, own.CtPrimary is null ? 7 : null,
            own.RatedVoltage is null ? 7 : null, own.VtPrimary is null ? 7 : null, own.CtSecondary is null ? 7 : null);
        Assert.Null(q.ToSi(others));
        Assert.NotNull(q.ToSi(own));
    }

    // Absolute and primary units need no reference: 5 A pri is 5 A, 1.2 kA pri is 1200 A.
    [Fact]
    public void Primary_units_need_no_reference()
    {
        Assert.Equal(5, QuantityParser.Parse("5 A pri", Dimension.Current, UnitContext.Setting).Value!.Value.ToSi(default));
        Assert.Equal(1200, QuantityParser.Parse("1.2 kA pri", Dimension.Current, UnitContext.Setting).Value!.Value.ToSi(default));
        Assert.Equal("1.2 kA pri", QuantityParser.Parse("1.2   kA pri", Dimension.Current, UnitContext.Setting).Value!.Value.ToString());
    }
}
