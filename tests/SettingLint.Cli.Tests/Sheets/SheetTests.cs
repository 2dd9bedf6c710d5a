using System.Globalization;
using SettingLint.Core.Findings;
using SettingLint.Reporting.Html;
using SettingLint.Sheets.Tables;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>`settinglint sheet`: the values a technician keys in, the relay's range, findings, the caution, changes.</summary>
public sealed class SheetTests
{
    private static readonly string Caution = "Caution: " + HtmlReport.Caution;

    /// <summary>The rows of a written CSV sheet below its caution and header, as (tag, setting path tail) to cells by header.</summary>
    private static Dictionary<(string Tag, string Element, string Setting), Dictionary<string, string>> Read(string csv)
    {
        var table = CsvTableReader.Read(csv);
        var header = table.Rows[1].Select(c => c.Text).ToList();
        return table.Rows.Skip(2).Where(r => !r.IsEmpty)
            .Select(r => header.Select((h, i) => (h, i < r.Length ? r[i].Text : "")).ToDictionary(p => p.h, p => p.Item2))
            .ToDictionary(d => (d["tag"], d["element"], d["setting"]));
    }

    [Fact]
    public void Secondary_values_are_the_primary_ones_through_the_CT_or_VT_ratio_for_5_A_and_1_A_CTs()
    {
        using var repo = new TempRepo();
        repo.Write(".settinglint.yaml", Cli.EngineOnlyConfig);
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        // Motor 1: phase CT 75:5, core-balance CT 50:5, VT 4200:120 (the sample). Motor 2: phase CT 300:1, core-balance 50:1.
        var protection = """
            protection:
              thermal:
                enabled: true
                pickup: 1.15 xFLC
              short_circuit:
                enabled: true
                pickup: 7.2 A sec
              ground_fault:
                enabled: true
                pickup: 0.2 xCT
              undervoltage:
                enabled: true
                pickup: 90 %
              overvoltage:
                enabled: true
                pickup: 132 V sec

            """;
        var one = Samples.Motor[..Samples.Motor.IndexOf("protection:", StringComparison.Ordinal)] + protection;
        repo.Write("motors/m-1.yaml", one);
        var two = Samples.Replace(Samples.Replace(Samples.Replace(one, "tag: M-1", "tag: M-2"),
            "phase_ct: { primary: 75 A, secondary: 5 A, class: C50, burden: 0.3 ohm }", "phase_ct: { primary: 300 A, secondary: 1 A, class: C50, burden: 0.3 ohm }"),
            "ground_ct: { connection: core-balance, primary: 50 A, secondary: 5 A }", "ground_ct: { connection: core-balance, primary: 50 A, secondary: 1 A }");
        repo.Write("motors/m-2.yaml", two);
        var output = repo.PathOf("out/sheet.csv");
        var run = Cli.Run("sheet", repo.Root, "--output", output);
        Assert.True(run.Exit == 0, run.ToString());
        var rows = Read(output);
        void Expect(string tag, string element, string setting, double primary, double secondary, string unit)
        {
            var row = rows[(tag, element, setting)];
            // The sheet gives six significant figures.
            Assert.Equal(primary, double.Parse(row["primary"], CultureInfo.InvariantCulture), primary * 1e-5);
            Assert.Equal(secondary, double.Parse(row["secondary"], CultureInfo.InvariantCulture), secondary * 1e-5);
            Assert.Equal(unit, row["unit"]);
        }
        // IEEE C57.13: the marked ratio is rated primary to rated secondary current (or voltage); a relay setting on
        // the secondary side is the primary value divided by it. FLC 58 A, rated voltage 4000 V (the sample).
        Expect("M-1", "Thermal overload (49)", "pickup", 1.15 * 58, 1.15 * 58 * 5 / 75, "A");
        Expect("M-1", "Short circuit (50P)", "pickup", 7.2 * 75 / 5, 7.2, "A");
        Expect("M-1", "Ground fault (50G/50N)", "pickup", 0.2 * 50, 0.2 * 50 * 5 / 50, "A");
        Expect("M-1", "Undervoltage (27)", "pickup", 0.9 * 4000, 0.9 * 4000 * 120 / 4200, "V");
        Expect("M-1", "Overvoltage (59)", "pickup", 132 * 4200.0 / 120, 132, "V");
        Expect("M-2", "Thermal overload (49)", "pickup", 1.15 * 58, 1.15 * 58 * 1 / 300, "A");
        Expect("M-2", "Short circuit (50P)", "pickup", 7.2 * 300 / 1, 7.2, "A");
        Expect("M-2", "Ground fault (50G/50N)", "pickup", 0.2 * 50, 0.2 * 50 * 1 / 50, "A");
        Assert.Equal("1.15 xFLC", rows[("M-1", "Thermal overload (49)", "pickup")]["value as written"]);
        Assert.Equal("", rows[("M-1", "Thermal overload (49)", "enabled")]["secondary"]);
    }

    [Fact]
    public void The_demo_sheet_has_the_relay_range_the_findings_and_the_caution_in_every_format()
    {
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        using var repo = new TempRepo();
        var csv = repo.PathOf("s.csv");
        Assert.Equal(0, Cli.Run("sheet", examples, "--output", csv).Exit);
        var text = File.ReadAllText(csv);
        Assert.StartsWith(Caution + ",,,,,,,,,\n", text.Replace("\r\n", "\n", StringComparison.Ordinal), StringComparison.Ordinal);
        var rows = Read(csv);
        // P-202's planted mistake: 46 A primary where 46 A secondary was meant (examples/README.md).
        var sc = rows[("P-202", "Short circuit (50P)", "pickup")];
        Assert.Equal("46 A pri", sc["value as written"]);
        Assert.Equal("1 xCT to 20 xCT", sc["relay range"]);
        Assert.Equal("0.01 xCT", sc["relay step"]);
        Assert.Contains("SL201 error: ", sc["findings"], StringComparison.Ordinal);
        Assert.Equal("", rows[("P-201", "Short circuit (50P)", "pickup")]["findings"]);

        var html = repo.PathOf("s.html");
        Assert.Equal(0, Cli.Run("sheet", examples, "--output", html, "--motor", "P-202").Exit);
        var page = File.ReadAllText(html);
        Assert.Contains("<p class=\"caution\">" + System.Net.WebUtility.HtmlEncode(Caution) + "</p>", page, StringComparison.Ordinal);
        Assert.DoesNotContain(">P-201<", page, StringComparison.Ordinal);

        var xlsx = repo.PathOf("s.xlsx");
        Assert.Equal(0, Cli.Run("sheet", examples, "--output", xlsx).Exit);
        var book = XlsxTableReader.Read(xlsx);
        Assert.Equal(Caution, book.Rows[0][0].Text);
        Assert.Equal("tag", book.Rows[1][0].Text);
        Assert.Equal(CsvTableReader.Read(csv).Rows.Length, book.Rows.Length);

        Assert.Equal(ExitCodes.Usage, Cli.Run("sheet", examples, "--output", csv, "--motor", "NO-SUCH").Exit);
        Assert.Equal(ExitCodes.Usage, Cli.Run("sheet", examples, "--output", repo.PathOf("s.txt")).Exit);
    }

    [Fact]
    public void The_help_of_sheet_carries_the_caution()
    {
        var run = Cli.Run("sheet", "--help");
        Assert.Contains(Caution, run.Stdout.ReplaceLineEndings(" ").Replace("  ", " ", StringComparison.Ordinal), StringComparison.Ordinal);
    }

    [Fact]
    public void Changed_since_lists_only_the_settings_that_changed_old_beside_new()
    {
        using var repo = new GateGitRepo();
        repo.Git("add", "-A");
        repo.Commit("demo");
        repo.Edit(GateGitRepo.Breaker, "pickup: 46 A sec", "pickup: 44 A sec");
        repo.Edit(GateGitRepo.Contactor, "  undercurrent:", "  undercurrent:\n    delay: 4 s\n  undercurrent_unused:");
        var output = repo.PathOf("out/changes.csv");
        var run = Cli.Run("sheet", repo.Root, "--output", output, "--changed-since", "HEAD");
        Assert.True(run.Exit == 0, run.ToString());
        var table = CsvTableReader.Read(output);
        var header = table.Rows[1].Select(c => c.Text).ToList();
        Assert.Equal(["tag", "element", "setting", "change", "old value", "new value"], header.Take(6));
        var changed = table.Rows.Skip(2).Where(r => !r.IsEmpty).Select(r => string.Join("|", r.Take(6).Select(c => c.Text))).ToList();
        Assert.Contains("P-201|Short circuit (50P)|pickup|changed|46 A sec|44 A sec", changed);
        Assert.All(changed, c => Assert.StartsWith("P-", c, StringComparison.Ordinal));
        Assert.DoesNotContain(changed, c => c.Contains("|enabled|", StringComparison.Ordinal) && c.StartsWith("P-201", StringComparison.Ordinal));
    }
}
