using SettingLint.Core.Fixes;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// The files the confirming run of the suggestions reads (<see cref="FixFinder.Reach"/>): the fixed motors, the other motors
/// on their buses and the files that are not motors, as the check divided them; never the motors of other buses.
/// </summary>
public sealed class FixReachTests
{
    private static string Motor(string tag, string bus) => Samples.Replace(Samples.Motor,
        "tag: M-1\ntitle: Test pump\nbus: ../buses/bus-1.yaml\n", $"tag: {tag}\ntitle: Test pump\nbus: {bus}\n");

    [Fact]
    public void A_fix_reads_its_motor_the_motors_on_its_bus_and_the_files_that_are_not_motors()
    {
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", "packs: []\n");
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("buses/bus-2.yaml", Samples.Replace(Samples.Bus, "tag: BUS-1", "tag: BUS-2"));
        repo.Write("motors/a/m-1.yaml", Motor("M-1", "../../buses/bus-1.yaml"));
        repo.Write("motors/m-2.yaml", Motor("M-2", "../buses/bus-2.yaml"));
        repo.Write("motors/m-3.yaml", Motor("M-3", "../buses/bus-1.yaml"));
        // A motor with its bus written inline is on a bus of its own.
        repo.Write("motors/m-4.yaml", Samples.Replace(Samples.Motor, "tag: M-1\ntitle: Test pump\nbus: ../buses/bus-1.yaml\n",
            "tag: M-4\ntitle: Test pump\nbus:\n  tag: BUS-4\n  nominal_voltage: 4160 V\n  frequency: 60 Hz\n"));
        var result = Linter.Check(new CheckRequest(repo.Root, []) { Parallel = false });

        Assert.Equal(["motors/a/m-1.yaml", "motors/m-2.yaml", "motors/m-3.yaml", "motors/m-4.yaml"], result.MotorFiles.Select(m => m.File));
        Assert.Equal("buses/bus-1.yaml buses/bus-2.yaml buses/bus-1.yaml (inline)", string.Join(" ", result.MotorBuses.Select(b => b ?? "(inline)")));
        Assert.Equal(["buses/bus-1.yaml", "buses/bus-2.yaml", "motors/a/m-1.yaml", "motors/m-3.yaml"], FixFinder.Reach(result, ["motors/a/m-1.yaml"]));
        Assert.Equal(["buses/bus-1.yaml", "buses/bus-2.yaml", "motors/m-2.yaml"], FixFinder.Reach(result, ["motors/m-2.yaml"]));
        Assert.Equal(["buses/bus-1.yaml", "buses/bus-2.yaml", "motors/m-4.yaml"], FixFinder.Reach(result, ["motors/m-4.yaml"]));
        Assert.Equal(["buses/bus-1.yaml", "buses/bus-2.yaml"], FixFinder.Reach(result, []));
    }
}
