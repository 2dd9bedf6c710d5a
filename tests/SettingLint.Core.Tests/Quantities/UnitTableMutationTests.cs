using SettingLint.Core.Quantities;

namespace SettingLint.Core.Tests.Quantities;

/// <summary>
/// Pins every row of the unit table (symbol, dimension, factor to SI, basis), the units accepted in each context and the
/// names of the dimensions, so that a changed factor, a dropped unit or a renamed token fails here and not in a plant.
/// </summary>
public sealed class UnitTableMutationTests
{
    // Factors: SI prefixes k = 10^3, M = 10^6, m = 10^-3 (BIPM SI Brochure, 9th ed., Table 7); 1 min = 60 s and
    // 1 h = 3600 s (BIPM SI Brochure, Table 8, non-SI units accepted for use with the SI); 1 hp = 745.699872 W
    // (NIST SP 811, B.9, horsepower of 550 ft lbf/s); % = 0.01 (ISO 80000-1, common practice).
    // Bases: the setting-files contract, Quantities table and its additions (xVT, VA, Hz).
    public static TheoryData<string, Dimension, double, UnitBasis> Rows => new()
    {
        { "A", Dimension.Current, 1, UnitBasis.Absolute },
        { "kA", Dimension.Current, 1000, UnitBasis.Absolute },
        { "A pri", Dimension.Current, 1, UnitBasis.Primary },
        { "kA pri", Dimension.Current, 1000, UnitBasis.Primary },
        { "A sec", Dimension.Current, 1, UnitBasis.Secondary },
        { "xFLC", Dimension.Current, 1, UnitBasis.FullLoadCurrent },
        { "xCT", Dimension.Current, 1, UnitBasis.CtRating },
        { "V", Dimension.Voltage, 1, UnitBasis.Absolute },
        { "kV", Dimension.Voltage, 1000, UnitBasis.Absolute },
        { "V pri", Dimension.Voltage, 1, UnitBasis.Primary },
        { "kV pri", Dimension.Voltage, 1000, UnitBasis.Primary },
        { "V sec", Dimension.Voltage, 1, UnitBasis.Secondary },
        { "xVT", Dimension.Voltage, 1, UnitBasis.VtRating },
        { "ms", Dimension.Time, 0.001, UnitBasis.Absolute },
        { "s", Dimension.Time, 1, UnitBasis.Absolute },
        { "min", Dimension.Time, 60, UnitBasis.Absolute },
        { "h", Dimension.Time, 3600, UnitBasis.Absolute },
        { "hp", Dimension.Power, 745.699872, UnitBasis.Absolute },
        { "kW", Dimension.Power, 1000, UnitBasis.Absolute },
        { "MW", Dimension.Power, 1e6, UnitBasis.Absolute },
        { "%", Dimension.Fraction, 0.01, UnitBasis.Absolute },
        { "ohm", Dimension.Impedance, 1, UnitBasis.Absolute },
        { "VA", Dimension.Impedance, 1, UnitBasis.CtSecondaryPower },
        { "Hz", Dimension.Frequency, 1, UnitBasis.Absolute },
    };

    [Theory]
    [MemberData(nameof(Rows))]
    public void Each_unit_has_its_published_factor_and_basis(string symbol, Dimension dimension, double factor, UnitBasis basis)
    {
        Assert.True(Unit.All.TryGetValue(symbol, out var unit), symbol);
        Assert.Equal(symbol, unit.Symbol);
        Assert.Equal(dimension, unit.Dimension);
        Assert.Equal(factor, unit.Factor);
        Assert.Equal(basis, unit.Basis);
    }

    // The table holds these 24 units and no other (a unit the contract does not name would be a guess).
    [Fact]
    public void The_table_holds_exactly_the_contracts_units() =>
        Assert.Equal(Rows.Select(r => (string)r[0]).Order(StringComparer.Ordinal), Unit.All.Keys.Order(StringComparer.Ordinal));

    // setting-files contract, Quantities table (and additions: MW, xVT, VA, Hz): the accepted units, in the order
    // they are suggested.
    public static TheoryData<Dimension, UnitContext, string[]> Accepted => new()
    {
        { Dimension.Current, UnitContext.Setting, ["A pri", "A sec", "kA pri", "xFLC", "xCT"] },
        { Dimension.Current, UnitContext.MotorData, ["A", "kA", "xFLC"] },
        { Dimension.Current, UnitContext.Data, ["A", "kA"] },
        { Dimension.Voltage, UnitContext.Setting, ["%", "V pri", "V sec", "kV pri", "xVT"] },
        { Dimension.Voltage, UnitContext.MotorData, ["V", "kV"] },
        { Dimension.Voltage, UnitContext.Data, ["V", "kV"] },
        { Dimension.Time, UnitContext.Setting, ["ms", "s", "min", "h"] },
        { Dimension.Time, UnitContext.Data, ["ms", "s", "min", "h"] },
        { Dimension.Power, UnitContext.MotorData, ["hp", "kW", "MW"] },
        { Dimension.Fraction, UnitContext.Setting, ["%"] },
        { Dimension.Impedance, UnitContext.Data, ["ohm", "VA"] },
        { Dimension.Frequency, UnitContext.Data, ["Hz"] },
        { Dimension.None, UnitContext.Data, [] },
        { Dimension.None, UnitContext.Setting, [] },
    };

    [Theory]
    [MemberData(nameof(Accepted))]
    public void Accepted_units_per_context_follow_the_contract(Dimension dimension, UnitContext context, string[] expected) =>
        Assert.Equal(expected, AcceptedUnits.For(dimension, context));

    // setting-files contract: `protection.*` are settings; motor and starter data may be xFLC except the FLC and the
    // rated voltage themselves (a multiple of FLC cannot define FLC); all else is data.
    [Theory]
    [InlineData("protection.thermal.pickup", UnitContext.Setting)]
    [InlineData("motor.locked_rotor_current", UnitContext.MotorData)]
    [InlineData("motor.full_load_current", UnitContext.Data)]
    [InlineData("motor.rated_voltage", UnitContext.Data)]
    [InlineData("starter.soft_start_current_limit", UnitContext.MotorData)]
    [InlineData("fault_current_max", UnitContext.Data)]
    [InlineData("transformers.phase_ct.primary", UnitContext.Data)]
    [InlineData("protectionx", UnitContext.Data)]
    [InlineData("motorx.a", UnitContext.Data)]
    [InlineData("starterx.a", UnitContext.Data)]
    public void The_context_of_a_key_path(string path, UnitContext expected) =>
        Assert.Equal(expected, UnitContexts.Of(path));

    // The dimension tokens are those of the schemas and the rule language (rule-catalogue); SI symbols from the BIPM SI
    // Brochure, Table 4 (A, V, s, W, Hz; ohm written out, as files are ASCII); a fraction has no unit.
    [Theory]
    [InlineData(Dimension.Current, "current", "A", "a")]
    [InlineData(Dimension.Voltage, "voltage", "V", "a")]
    [InlineData(Dimension.Time, "time", "s", "a")]
    [InlineData(Dimension.Power, "power", "W", "a")]
    [InlineData(Dimension.Fraction, "percent", "", "a")]
    [InlineData(Dimension.Impedance, "impedance", "ohm", "an")]
    [InlineData(Dimension.Frequency, "frequency", "Hz", "a")]
    [InlineData(Dimension.None, "number", "", "a")]
    public void Dimension_tokens_symbols_and_articles(Dimension dimension, string token, string symbol, string article)
    {
        Assert.Equal(token, dimension.Token());
        Assert.Equal(dimension, Dimensions.Parse(token));
        Assert.Equal(symbol, dimension.SiSymbol());
        Assert.Equal(article, dimension.Article());
    }

    // "fraction" is read as the percent dimension too; anything else is unknown, never a guess.
    [Fact]
    public void Fraction_is_an_alias_and_unknown_tokens_are_null()
    {
        Assert.Equal(Dimension.Fraction, Dimensions.Parse("fraction"));
        Assert.Null(Dimensions.Parse("Current"));
        Assert.Null(Dimensions.Parse(""));
        Assert.Null(Dimensions.Parse("ampere"));
    }
}
