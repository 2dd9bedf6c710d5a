using System.Text;

namespace SettingLint.Core.Findings;

/// <summary>Fills {name} holes of a message template; an unknown name stays visible rather than vanishing.</summary>
internal static class MessageTemplate
{
    /// <summary>Renders a template with its values.</summary>
    public static string Render(string template, IReadOnlyDictionary<string, FindingValue> values)
    {
        var sb = new StringBuilder(template.Length + 32);
        var i = 0;
        while (i < template.Length)
        {
            var open = template.IndexOf('{', i);
            if (open < 0) { sb.Append(template, i, template.Length - i); break; }
            var close = template.IndexOf('}', open + 1);
            if (close < 0) { sb.Append(template, i, template.Length - i); break; }
            sb.Append(template, i, open - i);
            var name = template.Substring(open + 1, close - open - 1);
            sb.Append(values.TryGetValue(name, out var v) ? v.Text : "{" + name + "}");
            i = close + 1;
        }
        return sb.ToString();
    }

    /// <summary>The hole names of a template, in order of appearance.</summary>
    public static IReadOnlyList<string> Holes(string template)
    {
        var names = new List<string>();
        var i = 0;
        while (true)
        {
            var open = template.IndexOf('{', i);
            if (open < 0) break;
            var close = template.IndexOf('}', open + 1);
            if (close < 0) break;
            names.Add(template.Substring(open + 1, close - open - 1));
            i = close + 1;
        }
        return names;
    }
}
