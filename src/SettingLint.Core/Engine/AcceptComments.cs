using System.Collections.Immutable;
using System.Text.RegularExpressions;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Engine;

/// <summary>
/// One in-source acceptance, <c># settinglint-accept SL110 SL201: reason</c>: the rule ids it names, its reason,
/// where it is written, and the lines of the file it covers.
/// </summary>
/// <param name="Span">The comment, from its '#' to the end of the line.</param>
/// <param name="RuleIds">The ids as written (upper-cased), in order; may be empty or hold tokens that are no rule id.</param>
/// <param name="Reason">The text after the colon, trimmed; null when there is no colon or nothing after it.</param>
/// <param name="FirstLine">The first line covered.</param>
/// <param name="LastLine">The last line covered; below <paramref name="FirstLine"/> when the comment stands before nothing.</param>
/// <param name="KeyPath">The key path of the element the comment is on or before; empty when there is none.</param>
public sealed record AcceptComment(SourceSpan Span, ImmutableArray<string> RuleIds, string? Reason, int FirstLine, int LastLine, string KeyPath)
{
    /// <summary>Whether the comment covers a line.</summary>
    public bool Covers(int line) => line >= FirstLine && line <= LastLine;

    /// <summary>The covered lines as a person reads them: "line 12" or "lines 12-18".</summary>
    public string LinesText => FirstLine == LastLine
        ? "line " + FirstLine.ToString(System.Globalization.CultureInfo.InvariantCulture)
        : "lines " + FirstLine.ToString(System.Globalization.CultureInfo.InvariantCulture) + "-" + LastLine.ToString(System.Globalization.CultureInfo.InvariantCulture);
}

/// <summary>
/// Finds the acceptance comments of a loaded file. A comment on a line of its own covers the next line that holds
/// YAML; a trailing comment covers its own line; when that line is the key of a mapping or list (an element such as
/// <c>short_circuit:</c>), the comment covers the whole block.
/// </summary>
public static partial class AcceptComments
{
    /// <summary>The word that starts an acceptance comment, after '#'.</summary>
    public const string Marker = "settinglint-accept";

    // Every file is searched for the marker, in any case: a vectorised search, set up once, does it in a fraction of the time.
    private static readonly System.Buffers.SearchValues<string> MarkerSearch =
        System.Buffers.SearchValues.Create([Marker], StringComparison.OrdinalIgnoreCase);

    /// <summary>The acceptance comments of a file, in line order; empty (and cheap) when no line holds the marker.</summary>
    public static ImmutableArray<AcceptComment> Find(LoadedFile file) => Find(file.Lines, file.Root);

    /// <summary>The acceptance comments of a file's lines, with its tree (when it loaded) to tell comments from text and to find blocks.</summary>
    public static ImmutableArray<AcceptComment> Find(IReadOnlyList<string> lines, YNode? root)
    {
        // Most files hold no acceptance: a search of the whole text tells, without splitting it into lines.
        var marked = lines is LazyLines lazy
            ? lazy.Contains(MarkerSearch)
            : lines.Any(l => l.Contains(Marker, StringComparison.OrdinalIgnoreCase));
        if (!marked) return [];
        var scalars = new List<SourceSpan>();
        var keys = new List<(YEntry Entry, string Path)>();
        if (root is not null) Walk(root, "", scalars, keys);
        var result = ImmutableArray.CreateBuilder<AcceptComment>();
        for (var i = 0; i < lines.Count; i++)
        {
            var line = lines[i];
            if (!line.Contains(Marker, StringComparison.OrdinalIgnoreCase)) continue;
            var lineNo = i + 1;
            var hash = CommentStart(line, lineNo, scalars);
            if (hash < 0) continue;
            // The marker may follow another comment on the same line: "# 50P  # settinglint-accept SL203: ...".
            var marker = MarkerPattern().Match(line, hash);
            if (!marker.Success) continue;
            var (ids, reason) = Parse(line[(marker.Index + marker.Length)..]);
            var ownLine = line.AsSpan(0, hash).IsWhiteSpace();
            var target = ownLine ? NextContentLine(lines, i + 1) : lineNo;
            var (first, last, path) = target < 0 ? (lineNo + 1, lineNo, "") : Block(target, keys);
            result.Add(new AcceptComment(new SourceSpan(lineNo, marker.Index + 1, lineNo, line.Length + 1), ids, reason, first, last, path));
        }
        return result.ToImmutable();
    }

    [GeneratedRegex(@"#[ \t]*" + Marker + @"(?=[\s:]|$)", RegexOptions.IgnoreCase | RegexOptions.CultureInvariant)]
    private static partial Regex MarkerPattern();

    private static (ImmutableArray<string> Ids, string? Reason) Parse(string rest)
    {
        var colon = rest.IndexOf(':', StringComparison.Ordinal);
        var idsPart = colon < 0 ? rest : rest[..colon];
        var reason = colon < 0 ? null : rest[(colon + 1)..].Trim();
        var ids = idsPart.Split([' ', '\t', ','], StringSplitOptions.RemoveEmptyEntries).Select(t => t.ToUpperInvariant()).ToImmutableArray();
        // A reason needs some words, not only punctuation.
        if (reason is not null && !reason.Any(char.IsLetterOrDigit)) reason = null;
        return (ids, reason);
    }

    // A '#' starts a comment at the line's start or after white space, and not inside a quoted or block scalar.
    private static int CommentStart(string line, int lineNo, List<SourceSpan> scalars)
    {
        for (var j = 0; j < line.Length; j++)
        {
            if (line[j] != '#' || (j > 0 && !char.IsWhiteSpace(line[j - 1]))) continue;
            if (InsideScalar(lineNo, j + 1, scalars)) continue;
            return j;
        }
        return -1;
    }

    private static bool InsideScalar(int line, int column, List<SourceSpan> scalars)
    {
        foreach (var s in scalars)
        {
            if (line < s.StartLine || line > s.EndLine) continue;
            var afterStart = line > s.StartLine || column >= s.StartColumn;
            var beforeEnd = line < s.EndLine || column < s.EndColumn;
            if (afterStart && beforeEnd) return true;
        }
        return false;
    }

    // The next line with YAML on it: blank lines and other comments in between are skipped, so acceptances can stack.
    private static int NextContentLine(IReadOnlyList<string> lines, int from)
    {
        for (var k = from; k < lines.Count; k++)
        {
            var t = lines[k].AsSpan().Trim();
            if (t.Length > 0 && t[0] != '#') return k + 1;
        }
        return -1;
    }

    // The outermost key on the target line decides: a mapping or list value makes the block, anything else the line.
    private static (int First, int Last, string Path) Block(int target, List<(YEntry Entry, string Path)> keys)
    {
        foreach (var (entry, path) in keys)
        {
            if (entry.Key.Span.StartLine != target) continue;
            return (target, Math.Max(target, LastLine(entry.Value)), path);
        }
        return (target, target, "");
    }

    // The last line that holds content of a node; a span that ends at column 1 ends on the line before.
    private static int LastLine(YNode node)
    {
        switch (node)
        {
            case YMapping m:
                return m.Entries.Length == 0 ? EndLine(m.Span) : m.Entries.Max(e => Math.Max(EndLine(e.Key.Span), LastLine(e.Value)));
            case YSequence s:
                return s.Items.Length == 0 ? EndLine(s.Span) : s.Items.Max(LastLine);
            default:
                return EndLine(node.Span);
        }
    }

    private static int EndLine(SourceSpan span) =>
        span.EndColumn <= 1 && span.EndLine > span.StartLine ? span.EndLine - 1 : span.EndLine;

    private static void Walk(YNode node, string path, List<SourceSpan> scalars, List<(YEntry, string)> keys)
    {
        switch (node)
        {
            case YScalar s:
                scalars.Add(s.Span);
                break;
            case YMapping m:
                foreach (var e in m.Entries)
                {
                    var p = path.Length == 0 ? e.Key.Value : path + "." + e.Key.Value;
                    scalars.Add(e.Key.Span);
                    keys.Add((e, p));
                    Walk(e.Value, p, scalars, keys);
                }
                break;
            case YSequence q:
                foreach (var item in q.Items) Walk(item, path, scalars, keys);
                break;
        }
    }
}
