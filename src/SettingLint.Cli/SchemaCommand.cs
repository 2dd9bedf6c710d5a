using System.CommandLine;
using SettingLint.Core.Findings;
using SettingLint.Core.Validation;

namespace SettingLint.Cli;

/// <summary>
/// `settinglint schema --output DIR`: writes the JSON Schemas this version validates with (each with its stable `$id`)
/// and prints the first line that makes an editor with the YAML language server check a setting file against them.
/// </summary>
public static class SchemaCommand
{
    /// <summary>The comment the YAML language server reads on a file's first lines to choose its schema.</summary>
    public const string HeaderPrefix = "# yaml-language-server: $schema=";

    /// <summary>The schemas written, in the order printed: the setting files, then the configuration and the rule file.</summary>
    public static IReadOnlyList<string> Names { get; } = [.. SchemaSet.SettingKinds, SchemaSet.Config, SchemaSet.Rule];

    /// <summary>The file name of a schema, as in the repository's schema/ folder.</summary>
    public static string FileName(string name) => name + ".schema.json";

    /// <summary>The header line for a YAML file in <paramref name="fileFolder"/> checked against the schema file at <paramref name="schemaPath"/>.</summary>
    public static string Header(string fileFolder, string schemaPath) =>
        HeaderPrefix + Path.GetRelativePath(Path.GetFullPath(fileFolder), Path.GetFullPath(schemaPath)).Replace('\\', '/');

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var output = new Option<string>("--output", "-o") { Description = "The folder to write the schemas to (made when missing).", Required = true };
        var command = new Command("schema", "Write the JSON Schemas of the setting files, the configuration and rule files to a folder, and print the yaml-language-server line that lets an editor check a file against them.")
        {
            output,
        };
        command.SetAction(parse => Write(parse.GetValue(output)!, stdout, stderr));
        return command;
    }

    private static int Write(string folder, TextWriter stdout, TextWriter stderr)
    {
        try
        {
            Directory.CreateDirectory(folder);
            foreach (var name in Names)
            {
                // Written as embedded, byte for byte: the $id inside names the same schema whichever folder holds it.
                File.WriteAllText(Path.Combine(folder, FileName(name)), SchemaSet.Text(name), new System.Text.UTF8Encoding(false));
            }
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            stderr.WriteLine("settinglint: cannot write the schemas to " + folder + ": " + ex.Message);
            return ExitCodes.Usage;
        }
        stdout.WriteLine("Wrote " + Names.Count + " schemas to " + folder + ".");
        stdout.WriteLine("Make this the first line of a YAML file in the current folder, and an editor with the YAML language server checks it");
        stdout.WriteLine("(the path is relative to the file: from another folder, adjust it):");
        foreach (var name in Names)
        {
            stdout.WriteLine();
            stdout.WriteLine("a " + name + " file:");
            stdout.WriteLine(Header(".", Path.Combine(folder, FileName(name))));
        }
        return ExitCodes.Clean;
    }
}
