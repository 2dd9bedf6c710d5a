using System.Collections.Immutable;
using System.Globalization;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Rules;

/// <summary>An expression of the rule language, as parsed; Offset is its position in the source text.</summary>
public abstract record Expr(int Offset);

internal sealed record NumberLit(int Offset, double Value, Dim Dim) : Expr(Offset)
{
    /// <summary>Written in percent.</summary>
    public bool Percent { get; init; }
}

internal sealed record TextLit(int Offset, string Value) : Expr(Offset);

internal sealed record BoolLit(int Offset, bool Value) : Expr(Offset);

/// <summary>A dotted path (motor.full_load_current, bus.x_over_r, param.margin) or a bare let name.</summary>
internal sealed record PathRef(int Offset, string Path) : Expr(Offset);

internal sealed record Unary(int Offset, string Op, Expr Operand) : Expr(Offset);

internal sealed record Binary(int Offset, string Op, Expr Left, Expr Right) : Expr(Offset);

internal sealed record Call(int Offset, string Name, ImmutableArray<Expr> Args) : Expr(Offset);

/// <summary>A syntax or type error in a rule expression, at an offset of its text.</summary>
internal sealed class RuleSyntaxException(string message, int offset) : Exception(message)
{
    public int Offset { get; } = offset;
}

/// <summary>Parses the rule language: a small Pratt parser with a fixed depth bound.</summary>
internal sealed class ExpressionParser
{
    /// <summary>The deepest nesting an expression may have.</summary>
    public const int MaxDepth = 32;

    private static readonly string[] LiteralUnits = ["kA", "A", "kV", "V", "ms", "s", "min", "h", "hp", "kW", "MW", "ohm", "Hz", "%"];

    private readonly string _text;
    private int _pos;
    private int _depth;

    private ExpressionParser(string text) => _text = text;

    /// <summary>Parses a whole expression; throws <see cref="RuleSyntaxException"/> with the offset of the problem.</summary>
    public static Expr Parse(string text)
    {
        var p = new ExpressionParser(text);
        var e = p.ParseOr();
        p.SkipSpace();
        if (p._pos < text.Length) throw new RuleSyntaxException($"Unexpected '{text[p._pos..Math.Min(text.Length, p._pos + 12)]}' after a complete expression.", p._pos);
        return e;
    }

    private Expr ParseOr()
    {
        var left = ParseAnd();
        while (TryWord("or")) left = new Binary(left.Offset, "or", left, ParseAnd());
        return left;
    }

    private Expr ParseAnd()
    {
        var left = ParseNot();
        while (TryWord("and")) left = new Binary(left.Offset, "and", left, ParseNot());
        return left;
    }

    private Expr ParseNot()
    {
        SkipSpace();
        var at = _pos;
        if (TryWord("not")) return new Unary(at, "not", Nested(ParseNot));
        return ParseComparison();
    }

    private Expr ParseComparison()
    {
        var left = ParseAdditive();
        SkipSpace();
        foreach (var op in (string[])["<=", ">=", "==", "!=", "<", ">"])
        {
            if (string.CompareOrdinal(_text, _pos, op, 0, op.Length) == 0)
            {
                _pos += op.Length;
                var right = ParseAdditive();
                return new Binary(left.Offset, op, left, right);
            }
        }
        return left;
    }

    private Expr ParseAdditive()
    {
        var left = ParseMultiplicative();
        while (true)
        {
            SkipSpace();
            if (_pos < _text.Length && (_text[_pos] == '+' || _text[_pos] == '-'))
            {
                var op = _text[_pos++].ToString();
                left = new Binary(left.Offset, op, left, ParseMultiplicative());
            }
            else
            {
                return left;
            }
        }
    }

    private Expr ParseMultiplicative()
    {
        var left = ParseUnary();
        while (true)
        {
            SkipSpace();
            if (_pos < _text.Length && (_text[_pos] == '*' || _text[_pos] == '/'))
            {
                var op = _text[_pos++].ToString();
                left = new Binary(left.Offset, op, left, ParseUnary());
            }
            else
            {
                return left;
            }
        }
    }

    private Expr ParseUnary()
    {
        SkipSpace();
        if (_pos < _text.Length && _text[_pos] == '-')
        {
            var at = _pos++;
            return new Unary(at, "-", Nested(ParseUnary));
        }
        return ParsePrimary();
    }

    private Expr Nested(Func<Expr> parse)
    {
        if (++_depth > MaxDepth) throw new RuleSyntaxException($"The expression nests deeper than {MaxDepth} levels.", _pos);
        try
        {
            return parse();
        }
        finally
        {
            _depth--;
        }
    }

    private Expr ParsePrimary()
    {
        SkipSpace();
        if (_pos >= _text.Length) throw new RuleSyntaxException("The expression ends where a value is expected.", _pos);
        var c = _text[_pos];
        var at = _pos;
        if (c == '(')
        {
            _pos++;
            var inner = Nested(ParseOr);
            Expect(')');
            return inner;
        }
        if (c == '\'')
        {
            var end = _text.IndexOf('\'', _pos + 1);
            if (end < 0) throw new RuleSyntaxException("A text in quotes is not closed.", _pos);
            _pos = end + 1;
            return new TextLit(at, _text[(at + 1)..end]);
        }
        if (char.IsAsciiDigit(c) || c == '.')
        {
            return ParseNumber();
        }
        if (char.IsAsciiLetter(c) || c == '_')
        {
            var start = _pos;
            while (_pos < _text.Length && (char.IsAsciiLetterOrDigit(_text[_pos]) || _text[_pos] is '_' or '.')) _pos++;
            var word = _text[start.._pos];
            if (word.EndsWith('.')) throw new RuleSyntaxException($"'{word}' ends with a dot.", start);
            if (word == "true") return new BoolLit(at, true);
            if (word == "false") return new BoolLit(at, false);
            SkipSpace();
            if (_pos < _text.Length && _text[_pos] == '(')
            {
                _pos++;
                var args = ImmutableArray.CreateBuilder<Expr>();
                SkipSpace();
                if (_pos < _text.Length && _text[_pos] == ')')
                {
                    _pos++;
                    return new Call(at, word, args.ToImmutable());
                }
                while (true)
                {
                    args.Add(Nested(ParseOr));
                    SkipSpace();
                    if (_pos < _text.Length && _text[_pos] == ',') { _pos++; continue; }
                    Expect(')');
                    return new Call(at, word, args.ToImmutable());
                }
            }
            return new PathRef(at, word);
        }
        // Rule files are YAML, where an expression often sits in double quotes already: text inside it takes single ones.
        if (c == '"') throw new RuleSyntaxException("Unexpected '\"': use single quotes for text in an expression, as in starter.type == 'soft-starter'.", _pos);
        throw new RuleSyntaxException($"Unexpected '{c}'.", _pos);
    }

    private NumberLit ParseNumber()
    {
        var start = _pos;
        while (_pos < _text.Length && (char.IsAsciiDigit(_text[_pos]) || _text[_pos] == '.')) _pos++;
        if (_pos < _text.Length && (_text[_pos] == 'e' || _text[_pos] == 'E') && _pos + 1 < _text.Length
            && (char.IsAsciiDigit(_text[_pos + 1]) || ((_text[_pos + 1] == '-' || _text[_pos + 1] == '+') && _pos + 2 < _text.Length && char.IsAsciiDigit(_text[_pos + 2]))))
        {
            _pos += 2;
            while (_pos < _text.Length && char.IsAsciiDigit(_text[_pos])) _pos++;
        }
        var numberText = _text[start.._pos];
        if (!double.TryParse(numberText, NumberStyles.Float, CultureInfo.InvariantCulture, out var value))
        {
            throw new RuleSyntaxException($"'{numberText}' is not a number.", start);
        }
        // An optional unit after white space: "10 s", "20 %".
        var save = _pos;
        SkipSpace();
        foreach (var u in LiteralUnits)
        {
            if (string.CompareOrdinal(_text, _pos, u, 0, u.Length) == 0)
            {
                var after = _pos + u.Length;
                var boundary = after >= _text.Length || !(char.IsAsciiLetterOrDigit(_text[after]) || _text[after] is '_' or '(' or '.');
                if (!boundary) continue;
                var unit = Unit.All[u];
                _pos = after;
                return new NumberLit(start, value * unit.Factor, Dim.Of(unit.Dimension)) { Percent = u == "%" };
            }
        }
        _pos = save;
        return new NumberLit(start, value, Dim.None);
    }

    private void Expect(char c)
    {
        SkipSpace();
        if (_pos >= _text.Length || _text[_pos] != c) throw new RuleSyntaxException($"Expected '{c}'.", _pos);
        _pos++;
    }

    private bool TryWord(string word)
    {
        SkipSpace();
        if (string.CompareOrdinal(_text, _pos, word, 0, word.Length) != 0) return false;
        var after = _pos + word.Length;
        if (after < _text.Length && (char.IsAsciiLetterOrDigit(_text[after]) || _text[after] == '_')) return false;
        _pos = after;
        return true;
    }

    private void SkipSpace()
    {
        while (_pos < _text.Length && char.IsWhiteSpace(_text[_pos])) _pos++;
    }
}
