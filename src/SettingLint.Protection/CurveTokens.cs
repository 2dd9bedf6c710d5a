using System.Diagnostics.CodeAnalysis;

namespace SettingLint.Protection;

/// <summary>Maps <see cref="CurveKind"/> to and from the lower-case tokens used in settings files.</summary>
public static class CurveTokens
{
    /// <summary>The file token of a curve, e.g. "iec-very-inverse"; common practice (settings-file tokens).</summary>
    public static string Token(this CurveKind kind) => kind switch
    {
        CurveKind.IecStandardInverse => "iec-standard-inverse",
        CurveKind.IecVeryInverse => "iec-very-inverse",
        CurveKind.IecExtremelyInverse => "iec-extremely-inverse",
        CurveKind.IecLongTimeInverse => "iec-long-time-inverse",
        CurveKind.IeeeModeratelyInverse => "ieee-moderately-inverse",
        CurveKind.IeeeVeryInverse => "ieee-very-inverse",
        CurveKind.IeeeExtremelyInverse => "ieee-extremely-inverse",
        CurveKind.DefiniteTime => "definite-time",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "Unknown curve kind."),
    };

    // Enum.GetValues copies its array at every call, and rules parse a curve token for every motor.
    private static readonly CurveKind[] Kinds = Enum.GetValues<CurveKind>();

    /// <summary>Reads a curve token (exact, case-sensitive match) without throwing; common practice (settings-file tokens).</summary>
    public static bool TryParse([NotNullWhen(true)] string? token, out CurveKind kind)
    {
        // Exact match keeps the file format strict: a linter should flag "IEC-Very-Inverse", not guess.
        foreach (var candidate in Kinds)
        {
            if (string.Equals(candidate.Token(), token, StringComparison.Ordinal))
            {
                kind = candidate;
                return true;
            }
        }

        kind = default;
        return false;
    }

    /// <summary>Reads a curve token (exact, case-sensitive match); throws <see cref="FormatException"/> if unknown; common practice (settings-file tokens).</summary>
    public static CurveKind Parse(string token)
    {
        ArgumentNullException.ThrowIfNull(token);
        return TryParse(token, out var kind)
            ? kind
            : throw new FormatException("Unknown curve token '" + token + "'.");
    }
}
