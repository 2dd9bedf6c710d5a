namespace SettingLint.Protection.Tests;

public sealed class CurveTokenTests
{
    // Project convention: file tokens for every curve kind.
    [Theory]
    [InlineData("iec-standard-inverse", CurveKind.IecStandardInverse)]
    [InlineData("iec-very-inverse", CurveKind.IecVeryInverse)]
    [InlineData("iec-extremely-inverse", CurveKind.IecExtremelyInverse)]
    [InlineData("iec-long-time-inverse", CurveKind.IecLongTimeInverse)]
    [InlineData("ieee-moderately-inverse", CurveKind.IeeeModeratelyInverse)]
    [InlineData("ieee-very-inverse", CurveKind.IeeeVeryInverse)]
    [InlineData("ieee-extremely-inverse", CurveKind.IeeeExtremelyInverse)]
    [InlineData("definite-time", CurveKind.DefiniteTime)]
    public void TokenRoundTrips_CommonPractice(string token, CurveKind kind)
    {
        Assert.Equal(kind, CurveTokens.Parse(token));
        Assert.Equal(token, kind.Token());
        Assert.True(CurveTokens.TryParse(token, out var parsed));
        Assert.Equal(kind, parsed);
    }

    // Project convention: strict tokens, so the linter can report a misspelling.
    [Theory]
    [InlineData("IEC-Very-Inverse")]
    [InlineData("very-inverse")]
    [InlineData(" iec-very-inverse")]
    [InlineData("")]
    [InlineData(null)]
    public void UnknownToken_IsRejected_CommonPractice(string? token)
    {
        Assert.False(CurveTokens.TryParse(token, out _));
        if (token is not null)
        {
            Assert.Throws<FormatException>(() => CurveTokens.Parse(token));
        }
    }

    // Every enum member has a distinct token (common practice: one token per curve).
    [Fact]
    public void TokensAreDistinct_CommonPractice()
    {
        var tokens = Enum.GetValues<CurveKind>().Select(kind => kind.Token()).ToList();
        Assert.Equal(tokens.Count, tokens.Distinct(StringComparer.Ordinal).Count());
    }
}
