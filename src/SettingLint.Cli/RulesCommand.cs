using System.CommandLine;
using System.Text.Json;
using SettingLint.Core.Configuration;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Rules;

namespace SettingLint.Cli;

/// <summary>`settinglint rules list|show|test`.</summary>
public static class RulesCommand
{
    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var rules = new Command("rules", "List, explain and test the rules.");
        var format = new Option<string>("--format", "-f") { Description = "text or json.", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong("text", "json");
        Option<string?> ForOption() => new("--for")
        {
            Description = "A setting file or folder: the rules as its folder's configuration sets them (each .settinglint.yaml from the root configuration down), not the root configuration's.",
        };
        var listFor = ForOption();
        var list = new Command("list", "List the rules in effect here (or for a file or folder with --for): id, severity, title.") { format, listFor };
        list.SetAction(parse => List(parse.GetValue(format) == "json", parse.GetValue(listFor), stdout, stderr));
        var id = new Argument<string>("id") { Description = "A rule id such as SL201." };
        var showFor = ForOption();
        var show = new Command("show", "Explain a rule: rationale, basis, parameters with defaults and the values in effect here (or for a file or folder with --for).") { id, showFor };
        show.SetAction(parse => Show(parse.GetValue(id)!, parse.GetValue(showFor), stdout, stderr));
        var dir = new Argument<string?>("dir")
        {
            Description = "A rule pack folder or one rule's folder; without it, every pack the configuration here names (the built-in pack's fixtures when its rules/ folder is at the root).",
            Arity = ArgumentArity.ZeroOrOne,
        };
        var test = new Command("test", "Run rule fixtures: '# expect: SLnnn' on the line before each expected finding.") { dir };
        test.SetAction(parse => parse.GetValue(dir) is { } folder ? Test(folder, stdout, stderr) : TestConfigured(stdout, stderr));
        var catalogue = new Command("catalogue", "Print the markdown catalogue of the rules in effect (rules/README.md).");
        catalogue.SetAction(_ =>
        {
            if (Open(stderr) is not { } session) return ExitCodes.Usage;
            stdout.Write(Catalogue.Render(session.Rules.Rules));
            return ExitCodes.Clean;
        });
        var functions = new Command("functions", "Print the markdown table of the functions a rule may call (docs/rule-language.md).");
        functions.SetAction(_ =>
        {
            stdout.Write(FunctionTable.Render());
            return ExitCodes.Clean;
        });
        rules.Subcommands.Add(list);
        rules.Subcommands.Add(catalogue);
        rules.Subcommands.Add(functions);
        rules.Subcommands.Add(show);
        rules.Subcommands.Add(test);
        return rules;
    }

    private static Session? Open(TextWriter stderr)
    {
        var session = Session.Open([Directory.GetCurrentDirectory()]);
        if (session.Problems.IsEmpty) return session;
        foreach (var p in session.Problems) stderr.WriteLine(Where(p) + "error: " + p.Message);
        return null;
    }

    private static string Where(Notification n) =>
        n.File is null ? "settinglint: " : n.Span is { } s ? $"{n.File}:{s.StartLine}:{s.StartColumn}: " : n.File + ": ";

    /// <summary>What `rules list` and `rules show` describe: the rules of the root configuration, or those of a path's folder.</summary>
    private sealed record View(Session Session, IReadOnlyList<CompiledRule> Rules, ConfigScopes.Scope? Scope, string? For);

    private static View? OpenView(string? forPath, TextWriter stderr)
    {
        if (forPath is null) return Open(stderr) is { } session ? new View(session, session.Rules.Rules, null, null) : null;
        if (ConfigCommand.Open(forPath, stderr) is not var (s, scope, rel)) return null;
        return new View(s, scope.Rules, scope, rel);
    }

    // With --for: which path, which configuration files and which governing code (a rule's `when:` may read it).
    private static void WriteHeader(View view, TextWriter stdout)
    {
        if (view.Scope is not { } scope) return;
        var files = scope.Effective.Files.IsEmpty ? "none" : string.Join(", ", scope.Effective.Files);
        var code = scope.Effective.ElectricalCode is { } c ? $"{c.Value} ({c.File}:{c.Span.StartLine})" : "not declared";
        stdout.WriteLine($"Rules in effect for {view.For} (configuration: {files}; electrical_code: {code})");
    }

    private static int List(bool json, string? forPath, TextWriter stdout, TextWriter stderr)
    {
        if (OpenView(forPath, stderr) is not { } view) return ExitCodes.Usage;
        var all = EngineRules.All.Select(r => (r.Id, Level: r.DefaultLevel.Token(), r.Title, Tags: string.Join(" ", r.Tags)))
            .Concat(view.Rules.Select(r => (r.Id, Level: r.Level.Token(), r.Descriptor.Title, Tags: string.Join(" ", r.Descriptor.Tags))))
            .OrderBy(r => r.Id, StringComparer.Ordinal).ToList();
        if (json)
        {
            var buffer = new MemoryStream();
            using (var jw = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
            {
                jw.WriteStartArray();
                foreach (var r in all)
                {
                    jw.WriteStartObject();
                    jw.WriteString("id", r.Id);
                    jw.WriteString("severity", r.Level);
                    jw.WriteString("title", r.Title);
                    jw.WriteString("tags", r.Tags);
                    jw.WriteEndObject();
                }
                jw.WriteEndArray();
            }
            stdout.WriteLine(System.Text.Encoding.UTF8.GetString(buffer.ToArray()));
            return ExitCodes.Clean;
        }
        WriteHeader(view, stdout);
        foreach (var r in all) stdout.WriteLine($"{r.Id}  {r.Level,-7}  {r.Title}");
        return ExitCodes.Clean;
    }

    private static int Show(string id, string? forPath, TextWriter stdout, TextWriter stderr)
    {
        if (OpenView(forPath, stderr) is not { } view) return ExitCodes.Usage;
        var rule = view.Rules.FirstOrDefault(r => string.Equals(r.Id, id, StringComparison.OrdinalIgnoreCase));
        if (rule is null)
        {
            var engine = EngineRules.All.FirstOrDefault(r => string.Equals(r.Id, id, StringComparison.OrdinalIgnoreCase));
            if (engine is null)
            {
                stderr.WriteLine($"settinglint: no rule {id}. Try '{SettingLint.Reporting.ToolCommand.Current} rules list'.");
                return ExitCodes.Usage;
            }
            WriteHeader(view, stdout);
            stdout.WriteLine($"{engine.Id} ({engine.DefaultLevel.Token()}): {engine.Title}");
            stdout.WriteLine();
            stdout.WriteLine(engine.HelpText);
            return ExitCodes.Clean;
        }
        var d = rule.Descriptor;
        var set = view.Scope?.Effective.Rules.GetValueOrDefault(rule.Id);
        WriteHeader(view, stdout);
        stdout.WriteLine($"{d.Id} ({rule.Level.Token()}; default {d.DefaultLevel.Token()}): {d.Title}");
        if (set is not null)
        {
            var from = set.Enabled is { Value: false } off ? off.File + ":" + off.Span.StartLine
                : set.Severity is { } sev ? sev.File + ":" + sev.Span.StartLine
                : set.Enabled is { } on ? on.File + ":" + on.Span.StartLine : null;
            if (from is not null) stdout.WriteLine("Level set in: " + from);
        }
        stdout.WriteLine("Tags: " + string.Join(", ", d.Tags) + "    File: " + rule.SourceFile);
        stdout.WriteLine();
        stdout.WriteLine(d.Summary);
        stdout.WriteLine();
        stdout.WriteLine(d.HelpText);
        if (!rule.Parameters.IsEmpty)
        {
            stdout.WriteLine();
            stdout.WriteLine(view.For is null ? "Parameters (default -> in effect here):" : $"Parameters (default -> in effect for {view.For}):");
            foreach (var p in rule.Parameters)
            {
                var from = set?.Parameters.GetValueOrDefault(p.Name) is { } v ? $" ({v.File}:{v.Span.StartLine})" : "";
                stdout.WriteLine($"  {p.Name}: {p.Format(p.Default)} -> {p.Format(rule.ParameterValues[p.Index])}{from}   {p.Meaning}");
            }
        }
        return ExitCodes.Clean;
    }

    private static int Test(string dir, TextWriter stdout, TextWriter stderr)
    {
        if (!Directory.Exists(dir))
        {
            stderr.WriteLine($"settinglint: '{dir}' is not a folder.");
            return ExitCodes.Usage;
        }
        var (results, problems) = FixtureRunner.Run(Path.GetFullPath(dir));
        if (!problems.IsEmpty)
        {
            foreach (var p in problems) stderr.WriteLine(Where(p) + "error: " + p.Message);
            return ExitCodes.Usage;
        }
        var failed = Print(results, stdout);
        stdout.WriteLine($"{results.Length - failed} rules passed, {failed} failed");
        return failed == 0 ? ExitCodes.Clean : ExitCodes.Findings;
    }

    /// <summary>
    /// The fixtures of every pack the configuration here names, in its order. The built-in pack's fixtures are not
    /// shipped with the tool: they are tested when its source folder (rules/ at the root, as in SettingLint's own
    /// repository) is there, and said to be skipped otherwise.
    /// </summary>
    private static int TestConfigured(TextWriter stdout, TextWriter stderr)
    {
        if (Open(stderr) is not { } session) return ExitCodes.Usage;
        var failed = 0;
        var total = 0;
        var broken = false;
        foreach (var pack in session.Config.Packs)
        {
            var folder = pack == RulePacks.BuiltIn ? Path.Combine(session.Root, "rules") : pack;
            var shown = pack == RulePacks.BuiltIn ? "builtin" : Core.Discovery.RepositoryRoot.Relative(session.Root, pack);
            if (pack == RulePacks.BuiltIn && !File.Exists(Path.Combine(folder, "SL201", "rule.yaml")))
            {
                stdout.WriteLine("pack builtin: its fixtures are not installed with the tool (they are in SettingLint's source, rules/); not tested");
                continue;
            }
            stdout.WriteLine($"pack {shown}:");
            var (results, problems) = FixtureRunner.Run(folder);
            if (!problems.IsEmpty)
            {
                foreach (var p in problems) stderr.WriteLine(Where(p) + "error: " + p.Message);
                broken = true;
                continue;
            }
            failed += Print(results, stdout);
            total += results.Length;
        }
        stdout.WriteLine($"{total - failed} rules passed, {failed} failed");
        return broken ? ExitCodes.Usage : failed == 0 ? ExitCodes.Clean : ExitCodes.Findings;
    }

    // One line per passing rule, the details of each failing one; returns how many failed.
    private static int Print(IEnumerable<FixtureResult> results, TextWriter stdout)
    {
        var failed = 0;
        foreach (var r in results)
        {
            if (r.Passed)
            {
                stdout.WriteLine($"ok    {r.RuleId}  ({r.Expected} expected, {r.CheckedValues} values checked)");
                continue;
            }
            failed++;
            stdout.WriteLine($"FAIL  {r.RuleId}");
            foreach (var m in r.Missed) stdout.WriteLine($"      missed:     {m}");
            foreach (var u in r.Unexpected) stdout.WriteLine($"      unexpected: {u}");
            foreach (var w in r.WrongValues) stdout.WriteLine($"      value:      {w}");
            foreach (var w in r.WrongNotRun) stdout.WriteLine($"      not run:    {w}");
            foreach (var p in r.Problems) stdout.WriteLine($"      problem:    {p}");
        }
        return failed;
    }
}
