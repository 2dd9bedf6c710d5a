using System.Text;
using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>The quick read that plans a changed-files run: sure where the lines are plain, unsure (so loaded) otherwise.</summary>
public sealed class GateQuickScanTests
{
    private const string Root = "/r";

    private static (MotorReferences? Motor, bool Unsure) Scan(string text)
    {
        var file = new DiscoveredFile("/r/motors/m-1.yaml", "motors/m-1.yaml");
        var (motors, unsure, _) = QuickScan.Read(Root, [file], _ => Encoding.UTF8.GetBytes(text), 4 << 20, parallel: false);
        return (motors.SingleOrDefault(), unsure.Contains("motors/m-1.yaml"));
    }

    [Theory]
    [InlineData("kind: motor-protection\nbus: ../buses/b-1.yaml\nrelay_model: ../models/r.yaml\n")]
    [InlineData("# header\nkind: 'motor-protection'\nbus: \"../buses/b-1.yaml\"   # the MCC\nrelay_model: ../models/r.yaml # standard\n")]
    [InlineData("---\nkind: motor-protection\r\nbus: ../buses/b-1.yaml\r\nrelay_model: ../models/r.yaml\r\nmotor:\n  bus: not/top/level.yaml\n")]
    public void Plain_references_are_read_relative_to_the_file(string text)
    {
        var (motor, unsure) = Scan(text);
        Assert.False(unsure);
        Assert.Equal(new MotorReferences("motors/m-1.yaml", "buses/b-1.yaml", "models/r.yaml"), motor);
    }

    [Fact]
    public void An_inline_bus_is_the_motors_own_and_other_kinds_are_no_motor()
    {
        Assert.Equal((new MotorReferences("motors/m-1.yaml", null, null), false), Scan("kind: motor-protection\nbus:\n  kind: bus\n"));
        Assert.Equal((null, false), Scan("kind: bus\ntag: B-1\n"));
    }

    [Theory]
    [InlineData("{kind: motor-protection, bus: ../buses/b-1.yaml}\n")]
    [InlineData("kind: motor-protection\nbus: &b ../buses/b-1.yaml\n")]
    [InlineData("kind: motor-protection\nbus: \"..\\/buses/b-1.yaml\"\n")]
    [InlineData("kind: motor-protection\n\"bus\": ../buses/b-1.yaml\n")]
    [InlineData("kind: motor-protection\nbus: a.yaml\nbus: b.yaml\n")]
    [InlineData("kind: motor-protection\nbus: ../buses/b-1.yaml\n--- \nkind: bus\n")]
    [InlineData("title: notes without a kind\n")]
    [InlineData("kind: motor-protection\nbus:\n  ../buses/b-1.yaml\n")]
    [InlineData("kind: motor-protection\nbus: ../buses/\n\n  b-1.yaml\n")]
    [InlineData("kind:\n  motor-protection\nbus: ../buses/b-1.yaml\n")]
    [InlineData("kind: motor-protection\ntag:\n  M-1\nbus: ../buses/b-1.yaml\n")]
    [InlineData("kind: motor-protection\nbus:\n  - ../buses/b-1.yaml\n")]
    public void Anything_richer_is_unsure_and_so_loaded(string text)
    {
        Assert.True(Scan(text).Unsure);
    }

    [Fact]
    public void Tags_are_read_from_every_kind_of_setting_file()
    {
        DiscoveredFile[] files = [new("/r/a.yaml", "a.yaml"), new("/r/b.yaml", "b.yaml"), new("/r/c.yaml", "c.yaml")];
        var text = new Dictionary<string, string>
        {
            ["a.yaml"] = "kind: bus\ntag: 'SG-1' # switchgear\n",
            ["b.yaml"] = "kind: motor-protection\ntag: P-1\nbus: b.yaml\n",
            ["c.yaml"] = "kind: relay-model\n",
        };
        var (_, _, tags) = QuickScan.Read(Root, files, f => Encoding.UTF8.GetBytes(text[f.RelativePath]), 1000, parallel: false);
        Assert.Equal([("a.yaml", "SG-1"), ("b.yaml", "P-1")], tags.OrderBy(t => t.Key, StringComparer.Ordinal).Select(t => (t.Key, t.Value)));
    }

    [Fact]
    public void A_file_that_is_not_UTF8_is_unsure() =>
        Assert.Single(QuickScan.Read(Root, [new DiscoveredFile("/r/x.yaml", "x.yaml")], _ => [0x6B, 0xFF], 100, false).Uncertain);
}
