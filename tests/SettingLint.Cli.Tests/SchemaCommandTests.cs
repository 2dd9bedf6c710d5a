using System.Text.Json;
using SettingLint.Core.Validation;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>`settinglint schema --output DIR`, and the `$id`s editors and other tools know the schemas by.</summary>
public sealed class SchemaCommandTests
{
    // The ids are a contract with every setting file that names them: they never change within a format version.
    private static readonly (string Name, string Id)[] Ids =
    [
        ("motor-protection", "https://settinglint.invalid/schema/motor-protection.schema.json"),
        ("bus", "https://settinglint.invalid/schema/bus.schema.json"),
        ("relay-model", "https://settinglint.invalid/schema/relay-model.schema.json"),
        ("config", "https://settinglint.invalid/schema/config.schema.json"),
        ("rule", "https://settinglint.invalid/schema/rule.schema.json"),
    ];

    [Fact]
    public void Every_schema_keeps_its_id_and_the_validator_reads_it()
    {
        foreach (var (name, id) in Ids)
        {
            using var doc = JsonDocument.Parse(SchemaSet.Text(name));
            Assert.Equal(id, doc.RootElement.GetProperty("$id").GetString());
            // JSON Schema draft-07 §8.2: $id is a URI that identifies the schema; ours end in the file's name.
            Assert.EndsWith("/" + name + ".schema.json", new Uri(id).AbsolutePath, StringComparison.Ordinal);
            Assert.NotEmpty(SchemaNode.Read(SchemaSet.Text(name), name).PropertyList);
        }
        Assert.Equal(Ids.Select(i => i.Name).Order(), SchemaCommand.Names.Order());
    }

    [Fact]
    public void Schema_output_writes_the_schemas_and_prints_a_header_that_finds_them()
    {
        using var repo = new TempRepo();
        var folder = Path.Combine(repo.Root, "editor", "schemas");
        var run = Cli.Run(["schema", "--output", folder]);
        Assert.True(run.Exit == 0, run.ToString());
        foreach (var (name, _) in Ids)
        {
            var file = Path.Combine(folder, name + ".schema.json");
            Assert.Equal(File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "schema", name + ".schema.json")), File.ReadAllText(file));
            // The printed line, relative to the current folder, leads to the file written.
            var header = Assert.Single(run.Stdout.Split('\n'), l => l.StartsWith(SchemaCommand.HeaderPrefix, StringComparison.Ordinal) && l.EndsWith("/" + name + ".schema.json", StringComparison.Ordinal));
            Assert.Equal(Path.GetFullPath(file), Path.GetFullPath(Path.Combine(Environment.CurrentDirectory, header[SchemaCommand.HeaderPrefix.Length..])));
        }
    }

    [Fact]
    public void A_header_from_a_deeper_folder_climbs_to_the_schema() =>
        Assert.Equal("# yaml-language-server: $schema=../../schema/bus.schema.json", SchemaCommand.Header("/r/plant/buses", "/r/schema/bus.schema.json"));

    [Fact]
    public void Schema_without_an_output_folder_is_a_usage_error() => Assert.Equal(2, Cli.Run(["schema"]).Exit);
}
