using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>The loader: exact spans, encodings, duplicate keys, syntax errors and the SL008 limits.</summary>
public sealed class LoaderTests
{
    private const string Sample = "kind: bus\ntag: \"BUS-1\"\nupstream:\n  curve: definite-time\n  pickup: 1200 A\nlist: [a, bb]\n";

    private static LoadedFile Load(string text, LoadLimits? limits = null) =>
        YamlLoader.Load(Encoding.UTF8.GetBytes(text), "/repo/x.yaml", "x.yaml", limits ?? LoadLimits.Default);

    private static LoadedFile Load(byte[] bytes, LoadLimits? limits = null) =>
        YamlLoader.Load(bytes, "/repo/x.yaml", "x.yaml", limits ?? LoadLimits.Default);

    private static LoadLimits Small(int nodes = 100_000, long aliases = 10_000, int depth = 64) =>
        LoadLimits.Default with { MaxNodes = nodes, MaxAliasExpansion = aliases, MaxDepth = depth };

    private static YEntry Entry(LoadedFile file, params string[] keys)
    {
        YNode node = file.Root!;
        YEntry? entry = null;
        foreach (var k in keys)
        {
            entry = Assert.IsType<YMapping>(node).Find(k);
            Assert.NotNull(entry);
            node = entry.Value;
        }
        return entry!;
    }

    private static Finding Single(LoadedFile file, string ruleId)
    {
        var finding = Assert.Single(file.Findings);
        Assert.Equal(ruleId, finding.RuleId);
        return finding;
    }

    // SARIF 2.1.0 §3.30.5-§3.30.8: 1-based lines and columns; endColumn is the column after the region's last character.
    [Fact]
    public void Keys_and_values_have_exact_spans()
    {
        var file = Load(Sample);
        Assert.Empty(file.Findings);
        var kind = Entry(file, "kind");
        Assert.Equal(new SourceSpan(1, 1, 1, 5), kind.Key.Span);
        Assert.Equal(new SourceSpan(1, 7, 1, 10), kind.Value.Span);
        var tag = Entry(file, "tag");
        Assert.Equal(new SourceSpan(2, 1, 2, 4), tag.Key.Span);
        Assert.Equal(new SourceSpan(2, 6, 2, 13), tag.Value.Span); // the quotes belong to the value
        Assert.Equal("BUS-1", ((YScalar)tag.Value).Value);
        var curve = Entry(file, "upstream", "curve");
        Assert.Equal(new SourceSpan(4, 3, 4, 8), curve.Key.Span);
        Assert.Equal(new SourceSpan(4, 10, 4, 23), curve.Value.Span);
        var pickup = Entry(file, "upstream", "pickup");
        Assert.Equal(new SourceSpan(5, 3, 5, 9), pickup.Key.Span);
        Assert.Equal(new SourceSpan(5, 11, 5, 17), pickup.Value.Span);
        var list = Assert.IsType<YSequence>(Entry(file, "list").Value);
        Assert.Equal(new SourceSpan(6, 8, 6, 9), list.Items[0].Span);
        Assert.Equal(new SourceSpan(6, 11, 6, 13), list.Items[1].Span);
        Assert.Equal(new SourceSpan(6, 7, 6, 14), list.Span); // a flow collection ends after its closing bracket
        var upstream = Assert.IsType<YMapping>(Entry(file, "upstream").Value);
        Assert.Equal(4, upstream.Span.StartLine);
        Assert.Equal(3, upstream.Span.StartColumn);
        Assert.Equal(new SourceSpan(4, 3, 5, 17), upstream.Span); // a block collection ends with its last child
        Assert.Equal(new SourceSpan(1, 1, 6, 14), file.Root!.Span);
    }

    [Fact]
    public void Flow_mappings_and_empty_collections_span_their_brackets()
    {
        var file = Load("a: { k: v }\nb: []\nc: {}\n");
        Assert.Equal(new SourceSpan(1, 4, 1, 12), Entry(file, "a").Value.Span);
        Assert.Equal(new SourceSpan(2, 4, 2, 6), Entry(file, "b").Value.Span);
        Assert.Equal(new SourceSpan(3, 4, 3, 6), Entry(file, "c").Value.Span);
    }

    [Fact]
    public void Spans_agree_with_an_independent_text_search()
    {
        var file = Load(Samples.Motor);
        Assert.Empty(file.Findings);
        var fields = new (string[] Keys, string Text)[]
        {
            (["motor", "full_load_current"], "58 A"),
            (["transformers", "phase_ct", "burden"], "0.3 ohm"),
            (["transformers", "ground_ct", "connection"], "core-balance"),
            (["protection", "short_circuit", "pickup"], "7.2 A sec"),
        };
        foreach (var (keys, text) in fields)
        {
            var entry = Entry(file, keys);
            var (line, column) = Samples.Pos(Samples.Motor, text);
            Assert.Equal(new SourceSpan(line, column, line, column + text.Length), entry.Value.Span);
            var (kl, kc) = Samples.Pos(Samples.Motor, keys[^1] + ":");
            Assert.Equal(new SourceSpan(kl, kc, kl, kc + keys[^1].Length), entry.Key.Span);
        }
    }

    // YAML 1.2.2 spec 5.4: CR LF is one line break; columns must not shift.
    [Fact]
    public void A_CRLF_file_has_the_same_spans_as_the_LF_file()
    {
        var lf = Load(Samples.Motor);
        var crlf = Load(Samples.Motor.Replace("\n", "\r\n", StringComparison.Ordinal));
        Assert.Empty(crlf.Findings);
        Assert.Equal(Spans(lf.Root!), Spans(crlf.Root!));
        Assert.Equal(lf.Lines, crlf.Lines);
        Assert.DoesNotContain(crlf.Lines, l => l.Contains('\r', StringComparison.Ordinal));
    }

    // YAML 1.2.2 spec 5.4: a lone CR (old Mac line ends) is a line break too; Lines must agree with the parser's lines.
    [Fact]
    public void A_CR_only_file_has_the_same_spans_and_lines_as_the_LF_file()
    {
        var lf = Load(Samples.Motor);
        var cr = Load(Samples.Motor.Replace('\n', '\r'));
        Assert.Empty(cr.Findings);
        Assert.Equal(Spans(lf.Root!), Spans(cr.Root!));
        Assert.Equal(lf.Lines, cr.Lines);
        var bad = Load([.. "a: 1\rb: 2\rc: "u8, 0xFF]);
        Assert.Equal(SourceSpan.At(3, 4), Single(bad, EngineRules.Syntax).Span);
    }

    // YAML 1.2.2 spec 5.2: a byte order mark may start the stream; it is not content and takes no column.
    [Fact]
    public void A_UTF8_byte_order_mark_is_accepted_and_takes_no_column()
    {
        var plain = Load(Sample);
        var withBom = Load([0xEF, 0xBB, 0xBF, .. Encoding.UTF8.GetBytes(Sample)]);
        Assert.Empty(withBom.Findings);
        Assert.Equal(Spans(plain.Root!), Spans(withBom.Root!));
        Assert.Equal("kind: bus", withBom.Lines[0]);
        Assert.Equal("bus", ((YScalar)Entry(withBom, "kind").Value).Value);
    }

    // RFC 3629 section 3: 0xFF never appears in UTF-8. Columns count UTF-16 code units of the text before it.
    [Theory]
    [InlineData(new byte[] { (byte)'k', (byte)':', (byte)' ', (byte)'v', (byte)'\n', (byte)'t', (byte)'a', (byte)'g', (byte)':', (byte)' ', (byte)'B', 0xFF }, 2, 7)]
    [InlineData(new byte[] { (byte)'t', (byte)':', (byte)' ', 0xC3, 0xA9, 0xFF }, 1, 5)] // 'é' is two bytes, one column
    [InlineData(new byte[] { 0xEF, 0xBB, 0xBF, (byte)'t', (byte)':', (byte)' ', 0xC0, 0x80 }, 1, 4)] // overlong NUL after a BOM
    [InlineData(new byte[] { (byte)'a', (byte)':', (byte)' ', (byte)'\n', (byte)'b', (byte)':', (byte)' ', 0xE2, 0x82 }, 2, 4)] // truncated at the end
    [InlineData(new byte[] { (byte)'a', (byte)':', (byte)' ', 0xED, 0xA0, 0x80 }, 1, 4)] // an encoded surrogate
    public void Invalid_UTF8_is_SL001_at_the_bad_byte(byte[] bytes, int line, int column)
    {
        var file = Load(bytes);
        var finding = Single(file, EngineRules.Syntax);
        Assert.Equal(SourceSpan.At(line, column), finding.Span);
        Assert.Contains("not valid UTF-8", finding.Message, StringComparison.Ordinal);
        Assert.Null(file.Root);
        Assert.True(file.Failed);
    }

    // YAML 1.2.2 spec 5.1: only c-printable characters may appear. YamlDotNet reads a NUL as the end of the stream,
    // which would drop the rest of the file without a word.
    [Theory]
    [InlineData("kind: bus\n\0tag: [\n", 2, 1, "0000")]
    [InlineData("kind: bus\ntag: B\u0007\n", 2, 7, "0007")]
    [InlineData("kind: bus\u007F\n", 1, 10, "007F")]
    [InlineData("a: '\u0090'\n", 1, 5, "0090")]
    [InlineData("a: \uFFFF\n", 1, 4, "FFFF")]
    public void A_control_character_is_SL001_at_its_position(string text, int line, int column, string code)
    {
        var file = Load(text);
        var finding = Single(file, EngineRules.Syntax);
        Assert.Equal(SourceSpan.At(line, column), finding.Span);
        Assert.Contains("U+" + code, finding.Message, StringComparison.Ordinal);
        Assert.Null(file.Root);
    }

    [Theory]
    [InlineData("a: \"tab\there\"\n")]
    [InlineData("a: caf\u00e9 \u2013 \U0001F600\n")]
    public void Printable_characters_are_fine(string text) => Assert.Empty(Load(text).Findings);

    // YAML 1.2.2 spec 5.1, c-printable: in the 8-bit range x09, x0A, x0D, x20-x7E and xA0-xFF (x85 is a YAML 1.1
    // line break, refused as above). Each character stands in a double-quoted value, where the parser takes any of them.
    [Fact]
    public void Every_character_of_the_8_bit_range_is_refused_exactly_when_YAML_does_not_allow_it()
    {
        for (var c = (char)0; c <= '\u00FF'; c++)
        {
            var printable = c is '\t' or '\n' or '\r' or (>= ' ' and <= '~') or (>= '\u00A0' and <= '\u00FF');
            // The value is quoted and its quote and backslash escaped, so that only the character itself is in question.
            var text = "a: \"x" + (c is '"' or '\\' ? "\\" + c : c.ToString()) + "y\"\n";
            var refused = Load(text).Findings.Any(f => f.RuleId == EngineRules.Syntax && f.Message.Contains("U+" + ((int)c).ToString("X4", System.Globalization.CultureInfo.InvariantCulture), StringComparison.Ordinal));
            Assert.True(printable != refused, $"U+{(int)c:X4}: printable {printable}, refused {refused}");
        }
    }

    // YAML 1.2.2 spec 5.4: only LF and CR break lines; YamlDotNet also breaks at NEL, LS and PS (the YAML 1.1 set).
    [Theory]
    [InlineData("title: x\u0085y\n", "0085")]
    [InlineData("title: x\u2028y\n", "2028")]
    [InlineData("title: x\u2029y\n", "2029")]
    public void YAML_1_1_line_breaks_are_SL001(string text, string code)
    {
        var finding = Single(Load(text), EngineRules.Syntax);
        Assert.Equal(SourceSpan.At(1, 9), finding.Span);
        Assert.Contains("U+" + code, finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_UTF16_file_is_SL001()
    {
        var file = Load([0xFF, 0xFE, .. Encoding.Unicode.GetBytes("kind: bus\n")]);
        Assert.Contains("UTF-16", Single(file, EngineRules.Syntax).Message, StringComparison.Ordinal);
    }

    // SL002: YAML 1.2.2 spec 3.2.1.1 requires mapping keys to be unique.
    [Fact]
    public void A_duplicate_key_is_SL002_at_the_second_key_with_both_positions()
    {
        var file = Load("kind: bus\ntag: A\nupstream:\n  pickup: 1 A\n  curve: x\n  pickup: 2 A\ntag: B\n");
        Assert.Equal(2, file.Findings.Count);
        Assert.All(file.Findings, f => Assert.Equal(EngineRules.DuplicateKey, f.RuleId));
        var nested = file.Findings.Single(f => f.Span.StartLine == 6);
        Assert.Equal(new SourceSpan(6, 3, 6, 9), nested.Span);
        Assert.Equal("pickup", nested.Values["key"].Text);
        Assert.Equal(4, nested.Values["firstLine"].Number);
        Assert.Equal(3, nested.Values["firstColumn"].Number);
        Assert.Equal(6, nested.Values["line"].Number);
        Assert.Equal(3, nested.Values["column"].Number);
        Assert.Contains("line 4, column 3", nested.Message, StringComparison.Ordinal);
        var top = file.Findings.Single(f => f.Span.StartLine == 7);
        Assert.Equal(new SourceSpan(7, 1, 7, 4), top.Span);
        Assert.Equal(2, top.Values["firstLine"].Number);
        // The first value is kept; the duplicate does not silently win.
        Assert.Equal("A", ((YScalar)Entry(file, "tag").Value).Value);
        Assert.Equal("1 A", ((YScalar)Entry(file, "upstream", "pickup").Value).Value);
        Assert.Equal(["kind", "tag", "upstream"], ((YMapping)file.Root!).Entries.Select(e => e.Key.Value));
    }

    // Small mappings are searched key by key and large ones through a dictionary: duplicates on both sides of the switch.
    [Theory]
    [InlineData(3, 9)]
    [InlineData(3, 16)]
    [InlineData(3, 17)]
    [InlineData(16, 17)]
    [InlineData(20, 39)]
    public void A_duplicate_key_is_found_in_a_mapping_of_any_size(int first, int again)
    {
        var keys = Enumerable.Range(1, 40).Select(i => i == again ? "k" + first : "k" + i).ToList();
        var file = Load(string.Concat(keys.Select(k => k + ": 1\n")));
        var finding = Assert.Single(file.Findings);
        Assert.Equal(EngineRules.DuplicateKey, finding.RuleId);
        Assert.Equal(again, finding.Span.StartLine);
        Assert.Equal(first, finding.Values["firstLine"].Number);
        Assert.Equal(39, ((YMapping)file.Root!).Entries.Length);
    }

    [Fact]
    public void A_duplicate_key_whose_value_is_a_mapping_is_dropped_whole()
    {
        var file = Load("a: {x: 1}\nb: 2\na:\n  y: 3\nc: 4\n");
        Assert.Equal(EngineRules.DuplicateKey, Assert.Single(file.Findings).RuleId);
        Assert.Equal(["a", "b", "c"], ((YMapping)file.Root!).Entries.Select(e => e.Key.Value));
    }

    // SL001 carries the parser's own line and column (the oracle is YamlDotNet's exception).
    [Theory]
    [InlineData("kind: bus\ntag: a: b\n", 2, 7)]
    [InlineData("kind: bus\nlist: [1, 2\n", 3, 1)]
    [InlineData("kind: bus\n  tag: x\n", 2, 6)]
    [InlineData("a: \"unterminated\n", 1, 4)] // where the quoted scalar starts
    public void A_syntax_error_is_SL001_at_the_parser_position(string text, int line, int column)
    {
        var file = Load(text);
        var finding = Single(file, EngineRules.Syntax);
        var expected = ParserError(text);
        Assert.Equal(SourceSpan.At((int)expected.Start.Line, (int)expected.Start.Column), finding.Span);
        Assert.Equal(SourceSpan.At(line, column), finding.Span);
        Assert.StartsWith("YAML syntax error: ", finding.Message, StringComparison.Ordinal);
        Assert.DoesNotContain("(Line:", finding.Message, StringComparison.Ordinal);
        Assert.Null(file.Root);
    }

    private static YamlDotNet.Core.YamlException ParserError(string text)
    {
        var parser = new YamlDotNet.Core.Parser(new StringReader(text));
        try
        {
            while (parser.MoveNext())
            {
            }
        }
        catch (YamlDotNet.Core.YamlException ex)
        {
            return ex;
        }
        throw new InvalidOperationException("The parser accepted the text.");
    }

    [Fact]
    public void An_alias_to_an_unknown_anchor_is_SL001()
    {
        var finding = Single(Load("a: *nowhere\n"), EngineRules.Syntax);
        Assert.Equal(new SourceSpan(1, 4, 1, 12), finding.Span);
    }

    // --- SL008: nesting depth (contract limit 64) ---

    private static string NestedFlow(int depth) => new string('[', depth) + "1" + new string(']', depth) + "\n";

    private static string NestedBlock(int depth)
    {
        var sb = new StringBuilder();
        for (var i = 0; i < depth - 1; i++) sb.Append(' ', 2 * i).Append("k:\n");
        sb.Append(' ', 2 * (depth - 1)).Append("leaf: 1\n");
        return sb.ToString();
    }

    [Theory]
    [InlineData(8)]
    [InlineData(3)]
    public void Depth_exactly_at_a_small_limit_loads_and_one_more_is_SL008(int limit)
    {
        Assert.Empty(Load(NestedFlow(limit), Small(depth: limit)).Findings);
        Assert.Empty(Load(NestedBlock(limit), Small(depth: limit)).Findings);
        var over = Load(NestedFlow(limit + 1), Small(depth: limit));
        var finding = Single(over, EngineRules.Limit);
        Assert.Equal(SourceSpan.At(1, limit + 1), finding.Span); // the bracket that opens the level too many
        Assert.Null(over.Root);
        Assert.Equal(EngineRules.Limit, Single(Load(NestedBlock(limit + 1), Small(depth: limit)), EngineRules.Limit).RuleId);
    }

    [Fact]
    public void Depth_64_loads_and_65_is_SL008_at_the_default_limit()
    {
        Assert.Equal(64, LoadLimits.Default.MaxDepth);
        Assert.Empty(Load(NestedBlock(64)).Findings);
        Assert.Empty(Load(NestedFlow(64)).Findings);
        Assert.Contains("64", Single(Load(NestedBlock(65)), EngineRules.Limit).Message, StringComparison.Ordinal);
        Single(Load(NestedFlow(65)), EngineRules.Limit);
    }

    [Fact]
    public void Nesting_200_deep_is_SL008()
    {
        Single(Load(NestedFlow(200)), EngineRules.Limit);
        Single(Load(NestedBlock(200)), EngineRules.Limit);
    }

    [Fact]
    public void Depth_reached_through_an_alias_counts()
    {
        // root, b's list, its inner list, then *x brings two more levels: 5 in all.
        const string text = "a: &x [[1]]\nb: [[*x]]\n";
        Assert.Empty(Load(text, Small(depth: 5)).Findings);
        var finding = Single(Load(text, Small(depth: 4)), EngineRules.Limit);
        Assert.Equal(new SourceSpan(2, 6, 2, 8), finding.Span);
    }

    // --- SL008: node count (contract limit 100,000) ---

    private static string FlatList(int scalars) => "[" + string.Join(",", Enumerable.Repeat("1", scalars)) + "]\n";

    [Fact]
    public void Nodes_exactly_at_a_small_limit_load_and_one_more_is_SL008()
    {
        // The list itself is one node.
        Assert.Empty(Load(FlatList(9), Small(nodes: 10)).Findings);
        var finding = Single(Load(FlatList(10), Small(nodes: 10)), EngineRules.Limit);
        Assert.Equal(new SourceSpan(1, 20, 1, 21), finding.Span); // the 11th node: the 10th scalar
        Assert.Contains("10 nodes", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Nodes_100000_load_and_100001_are_SL008_at_the_default_limit()
    {
        Assert.Equal(100_000, LoadLimits.Default.MaxNodes);
        var ok = Load(FlatList(99_999));
        Assert.Empty(ok.Findings);
        Assert.Equal(99_999, Assert.IsType<YSequence>(ok.Root).Items.Length);
        Single(Load(FlatList(100_000)), EngineRules.Limit);
    }

    [Fact]
    public void Collections_count_as_nodes()
    {
        // Root list + 4 inner lists = 5 nodes.
        Assert.Empty(Load("[[],[],[],[]]\n", Small(nodes: 5)).Findings);
        Single(Load("[[],[],[],[],[]]\n", Small(nodes: 5)), EngineRules.Limit);
    }

    // --- SL008: alias expansion (contract limit 10,000 nodes through aliases) ---

    private static string Aliases(int count) => "a: &a x\nb: [" + string.Join(", ", Enumerable.Repeat("*a", count)) + "]\n";

    [Fact]
    public void Alias_expansion_exactly_at_a_small_limit_loads_and_one_more_is_SL008()
    {
        var ok = Load(Aliases(10), Small(aliases: 10));
        Assert.Empty(ok.Findings);
        Assert.Equal(10, Assert.IsType<YSequence>(Entry(ok, "b").Value).Items.Length);
        var finding = Single(Load(Aliases(11), Small(aliases: 10)), EngineRules.Limit);
        Assert.Equal(new SourceSpan(2, 45, 2, 47), finding.Span); // the 11th alias
    }

    [Fact]
    public void An_alias_to_a_collection_expands_by_its_size()
    {
        // {k: v} is three nodes: the mapping, its key and its value.
        const string head = "a: &a {k: v}\nb: [";
        Assert.Empty(Load(head + "*a, *a, *a]\n", Small(aliases: 9)).Findings);
        Single(Load(head + "*a, *a, *a, *a]\n", Small(aliases: 9)), EngineRules.Limit);
    }

    [Fact]
    public void Alias_expansion_10000_loads_and_10001_is_SL008_at_the_default_limit()
    {
        Assert.Equal(10_000, LoadLimits.Default.MaxAliasExpansion);
        Assert.Empty(Load(Aliases(10_000)).Findings);
        Single(Load(Aliases(10_001)), EngineRules.Limit);
    }

    // The "billion laughs" pattern (CVE-2003-1564 family): 9 levels of 9 aliases is 9^9 nodes if expanded.
    [Fact]
    public void An_alias_bomb_is_SL008_and_returns()
    {
        var sb = new StringBuilder("l0: &l0 [x, x, x, x, x, x, x, x, x]\n");
        for (var level = 1; level <= 9; level++)
        {
            sb.Append('l').Append(level).Append(": &l").Append(level).Append(" [")
                .Append(string.Join(", ", Enumerable.Repeat("*l" + (level - 1), 9))).Append("]\n");
        }
        var file = Load(sb.ToString());
        var finding = Single(file, EngineRules.Limit);
        Assert.Contains("alias", finding.Message, StringComparison.OrdinalIgnoreCase);
        Assert.Null(file.Root);
    }

    [Theory]
    [InlineData("a: &a [1, *a]\n")]
    [InlineData("a: &a {b: [*a]}\n")]
    [InlineData("&r [x, {k: *r}]\n")]
    public void A_recursive_alias_is_SL008(string text)
    {
        var finding = Single(Load(text), EngineRules.Limit);
        Assert.Contains("recursive", finding.Message, StringComparison.Ordinal);
    }

    // --- SL008: file size (contract limit 4 MiB) ---

    [Fact]
    public void A_5_MiB_file_is_SL008_without_being_read()
    {
        using var repo = new TempRepo();
        var path = repo.PathOf("big.yaml");
        using (var stream = new FileStream(path, FileMode.CreateNew))
        {
            stream.SetLength(5L * 1024 * 1024); // sparse: zero bytes that would be a syntax error if they were parsed
        }
        var file = YamlLoader.LoadFile(path, "big.yaml", LoadLimits.Default);
        var finding = Single(file, EngineRules.Limit);
        Assert.Equal(SourceSpan.FileStart, finding.Span);
        Assert.Equal(5L * 1024 * 1024, finding.Values["size"].Number);
        Assert.Equal(4L * 1024 * 1024, finding.Values["limit"].Number);
        Assert.Empty(file.Lines);
        Assert.Null(file.Root);
    }

    [Fact]
    public void A_file_exactly_at_the_size_limit_is_read()
    {
        var text = "a: 1\n";
        var limits = LoadLimits.Default with { MaxFileBytes = text.Length };
        Assert.Empty(Load(text, limits).Findings);
        Single(Load(text + " ", limits), EngineRules.Limit);
    }

    // --- documents ---

    [Fact]
    public void Two_documents_in_one_file_are_a_finding_at_the_second()
    {
        var file = Load("kind: bus\n---\nkind: motor-protection\n");
        var finding = Assert.Single(file.Findings);
        Assert.Equal(2, finding.Span.StartLine);
        Assert.Equal(1, finding.Span.StartColumn);
        Assert.Equal(EngineRules.SecondDocument, finding.RuleId);
        Assert.Contains("one YAML document", finding.Message, StringComparison.Ordinal);
        Assert.Equal("bus", ((YScalar)Entry(file, "kind").Value).Value);
    }

    [Fact]
    public void One_explicit_document_is_fine() =>
        Assert.Empty(Load("---\nkind: bus\n...\n").Findings);

    [Theory]
    [InlineData("")]
    [InlineData("# only a comment\n")]
    public void An_empty_file_has_no_tree_and_no_finding(string text)
    {
        var file = Load(text);
        Assert.Empty(file.Findings);
        Assert.Null(file.Root);
        Assert.False(file.IsSettingFile);
        Assert.False(file.Failed);
    }

    [Fact]
    public void A_mapping_as_a_key_is_refused()
    {
        var finding = Single(Load("? [a, b]\n: 1\nc: 2\n"), EngineRules.KeyNotPlain);
        Assert.Contains("key", finding.Message, StringComparison.Ordinal);
    }

    private static List<string> Spans(YNode node)
    {
        var list = new List<string>();
        void Walk(YNode n, string path)
        {
            list.Add(path + "=" + n.Span);
            switch (n)
            {
                case YMapping m:
                    foreach (var e in m.Entries)
                    {
                        list.Add(path + "/" + e.Key.Value + "#key=" + e.Key.Span);
                        Walk(e.Value, path + "/" + e.Key.Value);
                    }
                    break;
                case YSequence s:
                    for (var i = 0; i < s.Items.Length; i++) Walk(s.Items[i], path + "/" + i.ToString(System.Globalization.CultureInfo.InvariantCulture));
                    break;
            }
        }
        Walk(node, "");
        return list;
    }
}
