using System.Text;
using SettingLint.Reporting;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// The shipped build is a NativeAOT executable; `dotnet run` and these tests are the JIT build. Both must write the same
/// bytes: trimming or ahead-of-time compilation that changed a message, a number's formatting, an order or an exit code
/// would show here. The golden scenarios of <see cref="ScenarioTests"/> (their expected findings repeated below, so the
/// native output is held to the goldens and not only to the JIT's) and the demo plant run in text, JSON and SARIF.
/// The JIT side runs in-process (the same code `dotnet run` starts; a process per scenario would cost seconds each on
/// a busy 2-core machine); one test runs `dotnet settinglint.dll` as a process too, for the console path.
/// </summary>
public sealed class NativeParityTests
{
    private static readonly string[] Formats = ["text", "json", "sarif"];

    /// <summary>A golden scenario: how its repository differs from the minimal one, and the (rule, file, line, column) it must give.</summary>
    private sealed record Scenario(Func<TempRepo> Make, (string Rule, string File, int Line, int Column)[]? Expected);

    private const string MotorFile = "motors/m-1.yaml";
    private const string BusFile = "buses/bus-1.yaml";

    // The same repositories and expected findings as ScenarioTests (SL001-SL009, engine rules only).
    private static readonly Dictionary<string, Scenario> Scenarios = new(StringComparer.Ordinal)
    {
        ["clean"] = new(() => Cli.Repo(), []),
        ["SL001 syntax"] = new(() => With(Cli.Repo(), r => r.Write("notes/bad.yaml", "kind: bus\ntag: a: b\n")), [("SL001", "notes/bad.yaml", 2, 7)]),
        ["SL001 invalid UTF-8"] = new(() => With(Cli.Repo(), r => r.WriteBytes("notes/latin1.yaml", [.. "kind: bus\ntitle: Stra"u8, 0xDF, .. "e\n"u8])), [("SL001", "notes/latin1.yaml", 2, 12)]),
        ["SL002 duplicate key"] = new(() => Cli.Repo(bus: Samples.Bus + "tag: BUS-2\n"), [("SL002", BusFile, 9, 1)]),
        ["SL003 unknown key"] = new(() => Cli.Repo(Samples.MotorWith("  rated_output: 450 hp", "  rated_outptu: 450 hp")), [("SL004", MotorFile, 6, 1), ("SL003", MotorFile, 7, 3)]),
        ["SL004 missing key"] = new(() => Cli.Repo(Samples.MotorWith("  full_load_current: 58 A\n", "")), [("SL004", MotorFile, 6, 1)]),
        ["SL005 wrong type"] = new(() => Cli.Repo(Samples.MotorWith("service_factor: 1.15", "service_factor: high")), [("SL005", MotorFile, 10, 19)]),
        ["SL005 YAML 1.1 boolean"] = new(() => Cli.Repo(Samples.MotorWith("enabled: true", "enabled: yes")), [("SL005", MotorFile, 27, 14)]),
        ["SL006 bare number"] = new(() => Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58")), [("SL006", MotorFile, 9, 22)]),
        ["SL006 no side"] = new(() => Cli.Repo(Samples.MotorWith("pickup: 7.2 A sec", "pickup: 7.2 A")), [("SL006", MotorFile, 28, 13)]),
        ["SL007 missing bus"] = new(() => Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../buses/bus-9.yaml")), [("SL007", MotorFile, 5, 6)]),
        ["SL007 outside"] = new(() => With(Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../../elsewhere/bus.yaml")), r => r.WriteOutside("elsewhere/bus.yaml", Samples.Bus)), [("SL007", MotorFile, 5, 6)]),
        ["SL007 wrong kind"] = new(() => With(Cli.Repo(Samples.MotorWith("bus: ../buses/bus-1.yaml", "bus: ../models/relay-a.yaml")), r => r.Write("models/relay-a.yaml", Samples.RelayModel)), [("SL007", MotorFile, 5, 6)]),
        ["SL008 nesting"] = new(() => With(Cli.Repo(), r => r.Write("notes/deep.yaml", new string('[', 65) + new string(']', 65) + "\n")), [("SL008", "notes/deep.yaml", 1, 65)]),
        ["SL008 file too large"] = new(() => With(Cli.Repo(), r =>
        {
            using var stream = new FileStream(r.PathOf("huge.yaml"), FileMode.CreateNew);
            stream.SetLength(5L * 1024 * 1024);
        }), [("SL008", "huge.yaml", 1, 1)]),
        ["SL009 unknown kind"] = new(() => With(Cli.Repo(), r => r.Write("pumps/p-1.yaml", "kind: pump\nformat: 1\n")), [("SL009", "pumps/p-1.yaml", 1, 7)]),
        ["SL009 unknown format"] = new(() => Cli.Repo(bus: Samples.Replace(Samples.Bus, "format: 1", "format: 2")), [("SL009", BusFile, 2, 9), ("SL007", MotorFile, 5, 6)]),
        ["several bad files"] = new(() => With(Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58")), r =>
        {
            r.Write("a/bad.yaml", "kind: [\n");
            r.Write("z/other.yaml", "kind: pump\n");
        }), [("SL001", "a/bad.yaml", 2, 1), ("SL006", MotorFile, 9, 22), ("SL009", "z/other.yaml", 1, 7)]),
        // The built-in rule pack on: the clean sample motor's notes and the rules' numbers in the messages.
        ["built-in pack"] = new(() => Cli.Repo(engineOnly: false), null),
    };

    public static TheoryData<string, string> Cases()
    {
        var data = new TheoryData<string, string>();
        foreach (var name in Scenarios.Keys)
        {
            foreach (var format in Formats) data.Add(name, format);
        }
        return data;
    }

    [NativeTheory]
    [MemberData(nameof(Cases))]
    public void Golden_scenario_gives_the_same_bytes_native_and_jit(string name, string format)
    {
        var scenario = Scenarios[name];
        using var repo = scenario.Make();
        var args = new[] { "check", repo.Root, "--format", format };
        var native = NativeExecutable.Run(Here, args);
        AssertSame(Cli.Run(args), native);
        if (format == "json" && scenario.Expected is { } expected)
        {
            var run = new CliRun(native.Exit, Encoding.UTF8.GetString(native.Stdout), Encoding.UTF8.GetString(native.Stderr));
            Assert.Equal(expected, run.Findings);
            Assert.Equal(expected.Length == 0 ? 0 : 1, native.Exit);
        }
    }

    [NativeTheory]
    [InlineData("text")]
    [InlineData("json")]
    [InlineData("sarif")]
    [InlineData("markdown")]
    public void Demo_plant_gives_the_same_bytes_native_and_jit(string format)
    {
        var root = RepositoryPaths.Root();
        var args = new[] { "check", Path.Combine(root, "examples"), "--format", format };
        var native = NativeExecutable.Run(Here, args);
        AssertSame(Cli.Run(args), native);
        // The demo's four planted errors fail the gate (examples/README.md).
        Assert.Equal(1, native.Exit);
    }

    [NativeFact]
    public void One_file_check_of_the_demo_gives_the_same_bytes_native_and_jit()
    {
        var root = RepositoryPaths.Root();
        foreach (var format in Formats)
        {
            var args = new[] { "check", Path.Combine(root, "examples", "motors", "p-202.yaml"), "--format", format };
            AssertSame(Cli.Run(args), NativeExecutable.Run(Here, args));
        }
    }

    [NativeFact]
    public void Demo_sarif_and_version_from_the_jit_process_and_the_native_executable_are_byte_identical()
    {
        var root = RepositoryPaths.Root();
        var args = new[] { "check", "examples", "--format", "sarif" };
        var jit = NativeExecutable.RunJit(root, args);
        var native = NativeExecutable.Run(root, args);
        Assert.Equal(jit.Exit, native.Exit);
        AssertBytes(jit.Stdout, native.Stdout, "stdout");
        AssertBytes(jit.Stderr, native.Stderr, "stderr");
        Assert.True(native.Stdout.Length > 1000, native.ToString());
        // The version comes from the entry assembly, which in-process is the test host: only a process shows it.
        var jitVersion = NativeExecutable.RunJit(root, "--version");
        var nativeVersion = NativeExecutable.Run(root, "--version");
        // The version carries the commit: a native executable published from other sources fails here, by name.
        Assert.True(jitVersion.Stdout.AsSpan().SequenceEqual(nativeVersion.Stdout),
            $"{NativeExecutable.Variable} is version {Encoding.UTF8.GetString(nativeVersion.Stdout).Trim()}, these tests {Encoding.UTF8.GetString(jitVersion.Stdout).Trim()}: publish it again from this work tree.");
        Assert.Matches(@"^\d+\.\d+\.\d+", Encoding.UTF8.GetString(nativeVersion.Stdout));
    }

    [NativeFact]
    public void Rule_catalogue_and_fixtures_give_the_same_bytes_native_and_jit()
    {
        var root = RepositoryPaths.Root();
        foreach (var args in (string[][])[["rules", "catalogue"], ["rules", "list"], ["rules", "test", Path.Combine(root, "rules")]])
        {
            var native = NativeExecutable.Run(Here, args);
            AssertSame(Cli.Run(args), native);
            Assert.True(native.Exit == 0, string.Join(' ', args) + ": " + native);
        }
    }

    [NativeFact]
    public void Reviewer_report_files_are_the_same_native_and_jit()
    {
        var root = RepositoryPaths.Root();
        var outer = Path.Combine(Path.GetTempPath(), "settinglint-native-report-" + Guid.NewGuid().ToString("N"));
        try
        {
            var jitDir = Path.Combine(outer, "jit");
            var nativeDir = Path.Combine(outer, "native");
            // The same output folder name for both, since a report may name its own folder: run them one after the other.
            var examples = Path.Combine(root, "examples");
            var jit = Cli.Run("report", examples, "--output", Path.Combine(outer, "out"));
            Directory.Move(Path.Combine(outer, "out"), jitDir);
            var native = NativeExecutable.Run(Here, "report", examples, "--output", Path.Combine(outer, "out"));
            Directory.Move(Path.Combine(outer, "out"), nativeDir);
            AssertSame(jit, native);
            var jitFiles = Files(jitDir);
            Assert.Equal(jitFiles, Files(nativeDir));
            Assert.Contains("index.html", jitFiles);
            foreach (var f in jitFiles) AssertBytes(File.ReadAllBytes(Path.Combine(jitDir, f)), File.ReadAllBytes(Path.Combine(nativeDir, f)), f);
        }
        finally
        {
            if (Directory.Exists(outer)) Directory.Delete(outer, recursive: true);
        }
    }

    [NativeFact]
    public void Setting_sheets_and_the_import_of_a_workbook_are_the_same_native_and_jit()
    {
        // XLSX is zip and XML written and read by the project's own code: the trimmed, ahead-of-time build must give the
        // same workbook bytes (the zip times are fixed) and read a workbook back to the same files.
        using var repo = new TempRepo();
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        foreach (var name in (string[])["sheet.xlsx", "sheet.csv", "sheet.html"])
        {
            var jit = Cli.Run("sheet", examples, "--output", repo.PathOf("jit-" + name));
            var native = NativeExecutable.Run(Here, "sheet", examples, "--output", repo.PathOf("native-" + name));
            Assert.Equal(0, native.Exit);
            Assert.Equal(jit.Exit, native.Exit);
            AssertBytes(File.ReadAllBytes(repo.PathOf("jit-" + name)), File.ReadAllBytes(repo.PathOf("native-" + name)), name);
        }
        var list = repo.PathOf("list.xlsx");
        // The 60 Hz site's motors: their buses and relay model are the ones copied beside each import below.
        Assert.Equal(0, NativeExecutable.Run(Here, "sheet", Path.Combine(examples, "motors"), "--format", "import", "--output", list).Exit);
        // Each side imports into a repository of its own (a tag already in the repository is refused) with a copy of the
        // demo's buses and relay models, as README's import section does.
        using var jitRepo = new TempRepo();
        using var nativeRepo = new TempRepo();
        foreach (var side in (TempRepo[])[jitRepo, nativeRepo])
        {
            foreach (var folder in (string[])["buses", "models"])
            {
                foreach (var f in Directory.EnumerateFiles(Path.Combine(examples, folder))) side.Write(folder + "/" + Path.GetFileName(f), File.ReadAllText(f));
            }
        }
        var jitImport = Cli.Run("import", list, "--out", jitRepo.PathOf("motors"));
        var nativeImport = NativeExecutable.Run(Here, "import", list, "--out", nativeRepo.PathOf("motors"));
        Assert.True(Directory.Exists(jitRepo.PathOf("motors")), jitImport.ToString());
        Assert.True(Directory.Exists(nativeRepo.PathOf("motors")), nativeImport.ToString());
        Assert.Equal(jitImport.Exit, nativeImport.Exit);
        var written = Files(jitRepo.PathOf("motors"));
        Assert.Equal(Directory.GetFiles(Path.Combine(examples, "motors")).Length, written.Length);
        Assert.Equal(written, Files(nativeRepo.PathOf("motors")));
        foreach (var f in written) AssertBytes(File.ReadAllBytes(jitRepo.PathOf("motors/" + f)), File.ReadAllBytes(nativeRepo.PathOf("motors/" + f)), f);
    }

    // The in-process run's current folder: text output names files relative to it, so the native run starts there too.
    private static string Here => Environment.CurrentDirectory;

    private static string[] Files(string dir) =>
        [.. Directory.EnumerateFiles(dir, "*", SearchOption.AllDirectories).Select(f => Path.GetRelativePath(dir, f)).Order(StringComparer.Ordinal)];

    private static TempRepo With(TempRepo repo, Action<TempRepo> change)
    {
        change(repo);
        return repo;
    }

    // The in-process run's text as the console writes it: UTF-8 without a byte-order mark (.NET's default on Linux).
    // Messages that name a command say how this process was started (ToolCommand): `dotnet .../settinglint.dll` in the
    // test host, the executable's path for the native one. That one word differs by design; everything else must not.
    private static void AssertSame(CliRun jit, ProcessRun native)
    {
        Assert.True(jit.Exit == native.Exit, "exit codes differ: JIT " + jit + "\nnative " + native);
        var nativeCommand = ToolCommand.Resolve(Environment.GetEnvironmentVariable("PATH") ?? "", NativeExecutable.Find(), null);
        string AsNative(string text) => text.Replace(ToolCommand.Current, nativeCommand, StringComparison.Ordinal);
        AssertBytes(Encoding.UTF8.GetBytes(AsNative(jit.Stdout)), native.Stdout, "stdout");
        AssertBytes(Encoding.UTF8.GetBytes(AsNative(jit.Stderr)), native.Stderr, "stderr");
    }

    private static void AssertBytes(byte[] jit, byte[] native, string what)
    {
        if (jit.AsSpan().SequenceEqual(native)) return;
        var at = jit.AsSpan().CommonPrefixLength(native);
        string Around(byte[] b) => Encoding.UTF8.GetString(b, Math.Max(0, at - 80), Math.Min(b.Length, at + 80) - Math.Max(0, at - 80));
        Assert.Fail($"{what} differs at byte {at} (JIT {jit.Length} bytes, native {native.Length}):\n--- JIT\n{Around(jit)}\n--- native\n{Around(native)}");
    }
}
