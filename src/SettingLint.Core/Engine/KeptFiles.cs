using System.Collections.Immutable;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Engine;

/// <summary>
/// What a run keeps of each reported file once its group is done, until the end (the output is sorted): its path, its
/// motor's name and bus (the suggestions' confirming run reads the fixed motors' groups), its tag with its place (tags are
/// compared across the repository) and, of the few files that have them, its findings, checks not run and acceptance
/// comments. Paths and tags are packed (<see cref="PackedStrings"/>); a file is 32 bytes besides. Adding is thread-safe.
/// </summary>
/// <remarks>
/// A value of 48 bytes per file in one list, with its path and tag as strings, was some 150 bytes per motor held from its
/// group to the end of the run, and its strings then in the result: docs/performance.md, 2026-12-05, "Packed paths and tags".
/// Before that, objects per file (the Kept value and its tag's TextValue) had been some 120 bytes.
/// </remarks>
internal sealed class KeptFiles(int capacity)
{
    private readonly Lock _gate = new();
    private readonly PackedStrings _text = new(capacity * 2);
    private readonly Dictionary<int, Notes> _notes = [];
    private readonly Dictionary<string, int> _busNumbers = new(StringComparer.Ordinal);
    private Entry[] _entries = new Entry[Math.Max(capacity, 4)];

    /// <param name="Path">The path's entry.</param>
    /// <param name="Name">The motor's name's entry; -1 when the file is no motor.</param>
    /// <param name="Tag">The tag's entry; -1 when it has none.</param>
    /// <param name="Bus">The motor's bus by number; -1 for an inline bus or none.</param>
    /// <param name="TagSpan">Where the tag is written.</param>
    private readonly record struct Entry(int Path, int Name, int Tag, int Bus, SourceSpan TagSpan);

    /// <summary>What a file has beyond its names: its findings, checks not run and acceptance comments.</summary>
    public sealed record Notes(IReadOnlyList<Finding> Findings, IReadOnlyList<CheckNotRun> NotRun, ImmutableArray<AcceptComment> Acceptances);

    /// <summary>How many files are kept.</summary>
    public int Count { get; private set; }

    /// <summary>Keeps a file.</summary>
    /// <param name="path">Root-relative.</param>
    /// <param name="motor">The motor's name (its tag, else its file name) when the file is a motor.</param>
    /// <param name="bus">The root-relative bus file a motor is on; null for an inline bus or none.</param>
    /// <param name="tag">The tag as written, with its place; null when there is none.</param>
    /// <param name="notes">Its findings, checks not run and acceptances; null when it has none.</param>
    public void Add(string path, string? motor, string? bus, (string Text, SourceSpan Span)? tag, Notes? notes)
    {
        lock (_gate)
        {
            var p = _text.Add(path);
            var t = tag is { } written ? _text.Add(written.Text) : -1;
            var n = motor is null ? -1 : t >= 0 && motor == tag!.Value.Text ? t : _text.Add(motor);
            var b = bus is null ? -1 : _busNumbers.TryGetValue(bus, out var known) ? known : _busNumbers[bus] = _busNumbers.Count;
            if (Count == _entries.Length) Array.Resize(ref _entries, _entries.Length * 2);
            if (notes is not null) _notes[Count] = notes;
            _entries[Count++] = new Entry(p, n, t, b, tag?.Span ?? default);
        }
    }

    /// <summary>A kept file's path.</summary>
    public string Path(int index) => _text.GetString(_entries[index].Path);

    /// <summary>The kept files' paths, in the order of keeping.</summary>
    public IEnumerable<string> Paths()
    {
        for (var i = 0; i < Count; i++) yield return Path(i);
    }

    /// <summary>The kept files' tags, in the order of keeping.</summary>
    public IEnumerable<string> Tags()
    {
        for (var i = 0; i < Count; i++)
        {
            if (_entries[i].Tag >= 0) yield return _text.GetString(_entries[i].Tag);
        }
    }

    /// <summary>The files that have notes, by their place in the order of keeping, in that order.</summary>
    public IEnumerable<(int Index, Notes Notes)> WithNotes() => _notes.OrderBy(n => n.Key).Select(n => (n.Key, n.Value));

    /// <summary>The kept files' tags with their files, for <see cref="TagList.Reused"/>.</summary>
    public TagList TagList()
    {
        var items = new List<(int File, int Tag, SourceSpan Span)>(Count);
        for (var i = 0; i < Count; i++)
        {
            if (_entries[i].Tag >= 0) items.Add((_entries[i].Path, _entries[i].Tag, _entries[i].TagSpan));
        }
        return new TagList(_text, items);
    }

    /// <summary>The kept files sorted by path, with their motors, as a result lists them.</summary>
    public RunFiles ToRunFiles()
    {
        var order = PackedStrings.Sorted(Count, (a, b) => _text.Compare(_entries[a].Path, _entries[b].Path));
        var files = new int[Count];
        var motors = 0;
        for (var i = 0; i < order.Length; i++)
        {
            files[i] = _entries[order[i]].Path;
            if (_entries[order[i]].Name >= 0) motors++;
        }
        var (motorFile, motorName, motorBus) = (new int[motors], new int[motors], new int[motors]);
        for (int i = 0, m = 0; i < order.Length; i++)
        {
            var e = _entries[order[i]];
            if (e.Name < 0) continue;
            (motorFile[m], motorName[m], motorBus[m]) = (i, e.Name, e.Bus);
            m++;
        }
        var buses = new string[_busNumbers.Count];
        foreach (var (bus, number) in _busNumbers) buses[number] = bus;
        return new RunFiles(_text, files, motorFile, motorName, motorBus, buses);
    }
}

/// <summary>A setting file's tag as written, for the rule that a tag names one piece of equipment in the repository.</summary>
internal readonly record struct FileTag(string File, string Tag, SourceSpan Span);

/// <summary>Tags with their files, packed, for the rule that a tag names one piece of equipment in the repository.</summary>
/// <param name="text">The packed paths and tags.</param>
/// <param name="items">Each tag: its file's and its own entry in <paramref name="text"/>, and where it is written.</param>
internal sealed class TagList(PackedStrings text, List<(int File, int Tag, SourceSpan Span)> items)
{
    /// <summary>Tags given as strings (those of a changed-files run's bound files).</summary>
    public static TagList Of(IEnumerable<FileTag> tags)
    {
        var text = new PackedStrings();
        var items = new List<(int, int, SourceSpan)>();
        foreach (var (file, tag, span) in tags) items.Add((text.Add(file), text.Add(tag), span));
        return new TagList(text, items);
    }

    /// <summary>
    /// Every file that reuses a tag is told where it is taken: the first file of each tag in path order keeps it. Found by
    /// one sort of the tags (by tag, then path), so that no string or dictionary entry is made per tag.
    /// </summary>
    /// <returns>The findings of the files that reuse a tag, by file.</returns>
    public Dictionary<string, FindingBuilder> Reused()
    {
        var order = PackedStrings.Sorted(items.Count, (a, b) =>
        {
            var c = text.Compare(items[a].Tag, items[b].Tag);
            if (c == 0) c = text.Compare(items[a].File, items[b].File);
            return c == 0 ? a.CompareTo(b) : c;
        });
        var found = new Dictionary<string, FindingBuilder>(StringComparer.Ordinal);
        for (int i = 1, first = 0; i < order.Length; i++)
        {
            if (text.Compare(items[order[i - 1]].Tag, items[order[i]].Tag) != 0)
            {
                first = i;
                continue;
            }
            var (file, tag, span) = items[order[i]];
            var path = text.GetString(file);
            var builder = found.TryGetValue(path, out var b) ? b : found[path] = new FindingBuilder(path);
            builder.Add(EngineMessages.TagAlreadyUsedBy, span, "tag", ("tag", text.GetString(tag)), ("other", text.GetString(items[order[first]].File)));
        }
        return found;
    }
}
