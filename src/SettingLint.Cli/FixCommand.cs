using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Gate;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Reporting;
using SettingLint.Reporting.Html;

namespace SettingLint.Cli;

/// <summary>The options of `fix`.</summary>
/// <param name="Paths">Files or folders whose findings to fix.</param>
/// <param name="Rules">Fix only the findings of these rules; empty for all.</param>
/// <param name="DryRun">Print a unified diff instead of writing.</param>
public sealed record FixOptionsRecord(IReadOnlyList<string> Paths, IReadOnlySet<string> Rules, bool DryRun);

/// <summary>
/// `settinglint fix [PATH...]`: writes, for each setting a finding is on, the value that every rule on that setting
/// leaves, in the form the file uses; only values that a second check confirms, and only the number's characters.
/// </summary>
public static class FixCommand
{
    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var paths = new Argument<string[]>("paths") { Description = "Files or folders to fix (default: the current folder).", Arity = ArgumentArity.ZeroOrMore };
        var rule = new Option<string[]>("--rule") { Description = "Fix only the findings of this rule (repeatable), such as --rule SL201.", AllowMultipleArgumentsPerToken = false };
        var dryRun = new Option<bool>("--dry-run") { Description = "Print what would change as a unified diff, and write nothing." };
        var command = new Command("fix", "Rewrite settings that rules find wrong with a value every rule on the setting accepts, on the relay's step, in the file's own unit.\n\n" + CliApp.Caution)
        {
            paths, rule, dryRun,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(paths) ?? [];
            if (given.FirstOrDefault(p => p.StartsWith('-')) is { } bad)
            {
                stderr.WriteLine($"settinglint: unknown option '{bad}'. Try 'settinglint fix --help'.");
                return ExitCodes.Usage;
            }
            var rules = (parse.GetValue(rule) ?? []).ToHashSet(StringComparer.Ordinal);
            return Execute(new FixOptionsRecord(given.Length == 0 ? ["."] : given, rules, parse.GetValue(dryRun)), stdout, stderr);
        });
        return command;
    }

    /// <summary>Plans, verifies and writes the fixes; 0 when done (whatever remains), 2 for usage or configuration, 3 after an internal error.</summary>
    public static int Execute(FixOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        ArgumentNullException.ThrowIfNull(options);
        var session = Session.Open(options.Paths);
        if (!session.Problems.IsEmpty)
        {
            foreach (var p in session.Problems) stderr.WriteLine(Where(p) + "error: " + p.Message);
            return ExitCodes.Usage;
        }
        var unknown = options.Rules.Where(r => !session.Rules.Rules.Any(x => x.Id == r)).Order(StringComparer.Ordinal).ToList();
        if (unknown.Count > 0)
        {
            stderr.WriteLine("settinglint: --rule names a rule that is not loaded: " + string.Join(", ", unknown));
            return ExitCodes.Usage;
        }
        var data = ReportData.Collect(session, options.Paths);
        foreach (var n in data.Result.Notifications) stderr.WriteLine(Where(n) + (n.Kind == NotificationKind.Internal ? "internal error: " : "error: ") + n.Message);
        if (data.Result.Notifications.Any(n => n.Kind == NotificationKind.Configuration)) return ExitCodes.Usage;
        if (data.Result.Notifications.Any(n => n.Kind == NotificationKind.Internal)) return ExitCodes.Internal;

        var root = data.Result.RepositoryRoot;
        var files = new Dictionary<string, FileText?>(StringComparer.Ordinal);
        string? Read(string relative)
        {
            if (!files.TryGetValue(relative, out var f)) files[relative] = f = FileText.Read(Path.Combine(root, relative));
            return f?.Text;
        }
        var motors = data.Motors.ToDictionary(m => m.Document.RelativePath, StringComparer.Ordinal);
        var plan = FixPlanner.Plan(data.Result.Findings, SettingWindows.Derive(data.Outcomes), motors, Read, options.Rules);
        var (applied, refused) = Verify(session, options.Paths, root, data.Result.Findings, plan.Where(f => f.HasValue).ToList(), files);

        var changed = 0;
        foreach (var group in applied.GroupBy(f => f.MotorFile, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal))
        {
            var file = files[group.Key]!;
            var newText = FixPlanner.Apply(file.Text, group);
            if (options.DryRun)
            {
                stdout.Write(UnifiedDiff.Of(group.Key, file.Text, newText));
                continue;
            }
            var full = Path.GetFullPath(Path.Combine(root, group.Key));
            if (!Core.Discovery.RepositoryRoot.Contains(root, full))
            {
                stderr.WriteLine($"settinglint: {group.Key} lies outside the repository; not written.");
                continue;
            }
            file.WriteAtomically(full, newText);
            changed++;
        }
        foreach (var f in applied)
        {
            stdout.WriteLine($"{f.MotorFile}:{f.Span.StartLine}:{f.Span.StartColumn}: {(options.DryRun ? "would set" : "set")} {f.Setting} {f.OldWritten} -> {f.Written}: {f.Shown(f.OldSi)} -> {f.Shown(f.NewSi)} [{string.Join(", ", f.RuleIds)}]");
        }
        foreach (var (f, why) in refused.Concat(plan.Where(f => !f.HasValue).Select(f => (f, f.Reason!))).OrderBy(x => x.Item1.MotorFile, StringComparer.Ordinal).ThenBy(x => x.Item1.Span.StartLine))
        {
            stdout.WriteLine($"{f.MotorFile}:{f.Span.StartLine}:{f.Span.StartColumn}: no fix for {f.Setting} ({f.OldWritten}): {why}");
        }
        var verb = options.DryRun ? "would change" : "changed";
        stdout.WriteLine($"settinglint fix: {verb} {Count(applied.Count, "value")} in {Count(options.DryRun ? applied.Select(f => f.MotorFile).Distinct().Count() : changed, "file")}; {Count(refused.Count + plan.Count(f => !f.HasValue), "setting")} without a fix.");
        stdout.WriteLine(CliApp.Caution);
        return ExitCodes.Clean;
    }

    /// <summary>
    /// Checks the fixed files again, in memory: a fix stays only if no finding is left on its setting and its file gains
    /// no finding it did not have. A file that gains one loses all its fixes (which one caused it cannot be told).
    /// </summary>
    private static (List<SettingFix> Applied, List<(SettingFix Fix, string Why)> Refused) Verify(
        Session session, IReadOnlyList<string> paths, string root, ImmutableArray<Finding> before, List<SettingFix> fixes, Dictionary<string, FileText?> files)
    {
        var refused = new List<(SettingFix, string)>();
        var known = before.Select(f => (f.File, f.RuleId, f.KeyPath)).ToHashSet();
        for (var round = 0; round < 3 && fixes.Count > 0; round++)
        {
            var contents = fixes.GroupBy(f => f.MotorFile, StringComparer.Ordinal)
                .ToImmutableDictionary(g => g.Key, g => files[g.Key]!.Encode(FixPlanner.Apply(files[g.Key]!.Text, g)), StringComparer.Ordinal);
            var overlay = new FileOverlay(contents, []);
            var after = new Checker(session.Rules).Run(new CheckOptions(paths, Root: root, Include: session.Config.Includes, Overlay: overlay)).Findings;
            var bad = new List<(SettingFix, string)>();
            foreach (var fix in fixes)
            {
                var left = after.FirstOrDefault(f => f.File == fix.MotorFile && f.KeyPath == fix.Setting && f.Suppression is null);
                var gained = after.FirstOrDefault(f => f.File == fix.MotorFile && f.Suppression is null && !known.Contains((f.File, f.RuleId, f.KeyPath)));
                if (left is not null) bad.Add((fix, $"{fix.Written} still gets {left.RuleId}: {left.Message}"));
                else if (gained is not null) bad.Add((fix, $"the file would gain {gained.RuleId} at {gained.KeyPath}: {gained.Message}"));
            }
            if (bad.Count == 0) break;
            refused.AddRange(bad);
            var drop = bad.Select(b => b.Item1).ToHashSet();
            fixes = [.. fixes.Where(f => !drop.Contains(f))];
        }
        return (fixes, refused);
    }

    private static string Where(Notification n) =>
        n.File is null ? "settinglint: " : n.Span is { } s ? $"{n.File}:{s.StartLine}:{s.StartColumn}: " : n.File + ": ";

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}

/// <summary>A file's text with what is needed to write it back byte for byte apart from the edits: its byte order mark.</summary>
internal sealed class FileText(string text, bool bom)
{
    private static readonly UTF8Encoding Utf8 = new(false, true);

    public string Text { get; } = text;

    public static FileText? Read(string path)
    {
        if (!File.Exists(path)) return null;
        var bytes = File.ReadAllBytes(path);
        var bom = bytes.Length >= 3 && bytes[0] == 0xEF && bytes[1] == 0xBB && bytes[2] == 0xBF;
        try
        {
            return new FileText(Utf8.GetString(bytes, bom ? 3 : 0, bytes.Length - (bom ? 3 : 0)), bom);
        }
        catch (DecoderFallbackException)
        {
            return null;
        }
    }

    public byte[] Encode(string text)
    {
        var body = Utf8.GetBytes(text);
        return bom ? [0xEF, 0xBB, 0xBF, .. body] : body;
    }

    /// <summary>Writes a temporary file beside the target and renames it over, so that an interrupted run leaves the old or the new file.</summary>
    public void WriteAtomically(string path, string text)
    {
        var temp = Path.Combine(Path.GetDirectoryName(path)!, "." + Path.GetFileName(path) + ".settinglint-fix-" + Environment.ProcessId.ToString(CultureInfo.InvariantCulture));
        File.WriteAllBytes(temp, Encode(text));
        File.Move(temp, path, overwrite: true);
    }
}
