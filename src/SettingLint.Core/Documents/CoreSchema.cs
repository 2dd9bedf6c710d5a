using System.Globalization;

namespace SettingLint.Core.Documents;

/// <summary>Resolution of plain scalars by the YAML 1.2 core schema (so `no`, `on` and `0x1F` are not what YAML 1.1 made them).</summary>
public static class CoreSchema
{
    /// <summary>The type of a plain scalar, by YAML 1.2 section 10.3.2.</summary>
    public static ScalarType Resolve(string s)
    {
        switch (s)
        {
            case "" or "~" or "null" or "Null" or "NULL":
                return ScalarType.Null;
            case "true" or "True" or "TRUE" or "false" or "False" or "FALSE":
                return ScalarType.Bool;
            case ".inf" or ".Inf" or ".INF" or "+.inf" or "+.Inf" or "+.INF" or "-.inf" or "-.Inf" or "-.INF"
                or ".nan" or ".NaN" or ".NAN":
                return ScalarType.Float;
        }
        if (IsInt(s)) return ScalarType.Int;
        return IsFloat(s) ? ScalarType.Float : ScalarType.String;
    }

    /// <summary>The numeric value of an int or float scalar of the core schema; null when it is not one.</summary>
    public static double? Number(string s)
    {
        switch (s)
        {
            case ".inf" or ".Inf" or ".INF" or "+.inf" or "+.Inf" or "+.INF": return double.PositiveInfinity;
            case "-.inf" or "-.Inf" or "-.INF": return double.NegativeInfinity;
            case ".nan" or ".NaN" or ".NAN": return double.NaN;
        }
        if (s.StartsWith("0x", StringComparison.Ordinal) && s.Length > 2)
        {
            return long.TryParse(s.AsSpan(2), NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture, out var h) ? h : null;
        }
        if (s.StartsWith("0o", StringComparison.Ordinal) && s.Length > 2)
        {
            long v = 0;
            foreach (var ch in s.AsSpan(2))
            {
                if (ch is < '0' or > '7' || v > long.MaxValue / 8) return null;
                v = (v * 8) + (ch - '0');
            }
            return v;
        }
        if (!IsInt(s) && !IsFloat(s)) return null;
        return double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var d) ? d : null;
    }

    private static bool IsInt(string s)
    {
        if (s.Length > 2 && s[0] == '0' && (s[1] == 'x' || s[1] == 'o'))
        {
            for (var i = 2; i < s.Length; i++)
            {
                var c = s[i];
                var ok = s[1] == 'x' ? char.IsAsciiHexDigit(c) : c is >= '0' and <= '7';
                if (!ok) return false;
            }
            return true;
        }
        var start = s.Length > 0 && (s[0] == '-' || s[0] == '+') ? 1 : 0;
        if (start == s.Length) return false;
        for (var i = start; i < s.Length; i++)
        {
            if (!char.IsAsciiDigit(s[i])) return false;
        }
        return true;
    }

    // [-+]? ( \. [0-9]+ | [0-9]+ ( \. [0-9]* )? ) ( [eE] [-+]? [0-9]+ )?
    private static bool IsFloat(string s)
    {
        var i = 0;
        if (i < s.Length && (s[i] == '-' || s[i] == '+')) i++;
        var intDigits = 0;
        while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; intDigits++; }
        var fracDigits = 0;
        if (i < s.Length && s[i] == '.')
        {
            i++;
            while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; fracDigits++; }
        }
        if (intDigits == 0 && fracDigits == 0) return false;
        if (i < s.Length && (s[i] == 'e' || s[i] == 'E'))
        {
            i++;
            if (i < s.Length && (s[i] == '-' || s[i] == '+')) i++;
            var expDigits = 0;
            while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; expDigits++; }
            if (expDigits == 0) return false;
        }
        return i == s.Length;
    }
}
