using System.Globalization;
using System.Text;

namespace SettingLint.Reporting;

/// <summary>A unified diff (three lines of context) of two texts with the same number of lines, as fixes make.</summary>
public static class UnifiedDiff
{
    private const int Context = 3;

    /// <summary>The diff of a root-relative file, with a/ and b/ prefixes as git writes them; empty when nothing differs.</summary>
    public static string Of(string file, string before, string after)
    {
        ArgumentNullException.ThrowIfNull(before);
        ArgumentNullException.ThrowIfNull(after);
        var a = Lines(before);
        var b = Lines(after);
        if (a.Count != b.Count) throw new ArgumentException("a fix changes characters within lines, never the number of lines");
        var changed = Enumerable.Range(0, a.Count).Where(i => a[i] != b[i]).ToList();
        if (changed.Count == 0) return "";
        var sb = new StringBuilder();
        sb.Append("--- a/").Append(file).Append('\n').Append("+++ b/").Append(file).Append('\n');
        var k = 0;
        while (k < changed.Count)
        {
            var start = Math.Max(0, changed[k] - Context);
            var end = Math.Min(a.Count - 1, changed[k] + Context);
            var j = k + 1;
            while (j < changed.Count && changed[j] - Context <= end + 1)
            {
                end = Math.Min(a.Count - 1, changed[j] + Context);
                j++;
            }
            var count = end - start + 1;
            sb.Append(CultureInfo.InvariantCulture, $"@@ -{start + 1},{count} +{start + 1},{count} @@\n");
            for (var i = start; i <= end; i++)
            {
                if (a[i] == b[i])
                {
                    sb.Append(' ').Append(Bare(a[i])).Append('\n');
                }
                else
                {
                    sb.Append('-').Append(Bare(a[i])).Append('\n');
                    sb.Append('+').Append(Bare(b[i])).Append('\n');
                }
            }
            k = j;
        }
        return sb.ToString();
    }

    // Lines with their ends, so that a line-ending difference would show; the diff itself is written with \n.
    private static List<string> Lines(string text)
    {
        var lines = new List<string>();
        var start = 0;
        while (start < text.Length)
        {
            var nl = text.IndexOf('\n', start);
            var end = nl < 0 ? text.Length : nl + 1;
            lines.Add(text[start..end]);
            start = end;
        }
        return lines;
    }

    private static string Bare(string line) => line.TrimEnd('\n').TrimEnd('\r');
}
