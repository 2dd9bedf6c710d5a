using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Text;
using System.Text.Unicode;
using SettingLint.Core.Discovery;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Engine;

/// <summary>
/// A quick read of the top-level <c>kind</c>, <c>tag</c>, <c>bus</c> and <c>relay_model</c> lines of YAML files, without
/// a YAML parser or schema, so that a changed-files run loads only what a change can reach. A file it cannot read for
/// certain (a flow document, a quoted key, an anchor, a tag, an escape, a value that goes on over the next line) is
/// reported as uncertain and loaded anyway.
/// A full run groups the motors by the bus it finds (<see cref="BusGroups"/>).
/// </summary>
internal static class QuickScan
{
    /// <summary>Reads a file into the caller's buffer, as <see cref="IFileSource.ReadInto"/>: its length, -1 when it is not there.</summary>
    public delegate long Reader(DiscoveredFile file, long maxBytes, ref byte[] buffer);

    /// <summary>
    /// The references of the motor files among <paramref name="files"/>, the files that could not be read for certain, and
    /// the tag of each setting file read for certain that has one (a tag names one piece of equipment in the repository).
    /// </summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="files">The discovered files.</param>
    /// <param name="read">Reads a file's bytes (from an overlay or the disk); null when it cannot be read.</param>
    /// <param name="maxBytes">Files above this size are left to the loader (and its SL008).</param>
    /// <param name="parallel">Read the files in parallel.</param>
    public static (ImmutableArray<MotorReferences> Motors, ImmutableArray<string> Uncertain, IReadOnlyDictionary<string, string> Tags) Read(
        string root, IReadOnlyList<DiscoveredFile> files, Func<DiscoveredFile, byte[]?> read, long maxBytes, bool parallel) =>
        Read(root, files, (DiscoveredFile f, long max, ref byte[] buffer) => FileBytes.CopyInto(read(f), max, ref buffer), maxBytes, parallel);

    /// <summary>The same, each file read through a source into a buffer that each thread keeps (no array per file).</summary>
    /// <param name="withTags">Whether to collect the tags (a full run has no use for them; else they are empty).</param>
    public static (ImmutableArray<MotorReferences> Motors, ImmutableArray<string> Uncertain, IReadOnlyDictionary<string, string> Tags) Read(
        string root, IReadOnlyList<DiscoveredFile> files, IFileSource source, long maxBytes, bool parallel, bool withTags = true) =>
        Read(root, files, (DiscoveredFile f, long max, ref byte[] buffer) => source.ReadInto(f.FullPath, f.RelativePath, max, ref buffer), maxBytes, parallel, withTags);

    /// <summary>The same, with the files read by <paramref name="read"/>.</summary>
    public static (ImmutableArray<MotorReferences> Motors, ImmutableArray<string> Uncertain, IReadOnlyDictionary<string, string> Tags) Read(
        string root, IReadOnlyList<DiscoveredFile> files, Reader read, long maxBytes, bool parallel, bool withTags = true)
    {
        var scanned = Scan(root, files, read, maxBytes, parallel, withTags);
        var found = new List<MotorReferences>();
        var uncertain = new List<string>();
        var tags = new Dictionary<string, string>(StringComparer.Ordinal);
        for (var i = 0; i < scanned.Length; i++)
        {
            var s = scanned[i];
            if (!s.Unsure && !s.IsMotor && s.Tag is null) continue;
            var rel = files[i].RelativePath;
            if (s.Unsure) uncertain.Add(rel);
            if (s.Tag is { } tag) tags[rel] = tag;
            if (s.IsMotor) found.Add(new MotorReferences(rel, s.Bus, s.RelayModel));
        }
        return ([.. found.OrderBy(m => m.File, StringComparer.Ordinal)], [.. uncertain.Order(StringComparer.Ordinal)], tags);
    }

    /// <summary>What the quick read found in one file.</summary>
    /// <param name="Unsure">The file could not be read for certain (or at all): it is loaded to learn what it is.</param>
    /// <param name="IsMotor">A motor file.</param>
    /// <param name="Bus">A motor's bus file, root-relative; null for an inline bus or a reference it would not follow.</param>
    /// <param name="RelayModel">A motor's relay-model file, root-relative; null when none is named or it would not follow it.</param>
    /// <param name="Tag">The file's tag when asked for and written.</param>
    internal readonly record struct Scanned(bool Unsure, bool IsMotor, string? Bus, string? RelayModel, string? Tag);

    /// <summary>
    /// What the quick read finds in each file, in the order of <paramref name="files"/>: one value per file, so that a
    /// full run keeps no path of its own for any (<see cref="BusGroups"/>).
    /// </summary>
    internal static Scanned[] Scan(string root, IReadOnlyList<DiscoveredFile> files, Reader read, long maxBytes, bool parallel, bool withTags)
    {
        var scanned = new Scanned[files.Count];
        // The references are resolved once per folder and value written (a bus has many motors in one folder), as each file
        // is read: the values as written are let go with the file, before a collection can keep them for the run.
        // Peak RSS at 100,000 motors, native, --no-suggest: 169-175 MiB resolved after the scan, 136-140 as each file is read.
        var resolved = new ConcurrentDictionary<(string Dir, string Value), string?>();
        string? Resolve(string dir, string value) => resolved.GetOrAdd((dir, value), static (k, root) => ChangeSet.Resolve(root, k.Dir, k.Value), root);
        byte[] One(int i, byte[] buffer)
        {
            var f = files[i];
            var length = SafeRead(read, f, maxBytes, ref buffer);
            if (length < 0 || length > maxBytes || !TryScan(buffer.AsSpan(0, (int)length), out var found)) scanned[i] = new Scanned(true, false, null, null, null);
            else
            {
                var tag = withTags ? found.Tag : null;
                if (!found.IsMotor) scanned[i] = new Scanned(false, false, null, null, tag);
                else
                {
                    var dir = Path.GetDirectoryName(f.FullPath) ?? root;
                    // An empty value is an inline bus mapping: the motor's own, shared with no other motor.
                    scanned[i] = new Scanned(false, true, found.Bus!.Length == 0 ? null : Resolve(dir, found.Bus),
                        found.RelayModel is null ? null : Resolve(dir, found.RelayModel), tag);
                }
            }
            return buffer;
        }
        // Most setting files are a few KB: one buffer per thread, grown for a larger file.
        if (parallel && files.Count > 1) Parallel.For(0, files.Count, () => new byte[BufferBytes], (i, _, buffer) => One(i, buffer), _ => { });
        else
        {
            var buffer = new byte[BufferBytes];
            for (var i = 0; i < files.Count; i++) buffer = One(i, buffer);
        }
        return scanned;
    }

    private const int BufferBytes = 64 * 1024;

    // What the quick read found in a setting file: its tag, and of a motor its bus ("" for an inline one) and relay model as written.
    private readonly record struct Found(bool IsMotor, string? Tag, string? Bus, string? RelayModel);

    private static long SafeRead(Reader read, DiscoveredFile f, long maxBytes, ref byte[] buffer)
    {
        try
        {
            return read(f, maxBytes, ref buffer);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return -1;
        }
    }

    // False when unsure; else what the file is, with the values as written. It reads the bytes line by line and decodes
    // only the values of the four keys it looks for: every file of the repository passes through here.
    private static bool TryScan(ReadOnlySpan<byte> bytes, out Found scanned)
    {
        scanned = default;
        if (!Utf8.IsValid(bytes)) return false;
        string? kind = null, tag = null, bus = null, relay = null;
        bool hasTag = false, hasBus = false, hasRelay = false;
        var rest = bytes;
        while (!rest.IsEmpty)
        {
            var line = NextLine(ref rest);
            if (line.Length == 0 || line[0] is (byte)' ' or (byte)'\t' or (byte)'#') continue;
            if (line.StartsWith("---"u8) || line.StartsWith("..."u8))
            {
                if (line.Trim(" \t\v\f"u8) is var t && (t.SequenceEqual("---"u8) || t.SequenceEqual("..."u8))) continue;
                return false;
            }
            var colon = line.IndexOf((byte)':');
            if (colon <= 0) continue;
            var key = line[..colon];
            var which = key.SequenceEqual("kind"u8) ? 1 : key.SequenceEqual("bus"u8) ? 2 : key.SequenceEqual("relay_model"u8) ? 3 : key.SequenceEqual("tag"u8) ? 4 : 0;
            if (which == 0) continue;
            if (Value(Encoding.UTF8.GetString(line[(colon + 1)..].Trim(" \t"u8))) is not { } value) return false;
            // An indented line after the key goes on with its value (a plain scalar over two lines, or the value on the
            // next line): unsure, but for a bus written inline as a mapping under an empty value.
            if (NextContent(rest, out var indented) is var next && indented && !(which == 2 && value.Length == 0 && IsKeyLine(next))) return false;
            switch (which)
            {
                case 1 when kind is null: kind = value; break;
                case 2 when !hasBus: bus = value; hasBus = true; break;
                case 3 when !hasRelay: relay = value; hasRelay = true; break;
                case 4 when !hasTag: tag = value.Length == 0 ? null : value; hasTag = true; break;
                default: return false; // a duplicate key: the loader reports it
            }
        }
        if (kind is null) return false;
        if (kind != "motor-protection")
        {
            scanned = new Found(false, tag, null, null);
            return true;
        }
        if (!hasBus || (hasRelay && relay!.Length == 0)) return false;
        scanned = new Found(true, tag, bus, relay);
        return true;
    }

    private static ReadOnlySpan<byte> NextLine(scoped ref ReadOnlySpan<byte> rest)
    {
        var eol = rest.IndexOf((byte)'\n');
        var line = eol < 0 ? rest : rest[..eol];
        rest = eol < 0 ? [] : rest[(eol + 1)..];
        return line.TrimEnd((byte)'\r');
    }

    // The content of the next line that is neither blank nor a comment, and whether it is indented (below the key before it).
    private static ReadOnlySpan<byte> NextContent(ReadOnlySpan<byte> rest, out bool indented)
    {
        while (!rest.IsEmpty)
        {
            var line = NextLine(ref rest);
            var content = line.TrimStart(" \t"u8);
            if (content.IsEmpty || content[0] == (byte)'#') continue;
            indented = content.Length != line.Length;
            return content;
        }
        indented = false;
        return [];
    }

    // A plain key and a colon that ends the line or is followed by a blank: a mapping's first line.
    private static bool IsKeyLine(ReadOnlySpan<byte> content)
    {
        var colon = content.IndexOf((byte)':');
        if (colon <= 0 || (colon + 1 < content.Length && content[colon + 1] is not ((byte)' ' or (byte)'\t'))) return false;
        foreach (var b in content[..colon])
        {
            if (!(char.IsAsciiLetterOrDigit((char)b) || b is (byte)'_' or (byte)'-' or (byte)'.')) return false;
        }
        return true;
    }

    // A plain or simply quoted scalar with an optional comment; null for anything richer.
    private static string? Value(string rest)
    {
        var v = rest.Trim();
        if (v.Length == 0 || v[0] == '#') return "";
        if (v[0] is '{' or '[' or '&' or '*' or '!' or '|' or '>' or '%' or '@' or '`') return null;
        if (v[0] is '"' or '\'')
        {
            var close = v.IndexOf(v[0], 1);
            if (close < 0) return null;
            var inner = v[1..close];
            var after = v[(close + 1)..].Trim();
            if (inner.Contains('\\', StringComparison.Ordinal) || (v[0] == '\'' && after.StartsWith('\''))) return null;
            return after.Length == 0 || after[0] == '#' ? inner : null;
        }
        var hash = v.IndexOf(" #", StringComparison.Ordinal);
        var tab = v.IndexOf("\t#", StringComparison.Ordinal);
        var cut = hash < 0 ? tab : tab < 0 ? hash : Math.Min(hash, tab);
        return (cut < 0 ? v : v[..cut]).TrimEnd();
    }
}
