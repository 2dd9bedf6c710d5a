using System.Globalization;
using System.Text;
using System.Xml.Linq;
using SettingLint.Reporting.Html;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>Where this source tree is, a throw-away folder, and the demo report rendered once.</summary>
internal static class HtmlTestSupport
{
    public static string SourceRoot() => SettingLint.Tests.Shared.RepositoryPaths.Root();

    public static string Examples => Path.Combine(SourceRoot(), "examples");

    /// <summary>The demo plant's report data (the examples folder is checked once per test run).</summary>
    public static ReportData Demo => DemoData.Value;

    private static readonly Lazy<ReportData> DemoData = new(() => ReportData.Collect(new SettingLint.Core.Linting.CheckRequest(Examples, [])));

    public static ReportModel DemoModel(double nearMiss = ReportBuilder.DefaultNearMiss) => ReportBuilder.Build(Demo, ToolInfo.ForVersion("0.1.0"), nearMiss);

    public static double Num(string s) => double.Parse(s, NumberStyles.Float, CultureInfo.InvariantCulture);
}

/// <summary>A temporary folder, deleted on dispose; with <see cref="Repo"/> a repository (it has a .git folder).</summary>
internal sealed class TempFolder : IDisposable
{
    public TempFolder(bool repo = false)
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "settinglint-html-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
        if (repo) Directory.CreateDirectory(System.IO.Path.Combine(Path, ".git"));
    }

    public string Path { get; }

    public string Write(string relative, string text)
    {
        var full = System.IO.Path.Combine(Path, relative);
        Directory.CreateDirectory(System.IO.Path.GetDirectoryName(full)!);
        File.WriteAllText(full, text, new UTF8Encoding(false));
        return full;
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A temp folder left behind is not a test failure.
        }
    }
}

/// <summary>
/// Reads a plot back from its SVG text alone: the plot area's transform from its data attributes, and each series'
/// polyline turned back into values. Independent of the plot code's own axis type, so that a mistake there is caught.
/// </summary>
internal sealed class SvgPlot
{
    public static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    private readonly XElement _area;

    public SvgPlot(string svg)
    {
        Document = XDocument.Parse(svg);
        _area = Document.Descendants(Svg + "g").Single(g => (string?)g.Attribute("class") == "plot-area");
    }

    public XDocument Document { get; }

    public bool XLog => (string?)_area.Attribute("data-x-scale") == "log";

    public bool YLog => (string?)_area.Attribute("data-y-scale") == "log";

    public double A(string name) => HtmlTestSupport.Num((string)_area.Attribute(name)!);

    public double XValue(double px) => Back(px, A("data-x-start"), A("data-x-end"), A("data-x-min"), A("data-x-max"), XLog);

    public double YValue(double px) => Back(px, A("data-y-start"), A("data-y-end"), A("data-y-min"), A("data-y-max"), YLog);

    /// <summary>The values of a series' polyline points: (current or time, time or level).</summary>
    public List<(double X, double Y)> Series(string key)
    {
        var line = Document.Descendants(Svg + "polyline").Single(p => (string?)p.Attribute("data-series") == key);
        return [.. ((string)line.Attribute("points")!).Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(pair =>
        {
            var xy = pair.Split(',');
            return (XValue(HtmlTestSupport.Num(xy[0])), YValue(HtmlTestSupport.Num(xy[1])));
        })];
    }

    public bool Has(string key) => Document.Descendants().Any(e => (string?)e.Attribute("data-series") == key);

    /// <summary>A vertical line's x position, read back from its pixel coordinate.</summary>
    public double VerticalAt(string key)
    {
        var g = Document.Descendants(Svg + "g").Single(e => (string?)e.Attribute("data-series") == key);
        var line = g.Elements(Svg + "line").First();
        return XValue(HtmlTestSupport.Num((string)line.Attribute("x1")!));
    }

    /// <summary>A marker's centre read back from its pixel coordinates.</summary>
    public (double X, double Y) MarkerAt(string key)
    {
        var g = Document.Descendants(Svg + "g").Single(e => (string?)e.Attribute("data-series") == key);
        var c = g.Elements(Svg + "circle").FirstOrDefault();
        if (c is not null) return (XValue(HtmlTestSupport.Num((string)c.Attribute("cx")!)), YValue(HtmlTestSupport.Num((string)c.Attribute("cy")!)));
        var r = g.Elements(Svg + "rect").First();
        return (XValue(HtmlTestSupport.Num((string)r.Attribute("x")!) + 5), YValue(HtmlTestSupport.Num((string)r.Attribute("y")!) + 5));
    }

    private static double Back(double px, double start, double end, double min, double max, bool log)
    {
        var t = (px - start) / (end - start);
        return log ? Math.Pow(10, Math.Log10(min) + (t * (Math.Log10(max) - Math.Log10(min)))) : min + (t * (max - min));
    }
}
