using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>The text summary's counts on one run that holds new, baselined and accepted findings and a change to the gate.</summary>
public sealed class GateCountTests
{
    [Fact]
    public void New_baselined_accepted_and_gate_changes_are_each_counted_once_and_apart()
    {
        using var git = GatePlant.Create();
        // m-1's TST102 goes into the baseline; then m-3's new TST101 is accepted in the source (a change to the gate)
        // and m-2 gets a new TST101 of its own.
        Assert.Equal(0, Cli.Run(["baseline", git.Root, "--output", git.Temp.PathOf(GatePlant.BaselineFile)]).Exit);
        git.Commit("baseline");
        git.Write(GatePlant.M3, GatePlant.Motor("M-3", "bus-2", "pickup: 7.2 A sec", "pickup: 20 A sec  # settinglint-accept TST101: the fuses clear it first"));
        git.Write(GatePlant.M2, GatePlant.Motor("M-2", "bus-1", "acceleration_time: 4.5 s", "acceleration_time: 30 s").Replace("pickup: 7.2 A sec", "pickup: 30 A sec", StringComparison.Ordinal));

        var run = Cli.Run(["check", git.Root, "--baseline", git.Temp.PathOf(GatePlant.BaselineFile), "--changed-since", "HEAD", "--all-files"]);
        Assert.Equal(1, run.Exit);
        // Paths are shown from the current folder, which is not the repository's here.
        var lines = run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        // Listed: the new TST101 of m-2 and the change to the gate; neither the baselined nor the accepted finding.
        Assert.Single(lines, l => l.Contains("error TST101", StringComparison.Ordinal) && l.Contains("motors/m-2.yaml:", StringComparison.Ordinal));
        Assert.DoesNotContain(lines, l => l.Contains("error TST102", StringComparison.Ordinal));
        Assert.Single(lines, l => l.Contains("warning SL011", StringComparison.Ordinal) && l.Contains("motors/m-3.yaml:", StringComparison.Ordinal));
        Assert.Single(lines, l => l.StartsWith("settinglint: accepted TST101: 1 finding accepted in the source, in ", StringComparison.Ordinal));
        // "new" counts the one finding that can fail the run, not the accepted one nor the change to the gate.
        Assert.Single(lines, l => l.StartsWith("Baseline ", StringComparison.Ordinal) && l.Contains(": 1 new, 1 unchanged (not listed), 0 absent", StringComparison.Ordinal));
        Assert.Equal("1 error, 0 warnings, 0 notes in 5 files (3 motors); 1 in the baseline (not listed); 1 accepted in the source; 1 change to the gate (SL011)", Assert.Single(lines, l => l.Contains(" notes in ", StringComparison.Ordinal)));
    }
}
