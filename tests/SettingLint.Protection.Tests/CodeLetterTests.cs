namespace SettingLint.Protection.Tests;

public sealed class CodeLetterTests
{
    // NEMA MG 1 Table 10-1: band edges, lower bound included, upper excluded.
    [Theory]
    [InlineData(LockedRotorCodeLetter.A, 0.0, 3.15)]
    [InlineData(LockedRotorCodeLetter.F, 5.0, 5.6)]
    [InlineData(LockedRotorCodeLetter.G, 5.6, 6.3)]
    [InlineData(LockedRotorCodeLetter.H, 6.3, 7.1)]
    [InlineData(LockedRotorCodeLetter.P, 12.5, 14.0)]
    [InlineData(LockedRotorCodeLetter.R, 14.0, 16.0)]
    [InlineData(LockedRotorCodeLetter.U, 20.0, 22.4)]
    public void Bands_NemaMg1_Table10_1(LockedRotorCodeLetter letter, double lower, double upper) =>
        Assert.Equal(new KvaPerHorsepowerRange(lower, upper), LockedRotorCodes.Range(letter));

    // NEMA MG 1 Table 10-1: V is 22.4 kVA/hp and up.
    [Fact]
    public void V_IsOpenEnded_NemaMg1_Table10_1()
    {
        var band = LockedRotorCodes.Range(LockedRotorCodeLetter.V);
        Assert.Equal(22.4, band.Lower);
        Assert.True(double.IsPositiveInfinity(band.Upper));
    }

    // NEMA MG 1 Table 10-1: the letters I, O and Q are not used.
    [Fact]
    public void NoIOrOOrQ_NemaMg1_Table10_1()
    {
        var names = Enum.GetNames<LockedRotorCodeLetter>();
        Assert.DoesNotContain("I", names);
        Assert.DoesNotContain("O", names);
        Assert.DoesNotContain("Q", names);
        Assert.Equal(19, names.Length);
        Assert.False(LockedRotorCodes.TryParse("I", out _));
        Assert.False(LockedRotorCodes.TryParse("O", out _));
        Assert.False(LockedRotorCodes.TryParse("Q", out _));
        Assert.False(LockedRotorCodes.TryParse("g", out _));
        Assert.False(LockedRotorCodes.TryParse("5", out _));
    }

    // NEMA MG 1 Table 10-1 by hand: 500 hp, 4000 V, G: 5.6 x 500 x 1000 / (1.7320508 x 4000) = 404.1 A,
    // 6.3 x 500 x 1000 / 6928.2 = 454.7 A.
    [Fact]
    public void LrcRange_500Hp4000VCodeG_NemaMg1_Table10_1()
    {
        var range = LockedRotorCodes.LockedRotorCurrentRangeFromHorsepower(LockedRotorCodeLetter.G, 500, 4000);
        Assert.Equal(404.0, range.Minimum, 1.0);
        Assert.Equal(455.0, range.Maximum, 1.0);
    }

    // NEMA MG 1 Table 10-1 with 1 hp = 745.699872 W: 500 hp is 372 849.936 W, same band.
    [Fact]
    public void LrcRange_InWatts_NemaMg1_Table10_1()
    {
        var range = LockedRotorCodes.LockedRotorCurrentRangeFromWatts(LockedRotorCodeLetter.G, 372_849.936, 4000);
        Assert.Equal(404.145, range.Minimum, 0.001);
        Assert.Equal(454.663, range.Maximum, 0.001);
    }

    // Common practice: LRC scales with voltage (fixed locked-rotor impedance): 600 A at 4000 V is 540 A at 3600 V.
    [Fact]
    public void ScaleToVoltage_CommonPractice() =>
        Assert.Equal(540.0, LockedRotorCodes.ScaleToVoltage(600, 4000, 3600), 1e-9);

    // Exact unit definition: 1 hp = 745.699872 W.
    [Fact]
    public void Horsepower_ExactDefinition()
    {
        Assert.Equal(1.0, PowerUnits.HorsepowerFromWatts(745.699872), 1e-15);
    }
}
