using System.Text;
using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>`settinglint import`: problems at their cells, nothing written while a row is bad, spreadsheet conventions, --update, --map.</summary>
public sealed class ImportTests
{
    private static readonly UTF8Encoding Utf8 = new(false);

    /// <summary>A repository with the sample bus (tag BUS-1) and relay model, and no motor yet.</summary>
    private static TempRepo Repo()
    {
        var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write("models/relay-a.yaml", Samples.RelayModel);
        repo.Write(".settinglint.yaml", Cli.EngineOnlyConfig);
        return repo;
    }

    /// <summary>The sample motor's keys as a header and one row for a tag: a sheet that makes a complete file.</summary>
    internal const string Header =
        "tag,title,bus,motor.rated_output,motor.rated_voltage [V],motor.full_load_current [A],motor.service_factor,motor.locked_rotor_current,"
        + "motor.acceleration_time [s],motor.safe_stall_time_cold [s],motor.safe_stall_time_hot [s],motor.starts_cold,motor.starts_hot,motor.winding_leads,"
        + "starter.type,starter.interrupting_rating,transformers.phase_ct.primary [A],transformers.phase_ct.secondary [A],transformers.phase_ct.class,"
        + "transformers.phase_ct.burden,transformers.ground_ct.connection,transformers.ground_ct.primary [A],transformers.ground_ct.secondary [A],"
        + "transformers.vt.primary [V],transformers.vt.secondary [V],protection.short_circuit.enabled,protection.short_circuit.pickup";

    internal static string Row(string tag, string flc = "58", string pickup = "7.2 A sec", string bus = "../buses/bus-1.yaml", string title = "Test pump") =>
        $"{tag},{title},{bus},450 hp,4000,{flc},1.15,6.2 xFLC,4.5,14,10,2,1,6,circuit-breaker,40 kA,75,5,C50,0.3 ohm,core-balance,50,5,4200,120,true,{pickup}";

    [Fact]
    public void A_complete_sheet_writes_one_file_per_row_that_passes_the_schema()
    {
        using var repo = Repo();
        var csv = repo.Write("lists/motors.csv", Header + "\n" + Row("P-101") + "\n" + Row("P-102", flc: "61") + "\n");
        var run = Cli.Run("import", csv, "--out", repo.PathOf("motors"));
        Assert.True(run.Exit == 0, run.ToString());
        Assert.Contains("2 new, 0 updated, 0 unchanged", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("0 errors", run.Stdout, StringComparison.Ordinal);
        var text = File.ReadAllText(repo.PathOf("motors/p-102.yaml"));
        Assert.Contains("\nmotor:\n  rated_output: 450 hp\n  rated_voltage: 4000 V\n  full_load_current: 61 A\n", text, StringComparison.Ordinal);
        Assert.StartsWith("kind: motor-protection\nformat: 1\ntag: P-102\n", text, StringComparison.Ordinal);
        // The same check as `check` on the written files: nothing from the SL0xx rules.
        Assert.Equal(0, Cli.CheckJson(repo).Exit);
    }

    [Fact]
    public void Each_kind_of_bad_cell_is_reported_at_its_row_and_column_and_nothing_is_written()
    {
        using var repo = Repo();
        var csv = string.Join('\n',
            Header,
            Row("P-101"),
            Row("P-102", flc: "5x8"),                  // row 3: not a number
            Row("P-103", pickup: "7.2 s"),             // row 4: a time where a current goes
            Row("", title: "Pump without tag"),        // row 5: no tag
            Row("P-101", title: "Second P-101"),       // row 6: the tag of row 2 again
            Row("P-107", bus: "NO-SUCH-BUS"),          // row 7: a bus that does not exist
            Row("P-108", flc: "\"58,5\"")) + "\n";     // row 8: a decimal comma in a quoted cell
        var file = repo.Write("lists/bad.csv", csv);
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--format", "sarif");
        Assert.Equal(1, run.Exit);
        // Schema: Schemata/sarif-2.1.0.json shipped in the Sarif.Sdk 5.8.0 package (OASIS SARIF 2.1.0).
        Assert.Empty(SarifValidation.SchemaErrors(run.Stdout));
        var results = SheetTestFiles.SarifResults(run.Stdout);
        Assert.All(results, r => Assert.Equal("lists/bad.csv", r.Uri));
        (string Rule, int Line, int Column) At(string rule, string needle, int occurrence = 1)
        {
            var (line, column) = Samples.Pos(csv, needle, occurrence);
            return (rule, line, column);
        }
        // Oracles: the position of each bad cell's text in the CSV, found by searching the text (not by the reader).
        Assert.Equal(
            new[]
            {
                At("SL006", "5x8"),
                At("SL006", "7.2 s"),
                At("SL004", ",Pump without tag") is var (r5, l5, _) ? (r5, l5, 1) : default,
                At("SL005", "P-101", 2),
                At("SL007", "NO-SUCH-BUS"),
                At("SL005", "\"58,5\""),
            }.Order(),
            results.Select(r => (r.Rule, r.Line, r.Column)).Order());
        Assert.Contains(results, r => r.Message.StartsWith("Row 3, column F (motor.full_load_current [A]): ", StringComparison.Ordinal));
        Assert.Contains(results, r => r.Message.Contains("'58,5' has a decimal comma (a quoted cell)", StringComparison.Ordinal) && r.Message.Contains("'58.5'", StringComparison.Ordinal));
        Assert.Contains(results, r => r.Message.StartsWith("Row 6, column A (tag): the tag 'P-101' is also on row 2", StringComparison.Ordinal));
        Assert.Contains(results, r => r.Message.Contains("no bus file in the repository has the tag 'NO-SUCH-BUS'", StringComparison.Ordinal) && r.Message.Contains("(BUS-1)", StringComparison.Ordinal));
        Assert.Contains("nothing written", run.Stderr, StringComparison.Ordinal);
        Assert.False(Directory.Exists(repo.PathOf("motors")));
    }

    [Fact]
    public void Skip_bad_rows_writes_the_good_rows_and_still_fails()
    {
        using var repo = Repo();
        var file = repo.Write("lists/m.csv", Header + "\n" + Row("P-101") + "\n" + Row("P-102", flc: "five") + "\n" + Row("P-103") + "\n");
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--skip-bad-rows");
        Assert.Equal(1, run.Exit);
        Assert.True(File.Exists(repo.PathOf("motors/p-101.yaml")));
        Assert.False(File.Exists(repo.PathOf("motors/p-102.yaml")));
        Assert.True(File.Exists(repo.PathOf("motors/p-103.yaml")));
        Assert.Contains("1 row with problems skipped (3)", run.Stderr, StringComparison.Ordinal);
        Assert.Contains("lists/m.csv:3:", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void An_unknown_column_stops_the_whole_sheet_with_a_suggestion()
    {
        using var repo = Repo();
        var csv = "tag,motor.full_load_curent [A]\nP-101,58\n";
        var file = repo.Write("m.csv", csv);
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--skip-bad-rows");
        Assert.Equal(1, run.Exit);
        Assert.Contains("m.csv:1:5: error SL003: Row 1, column B: the header 'motor.full_load_curent [A]' is not a key path of a motor-protection file (did you mean motor.full_load_current?)", run.Stdout, StringComparison.Ordinal);
        Assert.False(Directory.Exists(repo.PathOf("motors")));
    }

    [Fact]
    public void A_sheet_saved_by_a_spreadsheet_program_with_semicolons_BOM_CRLF_and_quoted_cells_imports()
    {
        // Common practice: a spreadsheet program in a decimal-comma locale saves "CSV UTF-8" with semicolons, a BOM and
        // CRLF, and quotes a cell that holds the separator or a quote.
        using var repo = Repo();
        var csv = "tag;title;bus;motor.full_load_current [A];protection.short_circuit.pickup\r\n"
            + "P-101;\"Pump; raw water, \"\"north\"\"\";../buses/bus-1.yaml;58;7.2 A sec\r\n";
        var file = repo.WriteBytes("m.csv", [0xEF, 0xBB, 0xBF, .. Utf8.GetBytes(csv)]);
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"));
        Assert.Contains("1 new", run.Stderr, StringComparison.Ordinal);
        var text = File.ReadAllText(repo.PathOf("motors/p-101.yaml"));
        Assert.Contains("\ntitle: Pump; raw water, \"north\"\n", text, StringComparison.Ordinal);
        Assert.Contains("\n  full_load_current: 58 A\n", text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_decimal_comma_in_a_quoted_cell_of_a_comma_separated_sheet_is_refused_with_the_point_form()
    {
        using var repo = Repo();
        var csv = "tag,motor.service_factor,protection.thermal.pickup\r\nP-101,\"1,15\",\"1,05 xFLC\"\r\n";
        var file = repo.Write("m.csv", csv);
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"));
        Assert.Equal(1, run.Exit);
        Assert.Contains("m.csv:2:7: error SL005: Row 2, column B (motor.service_factor): '1,15' has a decimal comma (a quoted cell); setting files take a decimal point ('1.15').", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("m.csv:2:14: error SL005: Row 2, column C (protection.thermal.pickup): '1,05 xFLC' has a decimal comma (a quoted cell); setting files take a decimal point ('1.05 xFLC').", run.Stdout, StringComparison.Ordinal);
        Assert.False(Directory.Exists(repo.PathOf("motors")));
    }

    [Fact]
    public void A_file_that_exists_is_never_overwritten_without_update()
    {
        using var repo = Repo();
        var motor = repo.Write("motors/m-1.yaml", Samples.Motor);
        var file = repo.Write("m.csv", "tag,motor.full_load_current [A]\nM-1,60\n");
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"));
        Assert.Equal(1, run.Exit);
        Assert.Contains("m.csv:2:1: error SL005: Row 2, column A (tag): ", run.Stdout, StringComparison.Ordinal);
        Assert.Contains("--update", run.Stdout, StringComparison.Ordinal);
        Assert.Equal(Samples.Motor, File.ReadAllText(motor));
    }

    [Fact]
    public void Update_changes_only_the_characters_of_the_values_in_the_sheet()
    {
        using var repo = Repo();
        var original = Samples.MotorWith("  full_load_current: 58 A\n", "  full_load_current: 58 A      # nameplate, checked on site\n")
            .Replace("kind: motor-protection\n", "# Pump house, north wall\nkind: motor-protection\n", StringComparison.Ordinal);
        var motor = repo.Write("motors/m-1.yaml", original);
        // A value that changes, one that means the same written otherwise (left as written), a key the file lacks in a
        // block mapping and one in a flow mapping.
        var file = repo.Write("m.csv",
            "tag,motor.full_load_current [A],motor.service_factor,protection.short_circuit.delay,motor.no_load_current\n"
            + "M-1,60,1.150,0.05 s,20 A\n");
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--update");
        Assert.Contains("0 new, 1 updated, 0 unchanged", run.Stderr, StringComparison.Ordinal);
        var expected = original
            .Replace("full_load_current: 58 A      #", "full_load_current: 60 A      #", StringComparison.Ordinal)
            .Replace("  winding_leads: 6\n", "  winding_leads: 6\n  no_load_current: 20 A\n", StringComparison.Ordinal)
            .Replace("    pickup: 7.2 A sec\n", "    pickup: 7.2 A sec\n    delay: 0.05 s\n", StringComparison.Ordinal);
        Assert.Equal(expected, File.ReadAllText(motor));
        // Once more: nothing changes.
        var again = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--update");
        Assert.Contains("0 new, 0 updated, 1 unchanged", again.Stderr, StringComparison.Ordinal);
        Assert.Equal(expected, File.ReadAllText(motor));
    }

    [Fact]
    public void Update_adds_a_key_to_a_flow_mapping_inside_its_braces()
    {
        using var repo = Repo();
        var original = Samples.MotorWith("ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }", "ground_ct: { connection: core-balance }   # window CT");
        var motor = repo.Write("motors/m-1.yaml", original);
        var file = repo.Write("m.csv", "tag,transformers.ground_ct.primary [A],transformers.ground_ct.secondary [A]\nM-1,50,1\n");
        Cli.Run("import", file, "--out", repo.PathOf("motors"), "--update");
        Assert.Equal(original.Replace("{ connection: core-balance }", "{ connection: core-balance, primary: 50 A, secondary: 1 A }", StringComparison.Ordinal), File.ReadAllText(motor));
    }

    [Fact]
    public void A_map_names_the_sheets_own_headers_and_ignores_columns()
    {
        using var repo = Repo();
        var map = repo.Write("map.yaml", "columns:\n  Pump no.: tag\n  FLC: motor.full_load_current [A]\n  Remarks: ignore\n");
        var file = repo.Write("m.csv", "Pump no.,FLC,Remarks\nP-101,58,new seal fitted 2025\n");
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"), "--map", map);
        Assert.Contains("1 new", run.Stderr, StringComparison.Ordinal);
        Assert.Equal("kind: motor-protection\nformat: 1\ntag: P-101\nmotor:\n  full_load_current: 58 A\n", File.ReadAllText(repo.PathOf("motors/p-101.yaml")));
    }

    [Fact]
    public void An_XLSX_sheet_is_read_by_name_and_its_problems_are_at_row_and_column()
    {
        using var repo = Repo();
        var book = repo.PathOf("list.xlsx");
        SheetTestFiles.WriteXlsx(book, "Motors", [["tag", "motor.full_load_current [A]", "motor.service_factor"], ["P-101", "58", "1.15"], ["P-102", "61", "abc"]], firstSheet: "Cover");
        var run = Cli.Run("import", book, "--out", repo.PathOf("motors"), "--sheet", "Motors", "--format", "sarif");
        Assert.Equal(1, run.Exit);
        var result = Assert.Single(SheetTestFiles.SarifResults(run.Stdout));
        Assert.Equal(("SL005", "list.xlsx", 3, 3), (result.Rule, result.Uri, result.Line, result.Column));
        Assert.StartsWith("Row 3, column C (motor.service_factor): ", result.Message, StringComparison.Ordinal);
        var wrong = Cli.Run("import", book, "--out", repo.PathOf("motors"), "--sheet", "Pumps");
        Assert.Equal(2, wrong.Exit);
        Assert.Contains("has no sheet named 'Pumps'; its sheets are: 'Cover', 'Motors'", wrong.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public void A_bus_named_by_its_tag_is_written_as_the_path_to_its_file()
    {
        using var repo = Repo();
        var file = repo.Write("m.csv", "tag,bus,relay_model\nP-101,BUS-1,RELAY-A\n");
        Cli.Run("import", file, "--out", repo.PathOf("area/motors"));
        var text = File.ReadAllText(repo.PathOf("area/motors/p-101.yaml"));
        Assert.Contains("\nbus: ../../buses/bus-1.yaml\nrelay_model: ../../models/relay-a.yaml\n", text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_CSV_that_is_not_UTF8_is_refused_before_anything_is_read()
    {
        using var repo = Repo();
        var file = repo.WriteBytes("m.csv", [.. "tag,title\nP-101,Pompe \u00e0 eau\n".Select(c => (byte)c)]);
        var run = Cli.Run("import", file, "--out", repo.PathOf("motors"));
        Assert.Equal(2, run.Exit);
        Assert.Contains("is not UTF-8", run.Stderr, StringComparison.Ordinal);
    }
}
