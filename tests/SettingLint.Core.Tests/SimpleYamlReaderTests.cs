using System.Text;
using CsCheck;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// The simple reader (the loader's fast path) gives exactly what the parser's path gives: the same tree, spans, scalar
/// styles and types, and the same findings, on every YAML file of the repository and on generated documents in and
/// just outside the subset it takes. Any difference is a defect of the simple reader (the parser's path is the reference).
/// </summary>
public sealed class SimpleYamlReaderTests
{
    private static readonly string RepoRoot = RepositoryPaths.Root();

    private static LoadedFile Load(byte[] bytes, bool simple, LoadLimits? limits = null) =>
        YamlLoader.Load(bytes, "/repo/x.yaml", "x.yaml", limits ?? LoadLimits.Default, simple);

    /// <summary>A full, ordered description of a load: every node with its span, style, type and text, then every finding.</summary>
    internal static string Dump(LoadedFile file)
    {
        var sb = new StringBuilder();
        Node(file.Root, sb);
        foreach (var f in file.Findings)
        {
            sb.Append('\n').Append(f.RuleId).Append(' ').Append(f.Span).Append(' ').Append(f.KeyPath).Append(' ').Append(f.MessageId).Append(' ')
                .Append(string.Join(",", f.Values.Select(kv => kv.Key + "=" + kv.Value)));
        }
        return sb.ToString();
    }

    private static void Node(YNode? node, StringBuilder sb)
    {
        switch (node)
        {
            case null:
                sb.Append("null");
                break;
            case YScalar s:
                sb.Append("S(").Append(s.Span).Append(' ').Append(s.Style).Append(' ').Append(s.Type).Append(" [").Append(s.Value).Append("])");
                break;
            case YMapping m:
                sb.Append("M(").Append(m.Span).Append("){");
                foreach (var e in m.Entries)
                {
                    Node(e.Key, sb);
                    sb.Append(": ");
                    Node(e.Value, sb);
                    sb.Append(", ");
                }
                sb.Append('}');
                break;
            case YSequence q:
                sb.Append("Q(").Append(q.Span).Append(")[");
                foreach (var i in q.Items)
                {
                    Node(i, sb);
                    sb.Append(", ");
                }
                sb.Append(']');
                break;
        }
    }

    [Fact]
    public void EveryYamlFileOfTheRepository_LoadsAlikeBothWays()
    {
        var files = Directory.EnumerateFiles(RepoRoot, "*.*", SearchOption.AllDirectories)
            .Where(f => f.EndsWith(".yaml", StringComparison.Ordinal) || f.EndsWith(".yml", StringComparison.Ordinal))
            .Where(f => !f.Contains("/bin/", StringComparison.Ordinal) && !f.Contains("/obj/", StringComparison.Ordinal) && !f.Contains("/.git/", StringComparison.Ordinal))
            .Order(StringComparer.Ordinal).ToList();
        Assert.True(files.Count > 100, $"only {files.Count} YAML files found under {RepoRoot}");
        var taken = 0;
        foreach (var f in files)
        {
            var bytes = File.ReadAllBytes(f);
            Assert.Equal(Dump(Load(bytes, simple: false)), Dump(Load(bytes, simple: true)));
            var text = Encoding.UTF8.GetString(bytes);
            if (SimpleYamlReader.TryRead(text, LoadLimits.Default) is not null) taken++;
        }
        // The comparison means something only if the simple reader takes many of them (the demo's motors, buses, fixtures).
        Assert.True(taken > files.Count / 3, $"the simple reader took {taken} of {files.Count} files");
    }

    [YamlCorpusFact]
    public void EveryCaseOfTheYamlTestSuite_LoadsAlikeBothWays()
    {
        var corpus = YamlTestSuiteCorpus.Require();
        var inputs = Directory.EnumerateFiles(corpus, "in.yaml", SearchOption.AllDirectories).Order(StringComparer.Ordinal).ToList();
        Assert.True(inputs.Count > 300, $"only {inputs.Count} cases under {corpus}");
        foreach (var input in inputs)
        {
            var bytes = File.ReadAllBytes(input);
            Assert.True(Dump(Load(bytes, simple: false)) == Dump(Load(bytes, simple: true)), "differs: " + input);
        }
    }

    [Fact]
    public void AGeneratedMotor_IsTakenByTheSimpleReader_WithTheParsersSpans()
    {
        const string text = "# a comment\nkind: motor-protection\nformat: 1\ntag: \"P-1\"\ntitle: 'Pump 1' # trailing\nmotor:\n  rated_output: 1250 hp\n\n  full_load_current: 154 A\ntransformers:\n  phase_ct: { primary: 200 A, secondary: 5 A, class: C100 }\n  ground_ct: {connection: residual}\nprotection:\n  thermal:\n    enabled: true\n    pickup: -1.15 xFLC\n";
        var simple = SimpleYamlReader.TryRead(text, LoadLimits.Default);
        Assert.NotNull(simple);
        var bytes = Encoding.UTF8.GetBytes(text);
        var parsed = Load(bytes, simple: false);
        Assert.Equal(Dump(parsed), Dump(Load(bytes, simple: true)));
        // Spans as the parser gives them: the flow mapping from its brace (column 13) to just after the closing one (column 59).
        var ct = Assert.IsType<YMapping>(Assert.IsType<YMapping>(simple["transformers"])["phase_ct"]);
        Assert.Equal(new SourceSpan(11, 13, 11, 60), ct.Span);
        Assert.Equal(ScalarType.Bool, Assert.IsType<YScalar>(Assert.IsType<YMapping>(Assert.IsType<YMapping>(simple["protection"])["thermal"])["enabled"]).Type);
    }

    [Theory]
    [InlineData("a: 1\na: 2\n")]                 // duplicate key: the parser's path makes the finding
    [InlineData("a:\n  - 1\n")]                   // a list
    [InlineData("a: &x 1\nb: *x\n")]              // anchor and alias
    [InlineData("a: !!str 1\n")]                  // a tag
    [InlineData("a: |\n  text\n")]                // a block scalar
    [InlineData("a: one\n  two\n")]               // a multi-line plain scalar
    [InlineData("a: \"x\\ty\"\n")]                // an escape
    [InlineData("a:\tb\n")]                       // a tab
    [InlineData("a: 1\r\nb: 2\r\n")]              // carriage returns
    [InlineData("---\na: 1\n")]                   // a document marker
    [InlineData("a: 1\n---\nb: 2\n")]             // a second document
    [InlineData("a:\n")]                          // an empty value
    [InlineData("a: [1, 2]\n")]                   // a flow sequence
    [InlineData("a: { b: 1, }\n")]                // a trailing comma in a flow mapping
    [InlineData("a: b: c\n")]                     // a syntax error
    [InlineData("a: 'it''s'\n")]                  // a quote inside single quotes
    [InlineData("a: caf\u00e9\n")]                // non-ASCII text
    [InlineData("# only a comment\n")]            // no content
    [InlineData("a: 1\n b: 2\n")]                 // a bad indentation
    public void OutsideTheSubset_TheSimpleReaderDeclines(string text)
    {
        Assert.Null(SimpleYamlReader.TryRead(text, LoadLimits.Default));
        var bytes = Encoding.UTF8.GetBytes(text);
        Assert.Equal(Dump(Load(bytes, simple: false)), Dump(Load(bytes, simple: true)));
    }

    [Fact]
    public void OverTheNodeLimit_TheSimpleReaderDeclines()
    {
        var limits = LoadLimits.Default with { MaxNodes = 5 };
        const string text = "a: 1\nb: 2\nc: 3\n";
        Assert.Null(SimpleYamlReader.TryRead(text, limits));
        var bytes = Encoding.UTF8.GetBytes(text);
        var loaded = Load(bytes, simple: true, limits);
        Assert.Equal(Dump(Load(bytes, simple: false, limits)), Dump(loaded));
        Assert.Contains(loaded.Findings, f => f.RuleId == "SL008");
    }

    // Values the simple reader takes, and values at or over its edges (most of which it must decline).
    private static readonly string[] GoodValues =
    [
        "1", "1.5", "-5", "-.5", "0x1F", ".inf", "true", "False", "~", "null", "NULL", "a b", "4160 V", "low-resistance", "../buses/sg-0001.yaml",
        "\"q\"", "'q'", "\"\"", "''", "\" spaced \"", "Bob's pump", "a, b", "x   ", "1 # note", "\"a\" # c", "+1", "1e3", "on", "yes", "0o17", "1_000",
        "{ primary: 200 A, secondary: 5 A }", "{a: 1}", "{ x: 1.5 xFLC }  # c",
    ];

    private static readonly string[] EdgeValues =
    [
        "- 5", "a #c", "a#b", "'it''s'", "\"a\\\"b\"", "{ a: 1, }", "{ a: 1, a: 2 }", "{}", "[1, 2]", "&x 1", "*x", "!!str 1", "|", ">", "a: b",
        "12:30", "", "'a'#c", "%x", "@x", "`x", "a,b", "{ a: 'x' }", "{ a: b c }", "{ a: 1 }x", "\"unterminated", "? x", ": x", "-", "#", "{ a: [1] }",
        "{ a: }", "{ a:1 }", "'a' 'b'", "\"a\" b", "http://x", "a\tb", "[a]", "]", "a]", "a}", "{ a: 1 } # c", "{ 'a': 1 }", "-x", "?x", ":x", "a:", "a ::",
    ];

    private static readonly string[] Keys = ["kind", "tag", "a", "b", "pickup", "x.y", "on", "1", "k-2", "path/to", "_u", "delay", "y"];

    private static readonly string[] EdgeKeys = ["a b", "\"q\"", "'q'", "-a", "k#", "? k", "[k]", "k ", "&k k", "*k", "é", "k\t", "", "~", "- k", "{k}"];

    /// <summary>A document in the subset, built from a list of random numbers: nested block mappings, comments, blank lines.</summary>
    private sealed class Builder(int[] r)
    {
        private int _i;
        private readonly StringBuilder _sb = new();

        private int Next(int n) => (int)((uint)r[_i++ % r.Length] % (uint)n);

        public string Document()
        {
            Mapping(0, 0);
            return _sb.ToString();
        }

        private void Mapping(int indent, int depth)
        {
            var count = 1 + Next(5);
            var used = new HashSet<string>();
            var step = 1 + Next(4);
            for (var e = 0; e < count; e++)
            {
                if (Next(6) == 0) _sb.Append(' ', Next(6)).Append("# comment ").Append(Next(100)).Append('\n');
                if (Next(8) == 0) _sb.Append(' ', Next(4)).Append('\n');
                var key = Keys[Next(Keys.Length)];
                if (!used.Add(key)) continue;
                _sb.Append(' ', indent).Append(key).Append(':');
                if (depth < 4 && Next(4) == 0)
                {
                    if (Next(3) == 0) _sb.Append("   # about the group");
                    _sb.Append('\n');
                    Mapping(indent + step, depth + 1);
                }
                else
                {
                    _sb.Append(' ', 1 + Next(2)).Append(GoodValues[Next(GoodValues.Length)]).Append('\n');
                }
            }
            if (used.Count == 0) _sb.Append(' ', indent).Append("z: 0\n");
        }
    }

    private static readonly Gen<int[]> Numbers = Gen.Int[0, int.MaxValue].Array[64];

    [Trait("Category", "Property")]
    [Fact]
    public void GeneratedDocumentsInTheSubset_AreTakenAndLoadAlike() =>
        Numbers.SampleSeeded(r =>
        {
            var text = new Builder(r).Document();
            Assert.True(SimpleYamlReader.TryRead(text, LoadLimits.Default) is not null, "declined:\n" + text);
            var bytes = Encoding.UTF8.GetBytes(text);
            Assert.Equal(Dump(Load(bytes, simple: false)), Dump(Load(bytes, simple: true)));
        }, iter: 300);

    [Trait("Category", "Property")]
    [Fact]
    public void GeneratedDocumentsJustOutsideTheSubset_LoadAlike() =>
        Gen.Select(Numbers, Gen.Int[0, 9], Gen.Int[0, 100_000], Gen.Int[0, 100_000]).SampleSeeded(t =>
        {
            var (r, kind, at, pick) = t;
            var text = new Builder(r).Document();
            var lines = text.Split('\n').ToList();
            var line = at % Math.Max(1, lines.Count - 1);
            // One change at the edge of the subset: a value or key outside it, a character, a line, an indentation, a line ending.
            switch (kind)
            {
                case 0: lines[line] = ReplaceValue(lines[line], EdgeValues[pick % EdgeValues.Length]); break;
                case 1: lines[line] = ReplaceKey(lines[line], EdgeKeys[pick % EdgeKeys.Length]); break;
                case 2: lines.Insert(line, new string(' ', pick % 5) + EdgeValues[pick % EdgeValues.Length]); break;
                case 3: lines[line] = " " + lines[line]; break;
                case 4: lines[line] = lines[line].Length > 1 ? lines[line][1..] : lines[line]; break;
                case 5: lines[line] += "\r"; break;
                case 6: lines.Insert(line, pick % 2 == 0 ? "---" : "..."); break;
                case 7: lines[line] = lines[line].Insert(pick % (lines[line].Length + 1), ((string[])["\t", "#", ":", " ", "'", "\"", "{", "}", ",", "\u00e9", "\\", "-"])[pick % 12]); break;
                case 8: lines.Insert(line, lines[line]); break; // a duplicate key, or a repeated line
                default: lines[line] = ReplaceValue(lines[line], ""); break;
            }
            var bytes = Encoding.UTF8.GetBytes(string.Join('\n', lines));
            Assert.Equal(Dump(Load(bytes, simple: false)), Dump(Load(bytes, simple: true)));
        }, iter: 600);

    private static string ReplaceValue(string line, string value)
    {
        var colon = line.IndexOf(": ", StringComparison.Ordinal);
        return colon < 0 ? line + " " + value : line[..(colon + 2)] + value;
    }

    private static string ReplaceKey(string line, string key)
    {
        var start = line.Length - line.TrimStart(' ').Length;
        var colon = line.IndexOf(':', StringComparison.Ordinal);
        return colon < 0 ? line : line[..start] + key + line[colon..];
    }
}
