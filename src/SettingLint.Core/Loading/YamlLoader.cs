using System.Collections.Immutable;
using System.Runtime.InteropServices;
using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using YamlDotNet.Core;
using YamlDotNet.Core.Events;
using YScalarStyle = YamlDotNet.Core.ScalarStyle;

namespace SettingLint.Core.Loading;

/// <summary>
/// Turns bytes into a tree of <see cref="YNode"/> with exact spans, from the parser's events, so that
/// every duplicate key is found with both positions and every limit is enforced before it can hurt.
/// </summary>
public static class YamlLoader
{
    private static readonly UTF8Encoding StrictUtf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    /// <summary>
    /// Parses a tiny document once, on the thread pool: the parser's first document start builds its default tag
    /// directives, which compile a regular expression (some tens of milliseconds). Started early, that happens while
    /// the command line is parsed instead of in front of the first file.
    /// </summary>
    public static void Warm() => _ = Task.Run(() => Load("a: 1\n"u8.ToArray(), "", "", LoadLimits.Default));

    /// <summary>Loads a file from disk; the size limit is checked before anything is read.</summary>
    public static LoadedFile LoadFile(string path, string relativePath, LoadLimits limits)
    {
        // One open: the size comes from the open file, so that no second call to the file system asks for it by name.
        using var handle = File.OpenHandle(path, FileMode.Open, FileAccess.Read, FileShare.Read);
        var length = RandomAccess.GetLength(handle);
        if (length > limits.MaxFileBytes) return TooLarge(path, relativePath, length, limits);
        // A size of zero may be a special file that has no size: read it to its end, and let Load check the limit.
        if (length == 0) return Load(File.ReadAllBytes(path), path, relativePath, limits);
        var bytes = new byte[length];
        var read = 0;
        while (read < bytes.Length)
        {
            var n = RandomAccess.Read(handle, bytes.AsSpan(read), read);
            if (n == 0) break;
            read += n;
        }
        // A file that shrank while it was read is taken as it was read.
        return Load(read == bytes.Length ? bytes : bytes[..read], path, relativePath, limits);
    }

    /// <summary>Loads a file's bytes.</summary>
    public static LoadedFile Load(byte[] bytes, string path, string relativePath, LoadLimits limits) => Load(bytes, path, relativePath, limits, simpleReader: true);

    /// <summary>Loads a file's bytes; without <paramref name="simpleReader"/> only through the parser (for the tests that compare the two).</summary>
    internal static LoadedFile Load(byte[] bytes, string path, string relativePath, LoadLimits limits, bool simpleReader)
    {
        if (bytes.LongLength > limits.MaxFileBytes) return TooLarge(path, relativePath, bytes.LongLength, limits);
        var findings = new FindingBuilder(relativePath);
        var text = Decode(bytes, findings);
        if (text is null || !Printable(text, findings)) return new LoadedFile(path, relativePath, null, findings.Findings, []);
        var lines = new LazyLines(text);
        // Most setting files are plain block mappings that the simple reader takes; anything else goes through the parser.
        var root = (simpleReader ? SimpleYamlReader.TryRead(text, limits) : null) ?? new TreeBuilder(findings, limits).Build(text);
        return new LoadedFile(path, relativePath, root, findings.Findings, lines);
    }

    /// <summary>The SL008 result of a file over the size limit, whether its size came from the disk or its bytes.</summary>
    private static LoadedFile TooLarge(string path, string relativePath, long size, LoadLimits limits)
    {
        var findings = new FindingBuilder(relativePath);
        findings.Add(EngineMessages.FileBytesOverLimit, SourceSpan.FileStart, "",
            ("size", Num(size, "B")), ("limit", Num(limits.MaxFileBytes, "B")));
        return new LoadedFile(path, relativePath, null, findings.Findings, []);
    }

    private static FindingValue Num(long value, string unit) =>
        new(value.ToString(System.Globalization.CultureInfo.InvariantCulture), value, unit);

    private static string? Decode(byte[] bytes, FindingBuilder findings)
    {
        var offset = 0;
        if (bytes.Length >= 3 && bytes[0] == 0xEF && bytes[1] == 0xBB && bytes[2] == 0xBF) offset = 3;
        else if (bytes.Length >= 2 && ((bytes[0] == 0xFE && bytes[1] == 0xFF) || (bytes[0] == 0xFF && bytes[1] == 0xFE)))
        {
            findings.Add(EngineMessages.FileIsUtf16, SourceSpan.FileStart, "");
            return null;
        }
        try
        {
            return StrictUtf8.GetString(bytes, offset, bytes.Length - offset);
        }
        catch (DecoderFallbackException ex)
        {
            var bad = offset + Math.Max(0, ex.Index);
            var bytePos = FirstInvalidByte(bytes, offset);
            if (bytePos >= 0) bad = bytePos;
            var (line, column) = PositionOfByte(bytes, offset, bad);
            findings.Add(EngineMessages.NotValidUtf8, SourceSpan.At(line, column), "",
                ("offset", Num(bad, "B")), ("value", bytes[bad].ToString("X2", System.Globalization.CultureInfo.InvariantCulture)),
                ("line", Num(line, "")), ("column", Num(column, "")));
            return null;
        }
    }

    // The runtime's own range search (ready at start, unlike a search set made for this), stepping over line breaks and tabs.
    private static bool PrintableAsciiOnly(string text)
    {
        var rest = text.AsSpan();
        while (true)
        {
            var i = rest.IndexOfAnyExceptInRange(' ', '~');
            if (i < 0) return true;
            if (rest[i] is not ('\n' or '\r' or '\t')) return false;
            rest = rest[(i + 1)..];
        }
    }

    // YAML 1.2.2 spec 5.1 (c-printable): the parser would take a NUL for the end of the stream and drop the rest silently.
    // NEL, LS and PS are printable in 1.2 (5.4) but the parser breaks lines at them as YAML 1.1 did: refused as well.
    private static bool Printable(string text, FindingBuilder findings)
    {
        // Most files are printable ASCII with line breaks and tabs: a vectorised search from one line break to the next tells.
        if (PrintableAsciiOnly(text)) return true;
        var line = 1;
        var lineStart = 0;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (c == '\n' || (c == '\r' && (i + 1 == text.Length || text[i + 1] != '\n'))) { line++; lineStart = i + 1; continue; }
            // Strict UTF-8 decoding leaves only paired surrogates (characters above U+FFFF), inside this range.
            var lineBreak11 = c is '\u0085' or '\u2028' or '\u2029';
            if (!lineBreak11 && c is '\t' or '\r' or (>= ' ' and <= '~') or (>= '\u00A0' and <= '\uFFFD')) continue;
            var code = ((int)c).ToString("X4", System.Globalization.CultureInfo.InvariantCulture);
            findings.Add(lineBreak11 ? EngineMessages.LineBreakOfYaml11 : EngineMessages.ControlCharacter, SourceSpan.At(line, i - lineStart + 1), "",
                ("code", code), ("line", Num(line, "")), ("column", Num(i - lineStart + 1, "")));
            return false;
        }
        return true;
    }

    // The decoder's index is not always the first bad byte; find it by walking the UTF-8 structure.
    private static int FirstInvalidByte(byte[] b, int start)
    {
        var i = start;
        while (i < b.Length)
        {
            var c = b[i];
            int n;
            if (c < 0x80) { i++; continue; }
            if (c is >= 0xC2 and <= 0xDF) n = 1;
            else if (c is >= 0xE0 and <= 0xEF) n = 2;
            else if (c is >= 0xF0 and <= 0xF4) n = 3;
            else return i;
            for (var k = 1; k <= n; k++)
            {
                if (i + k >= b.Length || (b[i + k] & 0xC0) != 0x80) return i;
            }
            // Overlong, surrogate and out-of-range forms.
            if (c == 0xE0 && b[i + 1] < 0xA0) return i;
            if (c == 0xED && b[i + 1] > 0x9F) return i;
            if (c == 0xF0 && b[i + 1] < 0x90) return i;
            if (c == 0xF4 && b[i + 1] > 0x8F) return i;
            i += n + 1;
        }
        return -1;
    }

    private static (int Line, int Column) PositionOfByte(byte[] bytes, int start, int target)
    {
        var line = 1;
        var lineStart = start;
        for (var i = start; i < target && i < bytes.Length; i++)
        {
            var lineBreak = bytes[i] == (byte)'\n' || (bytes[i] == (byte)'\r' && (i + 1 >= bytes.Length || bytes[i + 1] != (byte)'\n'));
            if (lineBreak) { line++; lineStart = i + 1; }
        }
        // Columns count UTF-16 code units of the valid text before the bad byte.
        var prefix = Encoding.UTF8.GetString(bytes, lineStart, Math.Max(0, target - lineStart));
        return (line, prefix.Length + 1);
    }

    // YAML 1.2.2 spec 5.4: CR LF, LF and a lone CR each end a line; the parser counts lines so, and so must we.
    /// <summary>Builds the tree from parser events with an explicit stack, enforcing every limit as it goes.</summary>
    private sealed class TreeBuilder(FindingBuilder findings, LoadLimits limits)
    {
        // The entries and items of every open collection, each collection's on top of its parent's: a collection takes
        // its own off the top when it ends (its children have ended before it), into an array of its exact size.
        private readonly List<YEntry> _openEntries = new(64);
        private readonly List<YNode> _openItems = new(16);

        private sealed class Frame(List<YEntry> entries, List<YNode> items)
        {
            public required bool IsMapping;
            public required Mark Start;
            public bool Flow;
            public string? Anchor;
            // Most mappings are small enough that a scan of their keys finds a duplicate sooner than a dictionary
            // would be built: the dictionary is made only past this many keys.
            private const int ScanLimit = 16;
            private readonly int _entriesStart = entries.Count;
            private readonly int _itemsStart = items.Count;
            private Dictionary<string, YScalar>? _keys;
            public YScalar? PendingKey;

            private int EntryCount => entries.Count - _entriesStart;

            public void AddItem(YNode node) => items.Add(node);

            public void AddEntry(YEntry entry) => entries.Add(entry);

            public ImmutableArray<YEntry> TakeEntries() => Take(entries, _entriesStart);

            public ImmutableArray<YNode> TakeItems() => Take(items, _itemsStart);

            private static ImmutableArray<T> Take<T>(List<T> open, int start)
            {
                var n = open.Count - start;
                if (n == 0) return [];
                var own = new T[n];
                open.CopyTo(start, own, 0, n);
                open.RemoveRange(start, n);
                return ImmutableCollectionsMarshal.AsImmutableArray(own);
            }

            /// <summary>The first key of this mapping with the same text, when there is one.</summary>
            public YScalar? FindKey(string key)
            {
                if (_keys is not null) return _keys.GetValueOrDefault(key);
                for (var i = _entriesStart; i < entries.Count; i++)
                {
                    if (entries[i].Key.Value == key) return entries[i].Key;
                }
                return null;
            }

            /// <summary>Records a key whose value is to come; past the scan limit the keys move into a dictionary.</summary>
            public void AddKey(YScalar key)
            {
                if (_keys is null && EntryCount >= ScanLimit)
                {
                    _keys = new Dictionary<string, YScalar>(EntryCount * 2, StringComparer.Ordinal);
                    for (var i = _entriesStart; i < entries.Count; i++) _keys[entries[i].Key.Value] = entries[i].Key;
                }
                _keys?.Add(key.Value, key);
            }
            public bool SkipNextValue;
            public bool ExpectKey = true;
            public long Size = 1;
            public int Height;
            public SourceSpan LastEnd;
        }

        private readonly Stack<Frame> _stack = new();
        private readonly Dictionary<string, (YNode Node, long Size, int Height)> _anchors = new(StringComparer.Ordinal);
        private readonly HashSet<string> _openAnchors = new(StringComparer.Ordinal);
        private long _nodes;
        private long _expanded;
        private Mark _lastMark = Mark.Empty;

        public YNode? Build(string text)
        {
            YNode? root = null;
            var documents = 0;
            try
            {
                var parser = new Parser(new Scanner(new StringReader(text), skipComments: true));
                while (parser.MoveNext())
                {
                    var ev = parser.Current!;
                    _lastMark = ev.Start;
                    switch (ev)
                    {
                        case DocumentStart:
                            documents++;
                            if (documents == 2)
                            {
                                findings.Add(EngineMessages.SecondDocumentIgnored, Span(ev.Start, ev.End), "");
                                // The rest is not read into the tree, but it must still parse: a broken file is never passed silently.
                                return DrainRest(parser) ? root : null;
                            }
                            break;
                        case MappingStart ms:
                            if (!Open(true, ms.Start, ms.Anchor.IsEmpty ? null : ms.Anchor.Value, ms.Style == MappingStyle.Flow)) return null;
                            break;
                        case SequenceStart ss:
                            if (!Open(false, ss.Start, ss.Anchor.IsEmpty ? null : ss.Anchor.Value, ss.Style == SequenceStyle.Flow)) return null;
                            break;
                        case MappingEnd or SequenceEnd:
                        {
                            var f = _stack.Pop();
                            // A flow collection ends after its closing bracket (the end event's start is the bracket);
                            // a block one with its last child (its end event stands at the next token).
                            var end = f.Flow ? SourceSpan.At((int)ev.Start.Line, (int)ev.Start.Column + 1)
                                : f.LastEnd == default ? Span(f.Start, ev.End) : f.LastEnd;
                            var span = new SourceSpan((int)f.Start.Line, (int)f.Start.Column, end.EndLine, end.EndColumn);
                            YNode node = f.IsMapping ? new YMapping(f.TakeEntries(), span) : new YSequence(f.TakeItems(), span);
                            if (f.Anchor is not null)
                            {
                                _openAnchors.Remove(f.Anchor);
                                _anchors[f.Anchor] = (node, f.Size, f.Height);
                            }
                            if (!Add(node, f.Size, f.Height + 1, ev)) return null;
                            if (_stack.Count == 0) root = node;
                            break;
                        }
                        case Scalar sc:
                        {
                            _nodes++;
                            if (!CheckNodes(ev)) return null;
                            var style = sc.Style switch
                            {
                                YScalarStyle.Plain or YScalarStyle.Any => Documents.ScalarStyle.Plain,
                                YScalarStyle.Literal or YScalarStyle.Folded => Documents.ScalarStyle.Block,
                                _ => Documents.ScalarStyle.Quoted,
                            };
                            var stringTag = !sc.Tag.IsEmpty && sc.Tag.Value is "tag:yaml.org,2002:str" or "!";
                            var node = new YScalar(sc.Value, style, Span(sc.Start, sc.End), stringTag);
                            if (!sc.Anchor.IsEmpty) _anchors[sc.Anchor.Value] = (node, 1, 0);
                            if (!Add(node, 1, 1, ev)) return null;
                            if (_stack.Count == 0) root = node;
                            break;
                        }
                        case AnchorAlias al:
                        {
                            var name = al.Value.Value;
                            if (_openAnchors.Contains(name))
                            {
                                findings.Add(EngineMessages.AliasRefersNodeContains, Span(al.Start, al.End), "", ("alias", name));
                                return null;
                            }
                            if (!_anchors.TryGetValue(name, out var target))
                            {
                                findings.Add(EngineMessages.AliasNamesAnchorDefined, Span(al.Start, al.End), "", ("alias", name));
                                return null;
                            }
                            _expanded = Sat(_expanded + target.Size);
                            if (_expanded > limits.MaxAliasExpansion)
                            {
                                findings.Add(EngineMessages.AliasesExpandMoreThan, Span(al.Start, al.End), "",
                                    ("limit", Num(limits.MaxAliasExpansion, "")));
                                return null;
                            }
                            if (!Add(target.Node, target.Size, target.Height + 1, ev)) return null;
                            if (_stack.Count == 0) root = target.Node;
                            break;
                        }
                    }
                }
            }
            catch (YamlException ex)
            {
                var mark = ex.Start.Line > 0 ? ex.Start : _lastMark;
                findings.Add(EngineMessages.YamlSyntaxError, SourceSpan.At(Math.Max(1, (int)mark.Line), Math.Max(1, (int)mark.Column)), "", ("detail", Detail(ex)));
                return null;
            }
            catch (Exception ex) when (ex is InvalidOperationException or ArgumentException or FormatException)
            {
                // Some parser faults carry no mark; the last event's position is the best there is.
                findings.Add(EngineMessages.YamlSyntaxError, SourceSpan.At(Math.Max(1, (int)_lastMark.Line), Math.Max(1, (int)_lastMark.Column)), "", ("detail", ex.Message));
                return null;
            }
            return root;
        }

        /// <summary>Parses the remaining events without keeping them, within the node limit; false after a syntax finding.</summary>
        private bool DrainRest(Parser parser)
        {
            var depth = 0;
            while (parser.MoveNext())
            {
                var ev = parser.Current!;
                _lastMark = ev.Start;
                if (ev is MappingStart or SequenceStart) depth++;
                else if (ev is MappingEnd or SequenceEnd) depth--;
                if (ev is Scalar or MappingStart or SequenceStart or AnchorAlias) _nodes++;
                if (!CheckNodes(ev)) return false;
                if (depth > limits.MaxDepth)
                {
                    findings.Add(EngineMessages.NestingDeeperThanLevels, Span(ev.Start, ev.End), "", ("limit", Num(limits.MaxDepth, "")));
                    return false;
                }
            }
            return true;
        }

        private static string Detail(YamlException ex)
        {
            var m = ex.Message;
            // YamlDotNet prefixes its marks: "(Line: 3, Col: 1, Idx: 20) - (Line: ...): message".
            var idx = m.LastIndexOf("): ", StringComparison.Ordinal);
            return idx >= 0 ? m[(idx + 3)..] : m;
        }

        private static long Sat(long v) => v < 0 ? long.MaxValue / 2 : Math.Min(v, long.MaxValue / 2);

        private bool CheckNodes(ParsingEvent ev)
        {
            if (_nodes <= limits.MaxNodes) return true;
            findings.Add(EngineMessages.TooManyNodes, Span(ev.Start, ev.End), "", ("limit", Num(limits.MaxNodes, "")));
            return false;
        }

        private bool Open(bool mapping, Mark start, string? anchor, bool flow)
        {
            _nodes++;
            if (_nodes > limits.MaxNodes)
            {
                findings.Add(EngineMessages.TooManyNodes, SourceSpan.At((int)start.Line, (int)start.Column), "", ("limit", Num(limits.MaxNodes, "")));
                return false;
            }
            if (_stack.Count + 1 > limits.MaxDepth)
            {
                findings.Add(EngineMessages.NestingDeeperThanLevels, SourceSpan.At((int)start.Line, (int)start.Column), "", ("limit", Num(limits.MaxDepth, "")));
                return false;
            }
            if (anchor is not null) _openAnchors.Add(anchor);
            _stack.Push(new Frame(_openEntries, _openItems) { IsMapping = mapping, Start = start, Anchor = anchor, Flow = flow });
            return true;
        }

        private bool Add(YNode node, long size, int height, ParsingEvent ev)
        {
            if (_stack.Count == 0) return true;
            var parent = _stack.Peek();
            if (_stack.Count + height - 1 > limits.MaxDepth)
            {
                findings.Add(EngineMessages.NestingDeeperThanLevels, Span(ev.Start, ev.End), "", ("limit", Num(limits.MaxDepth, "")));
                return false;
            }
            parent.Size = Sat(parent.Size + size);
            parent.Height = Math.Max(parent.Height, height);
            parent.LastEnd = new SourceSpan(node.Span.StartLine, node.Span.StartColumn, node.Span.EndLine, node.Span.EndColumn);
            if (!parent.IsMapping)
            {
                parent.AddItem(node);
                return true;
            }
            if (parent.ExpectKey)
            {
                parent.ExpectKey = false;
                if (node is not YScalar key)
                {
                    findings.Add(EngineMessages.KeyMustPlainWord, node.Span, "", ("what", node.Describe()));
                    parent.SkipNextValue = true;
                    return true;
                }
                if (parent.FindKey(key.Value) is { } first)
                {
                    findings.Add(EngineMessages.KeyAppearsTwiceMapping, key.Span, key.Value,
                        ("key", key.Value), ("firstLine", Num(first.Span.StartLine, "")), ("firstColumn", Num(first.Span.StartColumn, "")),
                        ("line", Num(key.Span.StartLine, "")), ("column", Num(key.Span.StartColumn, "")));
                    parent.SkipNextValue = true;
                    return true;
                }
                parent.AddKey(key);
                parent.PendingKey = key;
                return true;
            }
            parent.ExpectKey = true;
            if (parent.SkipNextValue)
            {
                parent.SkipNextValue = false;
                return true;
            }
            parent.AddEntry(new YEntry(parent.PendingKey!, node));
            parent.PendingKey = null;
            return true;
        }

        private static SourceSpan Span(Mark start, Mark end) =>
            new((int)start.Line, (int)start.Column, (int)end.Line, (int)end.Column);
    }
}
