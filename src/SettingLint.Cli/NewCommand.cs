using System.CommandLine;
using System.Text;
using SettingLint.Core.Discovery;
using SettingLint.Core.Findings;
using SettingLint.Core.Validation;
using SettingLint.Sheets.Import;
using SettingLint.Sheets.Skeleton;
using SettingLint.Sheets.Tables;

namespace SettingLint.Cli;

/// <summary>`settinglint new motor|bus|relay-model TAG`: a commented skeleton of a new setting file.</summary>
public static class NewCommand
{
    /// <summary>The kinds by the names the command takes: a motor-protection file is a "motor".</summary>
    public static IReadOnlyList<(string Name, string Kind)> Kinds { get; } =
        [.. SchemaSet.SettingKinds.Select(k => (k == SchemaSet.MotorProtection ? "motor" : k, k))];

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var kind = new Argument<string>("kind") { Description = "What to make: " + string.Join(", ", Kinds.Select(k => k.Name)) + "." };
        kind.AcceptOnlyFromAmong([.. Kinds.Select(k => k.Name)]);
        var tag = new Argument<string>("tag") { Description = "The equipment tag; the file is named from it (P-101 makes p-101.yaml)." };
        var outDir = new Option<string>("--out") { Description = "The folder to write the file in (default: the current folder).", DefaultValueFactory = _ => "." };
        var bus = new Option<string?>("--bus") { Description = "For a motor: the bus file it is fed from; written as a path relative to the new file." };
        var command = new Command("new",
            "Write a new setting file with every key of its kind under its description from the schema: required keys empty to fill in, optional ones commented out.")
        {
            kind, tag, outDir, bus,
        };
        command.SetAction(parse => Execute(parse.GetValue(kind)!, parse.GetValue(tag)!, parse.GetValue(outDir) ?? ".", parse.GetValue(bus), stdout, stderr));
        return command;
    }

    /// <summary>Writes the skeleton; 0 when written, 2 when the tag makes no file name, the file exists or the bus is not one.</summary>
    public static int Execute(string kindName, string tag, string outDir, string? bus, TextWriter stdout, TextWriter stderr)
    {
        var kind = Kinds.First(k => k.Name == kindName).Kind;
        if (SheetFiles.FileName(tag) is not { } name)
        {
            stderr.WriteLine($"settinglint: new: the tag '{tag}' makes no file name; a tag needs a letter or digit.");
            return ExitCodes.Usage;
        }
        var dir = Path.GetFullPath(outDir);
        var file = Path.Combine(dir, name);
        if (File.Exists(file))
        {
            stderr.WriteLine($"settinglint: new: {Path.GetRelativePath(Directory.GetCurrentDirectory(), file)} exists already; it is not overwritten.");
            return ExitCodes.Usage;
        }
        var filled = new Dictionary<string, string>(StringComparer.Ordinal);
        if (bus is not null)
        {
            var busKind = SheetFiles.ReferencedKind("bus");
            if (kind != SchemaSet.MotorProtection || busKind is null)
            {
                stderr.WriteLine("settinglint: new: --bus goes with a motor.");
                return ExitCodes.Usage;
            }
            var full = Path.GetFullPath(bus);
            if (!File.Exists(full) || RepositoryFiles.KindOf(full) != busKind)
            {
                stderr.WriteLine($"settinglint: new: --bus: {bus} is not a bus file (a YAML file with 'kind: bus').");
                return ExitCodes.Usage;
            }
            filled["bus"] = YamlText.Scalar(Path.GetRelativePath(dir, full).Replace('\\', '/'), text: true);
        }
        var schemaFile = Path.Combine(RepositoryRoot.Find(dir), "schema", kind + ".schema.json");
        var header = File.Exists(schemaFile) ? Path.GetRelativePath(dir, schemaFile).Replace('\\', '/') : SkeletonWriter.SchemaId(kind);
        Directory.CreateDirectory(dir);
        File.WriteAllText(file, SkeletonWriter.Write(kind, tag, header, filled), new UTF8Encoding(false));
        stdout.WriteLine($"settinglint: wrote {Path.GetRelativePath(Directory.GetCurrentDirectory(), file)}; fill in the keys left empty, then run 'settinglint check'.");
        return ExitCodes.Clean;
    }
}
