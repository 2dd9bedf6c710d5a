using System.Collections.Immutable;
using System.Runtime.InteropServices;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Loading;

/// <summary>
/// A reader of the plain YAML that setting files are written in, for speed: block mappings, one-line flow mappings of
/// plain words, and one-line plain, single- and double-quoted scalars without escapes, in printable ASCII with spaces
/// and line feeds only. It gives exactly the tree, spans and scalar types of the parser's path, and declines (returns
/// null) on anything else: anchors, aliases, tags, lists, block and multi-line scalars, escapes, empty values, tabs,
/// carriage returns, non-ASCII text, directives, document markers, duplicate keys, limits, syntax errors. The loader
/// then takes the parser's path, which makes every finding. Measured (native build, 10,000 generated motors, 2026-12-05,
/// docs/performance.md): `check --no-suggest` took 2.25 x the parse-only floor's CPU through the parser, 1.10 x with this
/// reader (wall 2.68 x and 1.19 x); the parser's path was a third of a full check's CPU (perf).
/// Equal output to the parser's path is tested on every YAML file of the repository and on generated documents
/// (SimpleYamlReaderTests).
/// </summary>
internal sealed class SimpleYamlReader
{
    private readonly string _text;
    private readonly LoadLimits _limits;
    private int _pos;      // start of the current line
    private int _line = 1; // its 1-based number
    private long _nodes;

    private SimpleYamlReader(string text, LoadLimits limits)
    {
        _text = text;
        _limits = limits;
    }

    /// <summary>The document's root mapping, or null when the text is outside what this reader takes.</summary>
    public static YMapping? TryRead(string text, LoadLimits limits)
    {
        // Printable ASCII and line feeds only: no tab, no carriage return, no character whose column the parser may count otherwise.
        var rest = text.AsSpan();
        while (true)
        {
            var i = rest.IndexOfAnyExceptInRange(' ', '~');
            if (i < 0) break;
            if (rest[i] != '\n') return null;
            rest = rest[(i + 1)..];
        }
        var reader = new SimpleYamlReader(text, limits);
        if (!reader.NextContent(out var indent) || indent != 0) return null;
        var root = reader.Mapping(0, 1);
        // Anything left that is not a blank or comment line (a line less indented cannot be, at indent 0) was not read.
        return root is not null && !reader.NextContent(out _) ? root : null;
    }

    /// <summary>Moves to the next line with content (skipping blank and comment lines); false at the end.</summary>
    private bool NextContent(out int indent)
    {
        while (_pos < _text.Length)
        {
            var i = _pos;
            while (i < _text.Length && _text[i] == ' ') i++;
            if (i < _text.Length && _text[i] != '\n' && _text[i] != '#')
            {
                indent = i - _pos;
                return true;
            }
            NextLine();
        }
        indent = 0;
        return false;
    }

    private void NextLine()
    {
        var nl = _text.IndexOf('\n', _pos);
        _pos = nl < 0 ? _text.Length : nl + 1;
        _line++;
    }

    private int LineEnd
    {
        get
        {
            var nl = _text.IndexOf('\n', _pos);
            return nl < 0 ? _text.Length : nl;
        }
    }

    private static bool KeyStart(char c) => char.IsAsciiLetterOrDigit(c) || c == '_';

    private static bool KeyChar(char c) => char.IsAsciiLetterOrDigit(c) || c is '_' or '-' or '.' or '/';

    /// <summary>A block mapping whose keys stand at <paramref name="indent"/>, from the current line (which has content there).</summary>
    private YMapping? Mapping(int indent, int depth)
    {
        if (depth >= _limits.MaxDepth - 1 || ++_nodes > _limits.MaxNodes) return null;
        var entries = new List<YEntry>(8);
        while (NextContent(out var at) && at >= indent)
        {
            if (at > indent) return null;
            var end = LineEnd;
            var k = _pos + indent;
            var keyStart = k;
            if (!KeyStart(_text[k])) return null;
            while (k < end && KeyChar(_text[k])) k++;
            // YAML 1.2.2 7.4.2: an implicit key is at most 1024 characters; long keys are left to the parser.
            if (k >= end || _text[k] != ':' || (k + 1 < end && _text[k + 1] != ' ') || k - keyStart > 1000) return null;
            var key = new YScalar(_text[keyStart..k], ScalarStyle.Plain, Span(keyStart, k));
            foreach (var e in entries)
            {
                if (e.Key.Value == key.Value) return null;
            }
            if (++_nodes > _limits.MaxNodes) return null;
            var v = k + 1;
            while (v < end && _text[v] == ' ') v++;
            YNode? value;
            if (v == end || _text[v] == '#')
            {
                // Nothing after the key: a mapping on the lines below, more indented; an empty value is the parser's.
                NextLine();
                if (!NextContent(out var inner) || inner <= indent) return null;
                value = Mapping(inner, depth + 1);
            }
            else
            {
                value = Inline(v, end);
                NextLine();
            }
            if (value is null) return null;
            entries.Add(new YEntry(key, value));
        }
        var first = entries[0].Key.Span;
        var last = entries[^1].Value.Span;
        return new YMapping(ImmutableCollectionsMarshal.AsImmutableArray(entries.ToArray()),
            new SourceSpan(first.StartLine, first.StartColumn, last.EndLine, last.EndColumn));
    }

    /// <summary>A value that starts at <paramref name="v"/> and ends on its line: a flow mapping or a scalar.</summary>
    private YNode? Inline(int v, int end)
    {
        var c = _text[v];
        int close;
        switch (c)
        {
            case '{':
                return Flow(v, end);
            case '"' or '\'':
                close = _text.IndexOf(c, v + 1, end - v - 1);
                if (close < 0) return null;
                var inner = _text.AsSpan(v + 1, close - v - 1);
                if (c == '"' && inner.Contains('\\')) return null;
                if (!Trailer(close + 1, end)) return null;
                if (++_nodes > _limits.MaxNodes) return null;
                return new YScalar(inner.ToString(), ScalarStyle.Quoted, Span(v, close + 1));
        }
        if (!PlainStart(v, end)) return null;
        // The value runs to the end of the line or to a comment (a '#' after a space); any other '#', and any ':', is the parser's.
        var stop = end;
        for (var i = v; i < end; i++)
        {
            var ch = _text[i];
            if (ch == '#')
            {
                if (_text[i - 1] != ' ') return null;
                stop = i;
                break;
            }
            if (ch is ':' or '[' or ']' or '{' or '}') return null;
        }
        while (_text[stop - 1] == ' ') stop--;
        if (++_nodes > _limits.MaxNodes) return null;
        return new YScalar(_text[v..stop], ScalarStyle.Plain, Span(v, stop));
    }

    /// <summary>Only spaces, then the end of the line or a comment, after a value that ended before <paramref name="i"/>.</summary>
    private bool Trailer(int i, int end)
    {
        if (i == end) return true;
        if (_text[i] != ' ') return false;
        while (i < end && _text[i] == ' ') i++;
        return i == end || _text[i] == '#';
    }

    // YAML 1.2.2 7.3.3 (ns-plain-first): no indicator starts a plain scalar, but for '-' before a digit or a point ("-5", "-.5").
    private bool PlainStart(int v, int end)
    {
        var c = _text[v];
        if (c == '-') return v + 1 < end && (char.IsAsciiDigit(_text[v + 1]) || _text[v + 1] == '.');
        return c is not ('?' or ':' or ',' or '[' or ']' or '{' or '}' or '#' or '&' or '*' or '!' or '|' or '>' or '\'' or '"' or '%' or '@' or '`');
    }

    /// <summary>A flow mapping on one line, of plain keys and plain values: "{ primary: 200 A, secondary: 5 A }".</summary>
    private YMapping? Flow(int open, int end)
    {
        if (++_nodes > _limits.MaxNodes) return null;
        var entries = new List<YEntry>(4);
        var i = open + 1;
        while (true)
        {
            while (i < end && _text[i] == ' ') i++;
            if (i >= end || !KeyStart(_text[i])) return null;
            var keyStart = i;
            while (i < end && KeyChar(_text[i])) i++;
            if (i + 1 >= end || _text[i] != ':' || _text[i + 1] != ' ' || i - keyStart > 1000) return null;
            var key = new YScalar(_text[keyStart..i], ScalarStyle.Plain, Span(keyStart, i));
            foreach (var e in entries)
            {
                if (e.Key.Value == key.Value) return null;
            }
            i++;
            while (i < end && _text[i] == ' ') i++;
            if (i >= end || !PlainStart(i, end)) return null;
            var valueStart = i;
            while (i < end && _text[i] is not (',' or '}'))
            {
                if (_text[i] is ':' or '#' or '[' or ']' or '{' or '\'' or '"') return null;
                i++;
            }
            if (i >= end) return null;
            var stop = i;
            while (_text[stop - 1] == ' ') stop--;
            var value = new YScalar(_text[valueStart..stop], ScalarStyle.Plain, Span(valueStart, stop));
            _nodes += 2;
            if (_nodes > _limits.MaxNodes) return null;
            entries.Add(new YEntry(key, value));
            if (_text[i] == '}') break;
            i++;
        }
        if (!Trailer(i + 1, end)) return null;
        // As the parser's path spans a flow collection: from its opening bracket to just after its closing one.
        var line = _line;
        return new YMapping(ImmutableCollectionsMarshal.AsImmutableArray(entries.ToArray()),
            new SourceSpan(line, open - _pos + 1, line, i - _pos + 2));
    }

    /// <summary>The span of characters [start, end) of the current line, 1-based.</summary>
    private SourceSpan Span(int start, int end) => new(_line, start - _pos + 1, _line, end - _pos + 1);
}
