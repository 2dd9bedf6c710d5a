using System.Text.Json;
using System.Text.RegularExpressions;
using System.Xml.Linq;
using SettingLint.Core.Findings;
using SettingLint.Reporting.Html;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>The demo plant's report: every motor listed, every page self-contained and cautioned, margins in the promised order.</summary>
public sealed partial class HtmlReportTests
{
    private static IReadOnlyDictionary<string, string> Files(ReportModel model) => HtmlReport.Render(model).ToDictionary(f => f.Path, f => f.Content, StringComparer.Ordinal);

    [GeneratedRegex("<tr[^>]* data-motor=\"([^\"]+)\"")]
    private static partial Regex MotorRow();

    [Fact]
    public void The_motor_table_lists_every_motor_of_the_demo()
    {
        var model = HtmlTestSupport.DemoModel();
        var index = Files(model)["index.html"];
        var listed = MotorRow().Matches(index).Select(m => m.Groups[1].Value).ToList();
        Assert.Equal(11, listed.Count);
        Assert.Equal(HtmlTestSupport.Demo.Result.Motors.Order(StringComparer.Ordinal), listed.Order(StringComparer.Ordinal));
        foreach (var m in model.Motors) Assert.Contains("href=\"" + HtmlReport.PagePath(m) + "\"", index, StringComparison.Ordinal);
    }

    [Fact]
    public void Every_page_carries_the_caution_and_needs_nothing_from_outside()
    {
        foreach (var (path, content) in Files(HtmlTestSupport.DemoModel()))
        {
            if (path.EndsWith(".json", StringComparison.Ordinal))
            {
                Assert.Equal(HtmlReport.Caution, JsonDocument.Parse(content).RootElement.GetProperty("caution").GetString());
                continue;
            }
            if (path.EndsWith(".html", StringComparison.Ordinal)) Assert.Contains(HtmlReport.Caution, content, StringComparison.Ordinal);
            else Assert.Contains("These rules screen settings for review;", content, StringComparison.Ordinal);
            Assert.DoesNotContain("<script", content, StringComparison.OrdinalIgnoreCase);
            Assert.DoesNotContain("@import", content, StringComparison.OrdinalIgnoreCase);
            Assert.DoesNotContain("url(http", content, StringComparison.OrdinalIgnoreCase);
            Assert.DoesNotMatch("(src|href)=\"(https?:)?//", content);
            // The only absolute URI is the SVG namespace, which is a name, not a fetch.
            var uris = Regex.Matches(content, "https?://[^\"' )<]+").Select(m => m.Value).Distinct().ToList();
            Assert.All(uris, u => Assert.Equal("http://www.w3.org/2000/svg", u));
        }
    }

    [Fact]
    public void Standalone_plots_are_well_formed_svg_and_match_the_inline_ones()
    {
        var model = HtmlTestSupport.DemoModel();
        var files = Files(model);
        foreach (var m in model.Motors)
        {
            var svg = files[HtmlReport.TimeCurrentPath(m)];
            var doc = XDocument.Parse(svg);
            Assert.Equal("svg", doc.Root!.Name.LocalName);
            Assert.Contains(svg[(svg.IndexOf('\n', StringComparison.Ordinal) + 1)..], files[HtmlReport.PagePath(m)], StringComparison.Ordinal);
            XDocument.Parse(files[HtmlReport.ThermalLevelPath(m)]);
        }
    }

    [Fact]
    public void Margins_put_failures_first_then_the_tightest()
    {
        var p202 = HtmlTestSupport.DemoModel().Motors.Single(m => m.Tag == "P-202");
        var rows = p202.Margins;
        var firstPass = rows.ToList().FindIndex(r => r.Status != MarginStatus.Failed);
        Assert.True(firstPass > 0);
        Assert.All(rows.Take(firstPass), r => Assert.Equal(MarginStatus.Failed, r.Status));
        Assert.All(rows.Skip(firstPass), r => Assert.NotEqual(MarginStatus.Failed, r.Status));
        // Errors before notes among the failures; ratios rise among the passes that have one.
        Assert.Equal(Level.Error, rows[0].Outcome.Level);
        var ratios = rows.Skip(firstPass).Where(r => r.MarginRatio is not null).Select(r => r.MarginRatio!.Value).ToList();
        Assert.Equal(ratios.Order(), ratios);
        // The planted secondary-read-as-primary pickup: 46 A pri against 1.7 x the 1.04 kA start.
        var sl201 = rows.Single(r => r.Outcome.RuleId == "SL201");
        Assert.Equal(MarginStatus.Failed, sl201.Status);
        Assert.StartsWith("46 A pri", sl201.Actual, StringComparison.Ordinal);
        Assert.NotNull(sl201.Message);
        // Every rule that applied is a row: passing ones too.
        Assert.Equal(HtmlTestSupport.Demo.Outcomes.Count(o => o.MotorFile == p202.File), rows.Length);
    }

    [Fact]
    public void Near_misses_follow_the_parameter()
    {
        var tight = HtmlTestSupport.DemoModel(0.10).Motors.Single(m => m.Tag == "P-201");
        var loose = HtmlTestSupport.DemoModel(0.50).Motors.Single(m => m.Tag == "P-201");
        var none = HtmlTestSupport.DemoModel(0).Motors.Single(m => m.Tag == "P-201");
        Assert.Equal(0, none.NearMisses);
        Assert.True(loose.NearMisses > tight.NearMisses);
        Assert.All(tight.Margins.Where(r => r.Status == MarginStatus.NearMiss), r => Assert.True(r.Outcome.Passed && r.MarginRatio < 0.10));
        // SL201 on P-201: 1.84 kA against 1.76 kA, 4.5 % inside: a near miss at 10 %.
        Assert.Equal(MarginStatus.NearMiss, tight.Margins.Single(r => r.Outcome.RuleId == "SL201").Status);
    }

    [Fact]
    public void Report_json_carries_margins_and_windows_of_every_motor()
    {
        var json = JsonDocument.Parse(ReportJson.Render(HtmlTestSupport.DemoModel())).RootElement;
        var motors = json.GetProperty("motors").EnumerateArray().ToList();
        Assert.Equal(11, motors.Count);
        var p201 = motors.Single(m => m.GetProperty("tag").GetString() == "P-201");
        var sc = p201.GetProperty("windows").EnumerateArray().Single(w => w.GetProperty("setting").GetString() == "protection.short_circuit.pickup");
        Assert.Equal("SL201", sc.GetProperty("lower").GetProperty("ruleId").GetString());
        Assert.Equal(1840, sc.GetProperty("set").GetProperty("number").GetDouble(), 6);
        Assert.True(sc.GetProperty("holds").GetBoolean());
        var margin = p201.GetProperty("margins").EnumerateArray().First(m => m.GetProperty("ruleId").GetString() == "SL201");
        Assert.Equal("near-miss", margin.GetProperty("status").GetString());
        Assert.True(margin.GetProperty("marginRatio").GetDouble() is > 0 and < 0.1);
    }

    [Fact]
    public void Writing_the_report_makes_the_index_a_page_per_motor_and_the_svg_files()
    {
        using var dir = new TempFolder();
        var model = HtmlTestSupport.DemoModel();
        HtmlReport.Write(model, dir.Path);
        Assert.True(File.Exists(Path.Combine(dir.Path, "index.html")));
        Assert.True(File.Exists(Path.Combine(dir.Path, "report.json")));
        foreach (var m in model.Motors)
        {
            Assert.True(File.Exists(Path.Combine(dir.Path, HtmlReport.PagePath(m))));
            Assert.True(File.Exists(Path.Combine(dir.Path, HtmlReport.TimeCurrentPath(m))));
        }
        // The same model writes the same bytes: no times, no machine paths.
        var again = HtmlReport.Render(model);
        Assert.Equal(File.ReadAllText(Path.Combine(dir.Path, "index.html")), again.Single(f => f.Path == "index.html").Content);
        Assert.DoesNotContain(HtmlTestSupport.SourceRoot(), File.ReadAllText(Path.Combine(dir.Path, "report.json")), StringComparison.Ordinal);
    }

    [Fact]
    public void Text_from_the_files_is_escaped()
    {
        using var repo = new TempFolder(repo: true);
        var motor = File.ReadAllText(Path.Combine(HtmlTestSupport.Examples, "motors", "p-201.yaml"))
            .Replace("title: High-lift pump 1", "title: \"<b>pump</b> & 'co'\"", StringComparison.Ordinal)
            .Replace("../buses/", "buses/", StringComparison.Ordinal).Replace("../models/", "models/", StringComparison.Ordinal);
        repo.Write("p.yaml", motor);
        repo.Write("buses/sg-41a.yaml", File.ReadAllText(Path.Combine(HtmlTestSupport.Examples, "buses", "sg-41a.yaml")));
        repo.Write("models/standard-motor-relay.yaml", File.ReadAllText(Path.Combine(HtmlTestSupport.Examples, "models", "standard-motor-relay.yaml")));
        var files = HtmlReport.Render(ReportBuilder.Build(ReportData.Collect(new SettingLint.Core.Linting.CheckRequest(repo.Path, [])), ToolInfo.ForVersion("0.1.0")));
        var page = files.Single(f => f.Path.StartsWith("motors/", StringComparison.Ordinal)).Content;
        Assert.DoesNotContain("<b>pump</b>", page, StringComparison.Ordinal);
        Assert.Contains("&lt;b&gt;pump&lt;/b&gt; &amp; &#39;co&#39;", page, StringComparison.Ordinal);
    }
}

/// <summary>A rule not run for missing data shows on the motor's page, in the index and in report.json.</summary>
public sealed class HtmlNotRunTests
{
    [Fact]
    public void A_bus_without_its_minimum_fault_current_shows_SL202_not_run_on_each_of_its_motors()
    {
        using var folder = new TempFolder(repo: true);
        foreach (var file in Directory.EnumerateFiles(HtmlTestSupport.Examples, "*.yaml", SearchOption.AllDirectories))
        {
            var relative = Path.GetRelativePath(HtmlTestSupport.Examples, file);
            var text = File.ReadAllText(file);
            if (relative.EndsWith("sg-41a.yaml", StringComparison.Ordinal))
            {
                var line = text.Split('\n').Single(l => l.StartsWith("fault_current_min:", StringComparison.Ordinal));
                text = text.Replace(line + "\n", "", StringComparison.Ordinal);
            }
            folder.Write(relative, text);
        }
        var model = ReportBuilder.Build(ReportData.Collect(new SettingLint.Core.Linting.CheckRequest(folder.Path, [])), ToolInfo.ForVersion("0.1.0"));
        var files = HtmlReport.Render(model).ToDictionary(f => f.Path, f => f.Content, StringComparer.Ordinal);
        var onBus = model.Motors.Where(m => m.Bus == "SG-41A").ToList();
        Assert.NotEmpty(onBus);
        foreach (var m in model.Motors)
        {
            var page = files[HtmlReport.PagePath(m)];
            var expected = m.Bus == "SG-41A" && m.Plot.ShortCircuitPickup is not null;
            Assert.Equal(expected, page.Contains("<h2 id=\"not-run\">", StringComparison.Ordinal));
            if (!expected) continue;
            Assert.Contains("<tr data-rule=\"SL202\"><td><b>SL202</b>", page, StringComparison.Ordinal);
            Assert.Contains("<code>bus.fault_current_min</code>", page, StringComparison.Ordinal);
        }
        var count = model.Motors.Sum(m => m.NotRun.Length);
        Assert.Equal(model.Result.NotRun.Length, count);
        Assert.True(count >= 1);
        Assert.Contains("checks not run for missing data", files["index.html"], StringComparison.Ordinal);
        using var json = System.Text.Json.JsonDocument.Parse(files["report.json"]);
        Assert.Equal(count, json.RootElement.GetProperty("summary").GetProperty("notRun").GetInt32());
    }
}
