using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;
using SettingLint.Reporting;

namespace SettingLint.Cli;

/// <summary>The options of `fix`.</summary>
/// <param name="Paths">Files or folders whose findings to fix.</param>
/// <param name="Rules">Fix only the findings of these rules; empty for all.</param>
/// <param name="DryRun">Print a unified diff instead of writing.</param>
public sealed record FixOptionsRecord(IReadOnlyList<string> Paths, IReadOnlySet<string> Rules, bool DryRun)
{
    /// <summary>Fix only the files `check --changed-since REV` would check, as they are in the working tree.</summary>
    public string? ChangedSince { get; init; }

    /// <summary>Fix only the files `check --staged` would check, from their staged contents (a file whose working copy differs is left alone).</summary>
    public bool Staged { get; init; }
}

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
        var changedSince = new Option<string?>("--changed-since") { Description = "Fix only the setting files `check --changed-since` would check: those changed since this git revision and the files that depend on them." };
        var staged = new Option<bool>("--staged") { Description = "Fix only the files `check --staged` would check, as staged; the fixed files are written to the working tree (stage them to commit the fix)." };
        var command = new Command("fix", "Rewrite settings that rules find wrong with a value every rule on the setting accepts, on the relay's step, in the file's own unit.\n\n" + CliApp.Caution)
        {
            paths, rule, dryRun, changedSince, staged,
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
            return Execute(new FixOptionsRecord(given.Length == 0 ? ["."] : given, rules, parse.GetValue(dryRun))
            {
                ChangedSince = parse.GetValue(changedSince),
                Staged = parse.GetValue(staged),
            }, stdout, stderr);
        });
        return command;
    }

    /// <summary>Plans, verifies and writes the fixes; 0 when done (whatever remains), 2 for usage or configuration, 3 after an internal error.</summary>
    public static int Execute(FixOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        ArgumentNullException.ThrowIfNull(options);
        // The one run of `check` (with --staged or --changed-since, the same files), asked for its suggestions.
        var fixes = new FixesObserver();
        var result = Linter.Check(new CheckRequest(Directory.GetCurrentDirectory(), options.Paths.Count == 0 ? ["."] : options.Paths)
        {
            Options = new GateOptions(ChangedSince: options.ChangedSince, Staged: options.Staged),
            Suggest = true,
            SuggestRules = options.Rules,
            Observers = [fixes],
        });
        foreach (var n in result.Notifications) stderr.WriteLine(Where(n) + (n.Kind == NotificationKind.Internal ? "internal error: " : "error: ") + n.Message);
        if (result.Notifications.Any(n => n.Kind == NotificationKind.Configuration)) return ExitCodes.Usage;
        if (result.Notifications.Any(n => n.Kind == NotificationKind.Internal)) return ExitCodes.Internal;
        var unknown = options.Rules.Where(r => !result.Rules.Any(x => x.Id == r)).Order(StringComparer.Ordinal).ToList();
        if (unknown.Count > 0)
        {
            stderr.WriteLine("settinglint: --rule names a rule that is not loaded: " + string.Join(", ", unknown));
            return ExitCodes.Usage;
        }

        var root = result.RepositoryRoot;
        var set = fixes.Set;
        var changed = 0;
        foreach (var (file, old, text) in set.NewTexts())
        {
            if (options.DryRun)
            {
                stdout.Write(UnifiedDiff.Of(file, old.Text, text));
                continue;
            }
            var full = Path.GetFullPath(Path.Combine(root, file));
            if (!Core.Discovery.RepositoryRoot.Contains(root, full))
            {
                stderr.WriteLine($"settinglint: {file} lies outside the repository; not written.");
                continue;
            }
            // Staged: the fix is of the index's text; a working copy with other changes is not overwritten with it.
            if (options.Staged && !(File.Exists(full) && File.ReadAllBytes(full).AsSpan().SequenceEqual(old.Encode(old.Text))))
            {
                stderr.WriteLine($"settinglint: {file} has changes that are not staged; not written (stage or stash them, then fix again).");
                continue;
            }
            WriteAtomically(full, old.Encode(text));
            changed++;
        }
        foreach (var f in set.Applied)
        {
            stdout.WriteLine($"{f.MotorFile}:{f.Span.StartLine}:{f.Span.StartColumn}: {(options.DryRun ? "would set" : "set")} {f.Setting} {f.OldWritten} -> {f.Written}: {f.Shown(f.OldSi)} -> {f.Shown(f.NewSi)} [{string.Join(", ", f.RuleIds)}]"
                + (f.Preference is { } why ? " (" + why + ")" : ""));
        }
        foreach (var (f, why) in set.Refused)
        {
            stdout.WriteLine($"{f.MotorFile}:{f.Span.StartLine}:{f.Span.StartColumn}: no fix for {f.Setting} ({f.OldWritten}): {why}");
        }
        var files = set.Applied.Select(f => f.MotorFile).Distinct(StringComparer.Ordinal).Count();
        stdout.WriteLine($"settinglint fix: {(options.DryRun ? "would change" : "changed")} {Count(set.Applied.Length, "value")} in {Count(options.DryRun ? files : changed, "file")}; {Count(set.Refused.Length, "setting")} without a fix.");
        if (options.Staged && !options.DryRun && changed > 0) stdout.WriteLine("settinglint fix: the fixed files are written to the working tree; stage them to commit the fix.");
        stdout.WriteLine(CliApp.Caution);
        return ExitCodes.Clean;
    }

    /// <summary>Receives the run's fixes.</summary>
    private sealed class FixesObserver : ICheckObserver
    {
        public SuggestionSet Set { get; private set; } = SuggestionSet.None;

        public void OnFixes(SuggestionSet fixes) => Set = fixes;
    }

    /// <summary>Writes a temporary file beside the target and renames it over, so that an interrupted run leaves the old or the new file.</summary>
    private static void WriteAtomically(string path, byte[] bytes)
    {
        var temp = Path.Combine(Path.GetDirectoryName(path)!, "." + Path.GetFileName(path) + ".settinglint-fix-" + Environment.ProcessId.ToString(CultureInfo.InvariantCulture));
        File.WriteAllBytes(temp, bytes);
        File.Move(temp, path, overwrite: true);
    }

    private static string Where(Notification n) =>
        n.File is null ? "settinglint: " : n.Span is { } s ? $"{n.File}:{s.StartLine}:{s.StartColumn}: " : n.File + ": ";

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}

