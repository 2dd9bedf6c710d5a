using System.Globalization;
using System.Text;

namespace SettingLint.Reporting.Svg;

/// <summary>Escaping and number spelling shared by the SVG and HTML writers: invariant, so that reports are byte-identical everywhere.</summary>
public static class Markup
{
    /// <summary>Text escaped for element content and double-quoted attributes.</summary>
    public static string Escape(string? text)
    {
        if (string.IsNullOrEmpty(text)) return "";
        var sb = new StringBuilder(text.Length + 8);
        foreach (var c in text)
        {
            switch (c)
            {
                case '&': sb.Append("&amp;"); break;
                case '<': sb.Append("&lt;"); break;
                case '>': sb.Append("&gt;"); break;
                case '"': sb.Append("&quot;"); break;
                case '\'': sb.Append("&#39;"); break;
                // Control characters are not allowed in XML 1.0; a tag or title with one must still render.
                case < ' ' when c is not ('\n' or '\t'): sb.Append('?'); break;
                default: sb.Append(c); break;
            }
        }
        return sb.ToString();
    }

    /// <summary>A pixel coordinate with two decimals (0.01 px is far below what a 1 % comparison needs).</summary>
    public static string Px(double v) => v.ToString("0.##", CultureInfo.InvariantCulture);

    /// <summary>A number written so that it reads back exactly (data attributes).</summary>
    public static string Exact(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    /// <summary>An integer, invariant.</summary>
    public static string Int(int v) => v.ToString(CultureInfo.InvariantCulture);
}
