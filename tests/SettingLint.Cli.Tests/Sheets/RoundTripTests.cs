using System.Globalization;
using System.Security.Cryptography;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;
using SettingLint.Sheets.Tables;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Sheets;

/// <summary>
/// From a motor list to files and back: a generated list of 300 motors (CSV and XLSX) imports, checks clean and comes
/// back through `sheet --format import` without a byte changing; the demo's motor list imports into its motor files.
/// </summary>
public sealed class RoundTripTests
{
    private const int Motors = 300;

    /// <summary>A motor list of 300 rows with values drawn from a fixed seed, each a complete motor file.</summary>
    private static List<IReadOnlyList<string>> MotorList()
    {
        var random = new Random(20261205);
        var header = (ImportTests.Header + ",protection.thermal.enabled,protection.thermal.pickup,protection.thermal.time_constant [min]").Split(',');
        var rows = new List<IReadOnlyList<string>> { header };
        int[] ctPrimaries = [50, 75, 100, 150, 200, 300, 400, 600];
        for (var i = 0; i < Motors; i++)
        {
            var flc = Math.Round(10 + random.NextDouble() * 390, 1);
            var ct = ctPrimaries.First(p => p >= flc * 1.1 || p == ctPrimaries[^1]);
            var secondary = random.Next(2) == 0 ? 5 : 1;
            var cells = ImportTests.Row("M-" + (1000 + i).ToString(CultureInfo.InvariantCulture),
                flc: flc.ToString(CultureInfo.InvariantCulture),
                pickup: Math.Round(6 + random.NextDouble() * 6, 2).ToString(CultureInfo.InvariantCulture) + " xFLC",
                title: "Pump " + i.ToString(CultureInfo.InvariantCulture) + (i % 7 == 0 ? ", \"spare\"" : "")).Split(',');
            // The title of every seventh row holds a comma and quotes: join by hand would split it, so it is put back.
            var list = i % 7 == 0 ? [cells[0], cells[1] + "," + cells[2], .. cells[3..]] : cells.ToList();
            list[16] = ct.ToString(CultureInfo.InvariantCulture);                    // transformers.phase_ct.primary [A]
            list[17] = secondary.ToString(CultureInfo.InvariantCulture);             // transformers.phase_ct.secondary [A]
            list.Add(random.Next(4) == 0 ? "false" : "true");
            list.Add(Math.Round(1.0 + random.Next(0, 21) * 0.01, 2).ToString("0.00", CultureInfo.InvariantCulture) + " xFLC");
            list.Add(random.Next(5, 60).ToString(CultureInfo.InvariantCulture));
            Assert.Equal(header.Length, list.Count);
            rows.Add(list);
        }
        return rows;
    }

    private static string Csv(List<IReadOnlyList<string>> rows) =>
        string.Join("\r\n", rows.Select(r => string.Join(',', r.Select(c => c.Contains(',', StringComparison.Ordinal) || c.Contains('"', StringComparison.Ordinal) ? "\"" + c.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : c)))) + "\r\n";

    private static TempRepo Repo()
    {
        var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(".settinglint.yaml", Cli.EngineOnlyConfig);
        return repo;
    }

    private static Dictionary<string, string> Hashes(string folder) =>
        Directory.GetFiles(folder).ToDictionary(f => Path.GetFileName(f), f => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(f))));

    [Theory]
    [InlineData(".csv")]
    [InlineData(".xlsx")]
    public void Three_hundred_motors_import_check_and_come_back_byte_for_byte(string extension)
    {
        using var repo = Repo();
        var rows = MotorList();
        var list = repo.PathOf("list" + extension);
        if (extension == ".csv") File.WriteAllText(list, Csv(rows));
        else SheetTestFiles.WriteXlsx(list, "Motors", rows);

        var first = Cli.Run("import", list, "--out", repo.PathOf("motors"));
        Assert.True(first.Exit == 0, first.ToString());
        Assert.Contains($"{Motors} new, 0 updated, 0 unchanged", first.Stderr, StringComparison.Ordinal);
        Assert.Contains($"0 errors, 0 warnings, 0 notes in {Motors} files ({Motors} motors)", first.Stdout, StringComparison.Ordinal);
        var written = Hashes(repo.PathOf("motors"));
        Assert.Equal(Motors, written.Count);
        Assert.Contains("\ntitle: Pump 0, \"spare\"\n", File.ReadAllText(repo.PathOf("motors/m-1000.yaml")), StringComparison.Ordinal);

        // Out as the motor list import reads, and in again over the same files: nothing changes.
        var export = repo.PathOf("export" + extension);
        Assert.Equal(0, Cli.Run("sheet", repo.PathOf("motors"), "--output", export, "--format", "import").Exit);
        var again = Cli.Run("import", export, "--out", repo.PathOf("motors"), "--update");
        Assert.True(again.Exit == 0, again.ToString());
        Assert.Contains($"0 new, 0 updated, {Motors} unchanged", again.Stderr, StringComparison.Ordinal);
        Assert.Equal(written, Hashes(repo.PathOf("motors")));

        // Into an empty repository, the exported list makes the same bytes as the original list.
        using var fresh = Repo();
        var copy = fresh.PathOf("export" + extension);
        File.Copy(export, copy);
        Assert.Equal(0, Cli.Run("import", copy, "--out", fresh.PathOf("motors")).Exit);
        Assert.Equal(written, Hashes(fresh.PathOf("motors")));
    }

    /// <summary>
    /// Each site of the demo has its motor list: the 60 Hz site at the top and the 50 Hz IEC site in <c>intake/</c>,
    /// whose lists carry the additions for reduced-voltage and soft starts and IEC CTs (rated burden in VA).
    /// </summary>
    [Theory]
    [InlineData("")]
    [InlineData("intake/")]
    public void The_demo_motor_list_imports_into_the_demo_motor_files_apart_from_comments(string site)
    {
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        using var repo = new TempRepo();
        foreach (var folder in (string[])["models", site + "buses"])
        {
            foreach (var file in Directory.GetFiles(Path.Combine(examples, folder))) repo.Write(folder + "/" + Path.GetFileName(file), File.ReadAllText(file));
        }
        repo.Write("schema/motor-protection.schema.json", File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "schema", "motor-protection.schema.json")));
        var list = repo.Write(site + "import/motor-list.csv", File.ReadAllText(Path.Combine(examples, site + "import", "motor-list.csv")));
        var run = Cli.Run("import", list, "--out", repo.PathOf(site + "motors"));
        Assert.True(run.Exit is 0 or 1 && run.Stderr.Contains(" new, 0 updated", StringComparison.Ordinal), run.ToString());
        // Whatever motors the site has, the list must make each of them, and no other.
        var demo = Directory.GetFiles(Path.Combine(examples, site + "motors"), "*.yaml").Select(Path.GetFileName).Order(StringComparer.Ordinal).ToList();
        Assert.Equal(demo, Directory.GetFiles(repo.PathOf(site + "motors"), "*.yaml").Select(Path.GetFileName).Order(StringComparer.Ordinal));
        foreach (var name in demo)
        {
            Assert.Equal(Values(Path.Combine(examples, site + "motors", name!)), Values(repo.PathOf(site + "motors/" + name)));
        }
    }

    /// <summary>Every scalar of a file by key path, as YAML reads it: comments, key order, flow or block style and quoting do not count.</summary>
    private static SortedDictionary<string, string> Values(string file)
    {
        var values = new SortedDictionary<string, string>(StringComparer.Ordinal);
        void Walk(YMapping m, string prefix)
        {
            foreach (var e in m.Entries)
            {
                var path = prefix.Length == 0 ? e.Key.Value : prefix + "." + e.Key.Value;
                if (e.Value is YMapping child) Walk(child, path);
                else values[path] = e.Value is YScalar s ? s.Value : e.Value.Describe();
            }
        }
        Walk((YMapping)YamlLoader.LoadFile(file, file, LoadLimits.Default).Root!, "");
        return values;
    }
}
