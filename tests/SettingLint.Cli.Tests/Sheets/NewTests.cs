using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Core.Validation;
using SettingLint.Sheets.Import;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>`settinglint new`: a skeleton with every key of the kind, required ones to fill, optional ones commented out.</summary>
public sealed class NewTests
{
    [Theory]
    [InlineData("motor", SchemaSet.MotorProtection)]
    [InlineData("bus", SchemaSet.Bus)]
    public void The_skeleton_holds_every_key_of_the_schema_required_ones_open_and_optional_ones_commented(string name, string kind)
    {
        using var repo = new TempRepo();
        var run = Cli.Run("new", name, "X-1", "--out", repo.PathOf("files"));
        Assert.True(run.Exit == 0, run.ToString());
        var text = File.ReadAllText(repo.PathOf("files/x-1.yaml"));
        var lines = text.Split('\n');
        // Every leaf key of the schema, in its order, at its depth: open when it and its parents are required, else commented out.
        var from = 0;
        foreach (var key in ContractKeys.Of(kind).All)
        {
            var parts = key.Path.Split('.');
            var indent = new string(' ', 2 * (parts.Length - 1));
            var open = indent + parts[^1] + ":";
            var shut = indent + "# " + parts[^1] + ":";
            var at = Array.FindIndex(lines, from, l => l == open || l.StartsWith(open + " ", StringComparison.Ordinal) || l == shut || l.StartsWith(shut + " ", StringComparison.Ordinal));
            Assert.True(at >= 0, key.Path + " is not in the skeleton after line " + from);
            Assert.True(IsRequired(kind, key.Path) == lines[at].StartsWith(open, StringComparison.Ordinal), key.Path + ": " + lines[at]);
            from = at + 1;
        }
        // As written it loads, and its open keys are the required ones (a required mapping whose keys are all optional,
        // such as protection, stands open and empty).
        Assert.Equal(ContractKeys.Of(kind).All.Select(k => k.Path).Where(p => IsRequired(kind, p)).Order(StringComparer.Ordinal),
            Leaves(text).Where(p => ContractKeys.Of(kind).Find(p) is not null).Order(StringComparer.Ordinal));
        Assert.All(Leaves(text).Where(p => ContractKeys.Of(kind).Find(p) is null), p => Assert.True(IsRequired(kind, p), p));
        // No schema folder in this repository: the header names the schema by its $id.
        Assert.StartsWith("# yaml-language-server: $schema=" + SettingLint.Sheets.Skeleton.SkeletonWriter.SchemaId(kind) + "\n", text, StringComparison.Ordinal);
        Assert.Contains("\ntag: X-1\n", text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_key_stands_under_its_description_and_the_bus_is_filled_in()
    {
        using var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("schema/motor-protection.schema.json", SchemaSet.Text(SchemaSet.MotorProtection));
        var run = Cli.Run("new", "motor", "P-101", "--out", repo.PathOf("area/motors"), "--bus", repo.PathOf("buses/bus-1.yaml"));
        Assert.Equal(0, run.Exit);
        var text = File.ReadAllText(repo.PathOf("area/motors/p-101.yaml"));
        var flc = SchemaFacts.ResolvePath(SchemaSet.Shared.Get(SchemaSet.MotorProtection), "motor.full_load_current")!;
        var lines = text.Split('\n');
        var at = Array.IndexOf(lines, "  full_load_current:");
        Assert.True(at > 0);
        // The description's last words end the comment right above the key.
        Assert.EndsWith(flc.Description!.Split(' ')[^1], lines[at - 1], StringComparison.Ordinal);
        Assert.Contains("\nbus: ../../buses/bus-1.yaml\n", text, StringComparison.Ordinal);
        Assert.StartsWith("# yaml-language-server: $schema=../../schema/motor-protection.schema.json\n", text, StringComparison.Ordinal);
        Assert.Contains("\n  # acceleration_time_max:\n", text, StringComparison.Ordinal);
        // What `check` says of it: only the empty required keys, each at its own key (no unknown key, no syntax error).
        var check = Cli.Run("check", repo.PathOf("area/motors/p-101.yaml"), "--format", "json");
        // Unfilled values (SL005, SL006), and the elements a skeleton leaves commented out, which are missing until filled in (SL204, SL305, SL808).
        Assert.All(check.Findings, f => Assert.Contains(f.Rule, (string[])["SL005", "SL006", "SL204", "SL305", "SL808"]));
        Assert.Equal(2, Cli.Run("new", "motor", "P-101", "--out", repo.PathOf("area/motors")).Exit);
    }

    [Fact]
    public void A_relay_model_skeleton_offers_a_range_for_each_setting_with_a_dimension()
    {
        using var repo = new TempRepo();
        Assert.Equal(0, Cli.Run("new", "relay-model", "R-1", "--out", repo.Root).Exit);
        var text = File.ReadAllText(repo.PathOf("r-1.yaml"));
        Assert.Contains("\nranges:\n", text, StringComparison.Ordinal);
        Assert.Contains("\n  # short_circuit.pickup: { min: , max: , step: }\n", text, StringComparison.Ordinal);
        Assert.DoesNotContain("# short_circuit.enabled:", text, StringComparison.Ordinal);
    }

    private static List<string> Leaves(string text)
    {
        var root = (YMapping)YamlLoader.Load(System.Text.Encoding.UTF8.GetBytes(text), "", "", LoadLimits.Default).Root!;
        var list = new List<string>();
        void Walk(YMapping m, string prefix)
        {
            foreach (var e in m.Entries)
            {
                var path = prefix.Length == 0 ? e.Key.Value : prefix + "." + e.Key.Value;
                if (e.Value is YMapping child && child.Entries.Length > 0) Walk(child, path);
                else list.Add(path);
            }
        }
        Walk(root, "");
        return list;
    }

    private static bool IsRequired(string kind, string path)
    {
        var node = SchemaSet.Shared.Get(kind);
        foreach (var part in path.Split('.'))
        {
            if (!node.Required.Contains(part)) return false;
            node = node.Child(part)!;
        }
        return true;
    }
}
