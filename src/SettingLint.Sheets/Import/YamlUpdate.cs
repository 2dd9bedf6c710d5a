using System.Text;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;

namespace SettingLint.Sheets.Import;

/// <summary>One value to set in an existing file.</summary>
/// <param name="Path">Its key path.</param>
/// <param name="Scalar">The scalar to write, quoted where needed.</param>
/// <param name="Same">Whether the value already in the file means the same (then it is left as written).</param>
public sealed record ValueEdit(string Path, string Scalar, Func<YScalar, bool> Same);

/// <summary>
/// Changes values in an existing setting file by editing only the characters of each value, at the spans the loader
/// gives: comments, blank lines, key order, quoting of other values and every key the sheet does not hold stay as they
/// are. A key that is not in the file yet is added at the end of its mapping (block or flow).
/// </summary>
public static class YamlUpdate
{
    /// <summary>The file's text with the edits made, and the paths that could not be set (a mapping or list stands there).</summary>
    public static (string Text, IReadOnlyList<string> Blocked) Apply(string text, IReadOnlyList<ValueEdit> edits)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(edits);
        var blocked = new List<string>();
        var root = Load(text);
        // Values already there: replaced in one pass, from the end of the file backwards so that earlier offsets hold.
        var replacements = new List<(int Start, int End, string Scalar)>();
        var missing = new List<ValueEdit>();
        var lines = LineStarts(text);
        foreach (var edit in edits)
        {
            switch (Find(root, edit.Path))
            {
                case YScalar s:
                    if (!edit.Same(s)) replacements.Add((Offset(lines, s.Span.StartLine, s.Span.StartColumn), Offset(lines, s.Span.EndLine, s.Span.EndColumn), edit.Scalar));
                    break;
                case null:
                    missing.Add(edit);
                    break;
                default:
                    blocked.Add(edit.Path);
                    break;
            }
        }
        var sb = new StringBuilder(text);
        foreach (var (start, end, scalar) in replacements.OrderByDescending(r => r.Start))
        {
            sb.Remove(start, end - start).Insert(start, scalar);
        }
        text = sb.ToString();
        // New keys one at a time: each insertion moves what follows, so the tree is read again after each (a small file).
        foreach (var edit in missing)
        {
            root = Load(text);
            var next = Insert(text, root, edit);
            if (next is null) blocked.Add(edit.Path);
            else text = next;
        }
        return (text, blocked);
    }

    private static YMapping Load(string text)
    {
        var loaded = YamlLoader.Load(Encoding.UTF8.GetBytes(text), "", "", LoadLimits.Default);
        return loaded.Root as YMapping ?? throw new InvalidOperationException("The file is not a YAML mapping.");
    }

    /// <summary>The node at a key path, or null when a key on the way is missing.</summary>
    public static YNode? Find(YMapping root, string path)
    {
        YNode? node = root;
        foreach (var part in path.Split('.'))
        {
            if (node is not YMapping m) return node is null ? null : node;
            node = m[part];
        }
        return node;
    }

    private static string? Insert(string text, YMapping root, ValueEdit edit)
    {
        var parts = edit.Path.Split('.');
        var parent = root;
        var depth = 0;
        while (depth < parts.Length - 1 && parent[parts[depth]] is YMapping child)
        {
            parent = child;
            depth++;
        }
        if (depth < parts.Length - 1 && parent[parts[depth]] is not null) return null; // a scalar or list stands where a mapping must go
        var lines = LineStarts(text);
        var newline = text.Contains("\r\n", StringComparison.Ordinal) ? "\r\n" : "\n";
        var start = Offset(lines, parent.Span.StartLine, parent.Span.StartColumn);
        if (parent != root && start < text.Length && text[start] == '{')
        {
            // A flow mapping: ", key: value" after its last entry, or " key: value" inside an empty one.
            var flow = Flow(parts, depth, edit.Scalar);
            if (parent.Entries.Length == 0) return text.Insert(start + 1, " " + flow + " ");
            var last = parent.Entries[^1].Value.Span;
            return text.Insert(Offset(lines, last.EndLine, last.EndColumn), ", " + flow);
        }
        var indent = parent.Entries.Length > 0 ? parent.Entries[0].Key.Span.StartColumn - 1 : 0;
        var block = new StringBuilder();
        for (var i = depth; i < parts.Length; i++)
        {
            block.Append(' ', indent + 2 * (i - depth)).Append(parts[i]).Append(':');
            block.Append(i == parts.Length - 1 ? " " + edit.Scalar : "").Append(newline);
        }
        int at;
        if (parent == root || parent.Entries.Length == 0)
        {
            if (parent != root) return null; // an empty block mapping has no place to indent from
            at = text.Length;
        }
        else
        {
            // After the line where the mapping's last value ends.
            var endLine = parent.Entries[^1].Value.Span.EndLine;
            at = endLine < lines.Count ? lines[endLine] : text.Length;
        }
        if (at == text.Length && text.Length > 0 && !text.EndsWith('\n')) block.Insert(0, newline);
        return text.Insert(at, block.ToString());
    }

    private static string Flow(string[] parts, int from, string scalar)
    {
        var s = parts[^1] + ": " + scalar;
        for (var i = parts.Length - 2; i >= from; i--) s = parts[i] + ": { " + s + " }";
        return s;
    }

    private static List<int> LineStarts(string text)
    {
        var starts = new List<int> { 0 };
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == '\n') starts.Add(i + 1);
        }
        return starts;
    }

    private static int Offset(List<int> lines, int line, int column) =>
        line - 1 < lines.Count ? lines[line - 1] + column - 1 : lines[^1];
}
