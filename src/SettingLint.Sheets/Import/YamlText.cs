using System.Text;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Import;

/// <summary>Writes YAML for the values of a sheet: scalars that read back as the same text, and new files in the schema's order.</summary>
public static class YamlText
{
    /// <summary>
    /// A scalar that YAML reads back as exactly <paramref name="value"/>: plain when it is text that stays text (or a number,
    /// flag or quantity, which are checked afterwards as such), double-quoted otherwise.
    /// </summary>
    public static string Scalar(string value, bool text)
    {
        ArgumentNullException.ThrowIfNull(value);
        return NeedsQuotes(value, text) ? Quote(value) : value;
    }

    private static bool NeedsQuotes(string v, bool text)
    {
        if (v.Length == 0 || v != v.Trim()) return true;
        // Text that would resolve to a number, a flag or null must be quoted to stay text.
        if (text && CoreSchema.Resolve(v) != ScalarType.String) return true;
        if ("-?:,[]{}#&*!|>'\"%@`".Contains(v[0], StringComparison.Ordinal) && !(v.Length > 1 && v[0] is '-' && char.IsAsciiDigit(v[1]))) return true;
        if (v.Contains(": ", StringComparison.Ordinal) || v.Contains(" #", StringComparison.Ordinal) || v.EndsWith(':')) return true;
        foreach (var ch in v)
        {
            if (ch < ' ' || ch == '\u007f' || ch == '\uFEFF') return true;
        }
        return false;
    }

    private static string Quote(string v)
    {
        var sb = new StringBuilder(v.Length + 2).Append('"');
        foreach (var ch in v)
        {
            switch (ch)
            {
                case '"': sb.Append("\\\""); break;
                case '\\': sb.Append("\\\\"); break;
                case '\n': sb.Append("\\n"); break;
                case '\r': sb.Append("\\r"); break;
                case '\t': sb.Append("\\t"); break;
                default:
                    if (ch < ' ' || ch == '\u007f' || ch == '\uFEFF') sb.Append("\\u").Append(((int)ch).ToString("x4", System.Globalization.CultureInfo.InvariantCulture));
                    else sb.Append(ch);
                    break;
            }
        }
        return sb.Append('"').ToString();
    }

    /// <summary>
    /// A new file: the schema header comment, then each value under its mappings, in the order given (the schema's, so
    /// that keys of one mapping are together).
    /// </summary>
    /// <param name="schemaHeader">The `$schema=` target of the editor's header comment, or null for none.</param>
    /// <param name="values">Key paths and their scalars as written (already quoted where needed).</param>
    public static string Document(string? schemaHeader, IEnumerable<(string Path, string Scalar)> values)
    {
        var sb = new StringBuilder();
        if (schemaHeader is not null) sb.Append("# yaml-language-server: $schema=").Append(schemaHeader).Append('\n');
        var open = new List<string>();
        foreach (var (path, scalar) in values)
        {
            var parts = path.Split('.');
            var common = 0;
            while (common < open.Count && common < parts.Length - 1 && open[common] == parts[common]) common++;
            open.RemoveRange(common, open.Count - common);
            for (var i = common; i < parts.Length - 1; i++)
            {
                sb.Append(' ', 2 * i).Append(parts[i]).Append(":\n");
                open.Add(parts[i]);
            }
            sb.Append(' ', 2 * (parts.Length - 1)).Append(parts[^1]).Append(": ").Append(scalar).Append('\n');
        }
        return sb.ToString();
    }
}
