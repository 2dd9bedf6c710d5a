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
        var (motors, unsure) = QuickScan.Read(Root, [file], _ => Encoding.UTF8.GetBytes(text), 4 << 20, parallel: false);
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
    public void Anything_richer_is_unsure_and_so_loaded(string text)
    {
        Assert.True(Scan(text).Unsure);
    }

    [Fact]
    public void A_file_that_is_not_UTF8_is_unsure() =>
        Assert.Single(QuickScan.Read(Root, [new DiscoveredFile("/r/x.yaml", "x.yaml")], _ => [0x6B, 0xFF], 100, false).Uncertain);
}
