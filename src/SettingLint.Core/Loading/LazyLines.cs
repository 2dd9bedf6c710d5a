using System.Collections;
using System.Collections.Immutable;

namespace SettingLint.Core.Loading;

/// <summary>A file's lines, split only when first asked for: most files have no comment anyone reads.</summary>
internal sealed class LazyLines(string text) : IReadOnlyList<string>
{
    private ImmutableArray<string> _lines;

    private ImmutableArray<string> Lines
    {
        get
        {
            if (_lines.IsDefault) ImmutableInterlocked.InterlockedInitialize(ref _lines, Split(text));
            return _lines;
        }
    }

    public int Count => Lines.Length;

    /// <summary>Whether the lines have been split (for tests: a file that nobody reads a comment of is not).</summary>
    internal bool IsSplit => !_lines.IsDefault;

    /// <summary>Whether the text holds any of these strings, found without splitting it into lines.</summary>
    public bool Contains(System.Buffers.SearchValues<string> values) => text.AsSpan().ContainsAny(values);

    public string this[int index] => Lines[index];

    public IEnumerator<string> GetEnumerator() => ((IEnumerable<string>)Lines).GetEnumerator();

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();

    /// <summary>Splits at LF, CRLF or a lone CR, as YAML breaks lines.</summary>
    public static ImmutableArray<string> Split(string text)
    {
        var lines = ImmutableArray.CreateBuilder<string>();
        var start = 0;
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == '\n' || (text[i] == '\r' && (i + 1 == text.Length || text[i + 1] != '\n')))
            {
                var end = text[i] == '\n' && i > start && text[i - 1] == '\r' ? i - 1 : i;
                lines.Add(text[start..end]);
                start = i + 1;
            }
        }
        lines.Add(text[start..]);
        return lines.ToImmutable();
    }
}
