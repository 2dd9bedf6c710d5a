using System.Text;
using static SettingLint.Reporting.Svg.Markup;

namespace SettingLint.Reporting.Svg;

/// <summary>How one series is drawn and named in a legend.</summary>
/// <param name="Key">Stable identifier, written as data-series so that tests and scripts can find it.</param>
/// <param name="Label">The legend's text.</param>
/// <param name="Color">Stroke colour.</param>
/// <param name="Dash">stroke-dasharray, empty for a solid line.</param>
/// <param name="Width">Stroke width in px.</param>
/// <param name="Marker">Drawn as a marker (circle) rather than a line in the legend.</param>
public sealed record SeriesStyle(string Key, string Label, string Color, string Dash = "", double Width = 2, bool Marker = false);

/// <summary>
/// Builds one SVG plot: frame, grid, clipped series, legend and the caution line. One instance per plot; not shared.
/// Every id is prefixed so that several plots can sit inline in one HTML page.
/// </summary>
internal sealed class SvgDocument
{
    public const double Width = 1000;
    public const double PlotLeft = 84;
    public const double PlotTop = 44;
    public const double PlotWidth = 620;
    public const double LegendLeft = 736;

    private readonly StringBuilder _sb = new();
    private readonly string _id;
    private readonly List<(SeriesStyle Style, string Note)> _legend = [];

    // The boxes of the labels written so far, in px: a new label takes the first of its places that meets none of them.
    private readonly List<LabelBox> _labels = [];

    /// <summary>The box a label takes on the plot, in px.</summary>
    internal readonly record struct LabelBox(double X1, double Y1, double X2, double Y2)
    {
        public bool Overlaps(LabelBox other) => X1 < other.X2 && other.X1 < X2 && Y1 < other.Y2 && other.Y1 < Y2;
    }

    /// <summary>Where each label was placed, for tests: its text and box.</summary>
    internal IReadOnlyList<LabelBox> Labels => _labels;

    // About the width of the plot's sans-serif digits and lower-case letters, per px of font size; a little generous, so
    // that labels placed apart stay apart in the fonts a browser picks.
    private const double CharWidth = 0.6;

    private static double TextWidth(string text, double fontSize) => text.Length * fontSize * CharWidth;

    public SvgDocument(string id, double height, string title, string description, PlotAxis x, PlotAxis y)
    {
        _id = id;
        Height = height;
        X = x;
        Y = y;
        _sb.Append("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"plot\" id=\"").Append(Escape(id))
            .Append("\" width=\"").Append(Px(Width)).Append("\" height=\"").Append(Px(height))
            .Append("\" viewBox=\"0 0 ").Append(Px(Width)).Append(' ').Append(Px(height))
            .Append("\" role=\"img\" aria-labelledby=\"").Append(Escape(id)).Append("-title\" font-family=\"system-ui, -apple-system, 'Segoe UI', Roboto, Helvetica, Arial, sans-serif\" font-size=\"12\">\n");
        _sb.Append("<title id=\"").Append(Escape(id)).Append("-title\">").Append(Escape(title)).Append("</title>\n");
        _sb.Append("<desc>").Append(Escape(description)).Append("</desc>\n");
        _sb.Append("<rect x=\"0\" y=\"0\" width=\"").Append(Px(Width)).Append("\" height=\"").Append(Px(height)).Append("\" fill=\"#fbfaf7\"/>\n");
        _sb.Append("<text x=\"").Append(Px(PlotLeft)).Append("\" y=\"24\" font-size=\"15\" font-weight=\"600\" fill=\"#1d2733\">").Append(Escape(title)).Append("</text>\n");
        _sb.Append("<defs><clipPath id=\"").Append(Escape(id)).Append("-clip\"><rect x=\"").Append(Px(PlotLeft)).Append("\" y=\"").Append(Px(PlotTop))
            .Append("\" width=\"").Append(Px(PlotWidth)).Append("\" height=\"").Append(Px(PlotHeight)).Append("\"/></clipPath></defs>\n");
    }

    public double Height { get; }

    /// <summary>The plot area's height: what is left above the axis labels, the axis title and the caution lines.</summary>
    public double PlotHeight => PlotHeightFor(Height);

    /// <summary>The plot area's height for a plot of a total height.</summary>
    public static double PlotHeightFor(double height) => height - PlotTop - 104;

    public PlotAxis X { get; }

    public PlotAxis Y { get; }

    /// <summary>The frame and the plot's transform as data attributes: a reader of the SVG can turn coordinates back into values.</summary>
    public void Frame(string xTitle, string yTitle, Func<double, string> xLabel, Func<double, string> yLabel)
    {
        var bottom = PlotTop + PlotHeight;
        _sb.Append("<rect x=\"").Append(Px(PlotLeft)).Append("\" y=\"").Append(Px(PlotTop)).Append("\" width=\"").Append(Px(PlotWidth))
            .Append("\" height=\"").Append(Px(PlotHeight)).Append("\" fill=\"#ffffff\" stroke=\"#9aa3ad\"/>\n");
        _sb.Append("<g class=\"grid\" stroke-width=\"1\">\n");
        if (X.Log)
        {
            foreach (var v in X.Minors()) VLine(X.ToPixel(v), "#eef0f2");
            foreach (var v in X.Decades()) VLine(X.ToPixel(v), "#c9ced4");
        }
        else
        {
            foreach (var v in X.LinearTicks()) VLine(X.ToPixel(v), "#e3e6ea");
        }
        if (Y.Log)
        {
            foreach (var v in Y.Minors()) HLine(Y.ToPixel(v), "#eef0f2");
            foreach (var v in Y.Decades()) HLine(Y.ToPixel(v), "#c9ced4");
        }
        else
        {
            foreach (var v in Y.LinearTicks()) HLine(Y.ToPixel(v), "#e3e6ea");
        }
        _sb.Append("</g>\n<g class=\"ticks\" fill=\"#46505c\">\n");
        foreach (var v in X.Log ? X.Decades() : X.LinearTicks())
        {
            _sb.Append("<text x=\"").Append(Px(X.ToPixel(v))).Append("\" y=\"").Append(Px(bottom + 18)).Append("\" text-anchor=\"middle\">").Append(Escape(xLabel(v))).Append("</text>\n");
        }
        foreach (var v in Y.Log ? Y.Decades() : Y.LinearTicks())
        {
            _sb.Append("<text x=\"").Append(Px(PlotLeft - 8)).Append("\" y=\"").Append(Px(Y.ToPixel(v) + 4)).Append("\" text-anchor=\"end\">").Append(Escape(yLabel(v))).Append("</text>\n");
        }
        _sb.Append("</g>\n");
        _sb.Append("<text class=\"axis-title\" x=\"").Append(Px(PlotLeft + (PlotWidth / 2))).Append("\" y=\"").Append(Px(bottom + 42))
            .Append("\" text-anchor=\"middle\" font-size=\"13\" fill=\"#1d2733\">").Append(Escape(xTitle)).Append("</text>\n");
        _sb.Append("<text class=\"axis-title\" transform=\"translate(22 ").Append(Px(PlotTop + (PlotHeight / 2))).Append(") rotate(-90)\" text-anchor=\"middle\" font-size=\"13\" fill=\"#1d2733\">")
            .Append(Escape(yTitle)).Append("</text>\n");
        _sb.Append("<g class=\"plot-area\" clip-path=\"url(#").Append(Escape(_id)).Append("-clip)\"")
            .Append(" data-x-scale=\"").Append(X.Log ? "log" : "linear").Append("\" data-x-min=\"").Append(Exact(X.Min)).Append("\" data-x-max=\"").Append(Exact(X.Max))
            .Append("\" data-x-start=\"").Append(Exact(X.Start)).Append("\" data-x-end=\"").Append(Exact(X.End))
            .Append("\" data-y-scale=\"").Append(Y.Log ? "log" : "linear").Append("\" data-y-min=\"").Append(Exact(Y.Min)).Append("\" data-y-max=\"").Append(Exact(Y.Max))
            .Append("\" data-y-start=\"").Append(Exact(Y.Start)).Append("\" data-y-end=\"").Append(Exact(Y.End)).Append("\">\n");
    }

    /// <summary>A series drawn through points in data units, with a hover title and hover targets at some of its points.</summary>
    public void Polyline(SeriesStyle style, string title, IReadOnlyList<(double X, double Y)> points, Func<double, double, string>? hover = null, int hoverEvery = 12)
    {
        if (points.Count == 0) return;
        _sb.Append("<g class=\"series\" data-series=\"").Append(Escape(style.Key)).Append("\"><title>").Append(Escape(title)).Append("</title>\n");
        _sb.Append("<polyline data-series=\"").Append(Escape(style.Key)).Append("\" fill=\"none\" stroke=\"").Append(style.Color)
            .Append("\" stroke-width=\"").Append(Px(style.Width)).Append("\" stroke-linejoin=\"round\"");
        if (style.Dash.Length > 0) _sb.Append(" stroke-dasharray=\"").Append(style.Dash).Append('"');
        _sb.Append(" points=\"");
        for (var i = 0; i < points.Count; i++)
        {
            if (i > 0) _sb.Append(' ');
            _sb.Append(Px(X.ToPixel(points[i].X))).Append(',').Append(Px(Y.ToPixel(points[i].Y)));
        }
        _sb.Append("\"/>\n");
        if (hover is not null)
        {
            for (var i = 0; i < points.Count; i++)
            {
                if (i % hoverEvery != 0 && i != points.Count - 1) continue;
                var (px, py) = (X.ToPixel(points[i].X), Y.ToPixel(points[i].Y));
                if (!InArea(px, py)) continue;
                _sb.Append("<circle class=\"hover\" cx=\"").Append(Px(px)).Append("\" cy=\"").Append(Px(py))
                    .Append("\" r=\"6\" fill=\"transparent\"><title>").Append(Escape(hover(points[i].X, points[i].Y))).Append("</title></circle>\n");
            }
        }
        _sb.Append("</g>\n");
        AddLegend(style);
    }

    /// <summary>A vertical line at a value of the x axis across the whole plot, labelled near the top.</summary>
    public void Vertical(SeriesStyle style, double x, string title, string label)
    {
        if (!X.Contains(x)) return;
        var px = X.ToPixel(x);
        _sb.Append("<g class=\"series\" data-series=\"").Append(Escape(style.Key)).Append("\" data-value=\"").Append(Exact(x)).Append("\"><title>").Append(Escape(title)).Append("</title>\n");
        _sb.Append("<line x1=\"").Append(Px(px)).Append("\" y1=\"").Append(Px(PlotTop)).Append("\" x2=\"").Append(Px(px)).Append("\" y2=\"").Append(Px(PlotTop + PlotHeight))
            .Append("\" stroke=\"").Append(style.Color).Append("\" stroke-width=\"").Append(Px(style.Width)).Append('"');
        if (style.Dash.Length > 0) _sb.Append(" stroke-dasharray=\"").Append(style.Dash).Append('"');
        _sb.Append("/>\n");
        // A wide transparent stroke makes a thin line easy to hover.
        _sb.Append("<line x1=\"").Append(Px(px)).Append("\" y1=\"").Append(Px(PlotTop)).Append("\" x2=\"").Append(Px(px)).Append("\" y2=\"").Append(Px(PlotTop + PlotHeight))
            .Append("\" stroke=\"transparent\" stroke-width=\"9\"/>\n");
        // Read upwards beside the line, left of it at the top of the plot; where another label is, right of it, then lower down.
        var w = TextWidth(label, 11);
        var candidates = new List<(LabelBox Box, double AnchorX, double AnchorY)>();
        for (var drop = 0.0; drop + w < PlotHeight - 8; drop += w + 12)
        {
            var top = PlotTop + 8 + drop;
            candidates.Add((new LabelBox(px - 16, top, px - 3, top + w), px - 4, top));
            candidates.Add((new LabelBox(px + 3, top, px + 16, top + w), px + 14, top));
        }
        if (candidates.Count == 0) candidates.Add((new LabelBox(px - 16, PlotTop + 8, px - 3, PlotTop + 8 + w), px - 4, PlotTop + 8));
        var (_, ax, ay) = candidates[Place([.. candidates.Select(c => c.Box)])];
        _sb.Append("<text class=\"label\" data-box=\"").Append(BoxText(_labels[^1])).Append("\" transform=\"translate(").Append(Px(ax)).Append(' ').Append(Px(ay)).Append(") rotate(-90)\" text-anchor=\"end\" font-size=\"11\" fill=\"")
            .Append(style.Color).Append("\">").Append(Escape(label)).Append("</text>\n");
        _sb.Append("</g>\n");
        AddLegend(style);
    }

    /// <summary>A horizontal line at a value of the y axis between two x values (a timer).</summary>
    public void Horizontal(SeriesStyle style, double y, double fromX, double toX, string title, string label)
    {
        if (!Y.Contains(y)) return;
        var py = Y.ToPixel(y);
        var x1 = Math.Max(PlotLeft, X.ToPixel(fromX));
        var x2 = Math.Min(PlotLeft + PlotWidth, X.ToPixel(toX));
        if (x2 <= x1) return;
        _sb.Append("<g class=\"series\" data-series=\"").Append(Escape(style.Key)).Append("\" data-value=\"").Append(Exact(y)).Append("\"><title>").Append(Escape(title)).Append("</title>\n");
        _sb.Append("<line x1=\"").Append(Px(x1)).Append("\" y1=\"").Append(Px(py)).Append("\" x2=\"").Append(Px(x2)).Append("\" y2=\"").Append(Px(py))
            .Append("\" stroke=\"").Append(style.Color).Append("\" stroke-width=\"").Append(Px(style.Width)).Append('"');
        if (style.Dash.Length > 0) _sb.Append(" stroke-dasharray=\"").Append(style.Dash).Append('"');
        _sb.Append("/>\n");
        _sb.Append("<line x1=\"").Append(Px(x1)).Append("\" y1=\"").Append(Px(py)).Append("\" x2=\"").Append(Px(x2)).Append("\" y2=\"").Append(Px(py)).Append("\" stroke=\"transparent\" stroke-width=\"9\"/>\n");
        // Above the line at its right end; where another label is, below it, then at its left end.
        var w = TextWidth(label, 11);
        var at = Place(
        [
            new LabelBox(x2 - 2 - w, py - 15, x2 - 2, py - 3),
            new LabelBox(x2 - 2 - w, py + 3, x2 - 2, py + 15),
            new LabelBox(x1 + 2, py - 15, x1 + 2 + w, py - 3),
            new LabelBox(x1 + 2, py + 3, x1 + 2 + w, py + 15),
        ]);
        var (tx, ty, anchor) = at switch
        {
            0 => (x2 - 2, py - 5, "end"),
            1 => (x2 - 2, py + 13, "end"),
            2 => (x1 + 2, py - 5, "start"),
            _ => (x1 + 2, py + 13, "start"),
        };
        _sb.Append("<text class=\"label\" data-box=\"").Append(BoxText(_labels[^1])).Append("\" x=\"").Append(Px(tx)).Append("\" y=\"").Append(Px(ty)).Append("\" text-anchor=\"").Append(anchor).Append("\" font-size=\"11\" fill=\"").Append(style.Color).Append("\">").Append(Escape(label)).Append("</text>\n");
        _sb.Append("</g>\n");
        AddLegend(style);
    }

    /// <summary>A point marker with its values on hover.</summary>
    public void Marker(SeriesStyle style, double x, double y, string title, string label, bool diamond = false)
    {
        if (!X.Contains(x) || !Y.Contains(y)) return;
        var (px, py) = (X.ToPixel(x), Y.ToPixel(y));
        _sb.Append("<g class=\"series marker\" data-series=\"").Append(Escape(style.Key)).Append("\" data-x=\"").Append(Exact(x)).Append("\" data-y=\"").Append(Exact(y))
            .Append("\"><title>").Append(Escape(title)).Append("</title>\n");
        if (diamond)
        {
            _sb.Append("<rect x=\"").Append(Px(px - 5)).Append("\" y=\"").Append(Px(py - 5)).Append("\" width=\"10\" height=\"10\" transform=\"rotate(45 ")
                .Append(Px(px)).Append(' ').Append(Px(py)).Append(")\" fill=\"").Append(style.Color).Append("\" stroke=\"#ffffff\" stroke-width=\"1.5\"/>\n");
        }
        else
        {
            _sb.Append("<circle cx=\"").Append(Px(px)).Append("\" cy=\"").Append(Px(py)).Append("\" r=\"6\" fill=\"").Append(style.Color).Append("\" stroke=\"#ffffff\" stroke-width=\"1.5\"/>\n");
        }
        if (label.Length > 0)
        {
            // Right of the point and a little above it; where another label is, below it, then left of the point.
            var w = TextWidth(label, 11);
            var at = Place(
            [
                new LabelBox(px + 9, py - 15, px + 9 + w, py - 3),
                new LabelBox(px + 9, py + 3, px + 9 + w, py + 15),
                new LabelBox(px - 9 - w, py - 15, px - 9, py - 3),
                new LabelBox(px - 9 - w, py + 3, px - 9, py + 15),
                new LabelBox(px + 9, py - 28, px + 9 + w, py - 16),
                new LabelBox(px + 9, py + 16, px + 9 + w, py + 28),
            ]);
            var (tx, ty, anchor) = at switch
            {
                0 => (px + 9, py - 5, "start"),
                1 => (px + 9, py + 13, "start"),
                2 => (px - 9, py - 5, "end"),
                3 => (px - 9, py + 13, "end"),
                4 => (px + 9, py - 18, "start"),
                _ => (px + 9, py + 26, "start"),
            };
            _sb.Append("<text class=\"label\" data-box=\"").Append(BoxText(_labels[^1])).Append("\" x=\"").Append(Px(tx)).Append("\" y=\"").Append(Px(ty)).Append("\" text-anchor=\"").Append(anchor).Append("\" font-size=\"11\" fill=\"").Append(style.Color).Append("\">").Append(Escape(label)).Append("</text>\n");
        }
        _sb.Append("</g>\n");
        AddLegend(style);
    }

    /// <summary>A raw vertical segment in data units (an element's pickup edge), not part of any sampled curve.</summary>
    public void Segment(SeriesStyle style, double x1, double y1, double x2, double y2)
    {
        _sb.Append("<line class=\"edge\" data-series=\"").Append(Escape(style.Key)).Append("-edge\" x1=\"").Append(Px(X.ToPixel(x1))).Append("\" y1=\"").Append(Px(Y.ToPixel(y1)))
            .Append("\" x2=\"").Append(Px(X.ToPixel(x2))).Append("\" y2=\"").Append(Px(Y.ToPixel(y2))).Append("\" stroke=\"").Append(style.Color)
            .Append("\" stroke-width=\"").Append(Px(style.Width)).Append('"');
        if (style.Dash.Length > 0) _sb.Append(" stroke-dasharray=\"").Append(style.Dash).Append('"');
        _sb.Append("/>\n");
    }

    /// <summary>A legend entry for something not drawn (an element that is off or has no data), so the reader knows it was looked for.</summary>
    public void Missing(SeriesStyle style, string note) => _legend.Add((style, note));

    /// <summary>Closes the plot area, writes the legend and the caution, and returns the SVG element.</summary>
    public string Finish(string caution)
    {
        _sb.Append("</g>\n");
        _sb.Append("<g class=\"legend\" font-size=\"12\">\n");
        var y = PlotTop + 6;
        foreach (var (style, note) in _legend)
        {
            var missing = note.Length > 0;
            if (style.Marker)
            {
                _sb.Append("<circle cx=\"").Append(Px(LegendLeft + 14)).Append("\" cy=\"").Append(Px(y)).Append("\" r=\"5\" fill=\"").Append(missing ? "#c4c9cf" : style.Color).Append("\"/>\n");
            }
            else
            {
                _sb.Append("<line x1=\"").Append(Px(LegendLeft)).Append("\" y1=\"").Append(Px(y)).Append("\" x2=\"").Append(Px(LegendLeft + 28)).Append("\" y2=\"").Append(Px(y))
                    .Append("\" stroke=\"").Append(missing ? "#c4c9cf" : style.Color).Append("\" stroke-width=\"").Append(Px(Math.Max(style.Width, 1.5))).Append('"');
                if (style.Dash.Length > 0) _sb.Append(" stroke-dasharray=\"").Append(style.Dash).Append('"');
                _sb.Append("/>\n");
            }
            _sb.Append("<text x=\"").Append(Px(LegendLeft + 36)).Append("\" y=\"").Append(Px(y + 4)).Append("\" fill=\"").Append(missing ? "#8a929b" : "#1d2733").Append("\">")
                .Append(Escape(style.Label + (missing ? " (" + note + ")" : ""))).Append("</text>\n");
            y += 20;
        }
        _sb.Append("</g>\n");
        // Two lines: a plot is often attached to a review on its own, and the caution must fit its width.
        var cut = caution.IndexOf(". ", StringComparison.Ordinal);
        var (first, second) = cut > 0 ? (caution[..(cut + 1)], caution[(cut + 2)..]) : (caution, "");
        _sb.Append("<text class=\"caution\" x=\"16\" y=\"").Append(Px(Height - 26)).Append("\" font-size=\"11\" fill=\"#6a4a00\">")
            .Append("<tspan x=\"16\">").Append(Escape("Caution: " + first)).Append("</tspan>")
            .Append("<tspan x=\"16\" dy=\"14\">").Append(Escape(second)).Append("</tspan></text>\n");
        _sb.Append("</svg>\n");
        return _sb.ToString();
    }

    /// <summary>
    /// Takes the first place of a label that meets no label placed before and lies inside the plot area; when every
    /// place meets one, the first place (a label is never dropped). Returns the index of the place taken.
    /// </summary>
    private int Place(IReadOnlyList<LabelBox> places)
    {
        for (var i = 0; i < places.Count; i++)
        {
            var box = places[i];
            var inside = box.X1 >= PlotLeft && box.X2 <= PlotLeft + PlotWidth && box.Y1 >= PlotTop && box.Y2 <= PlotTop + PlotHeight;
            if (inside && !_labels.Exists(l => l.Overlaps(box)))
            {
                _labels.Add(box);
                return i;
            }
        }
        _labels.Add(places[0]);
        return 0;
    }

    // The box a label was given, so that a reader of the SVG (and the tests) can see that labels keep apart.
    private static string BoxText(LabelBox b) => Px(b.X1) + " " + Px(b.Y1) + " " + Px(b.X2) + " " + Px(b.Y2);

    private bool InArea(double px, double py) =>
        px >= PlotLeft - 0.5 && px <= PlotLeft + PlotWidth + 0.5 && py >= PlotTop - 0.5 && py <= PlotTop + PlotHeight + 0.5;

    private void AddLegend(SeriesStyle style)
    {
        if (!_legend.Any(l => l.Style.Key == style.Key)) _legend.Add((style, ""));
    }

    private void VLine(double px, string color) =>
        _sb.Append("<line x1=\"").Append(Px(px)).Append("\" y1=\"").Append(Px(PlotTop)).Append("\" x2=\"").Append(Px(px)).Append("\" y2=\"").Append(Px(PlotTop + PlotHeight)).Append("\" stroke=\"").Append(color).Append("\"/>\n");

    private void HLine(double py, string color) =>
        _sb.Append("<line x1=\"").Append(Px(PlotLeft)).Append("\" y1=\"").Append(Px(py)).Append("\" x2=\"").Append(Px(PlotLeft + PlotWidth)).Append("\" y2=\"").Append(Px(py)).Append("\" stroke=\"").Append(color).Append("\"/>\n");
}
