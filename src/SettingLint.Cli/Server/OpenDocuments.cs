using System.Collections.Immutable;
using System.Text;

namespace SettingLint.Cli.Server;

/// <summary>An open buffer: the client's URI, its local path (null for a buffer that is no file), version and text.</summary>
public sealed record OpenDocument(string Uri, string? Path, int Version, string Text);

/// <summary>The buffers the client has open, as the client last sent them. Notifications arrive on the RPC thread and
/// checks read snapshots on the worker, so every change replaces an immutable map under a lock.</summary>
public sealed class OpenDocuments
{
    private readonly Lock _gate = new();
    private ImmutableDictionary<string, OpenDocument> _docs = ImmutableDictionary.Create<string, OpenDocument>(StringComparer.Ordinal);

    /// <summary>The documents now open.</summary>
    public ImmutableDictionary<string, OpenDocument> Snapshot()
    {
        lock (_gate) return _docs;
    }

    /// <summary>Opens (or reopens) a document.</summary>
    public void Open(string uri, int version, string text)
    {
        lock (_gate) _docs = _docs.SetItem(uri, new OpenDocument(uri, WorkspaceLayout.PathOf(uri), version, text));
    }

    /// <summary>Applies the changes of one didChange; a version older than the one held is ignored (it arrived late).</summary>
    public bool Change(string uri, int version, IReadOnlyList<TextDocumentContentChangeEvent> changes)
    {
        lock (_gate)
        {
            if (!_docs.TryGetValue(uri, out var doc) || version < doc.Version) return false;
            var text = doc.Text;
            foreach (var c in changes) text = c.Range is { } r ? Apply(text, r, c.Text) : c.Text;
            _docs = _docs.SetItem(uri, doc with { Version = version, Text = text });
            return true;
        }
    }

    /// <summary>Replaces the text when a save carries it.</summary>
    public void Saved(string uri, string? text)
    {
        lock (_gate)
        {
            if (text is not null && _docs.TryGetValue(uri, out var doc)) _docs = _docs.SetItem(uri, doc with { Text = text });
        }
    }

    /// <summary>Closes a document; true when it was open.</summary>
    public bool Close(string uri)
    {
        lock (_gate)
        {
            var was = _docs.ContainsKey(uri);
            _docs = _docs.Remove(uri);
            return was;
        }
    }

    /// <summary>The text with a range replaced; positions count UTF-16 code units per line, as LSP does by default.</summary>
    public static string Apply(string text, LspRange range, string replacement)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(range);
        var start = Offset(text, range.Start);
        var end = Math.Max(start, Offset(text, range.End));
        return new StringBuilder(text.Length - (end - start) + replacement.Length)
            .Append(text, 0, start).Append(replacement).Append(text, end, text.Length - end).ToString();
    }

    /// <summary>The string index of a position; past the end of a line it is the line's end, past the last line the text's end.</summary>
    public static int Offset(string text, LspPosition position)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(position);
        var i = 0;
        for (var line = 0; line < position.Line; line++)
        {
            var nl = text.IndexOf('\n', i);
            if (nl < 0) return text.Length;
            i = nl + 1;
        }
        var lineEnd = text.IndexOf('\n', i);
        if (lineEnd < 0) lineEnd = text.Length;
        if (lineEnd > i && text[lineEnd - 1] == '\r') lineEnd--;
        return Math.Min(i + Math.Max(0, position.Character), lineEnd);
    }
}
