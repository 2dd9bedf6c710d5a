using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// Golden end-to-end scenarios, one per engine rule SL001-SL009: a small repository on disk, the command line run
/// in-process, and the exact (rule, line, column) list and exit code. Rule packs are switched off so that only the
/// engine's checks run (SL010 comes later).
/// </summary>
public sealed class ScenarioTests
{
    private const string MotorFile = "motors/m-1.yaml";
    private const string BusFile = "buses/bus-1.yaml";

    private static void AssertFindings(CliRun run, params (string Rule, string File, int Line, int Column)[] expected)
    {
        Assert.True(run.Exit is 0 or 1, run.ToString());
        Assert.Equal(expected, run.Findings);
        Assert.Equal(expected.Length == 0 ? 0 : 1, run.Exit);
        Assert.Equal(expected.Length, run.Json.GetProperty("summary").GetProperty("errors").GetInt32());
    }

    [Fact]
    public void Clean_minimal_repository_exits_0()
    {
        using var repo = Cli.Repo();
        var run = Cli.CheckJson(repo);
        AssertFindings(run);
        Assert.Equal(2, run.Json.GetProperty("summary").GetProperty("files").GetInt32());
        Assert.Equal("M-1", Assert.Single(run.Json.GetProperty("motors").EnumerateArray()).GetString());
        Assert.Empty(run.Stderr);
    }

    // SL001, YAML 1.2.2 spec 7.4/8.2: "a: b: c" is not a valid mapping; the parser's position.
    [Fact]
    public void SL001_syntax_error()
    {
        using var repo = Cli.Repo();
        repo.Write("notes/bad.yaml", "kind: bus\ntag: a: b\n");
        AssertFindings(Cli.CheckJson(repo), ("SL001", "notes/bad.yaml", 2, 7));
    }

    [Fact]
    public void SL001_invalid_utf8()
    {
        using var repo = Cli.Repo();
        repo.WriteBytes("notes/latin1.yaml", [.. "kind: bus\ntitle: Stra"u8, 0xDF, .. "e\n"u8]); // ISO 8859-1 sharp s
        AssertFindings(Cli.CheckJson(repo), ("SL001", "notes/latin1.yaml", 2, 12));
    }

    // SL002, YAML 1.2.2 spec 3.2.1.1: keys of a mapping are unique.
    [Fact]
    public void SL002_duplicate_key()
    {
        using var repo = Cli.Repo(bus: Samples.Bus + "tag: BUS-2\n");
        AssertFindings(Cli.CheckJson(repo), ("SL002", BusFile, 9, 1));
    }

    [Fact]
    public void SL003_unknown_key_with_suggestion()
    {
        using var repo = Cli.Repo(Samples.MotorWith("  rated_output: 450 hp", "  rated_outptu: 450 hp"));
        var run = Cli.CheckJson(repo);
        AssertFindings(run, ("SL004", MotorFile, 6, 1), ("SL003", MotorFile, 7, 3));
        Assert.Contains("did you mean 'rated_output'", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void SL004_missing_required_key_at_its_parent()
    {
        using var repo = Cli.Repo(Samples.MotorWith("  full_load_current: 58 A\n", ""));
        AssertFindings(Cli.CheckJson(repo), ("SL004", MotorFile, 6, 1));
    }

    [Fact]
    public void SL005_wrong_type()
    {
        using var repo = Cli.Repo(Samples.MotorWith("service_factor: 1.15", "service_factor: high"));
        AssertFindings(Cli.CheckJson(repo), ("SL005", MotorFile, 10, 19));
    }

    [Fact]
    public void SL005_YAML_1_1_boolean_is_not_a_boolean()
    {
        using var repo = Cli.Repo(Samples.MotorWith("enabled: true", "enabled: yes"));
        AssertFindings(Cli.CheckJson(repo), ("SL005", MotorFile, 27, 14));
    }

    // setting-files contract: "A bare number where a unit is needed is an error, never a guess."
    [Fact]
    public void SL006_bare_number()
    {
        using var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));
        AssertFindings(Cli.CheckJson(repo), ("SL006", MotorFile, 9, 22));
    }

    [Fact]
    public void SL006_current_in_protection_without_a_side()
    {
        using var repo = Cli.Repo(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 7.2 A"));
        var run = Cli.CheckJson(repo);
        AssertFindings(run, ("SL006", MotorFile, 28, 13));
        Assert.Contains("which side", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void SL007_missing_bus_file()
    {
        using var repo = Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../buses/bus-9.yaml"));
        AssertFindings(Cli.CheckJson(repo), ("SL007", MotorFile, 5, 6));
    }

    [Fact]
    public void SL007_bus_outside_the_repository()
    {
        using var repo = Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../../elsewhere/bus.yaml"));
        repo.WriteOutside("elsewhere/bus.yaml", Samples.Bus);
        var run = Cli.CheckJson(repo);
        AssertFindings(run, ("SL007", MotorFile, 5, 6));
        Assert.Contains("outside the repository root", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void SL007_wrong_kind_of_file()
    {
        using var repo = Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../models/relay-a.yaml"));
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        AssertFindings(Cli.CheckJson(repo), ("SL007", MotorFile, 5, 6));
    }

    // SL008: the contract's nesting limit is 64.
    [Fact]
    public void SL008_nesting_too_deep()
    {
        using var repo = Cli.Repo();
        repo.Write("notes/deep.yaml", new string('[', 65) + new string(']', 65) + "\n");
        AssertFindings(Cli.CheckJson(repo), ("SL008", "notes/deep.yaml", 1, 65));
    }

    [Fact]
    public void SL008_file_over_the_size_limit()
    {
        using var repo = Cli.Repo();
        using (var stream = new FileStream(repo.PathOf("huge.yaml"), FileMode.CreateNew))
        {
            stream.SetLength(5L * 1024 * 1024);
        }
        AssertFindings(Cli.CheckJson(repo), ("SL008", "huge.yaml", 1, 1));
    }

    [Fact]
    public void SL009_unknown_kind()
    {
        using var repo = Cli.Repo();
        repo.Write("pumps/p-1.yaml", "kind: pump\nformat: 1\n");
        AssertFindings(Cli.CheckJson(repo), ("SL009", "pumps/p-1.yaml", 1, 7));
    }

    [Fact]
    public void SL009_unknown_format()
    {
        using var repo = Cli.Repo(bus: Samples.Replace(Samples.Bus, "format: 1", "format: 2"));
        // The motor's bus does not bind, so its reference is SL007 too.
        AssertFindings(Cli.CheckJson(repo), ("SL009", BusFile, 2, 9), ("SL007", MotorFile, 5, 6));
    }

    [Fact]
    public void One_bad_file_does_not_stop_the_others()
    {
        using var repo = Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));
        repo.Write("a/bad.yaml", "kind: [\n");
        repo.Write("z/other.yaml", "kind: pump\n");
        AssertFindings(Cli.CheckJson(repo),
            ("SL001", "a/bad.yaml", 2, 1),
            ("SL006", MotorFile, 9, 22),
            ("SL009", "z/other.yaml", 1, 7));
    }

    [Fact]
    public void Checking_one_file_reports_only_that_file()
    {
        using var repo = Cli.Repo(bus: Samples.Bus + "tag: BUS-2\n");
        repo.Write("notes/bad.yaml", "kind: [\n");
        var run = Cli.Run("check", repo.PathOf(MotorFile), "--format", "json");
        // The bus is read to resolve the reference, but its own SL002 belongs to a run that checks it.
        AssertFindings(run);
        Assert.Equal(1, run.Json.GetProperty("summary").GetProperty("files").GetInt32());
    }
}
