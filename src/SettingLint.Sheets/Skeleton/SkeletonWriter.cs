using System.Text;
using System.Text.Json;
using SettingLint.Core.Validation;
using SettingLint.Sheets.Import;
using SettingLint.Core.Documents;

namespace SettingLint.Sheets.Skeleton;

/// <summary>
/// A new setting file with every key of its kind, each under its description from the schema: required keys left empty
/// for the user to fill, optional ones commented out. Everything comes from the schema, so a key added there shows here.
/// </summary>
public static class SkeletonWriter
{
    private const int Width = 100;

    /// <summary>The skeleton of a kind.</summary>
    /// <param name="kind">motor-protection, bus or relay-model.</param>
    /// <param name="tag">The tag to fill in.</param>
    /// <param name="schemaHeader">The `$schema=` target of the editor's header comment.</param>
    /// <param name="filled">Values to write in (key path to scalar), such as the bus reference.</param>
    public static string Write(string kind, string tag, string schemaHeader, IReadOnlyDictionary<string, string> filled)
    {
        ArgumentNullException.ThrowIfNull(filled);
        var schema = SchemaSet.Shared.Get(kind);
        var sb = new StringBuilder();
        sb.Append("# yaml-language-server: $schema=").Append(schemaHeader).Append('\n');
        Comment(sb, 0, (schema.Title ?? kind) + ". " + (schema.Description ?? ""));
        sb.Append("# Keys left empty are required: fill them in. Optional keys are commented out: remove the '# ' to use one.\n");
        var values = new Dictionary<string, string>(filled, StringComparer.Ordinal) { ["tag"] = YamlText.Scalar(tag, text: true) };
        Mapping(sb, schema, "", 0, commented: false, values);
        return sb.ToString();
    }

    /// <summary>The `$id` of an embedded schema, for a header when the repository has no schema folder.</summary>
    public static string SchemaId(string kind)
    {
        using var doc = JsonDocument.Parse(SchemaSet.Text(kind));
        return doc.RootElement.TryGetProperty("$id", out var id) && id.GetString() is { } s ? s : kind + ".schema.json";
    }

    private static void Mapping(StringBuilder sb, SchemaNode node, string prefix, int indent, bool commented, Dictionary<string, string> values)
    {
        foreach (var (key, child) in node.PropertyList)
        {
            var path = prefix.Length == 0 ? key : prefix + "." + key;
            var off = commented || !node.Required.Contains(key);
            sb.Append('\n', indent == 0 ? 1 : 0);
            Comment(sb, indent, Describe(child));
            var lead = new string(' ', indent) + (off ? "# " : "");
            if (child.PropertyList.Length > 0 && child.Allows(JsonType.Object) && !child.Allows(JsonType.String))
            {
                sb.Append(lead).Append(key).Append(":\n");
                Mapping(sb, child, path, indent + 2, off, values);
            }
            else if (child.PatternProperties.Length > 0)
            {
                // Keys by pattern (a relay model's ranges): one commented example per setting a motor file has, with the
                // keys of one entry.
                sb.Append(lead).Append(key).Append(":\n");
                Patterned(sb, child, indent + 2);
            }
            else
            {
                var value = values.TryGetValue(path, out var v) ? v : Only(child);
                sb.Append(lead).Append(key).Append(':').Append(value is null ? "" : " " + value).Append('\n');
            }
        }
    }

    private static void Patterned(StringBuilder sb, SchemaNode node, int indent)
    {
        var (_, entry) = node.PatternProperties[0];
        var keys = string.Join(", ", entry.PropertyList.Select(p => p.Name + ": "));
        Comment(sb, indent, "One entry per setting, keyed as in a motor file's protection section; " + string.Join(" ", entry.PropertyList.Select(p => p.Name + ": " + FirstSentence(p.Schema.Description))));
        var motor = ContractKeys.Of(SchemaSet.MotorProtection);
        foreach (var key in motor.All.Where(k => k.Path.StartsWith(SchemaPaths.Motor.ProtectionPrefix, StringComparison.Ordinal) && k.Dimension is not null))
        {
            sb.Append(' ', indent).Append("# ").Append(key.Path[SchemaPaths.Motor.ProtectionPrefix.Length..]).Append(": { ").Append(keys.TrimEnd()).Append(" }\n");
        }
    }

    /// <summary>The one value an enum allows (kind, format), written in.</summary>
    private static string? Only(SchemaNode node) => node.Enum is [var only] ? only.ToString() : null;

    private static string Describe(SchemaNode node)
    {
        var text = (node.Title is { } t ? t + ". " : "") + (node.Description ?? "");
        if (node.Enum is { Length: > 1 } values) text += " One of: " + string.Join(", ", values) + ".";
        return text.Trim();
    }

    private static string FirstSentence(string? text)
    {
        if (text is null) return "";
        var end = text.IndexOf(". ", StringComparison.Ordinal);
        return end < 0 ? text : text[..(end + 1)];
    }

    /// <summary>Comment lines at an indentation, wrapped at a width.</summary>
    private static void Comment(StringBuilder sb, int indent, string text)
    {
        if (text.Length == 0) return;
        var line = new StringBuilder();
        foreach (var word in text.Split(' ', StringSplitOptions.RemoveEmptyEntries))
        {
            if (line.Length > 0 && indent + 2 + line.Length + 1 + word.Length > Width)
            {
                sb.Append(' ', indent).Append("# ").Append(line).Append('\n');
                line.Clear();
            }
            if (line.Length > 0) line.Append(' ');
            line.Append(word);
        }
        if (line.Length > 0) sb.Append(' ', indent).Append("# ").Append(line).Append('\n');
    }
}
