using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// An invented 50 Hz plant under IEC practice (tests/plants/iec-50hz): IEC motors without a service factor, 1 A CTs of
/// IEC 61869-2 classes, a soft starter and a reduced-voltage start, all set correctly. It checks clean with no
/// acceptance; one mistake planted at a time gets its finding in the right family, on the mistaken line.
/// </summary>
public sealed class PlantTests
{
    private static readonly string Plant = Path.Combine(RepositoryPaths.Root(), "tests", "plants", "iec-50hz");

    [Fact]
    public void The_plant_set_correctly_checks_clean_with_no_acceptance()
    {
        var run = Cli.Run("check", Plant, "--format", "json");
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Empty(run.Findings);
        Assert.DoesNotContain("settinglint-accept", string.Concat(Directory.GetFiles(Plant, "*.yaml", SearchOption.AllDirectories).Select(File.ReadAllText)), StringComparison.Ordinal);
        // Only the relay-range rule waits for data (no relay model is given); nothing else is skipped.
        var notRun = run.Json.GetProperty("notRun").EnumerateArray().Select(n => n.GetProperty("ruleId").GetString()).Distinct().ToList();
        Assert.Equal(["SL108"], notRun);
    }

    // Each case: the file, the text replaced on one line, the rule that must fire there. Hand-worked reasons beside each.
    public static TheoryData<string, string, string, string> Mistakes => new()
    {
        // 48 timer at the soft start's own 30 s: not above 1.1 x 30 s = 33 s (common practice).
        { "motors/sw-201.yaml", "    time: 40 s", "    time: 30 s", "SL701" },
        // Current limit at FLC: the relay may never see a start (common practice).
        { "motors/sw-201.yaml", "  soft_start_current_limit: 3.5 xFLC", "  soft_start_current_limit: 1.0 xFLC", "SL703" },
        // Reduced-voltage start of 12 s: a 13 s timer is not above 1.1 x 12 s = 13.2 s.
        { "motors/hp-102.yaml", "    time: 15 s", "    time: 13 s", "SL701" },
        // 50P at 5 x 200 A = 1000 A, below 1.7 x 996 A x 6930/6600 = 1778 A (common practice).
        { "motors/hp-101.yaml", "    pickup: 9.5 xCT                  # 1900 A pri", "    pickup: 5 xCT", "SL201" },
        // 5P20 at 10 VA into 40 VA: about ALF 5, so 1000 A, below 2 x the 1900 A pickup (IEC 61869-2).
        { "motors/hp-101.yaml", "phase_ct: { primary: 200 A, secondary: 1 A, class: 5P20, rated_burden: 10 VA, burden: 2 VA }",
            "phase_ct: { primary: 200 A, secondary: 1 A, class: 5P20, rated_burden: 10 VA, burden: 40 VA }", "SL109" },
        // 59 at 104 % of 6.6 kV = 6864 V, not above the bus's 6930 V.
        { "motors/hp-101.yaml", "    pickup: 108 %", "    pickup: 104 %", "SL605" },
        // 50G at 80 A: 27 % of the 300 A resistor, above 20 %.
        { "motors/hp-101.yaml", "    pickup: 15 A pri                 # 5 % of the 300 A resistor", "    pickup: 80 A pri", "SL302" },
        // Heating time constant 150 s: the reduced-voltage start (0.8 x 6 x FLC for 12 s) trips hot, IEC 60255-149.
        { "motors/hp-102.yaml", "    time_constant: 450 s", "    time_constant: 150 s", "SL806" },
    };

    [Theory]
    [MemberData(nameof(Mistakes))]
    public void One_planted_mistake_gets_its_finding_on_its_line(string file, string correct, string wrong, string rule)
    {
        using var repo = new TempRepo();
        foreach (var f in Directory.GetFiles(Plant, "*", SearchOption.AllDirectories))
        {
            var rel = Path.GetRelativePath(Plant, f).Replace('\\', '/');
            repo.Write(rel, File.ReadAllText(f));
        }
        var text = File.ReadAllText(repo.PathOf(file));
        var (line, _) = Samples.Pos(text, correct);
        repo.Write(file, Samples.Replace(text, correct, wrong));
        var run = Cli.CheckJson(repo);
        Assert.True(run.In(file).Any(f => f.Rule == rule && f.Line == line), $"{rule} expected at {file}:{line}\n{run}");
        // The family is right and nothing else in the plant breaks.
        Assert.All(run.Findings, f => Assert.Equal(file, f.File));
    }
}
