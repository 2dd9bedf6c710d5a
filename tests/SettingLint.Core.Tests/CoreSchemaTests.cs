using CsCheck;
using SettingLint.Tests.Shared;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Tests;

/// <summary>Plain scalars resolve by the YAML 1.2 core schema (YAML 1.2.2 spec 10.3.2), not by YAML 1.1's wider rules.</summary>
public sealed class CoreSchemaTests
{
    [Theory]
    // YAML 1.1 booleans (the "Norway problem") are strings in 1.2.
    [InlineData("no", ScalarType.String)]
    [InlineData("No", ScalarType.String)]
    [InlineData("on", ScalarType.String)]
    [InlineData("off", ScalarType.String)]
    [InlineData("yes", ScalarType.String)]
    [InlineData("y", ScalarType.String)]
    // 10.3.2 bool: true|True|TRUE|false|False|FALSE.
    [InlineData("true", ScalarType.Bool)]
    [InlineData("True", ScalarType.Bool)]
    [InlineData("FALSE", ScalarType.Bool)]
    [InlineData("tRUE", ScalarType.String)]
    // 10.3.2 null: null|Null|NULL|~ and the empty scalar.
    [InlineData("~", ScalarType.Null)]
    [InlineData("null", ScalarType.Null)]
    [InlineData("NULL", ScalarType.Null)]
    [InlineData("", ScalarType.Null)]
    [InlineData("nULL", ScalarType.String)]
    // 10.3.2 int: [-+]?[0-9]+ | 0o[0-7]+ | 0x[0-9a-fA-F]+.
    [InlineData("0x1F", ScalarType.Int)]
    [InlineData("0o17", ScalarType.Int)]
    [InlineData("0o18", ScalarType.String)]
    [InlineData("0x", ScalarType.String)]
    [InlineData("-0x1F", ScalarType.String)]
    [InlineData("-12", ScalarType.Int)]
    [InlineData("+12", ScalarType.Int)]
    [InlineData("007", ScalarType.Int)]
    [InlineData("1_000", ScalarType.String)]
    [InlineData("0b101", ScalarType.String)]
    [InlineData("12:30", ScalarType.String)]
    // 10.3.2 float.
    [InlineData(".inf", ScalarType.Float)]
    [InlineData("-.Inf", ScalarType.Float)]
    [InlineData("+.INF", ScalarType.Float)]
    [InlineData(".nan", ScalarType.Float)]
    [InlineData(".NaN", ScalarType.Float)]
    [InlineData("inf", ScalarType.String)]
    [InlineData("1.15", ScalarType.Float)]
    [InlineData("1e3", ScalarType.Float)]
    [InlineData("1E-3", ScalarType.Float)]
    [InlineData(".5", ScalarType.Float)]
    [InlineData("5.", ScalarType.Float)]
    [InlineData(".", ScalarType.String)]
    [InlineData("1e", ScalarType.String)]
    [InlineData("1.2.3", ScalarType.String)]
    [InlineData("1_000.5", ScalarType.String)]
    [InlineData("58 A", ScalarType.String)]
    public void Plain_scalars_resolve_by_the_core_schema(string text, ScalarType type) =>
        Assert.Equal(type, CoreSchema.Resolve(text));

    [Theory]
    [InlineData("0x1F", 31)]
    [InlineData("0o17", 15)]
    [InlineData("-12", -12)]
    [InlineData("1e3", 1000)]
    [InlineData("1.15", 1.15)]
    public void Numbers_have_their_value(string text, double value) =>
        Assert.Equal(value, CoreSchema.Number(text));

    [Fact]
    public void Special_floats_have_their_value()
    {
        Assert.Equal(double.PositiveInfinity, CoreSchema.Number(".inf"));
        Assert.Equal(double.NegativeInfinity, CoreSchema.Number("-.inf"));
        Assert.True(double.IsNaN(CoreSchema.Number(".nan")!.Value));
        Assert.Null(CoreSchema.Number("1_000"));
        Assert.Null(CoreSchema.Number("no"));
    }

    // Every decimal integer is an int; never a string.
    [Trait("Category", "Property")]
    [Fact]
    public void Every_decimal_integer_is_an_int() =>
        Gen.Long.SampleSeeded(n => Assert.Equal(ScalarType.Int, CoreSchema.Resolve(n.ToString(System.Globalization.CultureInfo.InvariantCulture))));

    [Trait("Category", "Property")]
    [Fact]
    public void Every_round_trip_float_text_is_a_float_or_int() =>
        Gen.Double.Where(double.IsFinite).SampleSeeded(d =>
        {
            var text = d.ToString("R", System.Globalization.CultureInfo.InvariantCulture);
            Assert.Contains(CoreSchema.Resolve(text), new[] { ScalarType.Int, ScalarType.Float });
            Assert.Equal(d, CoreSchema.Number(text));
        });

    [Fact]
    public void Quoted_and_tagged_scalars_are_strings()
    {
        var file = YamlLoader.Load("a: 'no'\nb: \"0x1F\"\nc: !!str 1.5\nd: no\ne: 0x1F\nf: ! 12\n"u8.ToArray(), "/x.yaml", "x.yaml", LoadLimits.Default);
        var root = Assert.IsType<YMapping>(file.Root);
        Assert.Equal(ScalarType.String, ((YScalar)root["a"]!).Type);
        Assert.Equal(ScalarType.String, ((YScalar)root["b"]!).Type);
        Assert.Equal(ScalarType.String, ((YScalar)root["c"]!).Type);
        Assert.Equal(ScalarType.String, ((YScalar)root["d"]!).Type);
        Assert.Equal(ScalarType.Int, ((YScalar)root["e"]!).Type);
        Assert.Equal(ScalarType.String, ((YScalar)root["f"]!).Type);
        Assert.Equal(ScalarStyle.Quoted, ((YScalar)root["a"]!).Style);
        Assert.Equal(ScalarStyle.Plain, ((YScalar)root["d"]!).Style);
    }
}
