using System.Collections.Frozen;
using System.Collections.Immutable;
using System.Globalization;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Quantities;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Rules;

/// <summary>A rule file to load: where it comes from (for messages) and its bytes.</summary>
/// <param name="Trusted">Built into this assembly: validated against the rule schema by the build's tests, so not again at every start.</param>
public sealed record RuleSource(string DisplayPath, byte[] Bytes, bool Trusted = false);

/// <summary>The rules of a run, or the problems that stopped them loading (each with a file, line and column).</summary>
public sealed record RuleLoadResult(ImmutableArray<CompiledRule> Rules, ImmutableArray<Notification> Problems);

/// <summary>Reads rule files, validates them with the rule schema, and type-checks and compiles their expressions.</summary>
public sealed class RuleLoader(SchemaSet schemas)
{
    private readonly Compiler _compiler = new();

    // The built-in pack does not depend on the repository: it is compiled once per process, and a command can start
    // that at once (Warm) so that it overlaps with the command line, the configuration and the first files.
    private static readonly Lazy<Task<RuleLoadResult>> SharedBuiltIn =
        new(() => Task.Run(() => new RuleLoader(SchemaSet.Shared).Load(BuiltIn())), LazyThreadSafetyMode.ExecutionAndPublication);

    /// <summary>Starts compiling the built-in pack on the thread pool, if it has not started yet.</summary>
    public static void Warm() => _ = SharedBuiltIn.Value;

    /// <summary>The compiled built-in pack, unconfigured: shared by every run of the process with the shared schemas.</summary>
    /// <remarks>Compiled rules are immutable (configuring one makes a new record), so sharing them between runs is safe.</remarks>
    public static Task<RuleLoadResult> CompiledBuiltIn(SchemaSet schemas) =>
        ReferenceEquals(schemas, SchemaSet.Shared) ? SharedBuiltIn.Value : Task.Run(() => new RuleLoader(schemas).Load(BuiltIn()));

    /// <summary>The rule files of the built-in pack, embedded in this assembly.</summary>
    public static IReadOnlyList<RuleSource> BuiltIn()
    {
        var asm = typeof(RuleLoader).Assembly;
        return asm.GetManifestResourceNames()
            .Where(n => n.StartsWith("rules/", StringComparison.Ordinal) && n.EndsWith("/rule.yaml", StringComparison.Ordinal))
            .OrderBy(n => n, StringComparer.Ordinal)
            .Select(n =>
            {
                using var s = asm.GetManifestResourceStream(n)!;
                using var ms = new MemoryStream();
                s.CopyTo(ms);
                return new RuleSource("builtin:" + n, ms.ToArray(), Trusted: true);
            })
            .ToList();
    }

    /// <summary>The rule files of a folder: every `rule.yaml` below it (one folder per rule).</summary>
    public static IReadOnlyList<RuleSource> FromFolder(string folder, string displayRoot)
    {
        if (!Directory.Exists(folder)) return [];
        return Directory.EnumerateFiles(folder, "rule.yaml", SearchOption.AllDirectories)
            .Where(f => !f.Contains(Path.DirectorySeparatorChar + "fixtures" + Path.DirectorySeparatorChar, StringComparison.Ordinal))
            .OrderBy(f => f, StringComparer.Ordinal)
            .Select(f => new RuleSource(Path.GetRelativePath(displayRoot, f).Replace('\\', '/'), File.ReadAllBytes(f)))
            .ToList();
    }

    /// <summary>The rule files of a folder (absolute) of a source: every `rule.yaml` below it outside fixtures, named relative to the root.</summary>
    public static IReadOnlyList<RuleSource> FromSource(IFileSource source, string folder)
    {
        ArgumentNullException.ThrowIfNull(source);
        if (source.Probe(folder) != EntryKind.Folder) return [];
        var rel = Discovery.RepositoryRoot.Relative(source.Root, folder);
        return [.. source.FindFiles(rel == "." ? "" : rel, "rule.yaml")
            .Where(f => !("/" + f).Contains("/fixtures/", StringComparison.Ordinal))
            .Select(f => source.Read(f) is { } bytes ? new RuleSource(f, bytes) : null)
            .OfType<RuleSource>()];
    }

    /// <summary>Loads and compiles rule files; overrides change levels and parameters.</summary>
    public RuleLoadResult Load(IEnumerable<RuleSource> sources, RuleOverrides? overrides = null)
    {
        // Each file compiles on its own; the results are taken in source order, so messages do not depend on threads.
        var list = sources.ToList();
        var compiled = new (CompiledRule? Rule, List<Notification> Problems)[list.Count];
        Parallel.For(0, list.Count, i =>
        {
            var own = ImmutableArray.CreateBuilder<Notification>();
            compiled[i] = (LoadOne(list[i], own), [.. own]);
        });
        var result = Merge([new RuleLoadResult([.. compiled.Select(c => c.Rule).OfType<CompiledRule>()], [.. compiled.SelectMany(c => c.Problems)])]);
        return overrides is null ? result : Configure(result, overrides);
    }

    /// <summary>Joins loaded rules (of one pack or several): one rule per id, the first in order wins, each later one is a problem at its id; sorted by id.</summary>
    public static RuleLoadResult Merge(IEnumerable<RuleLoadResult> parts)
    {
        var rules = new List<CompiledRule>();
        var problems = ImmutableArray.CreateBuilder<Notification>();
        var seen = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var part in parts)
        {
            problems.AddRange(part.Problems);
            foreach (var rule in part.Rules)
            {
                if (seen.TryGetValue(rule.Id, out var other))
                {
                    problems.Add(new Notification(NotificationKind.Configuration, $"The rule id {rule.Id} is also defined in {other}.", rule.SourceFile, rule.Span));
                    continue;
                }
                seen[rule.Id] = rule.SourceFile;
                rules.Add(rule);
            }
        }
        return new RuleLoadResult([.. rules.OrderBy(r => r.Id, StringComparer.Ordinal)], problems.ToImmutable());
    }

    /// <summary>Applies a repository's levels and parameter values to compiled rules; each bad override is a problem at its line.</summary>
    public static RuleLoadResult Configure(RuleLoadResult compiled, RuleOverrides overrides)
    {
        var problems = compiled.Problems.ToBuilder();
        var rules = ImmutableArray.CreateBuilder<CompiledRule>(compiled.Rules.Length);
        foreach (var rule in compiled.Rules)
        {
            var o = overrides.For(rule.Id);
            if (o is null)
            {
                rules.Add(rule);
                continue;
            }
            var values = (double[])rule.ParameterValues.Clone();
            try
            {
                foreach (var (name, (text, span, file)) in o.Parameters ?? new Dictionary<string, (string, SourceSpan, string)>())
                {
                    var p = rule.Parameters.FirstOrDefault(x => x.Name == name)
                        ?? throw new RuleLoadException($"The rule {rule.Id} has no parameter '{name}'; it has {(rule.Parameters.IsEmpty ? "none" : string.Join(", ", rule.Parameters.Select(x => x.Name)))}.", span, file);
                    var (v, d, _) = ParameterValue(text, span, file);
                    if (d != p.Dim) throw new RuleLoadException($"The parameter {rule.Id}.{name} is {p.Dim}, but '{text}' is {d}.", span, file);
                    values[p.Index] = v;
                }
            }
            catch (RuleLoadException ex)
            {
                problems.Add(new Notification(NotificationKind.Configuration, rule.Id + ": " + ex.Message, ex.File ?? rule.SourceFile, ex.Span));
                continue;
            }
            rules.Add(rule with { Level = o.Level ?? rule.Level, ParameterValues = values });
        }
        return new RuleLoadResult(rules.ToImmutable(), problems.ToImmutable());
    }

    private CompiledRule? LoadOne(RuleSource source, ImmutableArray<Notification>.Builder problems)
    {
        var loaded = YamlLoader.Load(source.Bytes, source.DisplayPath, source.DisplayPath, LoadLimits.Default);
        var findings = new FindingBuilder(source.DisplayPath);
        foreach (var f in loaded.Findings) findings.Add(f);
        if (loaded.Root is YMapping root)
        {
            if (!source.Trusted) SchemaValidator.Validate(root, schemas.Get(SchemaSet.Rule), findings);
        }
        else if (!findings.HasAny)
        {
            findings.Add(EngineRules.NotAMapping, SourceSpan.FileStart, "", "A rule file is a mapping of keys.");
        }
        if (findings.HasAny)
        {
            foreach (var f in findings.Findings) problems.Add(new Notification(NotificationKind.Configuration, "Rule file: " + f.Message, source.DisplayPath, f.Span) { RuleId = f.RuleId, Values = f.Values });
            return null;
        }
        var r = (YMapping)loaded.Root!;
        string Text(string key) => (r[key] as YScalar)?.Value ?? "";
        var id = Text("id");
        try
        {
            var parameters = ImmutableArray.CreateBuilder<RuleParameter>();
            if (r["parameters"] is YMapping pm)
            {
                foreach (var e in pm.Entries)
                {
                    var body = (YMapping)e.Value;
                    var def = (YScalar)body["default"]!;
                    var (value, dim, percent) = ParameterValue(def.Value, def.Span);
                    var p = new RuleParameter(e.Key.Value, value, dim, percent, def.Value, (body["meaning"] as YScalar)?.Value ?? "", parameters.Count);
                    parameters.Add(p);
                }
            }
            var values = parameters.Select(p => p.Default).ToArray();
            var paramScope = parameters.ToDictionary(p => p.Name, p => (p.Index, ExprType.Num(p.Dim), p.Percent), StringComparer.Ordinal);
            var forEach = r["for_each"] is YScalar;
            var lets = ImmutableArray.CreateBuilder<(string, Compiled)>();
            var letScope = new Dictionary<string, (int, ExprType, bool)>(StringComparer.Ordinal);
            if (r["let"] is YMapping lm)
            {
                foreach (var e in lm.Entries)
                {
                    var c = CompileAt((YScalar)e.Value, new Scope(paramScope, letScope, forEach), loaded);
                    if (letScope.ContainsKey(e.Key.Value) || paramScope.ContainsKey(e.Key.Value)) throw new RuleLoadException($"The name '{e.Key.Value}' is already used.", e.Key.Span);
                    letScope[e.Key.Value] = (lets.Count, c.Type, c.Percent);
                    lets.Add((e.Key.Value, c));
                }
            }
            var scope = new Scope(paramScope, letScope, forEach);
            Compiled? when = null;
            if (r["when"] is YScalar w)
            {
                when = w.Type == ScalarType.Bool ? null : CompileAt(w, scope, loaded);
                if (when is not null && when.Type.Kind != ValKind.Bool) throw new RuleLoadException($"'when' must be true or false, not {when.Type}.", w.Span);
            }
            var checkNode = (YScalar)r["check"]!;
            var check = CheckOf(ParseAt(checkNode, loaded), scope, checkNode, loaded);
            var message = Text("message");
            foreach (var hole in MessageTemplate.Holes(message))
            {
                var known = hole is "actual" or "limit" or "margin" or "margin_ratio" or "subject" or "item.setting"
                    || paramScope.ContainsKey(hole) || letScope.ContainsKey(hole);
                if (!known) throw new RuleLoadException($"The message names '{{{hole}}}', which is not a value of this rule (actual, limit, margin, margin_ratio, subject, its parameters and lets).", r.Find("message")!.Value.Span);
            }
            var tags = r["tags"] is YSequence ts ? ts.Items.OfType<YScalar>().Select(t => t.Value).ToImmutableArray() : [];
            var basis = r["basis"] is YSequence bs ? bs.Items.OfType<YScalar>().Select(t => t.Value).ToList() : [];
            var severity = Levels.Parse(Text("severity")) ?? Level.Warning;
            var descriptor = new RuleDescriptor(id, NameOf(Text("title")), Text("title"), Text("summary"),
                Help(Text("title"), Text("rationale"), basis, parameters, values), severity, tags);
            var level = severity;
            var subject = Text("subject");
            return new CompiledRule(descriptor, source.DisplayPath, level, parameters.ToImmutable(), values, lets.ToImmutable(), when, check, subject, message, forEach, r.Find("id")!.Value.Span, [.. basis]);
        }
        catch (RuleLoadException ex)
        {
            problems.Add(new Notification(NotificationKind.Configuration, (id.Length > 0 ? id + ": " : "") + ex.Message, ex.File ?? source.DisplayPath, ex.Span));
            return null;
        }
    }

    private CheckNode CheckOf(Expr e, Scope scope, YScalar node, LoadedFile file)
    {
        switch (e)
        {
            case Binary { Op: "and" } b:
                return new AndNode(CheckOf(b.Left, scope, node, file), CheckOf(b.Right, scope, node, file));
            case Binary { Op: "or" } b:
                return new OrNode(CheckOf(b.Left, scope, node, file), CheckOf(b.Right, scope, node, file));
            case Binary { Op: "<" or "<=" or ">" or ">=" or "==" or "!=" } b:
            {
                CompileExpr(b, scope, node, file); // type-checks the comparison itself (seconds against amperes)
                var l = CompileExpr(b.Left, scope, node, file);
                var r = CompileExpr(b.Right, scope, node, file);
                return new ComparisonNode(b.Op, l, r);
            }
            default:
            {
                var c = CompileExpr(e, scope, node, file);
                if (c.Type.Kind != ValKind.Bool) throw new RuleLoadException($"'check' must be true or false, not {c.Type}.", node.Span);
                return new PlainNode(c);
            }
        }
    }

    private Compiled CompileAt(YScalar node, Scope scope, LoadedFile file) =>
        CompileExpr(ParseAt(node, file), scope, node, file);

    private Compiled CompileExpr(Expr e, Scope scope, YScalar node, LoadedFile file)
    {
        try
        {
            return _compiler.Compile(e, scope);
        }
        catch (RuleSyntaxException ex)
        {
            throw new RuleLoadException(ex.Message, SpanAt(node, ex.Offset, file));
        }
    }

    private static Expr ParseAt(YScalar node, LoadedFile file)
    {
        try
        {
            return ExpressionParser.Parse(node.Value);
        }
        catch (RuleSyntaxException ex)
        {
            throw new RuleLoadException(ex.Message, SpanAt(node, ex.Offset, file));
        }
    }

    /// <summary>The file position of an offset in a scalar's text (exact for one-line scalars).</summary>
    private static SourceSpan SpanAt(YScalar node, int offset, LoadedFile file)
    {
        var text = node.Value;
        var line = node.Span.StartLine;
        var col = node.Span.StartColumn + (node.Style == ScalarStyle.Quoted ? 1 : 0);
        if (node.Style == ScalarStyle.Block)
        {
            line++;
            var l = line - 1 < file.Lines.Count ? file.Lines[line - 1] : "";
            col = l.Length - l.TrimStart().Length + 1;
        }
        for (var i = 0; i < offset && i < text.Length; i++)
        {
            if (text[i] == '\n')
            {
                line++;
                var l = line - 1 < file.Lines.Count ? file.Lines[line - 1] : "";
                col = l.Length - l.TrimStart().Length + 1;
            }
            else
            {
                col++;
            }
        }
        return SourceSpan.At(line, col);
    }

    /// <summary>Reads a parameter value: a plain number or a number with an absolute unit.</summary>
    private static (double Value, Dim Dim, bool Percent) ParameterValue(string text, SourceSpan span, string? file = null)
    {
        var t = text.Trim();
        var cut = t.IndexOf(' ', StringComparison.Ordinal);
        var numberText = cut < 0 ? t : t[..cut];
        if (!QuantityParser.TryNumber(numberText, out var n)) throw new RuleLoadException($"'{text}' is not a number, or a number and a unit.", span, file);
        if (cut < 0) return (n, Dim.None, false);
        var unitText = t[(cut + 1)..].Trim();
        if (!Unit.All.TryGetValue(unitText, out var unit) || unit.Basis != UnitBasis.Absolute)
        {
            throw new RuleLoadException($"'{unitText}' is not a unit a parameter can have (A, kA, V, kV, ms, s, min, h, hp, kW, MW, ohm, Hz, %).", span, file);
        }
        return (n * unit.Factor, Dim.Of(unit.Dimension), unit.Symbol == "%");
    }

    private static string NameOf(string title)
    {
        var words = title.Split([' ', '-', ',', '.', '(', ')', '/', ':'], StringSplitOptions.RemoveEmptyEntries);
        var name = string.Concat(words.Take(8).Select(w => char.ToUpperInvariant(w[0]) + w[1..]));
        return new string(name.Where(char.IsAsciiLetterOrDigit).ToArray());
    }

    private static string Help(string title, string rationale, IReadOnlyList<string> basis, IEnumerable<RuleParameter> parameters, double[] values)
    {
        var sb = new System.Text.StringBuilder();
        sb.Append("**").Append(title).Append("**\n\n").Append(rationale.Trim()).Append("\n\n**Basis:** ").Append(string.Join("; ", basis)).Append('\n');
        var ps = parameters.ToList();
        if (ps.Count > 0)
        {
            sb.Append("\n**Parameters:**\n");
            foreach (var p in ps) sb.Append("- `").Append(p.Name).Append("` = ").Append(p.Format(values[p.Index])).Append(": ").Append(p.Meaning).Append('\n');
        }
        sb.Append('\n').Append(Caution.Text);
        return sb.ToString();
    }

    internal static string Invariant(double v) => v.ToString(CultureInfo.InvariantCulture);
}

/// <summary>A problem in a rule file or its configuration, at a position.</summary>
internal sealed class RuleLoadException(string message, SourceSpan span, string? file = null) : Exception(message)
{
    public SourceSpan Span { get; } = span;

    public string? File { get; } = file;
}

/// <summary>Per-rule configuration: enabled, level, parameter overrides (text, span and file of each).</summary>
public sealed record RuleOverride(bool? Enabled, Level? Level, IReadOnlyDictionary<string, (string Text, SourceSpan Span, string File)>? Parameters);

/// <summary>The configuration's rule settings by id.</summary>
public sealed record RuleOverrides(IReadOnlyDictionary<string, RuleOverride> ById)
{
    public RuleOverride? For(string id) => ById.GetValueOrDefault(id);
}
