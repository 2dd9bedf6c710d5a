using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Sources;
using SettingLint.Reporting.Html;
using SettingLint.Sheets.SettingSheets;

namespace SettingLint.Cli;

/// <summary>The options of `sheet`, parsed once.</summary>
/// <param name="Paths">Files or folders of the motors.</param>
/// <param name="Output">The file to write; its extension chooses CSV, XLSX or HTML.</param>
/// <param name="Format">setting (the technician's sheet) or import (the motor list that `import --update` reads back).</param>
/// <param name="Motor">One motor's tag, or null for all.</param>
/// <param name="ChangedSince">A git revision: only the settings changed since, old beside new.</param>
public sealed record SheetOptionsRecord(IReadOnlyList<string> Paths, string Output, string Format, string? Motor, string? ChangedSince);

/// <summary>`settinglint sheet [PATH...] --output FILE`: the settings as a technician keys them into the relay.</summary>
public static class SheetCommand
{
    /// <summary>The sheet's caution: the one the reports carry.</summary>
    public static string Caution => "Caution: " + HtmlReport.Caution;

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var paths = new Argument<string[]>("paths") { Description = "Files or folders of the motors (default: the current folder).", Arity = ArgumentArity.ZeroOrMore };
        var output = new Option<string>("--output", "-o") { Description = "The file to write: .csv, .xlsx or .html.", Required = true };
        var format = new Option<string>("--format", "-f") { Description = "setting: one row per motor and setting with primary and secondary values; import: one row per motor in the form 'import --update' reads back (.csv or .xlsx).", DefaultValueFactory = _ => "setting" };
        format.AcceptOnlyFromAmong("setting", "import");
        var motor = new Option<string?>("--motor") { Description = "Only the motor with this tag." };
        var changedSince = new Option<string?>("--changed-since") { Description = "Only the settings changed since this git revision, old and new side by side." };
        var command = new Command("sheet",
            "Write a setting sheet: per motor and setting, the value as written, its primary and secondary values (what is keyed into the relay), "
            + "the relay's range and step, and the findings on it.\n\n" + Caution)
        {
            paths, output, format, motor, changedSince,
        };
        command.SetAction(parse =>
        {
            var given = parse.GetValue(paths) ?? [];
            if (given.FirstOrDefault(p => p.StartsWith('-')) is { } bad)
            {
                stderr.WriteLine($"settinglint: unknown option '{bad}'. Try 'settinglint sheet --help'.");
                return ExitCodes.Usage;
            }
            var options = new SheetOptionsRecord(given.Length == 0 ? ["."] : given, parse.GetValue(output)!, parse.GetValue(format) ?? "setting", parse.GetValue(motor), parse.GetValue(changedSince));
            return Execute(options, stdout, stderr);
        });
        return command;
    }

    /// <summary>Checks the motors and writes the sheet; 0 when written, 2 for usage or configuration.</summary>
    public static int Execute(SheetOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        ArgumentNullException.ThrowIfNull(options);
        var extension = Path.GetExtension(options.Output).ToLowerInvariant();
        if (!SheetWriters.Extensions.Contains(extension) || (options.Format == "import" && extension == ".html"))
        {
            stderr.WriteLine($"settinglint: sheet: --output must end in {(options.Format == "import" ? ".csv or .xlsx" : ".csv, .xlsx or .html")}.");
            return ExitCodes.Usage;
        }
        if (options.Format == "import" && options.ChangedSince is not null)
        {
            stderr.WriteLine("settinglint: sheet: --changed-since goes with the setting sheet, not --format import.");
            return ExitCodes.Usage;
        }
        var (result, motors) = Run(options.Paths);
        var problems = result.Notifications.Where(n => n.Kind == NotificationKind.Configuration).ToList();
        if (problems.Count > 0)
        {
            foreach (var n in problems) stderr.WriteLine("settinglint: error: " + n.Message);
            return ExitCodes.Usage;
        }
        if (options.Motor is { } tag)
        {
            motors = [.. motors.Where(m => m.Tag == tag)];
            if (motors.IsEmpty)
            {
                stderr.WriteLine($"settinglint: sheet: no motor has the tag '{tag}'.");
                return ExitCodes.Usage;
            }
        }
        try
        {
            if (options.Format == "import")
            {
                var (header, rows) = ImportSheet.Build(motors.Select(m => m.Document.Path));
                SheetWriters.Write(options.Output, null, header, rows, "Motors");
                stdout.WriteLine($"settinglint: wrote {Count(rows.Count, "motor")} to {options.Output} (for 'settinglint import --update').");
                return ExitCodes.Clean;
            }
            var sheet = SheetBuilder.Rows(motors, result);
            var changes = options.ChangedSince is not null;
            if (options.ChangedSince is { } revision) sheet = SheetBuilder.Changes(sheet, Before(result.RepositoryRoot, options, revision));
            SheetWriters.Write(options.Output, Caution, SheetColumns.Header(changes), sheet.Select(r => SheetColumns.Cells(r, changes)),
                options.Motor is { } one ? "Settings of " + one : "Settings");
            stdout.WriteLine($"settinglint: wrote {Count(sheet.Length, "setting")} of {Count(sheet.Select(r => r.Tag).Distinct().Count(), "motor")} to {options.Output}.");
            stdout.WriteLine(Caution);
            return ExitCodes.Clean;
        }
        catch (GitException ex)
        {
            stderr.WriteLine("settinglint: --changed-since: " + ex.Message);
            return ExitCodes.Usage;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            stderr.WriteLine($"settinglint: sheet: cannot write '{options.Output}': {ex.Message}");
            return ExitCodes.Usage;
        }
    }

    private static (CheckResult Result, ImmutableArray<MotorProtection> Motors) Run(IReadOnlyList<string> paths, IFileSource? source = null)
    {
        var motors = new ConcurrentDictionary<string, MotorProtection>(StringComparer.Ordinal);
        var result = EngineRun.Check(paths, m => motors.TryAdd(m.Document.RelativePath, m), source);
        // Only the motors that were checked: a motor loaded as another's reference is not on the sheet.
        return (result, [.. motors.Values.OrderBy(m => m.Document.RelativePath, StringComparer.Ordinal)]);
    }

    /// <summary>The same sheet over the repository as it was at the revision, read through git without a copy.</summary>
    private static ImmutableArray<SheetRow> Before(string root, SheetOptionsRecord options, string revision)
    {
        var then = GitRevisionSource.At(root, revision);
        var cwd = Directory.GetCurrentDirectory();
        var old = options.Paths.Where(p => then.Probe(SourcePaths.Absolute(p, cwd)) is EntryKind.File or EntryKind.Folder).ToList();
        if (old.Count == 0) return [];
        var (result, motors) = Run(old, then);
        if (options.Motor is { } tag) motors = [.. motors.Where(m => m.Tag == tag)];
        return SheetBuilder.Rows(motors, result, then.Read);
    }

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}
