using System.Reflection;
using System.Text.RegularExpressions;
using SettingLint.Core.Documents;
using SettingLint.Core.Validation;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// The key paths the C# code reads by name are in SchemaPaths, and each one is a key of its schema (schema/*.schema.json):
/// a key renamed in a schema fails here instead of giving nulls in silence.
/// </summary>
public sealed partial class SchemaPathsTests
{
    private static IEnumerable<(string Name, string Path)> Constants(Type type) =>
        type.GetFields(BindingFlags.Public | BindingFlags.Static)
            .Where(f => f.IsLiteral && f.FieldType == typeof(string))
            .Select(f => (type.Name + "." + f.Name, (string)f.GetRawConstantValue()!));

    [Fact]
    public void Every_motor_path_is_a_key_of_the_motor_protection_schema()
    {
        var schema = SchemaSet.Shared.Get(SchemaSet.MotorProtection);
        var constants = Constants(typeof(SchemaPaths.Motor)).ToList();
        Assert.True(constants.Count >= 35, "SchemaPaths.Motor lost its constants: " + constants.Count);
        var unknown = constants.Where(c => SchemaFacts.ResolvePath(schema, c.Path.TrimEnd('.')) is null).Select(c => c.Name + " = " + c.Path);
        Assert.Empty(unknown);
    }

    [Fact]
    public void Every_bus_path_is_a_key_of_the_bus_schema()
    {
        var schema = SchemaSet.Shared.Get(SchemaSet.Bus);
        var constants = Constants(typeof(SchemaPaths.Bus)).ToList();
        Assert.NotEmpty(constants);
        var unknown = constants.Where(c => SchemaFacts.ResolvePath(schema, c.Path) is null).Select(c => c.Name + " = " + c.Path);
        Assert.Empty(unknown);
    }

    [Fact]
    public void A_renamed_key_is_not_found()
    {
        // The check above can fail: a key the schema does not have does not resolve.
        var schema = SchemaSet.Shared.Get(SchemaSet.MotorProtection);
        Assert.NotNull(SchemaFacts.ResolvePath(schema, SchemaPaths.Motor.FullLoadCurrent));
        Assert.Null(SchemaFacts.ResolvePath(schema, "motor.full_load_amps"));
        Assert.Null(SchemaFacts.ResolvePath(schema, "protection.thermal.tau"));
    }

    // A string literal that is a motor-file key path: it begins with a top-level key of the motor or bus schema and a dot.
    [GeneratedRegex("\"((?:motor|starter|transformers|protection|upstream)\\.[a-z_.]*)\"")]
    private static partial Regex PathLiteral();

    [Fact]
    public void No_key_path_literal_is_written_outside_SchemaPaths()
    {
        var root = RepositoryPaths.Root();
        // Bus keys of one plain word (grounding, frequency, upstream) are also words of other meanings (a dimension, a CSS
        // class), so only the paths with a dot or an underscore are looked for as they are.
        var values = Constants(typeof(SchemaPaths.Motor)).Concat(Constants(typeof(SchemaPaths.Bus))).Select(c => c.Path)
            .Where(p => p.Contains('.', StringComparison.Ordinal) || p.Contains('_', StringComparison.Ordinal)).ToHashSet(StringComparer.Ordinal);
        var files = Directory.EnumerateFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
            .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal)
                && !f.Contains($"{Path.DirectorySeparatorChar}bin{Path.DirectorySeparatorChar}", StringComparison.Ordinal)
                && Path.GetFileName(f) != "SchemaPaths.cs")
            .ToList();
        Assert.True(files.Count > 100, "the source files were not found: " + files.Count);
        var found = new List<string>();
        foreach (var file in files)
        {
            var lines = File.ReadAllLines(file);
            for (var i = 0; i < lines.Length; i++)
            {
                if (lines[i].TrimStart().StartsWith("//", StringComparison.Ordinal)) continue;
                foreach (Match m in PathLiteral().Matches(lines[i])) found.Add($"{Path.GetRelativePath(root, file)}:{i + 1}: {m.Value}");
                foreach (Match m in Regex.Matches(lines[i], "\"([a-z_.]+)\""))
                {
                    if (values.Contains(m.Groups[1].Value)) found.Add($"{Path.GetRelativePath(root, file)}:{i + 1}: {m.Value}");
                }
            }
        }
        Assert.Empty(found.Distinct());
    }
}
