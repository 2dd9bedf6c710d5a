using SettingLint.Core.Documents;

namespace SettingLint.Core.Fixes;

/// <summary>Finds the characters of a value's number in a file's text, so that a fix replaces exactly those.</summary>
internal static class ValueText
{
    /// <summary>The offset of a 1-based line and UTF-16 column in a text, or -1 when the text is shorter.</summary>
    public static int Offset(string text, int line, int column)
    {
        ArgumentNullException.ThrowIfNull(text);
        var offset = 0;
        for (var l = 1; l < line; l++)
        {
            var next = text.IndexOf('\n', offset);
            if (next < 0) return -1;
            offset = next + 1;
        }
        var at = offset + column - 1;
        return at <= text.Length ? at : -1;
    }

    /// <summary>
    /// The number at the start of the scalar that a span begins at (after an opening quote), its offset and length,
    /// and the unit written after it; null when the scalar does not start with a number.
    /// </summary>
    public static (int Start, int Length, string Unit)? NumberAt(string text, SourceSpan span)
    {
        var start = Offset(text, span.StartLine, span.StartColumn);
        if (start < 0 || start >= text.Length) return null;
        var i = start;
        var quote = text[i] is '"' or '\'' ? text[i] : '\0';
        if (quote != '\0') i++;
        var numberStart = i;
        if (i < text.Length && text[i] is '-' or '+') i++;
        var digits = 0;
        while (i < text.Length && (char.IsAsciiDigit(text[i]) || text[i] == '.'))
        {
            if (text[i] != '.') digits++;
            i++;
        }
        if (digits == 0) return null;
        if (i < text.Length && text[i] is 'e' or 'E')
        {
            var j = i + 1;
            if (j < text.Length && text[j] is '-' or '+') j++;
            if (j < text.Length && char.IsAsciiDigit(text[j]))
            {
                while (j < text.Length && char.IsAsciiDigit(text[j])) j++;
                i = j;
            }
        }
        var numberEnd = i;
        // The unit runs to the closing quote, a comment, a flow separator or the end of the line.
        var unitEnd = numberEnd;
        while (unitEnd < text.Length && text[unitEnd] is not ('\n' or '\r' or '#' or ',' or '}' or ']') && text[unitEnd] != quote) unitEnd++;
        return (numberStart, numberEnd - numberStart, text[numberEnd..unitEnd].Trim());
    }
}
