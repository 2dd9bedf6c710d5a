using System.Collections.Concurrent;
using System.Collections.Immutable;
using System.Text;
using System.Text.Unicode;
using SettingLint.Core.Discovery;

namespace SettingLint.Core.Engine;

/// <summary>
/// A quick read of the top-level <c>kind</c>, <c>bus</c> and <c>relay_model</c> lines of YAML files, without a YAML
/// parser or schema, so that a changed-files run loads only what a change can reach. A file it cannot read for
/// certain (a flow document, a quoted key, an anchor, a tag, an escape) is reported as uncertain and loaded anyway.
/// A full run groups the motors by the bus it finds (<see cref="BusGroups"/>).
/// </summary>
internal static class QuickScan
{
    /// <summary>The references of the motor files among <paramref name="files"/>, and the files that could not be read for certain.</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="files">The discovered files.</param>
    /// <param name="read">Reads a file's bytes (from an overlay or the disk); null when it cannot be read.</param>
    /// <param name="maxBytes">Files above this size are left to the loader (and its SL008).</param>
    /// <param name="parallel">Read the files in parallel.</param>
    public static (ImmutableArray<MotorReferences> Motors, ImmutableArray<string> Uncertain) Read(
        string root, IReadOnlyList<DiscoveredFile> files, Func<DiscoveredFile, byte[]?> read, long maxBytes, bool parallel)
    {
        var motors = new ConcurrentBag<MotorReferences>();
        var uncertain = new ConcurrentBag<string>();
        void One(DiscoveredFile f)
        {
            var bytes = SafeRead(read, f);
            if (bytes is null || bytes.LongLength > maxBytes || !TryScan(root, f, bytes, out var motor)) uncertain.Add(f.RelativePath);
            else if (motor is not null) motors.Add(motor);
        }
        if (parallel && files.Count > 1) Parallel.ForEach(files, One);
        else foreach (var f in files) One(f);
        return ([.. motors.OrderBy(m => m.File, StringComparer.Ordinal)], [.. uncertain.Order(StringComparer.Ordinal)]);
    }

    private static byte[]? SafeRead(Func<DiscoveredFile, byte[]?> read, DiscoveredFile f)
    {
        try
        {
            return read(f);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    // False when unsure; else the motor's references, or no motor for another kind. It reads the bytes line by line and
    // decodes only the values of the three keys it looks for: every file of the repository passes through here.
    private static bool TryScan(string root, DiscoveredFile file, byte[] bytes, out MotorReferences? motor)
    {
        motor = null;
        if (!Utf8.IsValid(bytes)) return false;
        string? kind = null, bus = null, relay = null;
        bool hasBus = false, hasRelay = false;
        ReadOnlySpan<byte> rest = bytes;
        while (!rest.IsEmpty)
        {
            var eol = rest.IndexOf((byte)'\n');
            var line = eol < 0 ? rest : rest[..eol];
            rest = eol < 0 ? [] : rest[(eol + 1)..];
            line = line.TrimEnd((byte)'\r');
            if (line.Length == 0 || line[0] is (byte)' ' or (byte)'\t' or (byte)'#') continue;
            if (line.StartsWith("---"u8) || line.StartsWith("..."u8))
            {
                if (line.Trim(" \t\v\f"u8) is var t && (t.SequenceEqual("---"u8) || t.SequenceEqual("..."u8))) continue;
                return false;
            }
            var colon = line.IndexOf((byte)':');
            if (colon <= 0) continue;
            var key = line[..colon];
            var which = key.SequenceEqual("kind"u8) ? 1 : key.SequenceEqual("bus"u8) ? 2 : key.SequenceEqual("relay_model"u8) ? 3 : 0;
            if (which == 0) continue;
            if (Value(Encoding.UTF8.GetString(line[(colon + 1)..])) is not { } value) return false;
            switch (which)
            {
                case 1 when kind is null: kind = value; break;
                case 2 when !hasBus: bus = value; hasBus = true; break;
                case 3 when !hasRelay: relay = value; hasRelay = true; break;
                default: return false; // a duplicate key: the loader reports it
            }
        }
        if (kind is null) return false;
        if (kind != "motor-protection") return true;
        if (!hasBus || (hasRelay && relay!.Length == 0)) return false;
        var dir = Path.GetDirectoryName(file.FullPath) ?? root;
        // An empty value is an inline bus mapping: the motor's own, shared with no other motor.
        var busFile = bus!.Length == 0 ? null : ChangeSet.Resolve(root, dir, bus);
        var relayFile = relay is null ? null : ChangeSet.Resolve(root, dir, relay);
        motor = new MotorReferences(file.RelativePath, busFile, relayFile);
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
