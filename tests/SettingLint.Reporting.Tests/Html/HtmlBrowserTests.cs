using System.Globalization;
using System.Net;
using System.Text.Json;
using System.Text.RegularExpressions;
using SettingLint.Reporting.Html;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>The report renders in a real browser: a motor page is screenshot by headless Chromium, and its plot is on the page and drawn.</summary>
public sealed class HtmlBrowserTests
{
    // A copy of the page with a probe script appended: the report itself has no scripts, the test adds one to read the layout.
    private const string Probe = """
        <script>
        (function () {
          var out = {};
          [['tcc', '#time-current svg'], ['level', '#thermal-level svg']].forEach(function (p) {
            var e = document.querySelector(p[1]);
            if (!e) return;
            var r = e.getBoundingClientRect();
            out[p[0]] = { x: r.left + scrollX, y: r.top + scrollY, w: r.width, h: r.height };
          });
          out.page = { w: document.documentElement.scrollWidth, h: document.documentElement.scrollHeight, vw: innerWidth };
          out.polylines = document.querySelectorAll('#time-current polyline').length;
          var pre = document.createElement('pre');
          pre.id = 'layout-probe';
          pre.textContent = JSON.stringify(out);
          document.body.appendChild(pre);
        })();
        </script>
        """;

    [BrowserFact]
    public void A_motor_page_renders_with_its_plot_on_the_page()
    {
        using var dir = new TempFolder();
        var model = HtmlTestSupport.DemoModel();
        HtmlReport.Write(model, dir.Path);
        var motor = model.Motors.Single(m => m.Tag == "P-201");
        var page = Path.Combine(dir.Path, HtmlReport.PagePath(motor));

        // Layout: where the browser put the plots.
        var probePage = Path.Combine(Path.GetDirectoryName(page)!, "probe.html");
        File.WriteAllText(probePage, File.ReadAllText(page).Replace("</body>", Probe + "\n</body>", StringComparison.Ordinal));
        var dom = HtmlBrowser.Run(probePage, "--dump-dom");
        var match = Regex.Match(dom, "<pre id=\"layout-probe\">(.*?)</pre>", RegexOptions.Singleline);
        Assert.True(match.Success, "the probe did not run; DOM:\n" + dom[..Math.Min(dom.Length, 2000)]);
        var layout = JsonDocument.Parse(WebUtility.HtmlDecode(match.Groups[1].Value)).RootElement;
        var tcc = Box(layout.GetProperty("tcc"));
        var viewport = layout.GetProperty("page").GetProperty("vw").GetDouble();
        Assert.True(tcc.W > 600 && tcc.H > 400, $"plot box {tcc}");
        Assert.True(tcc.X >= 0 && tcc.X + tcc.W <= viewport, $"plot box {tcc} is not inside the {viewport} px wide page");
        Assert.True(tcc.Y >= 0 && tcc.Y + tcc.H <= 2000, $"plot box {tcc} is not inside the first 2000 px");
        Assert.True(layout.GetProperty("polylines").GetInt32() >= 5);
        var level = Box(layout.GetProperty("level"));
        Assert.True(level.W > 600 && level.H > 200 && level.Y > tcc.Y + tcc.H);

        // Pixels: the screenshot of the unmodified page is not blank, and the plot's box holds the cold curve's blue.
        var png = Path.Combine(dir.Path, "p-201.png");
        HtmlBrowser.Run(page, "--screenshot=" + png);
        var image = HtmlPng.Read(File.ReadAllBytes(png));
        Assert.Equal(1280, image.Width);
        Assert.Equal(2000, image.Height);
        var colours = new HashSet<int>();
        for (var y = 0; y < image.Height; y += 3)
        {
            for (var x = 0; x < image.Width; x += 3) colours.Add(image.Rgb(x, y));
        }
        Assert.True(colours.Count > 100, $"only {colours.Count} colours: the page looks blank");
        var (blue, inside) = (0, new HashSet<int>());
        for (var y = (int)tcc.Y; y < Math.Min(image.Height, (int)(tcc.Y + tcc.H)); y++)
        {
            for (var x = (int)tcc.X; x < Math.Min(image.Width, (int)(tcc.X + tcc.W)); x++)
            {
                var c = image.Rgb(x, y);
                inside.Add(c);
                if (Near(c, 0x1f4e9c, 40)) blue++;
            }
        }
        Assert.True(inside.Count > 50, "the plot's box is nearly uniform: the SVG did not draw");
        Assert.True(blue > 300, $"only {blue} pixels of the thermal curves' blue inside the plot box");
    }

    private static (double X, double Y, double W, double H) Box(JsonElement e) =>
        (e.GetProperty("x").GetDouble(), e.GetProperty("y").GetDouble(), e.GetProperty("w").GetDouble(), e.GetProperty("h").GetDouble());

    private static bool Near(int c, int target, int tolerance) =>
        Math.Abs(((c >> 16) & 255) - ((target >> 16) & 255)) <= tolerance
        && Math.Abs(((c >> 8) & 255) - ((target >> 8) & 255)) <= tolerance
        && Math.Abs((c & 255) - (target & 255)) <= tolerance;

    [Fact]
    public void The_skip_reason_is_never_given_in_ci()
    {
        if (Environment.GetEnvironmentVariable("CI") == "true") Assert.Null(HtmlBrowser.SkipReason());
        else Assert.True(HtmlBrowser.SkipReason() is null == HtmlBrowser.Find() is not null, string.Create(CultureInfo.InvariantCulture, $"browser {HtmlBrowser.Find()}"));
    }
}
