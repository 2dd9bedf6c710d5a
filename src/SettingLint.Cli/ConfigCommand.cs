using System.CommandLine;
using SettingLint.Core.Configuration;
using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;

namespace SettingLint.Cli;

/// <summary>`settinglint config show PATH`: the configuration that governs a file, and the file and line of each value.</summary>
public static class ConfigCommand
{
    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var config = new Command("config", "Show the configuration in effect.");
        var path = new Argument<string>("path") { Description = "A setting file (or a folder: the configuration of files directly in it)." };
        var show = new Command("show", "Print the configuration that governs a file, after every .settinglint.yaml from the root configuration down to its folder, and the file and line each value comes from.") { path };
        show.SetAction(parse => Show(parse.GetValue(path)!, stdout, stderr));
        config.Subcommands.Add(show);
        return config;
    }

    private static int Show(string path, TextWriter stdout, TextWriter stderr)
    {
        if (Open(path, stderr) is not var (session, scope, rel)) return ExitCodes.Usage;
        stdout.Write(Describe(rel, session.Scopes!.RootFile, scope.Effective));
        return ExitCodes.Clean;
    }

    /// <summary>
    /// The session of a path and the scope that governs it (a folder: the files directly in it), with the path relative
    /// to the root; null when the path does not exist or the configuration has problems (written to stderr).
    /// </summary>
    internal static (Session Session, ConfigScopes.Scope Scope, string Relative)? Open(string path, TextWriter stderr)
    {
        var full = Path.GetFullPath(path);
        if (!File.Exists(full) && !Directory.Exists(full))
        {
            stderr.WriteLine("settinglint: the path '" + path + "' does not exist.");
            return null;
        }
        var session = Session.Open([full]);
        var rel = RepositoryRoot.Relative(session.Root, full);
        // A folder is shown as the configuration of a file directly in it.
        var asFile = Directory.Exists(full) ? (rel == "." ? "" : rel + "/") + "(file)" : rel;
        var scope = session.Scopes?.For(asFile);
        Report(session, scope, stderr, out var failed);
        return failed || scope is null ? null : (session, scope, rel);
    }

    private static void Report(Session session, ConfigScopes.Scope? scope, TextWriter stderr, out bool failed)
    {
        var problems = session.Problems.AddRange(scope?.Problems ?? []).AddRange(session.Scopes?.Problems ?? []).Distinct().ToList();
        foreach (var p in problems)
        {
            stderr.WriteLine((p.File is null ? "settinglint: " : p.Span is { } s ? $"{p.File}:{s.StartLine}:{s.StartColumn}: " : p.File + ": ") + "error: " + p.Message);
        }
        failed = problems.Count > 0;
    }

    /// <summary>The text of `config show`: one line per value in effect, with where it was written.</summary>
    public static string Describe(string file, ConfigFile? rootFile, EffectiveConfig effective)
    {
        ArgumentNullException.ThrowIfNull(effective);
        var w = new StringWriter { NewLine = "\n" };
        static string From<T>(Placed<T>? p) => p is null ? "default" : p.File + ":" + p.Span.StartLine;
        w.WriteLine("Configuration of " + file);
        w.WriteLine("files (farthest first): " + (effective.Files.IsEmpty ? "none" : string.Join(", ", effective.Files)));
        w.WriteLine();
        w.WriteLine($"fail_on: {rootFile?.FailOn?.Value ?? "error"}  ({From(rootFile?.FailOn)})");
        w.WriteLine($"packs: {(rootFile?.Packs is { } packs ? string.Join(", ", packs.Value) : "builtin")}  ({From(rootFile?.Packs)})");
        w.WriteLine(effective.ElectricalCode is { } code
            ? $"electrical_code: {code.Value}  ({From(code)})"
            : "electrical_code: not declared (NFPA 70 on a bus of 60 Hz or of unstated frequency, none on another)");
        w.WriteLine($"include: {(effective.Include is { } inc ? string.Join(", ", inc.Value) : "every YAML file")}  ({From(effective.Include)})");
        w.WriteLine($"exclude: {(effective.Exclude is { } exc ? string.Join(", ", exc.Value) : "none")}  ({From(effective.Exclude)})");
        foreach (var (id, rule) in effective.Rules)
        {
            if (rule.Enabled is { Value: false } off) w.WriteLine($"rules.{id}: off  ({From(off)})");
            else if (rule.Severity is { } level) w.WriteLine($"rules.{id}: {level.Value.Token()}  ({From(level)})");
            else if (rule.Enabled is { } on) w.WriteLine($"rules.{id}: on  ({From(on)})");
            foreach (var (name, value) in rule.Parameters) w.WriteLine($"rules.{id}.parameters.{name}: {value.Value}  ({From(value)})");
        }
        w.WriteLine(effective.Rules.IsEmpty ? "rules: every rule at its own level, with its own parameters" : "other rules: at their own level, with their own parameters");
        return w.ToString();
    }
}
