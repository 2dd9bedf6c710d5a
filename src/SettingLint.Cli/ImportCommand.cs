using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Reporting;
using SettingLint.Sheets.Import;
using SettingLint.Sheets.Tables;

namespace SettingLint.Cli;

/// <summary>`settinglint import FILE --out DIR`: a motor list (CSV or XLSX) into motor-protection files, one per row.</summary>
public static class ImportCommand
{
    /// <summary>The report formats of import's problems and of the check that follows.</summary>
    public static readonly string[] Formats = ["text", "sarif"];

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var file = new Argument<string>("file") { Description = "The motor list: a CSV file (comma or semicolon, UTF-8) or an XLSX workbook." };
        var outDir = new Option<string>("--out") { Description = "The folder of the new motor files (one per row, named from the tag).", Required = true };
        var sheet = new Option<string?>("--sheet") { Description = "The sheet of an XLSX workbook to read (default: the first)." };
        var map = new Option<string?>("--map") { Description = "A YAML file mapping the sheet's headers to key paths ('columns:', then 'Header: key.path [unit]' or 'Header: ignore')." };
        var update = new Option<bool>("--update") { Description = "Change the values the sheet holds in files that exist; comments and other keys are kept. Without it an existing file is an error." };
        var skip = new Option<bool>("--skip-bad-rows") { Description = "Write the rows without problems even when other rows have some (by default nothing is written)." };
        var format = new Option<string>("--format", "-f") { Description = "Report format: text or sarif (problems located at their cells).", DefaultValueFactory = _ => "text" };
        format.AcceptOnlyFromAmong(Formats);
        var output = new Option<string?>("--output", "-o") { Description = "Write the report to this file instead of standard output." };
        var command = new Command("import",
            "Write one motor-protection file per row of a motor list. The header names key paths of the contract (motor.full_load_current [A]); "
            + "every problem is reported at its cell, and nothing is written while any row has one. The files written are checked at once.")
        {
            file, outDir, sheet, map, update, skip, format, output,
        };
        command.SetAction(parse =>
        {
            var options = new ImportOptions(parse.GetValue(file)!, parse.GetValue(outDir)!, parse.GetValue(sheet), parse.GetValue(map), parse.GetValue(update), parse.GetValue(skip));
            return Execute(options, parse.GetValue(format) ?? "text", parse.GetValue(output), stdout, stderr);
        });
        return command;
    }

    /// <summary>Plans, writes and checks; 0 clean, 1 problems or findings, 2 a sheet or map that cannot be read.</summary>
    public static int Execute(ImportOptions options, string format, string? output, TextWriter stdout, TextWriter stderr)
    {
        ArgumentNullException.ThrowIfNull(options);
        ImportPlan plan;
        try
        {
            plan = Importer.Plan(options);
        }
        catch (SheetReadException ex)
        {
            stderr.WriteLine("settinglint: import: " + ex.Message);
            return ExitCodes.Usage;
        }
        var context = new ReportContext(Directory.GetCurrentDirectory(), false, false, ToolInfo.ForVersion(CheckCommand.Version));
        var problems = new CheckResult(plan.Root, [.. plan.Problems.Order(Finding.Order)], EngineRules.All, [], 0, Level.Error);
        if (plan.Files.IsEmpty)
        {
            Report(problems, format, output, context, stdout);
            stderr.WriteLine(plan.Problems.IsEmpty
                ? "settinglint: import: the sheet has no rows; nothing written."
                : $"settinglint: import: {Count(plan.BadRows.Length, "row")} with problems{(plan.SheetBroken ? " or a header that cannot be read" : "")}; nothing written{(options.SkipBadRows || plan.SheetBroken ? "" : " (--skip-bad-rows writes the other rows)")}.");
            return plan.Problems.IsEmpty ? ExitCodes.Clean : ExitCodes.Findings;
        }
        Write(plan.Files);
        var skipped = plan.BadRows.IsEmpty ? "" : "; " + Count(plan.BadRows.Length, "row") + " with problems skipped (" + string.Join(", ", plan.BadRows) + ")";
        stderr.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"settinglint: import: {plan.Files.Count(f => f.Change == FileChange.New)} new, {plan.Files.Count(f => f.Change == FileChange.Updated)} updated, {plan.Files.Count(f => f.Change == FileChange.Unchanged)} unchanged{skipped}."));
        var result = EngineRun.Check([.. plan.Files.Select(f => f.FullPath)]);
        if (!plan.Problems.IsEmpty)
        {
            if (result.RepositoryRoot == plan.Root) result = result with { Findings = [.. result.Findings.Concat(plan.Problems).Order(Finding.Order)] };
            else Report(problems, "text", null, context, stderr);
        }
        Report(result, format, output, context, stdout);
        return Math.Max(result.ExitCode, plan.Problems.IsEmpty ? ExitCodes.Clean : ExitCodes.Findings);
    }

    /// <summary>Writes every file to a temporary name beside it first, then moves each into place: a failure leaves no half-written file.</summary>
    private static void Write(ImmutableArray<PlannedFile> files)
    {
        var staged = new List<(string Temp, string Target)>();
        try
        {
            foreach (var f in files.Where(f => f.Change != FileChange.Unchanged))
            {
                Directory.CreateDirectory(Path.GetDirectoryName(f.FullPath)!);
                var temp = f.FullPath + ".settinglint-import.tmp";
                File.WriteAllText(temp, f.Text, new UTF8Encoding(false));
                staged.Add((temp, f.FullPath));
            }
            foreach (var (temp, target) in staged) File.Move(temp, target, overwrite: true);
        }
        finally
        {
            foreach (var (temp, _) in staged)
            {
                if (File.Exists(temp)) File.Delete(temp);
            }
        }
    }

    private static void Report(CheckResult result, string format, string? output, ReportContext context, TextWriter stdout)
    {
        var reporter = Reporters.For(format);
        if (output is null)
        {
            reporter.Write(result, context, stdout);
            return;
        }
        var dir = Path.GetDirectoryName(Path.GetFullPath(output));
        if (dir is not null) Directory.CreateDirectory(dir);
        using var writer = new StreamWriter(output, append: false, new UTF8Encoding(false));
        reporter.Write(result, context, writer);
    }

    private static string Count(int n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}
