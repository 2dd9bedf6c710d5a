using System.IO.Enumeration;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Discovery;

/// <summary>A file found for checking, or a link that was refused.</summary>
public sealed record DiscoveredFile
{
    // A file found under the root holds the root (one string for every file) and makes its full path when asked: at 100,000
    // generated motors the full paths were some 20 MB held from discovery until the files were divided by bus (resident
    // memory after discovery 65 -> 52 MiB, at the end of the quick read 73 -> 57 MiB; native, 2026-12-05).
    private readonly string? _root;
    private readonly string? _fullPath;

    /// <summary>A file at a full path of its own.</summary>
    /// <param name="fullPath">Absolute path (the link's own path for a refused link).</param>
    /// <param name="relativePath">Relative to the repository root, forward slashes.</param>
    public DiscoveredFile(string fullPath, string relativePath)
        : this(null, fullPath, relativePath)
    {
    }

    private DiscoveredFile(string? root, string? fullPath, string relativePath)
    {
        _root = root;
        _fullPath = fullPath;
        RelativePath = relativePath;
    }

    /// <summary>A file whose full path is the root joined with its relative path (<see cref="RepositoryRoot.Full"/>).</summary>
    public static DiscoveredFile Under(string root, string relativePath) => new(root, null, relativePath);

    /// <summary>Absolute path (the link's own path for a refused link).</summary>
    public string FullPath => _fullPath ?? RepositoryRoot.Full(_root!, RelativePath);

    /// <summary>Whether the full path is the root joined with the relative path; for a file made by <see cref="Under"/> that root, without making either path.</summary>
    internal bool IsUnder(string root) => _fullPath is null ? _root == root : _fullPath == RepositoryRoot.Full(root, RelativePath);

    /// <summary>Relative to the repository root, forward slashes.</summary>
    public string RelativePath { get; }

    /// <summary>Files are equal when both their paths are, however they were made.</summary>
    public bool Equals(DiscoveredFile? other) => other is not null && other.RelativePath == RelativePath && other.FullPath == FullPath;

    /// <inheritdoc />
    public override int GetHashCode() => HashCode.Combine(RelativePath, FullPath);

    private bool PrintMembers(System.Text.StringBuilder builder)
    {
        builder.Append("FullPath = ").Append(FullPath).Append(", RelativePath = ").Append(RelativePath);
        return true;
    }
}

/// <summary>
/// The files discovery found, sorted by relative path (ordinal), without duplicates: their relative paths packed, each
/// file made when asked (a new <see cref="DiscoveredFile"/> each time, equal to the last).
/// </summary>
/// <remarks>
/// A list of 100,000 files as objects held some 12 MB (the file, its path) from discovery through the quick read:
/// docs/performance.md, 2026-12-05, "Packed paths and tags".
/// </remarks>
internal sealed class DiscoveredFiles : IReadOnlyList<DiscoveredFile>
{
    private readonly string _root;
    private readonly PackedStrings _paths;
    private readonly Dictionary<int, string> _own;

    private DiscoveredFiles(string root, PackedStrings paths, Dictionary<int, string> own) => (_root, _paths, _own) = (root, paths, own);

    public int Count => _paths.Count;

    public DiscoveredFile this[int index] => _own.TryGetValue(index, out var full) ? new(full, _paths.GetString(index)) : DiscoveredFile.Under(_root, _paths.GetString(index));

    public IEnumerator<DiscoveredFile> GetEnumerator()
    {
        for (var i = 0; i < Count; i++) yield return this[i];
    }

    System.Collections.IEnumerator System.Collections.IEnumerable.GetEnumerator() => GetEnumerator();

    /// <summary>Gathers files in any order; sorted, the first of two with one relative path is kept.</summary>
    /// <param name="root">The repository root (absolute); a file added without a full path of its own lies at the root joined with its relative path.</param>
    public sealed class Builder(string root)
    {
        private readonly PackedStrings _paths = new();
        private readonly Dictionary<int, string> _own = [];

        /// <summary>Adds a file by its relative path (<paramref name="prefix"/> then <paramref name="rest"/>), with its own full path or none.</summary>
        /// <returns>Its number in the list that <see cref="Build"/> makes unsorted.</returns>
        public int Add(ReadOnlySpan<char> prefix, ReadOnlySpan<char> rest, string? fullPath = null)
        {
            var i = _paths.Add(prefix, rest);
            if (fullPath is not null) _own[i] = fullPath;
            return i;
        }

        /// <summary>The list: sorted, without duplicates; or, unsorted, every file in the order of adding.</summary>
        public DiscoveredFiles Build(bool sorted = true)
        {
            if (!sorted)
            {
                _paths.Trim();
                return new DiscoveredFiles(root, _paths, _own);
            }
            // By path, then the order of adding, so that the first added of two equal paths comes first and is kept.
            var order = PackedStrings.Sorted(_paths.Count, (a, b) => _paths.Compare(a, b) is var c and not 0 ? c : a.CompareTo(b));
            var paths = new PackedStrings(order.Length);
            var own = new Dictionary<int, string>();
            for (var i = 0; i < order.Length; i++)
            {
                if (i > 0 && _paths.Compare(order[i], order[i - 1]) == 0) continue;
                var n = paths.Add(_paths, order[i]);
                if (_own.TryGetValue(order[i], out var full)) own[n] = full;
            }
            paths.Trim();
            return new DiscoveredFiles(root, paths, own);
        }
    }
}

/// <summary>What discovery found: files to load in a fixed order, and findings for links it would not follow.</summary>
public sealed record DiscoveryResult(IReadOnlyList<DiscoveredFile> Files, IReadOnlyList<Finding> Findings, IReadOnlyList<string> Missing)
{
    /// <summary>Paths named explicitly that lie outside the repository root.</summary>
    public IReadOnlyList<string> Outside { get; init; } = [];
}

/// <summary>Finds `*.yaml` and `*.yml` under the checked paths, skipping hidden folders and never leaving the root through a link.</summary>
public static class FileDiscovery
{
    /// <summary>Whether a file name is a YAML file by its extension.</summary>
    public static bool IsYaml(string name) =>
        name.EndsWith(".yaml", StringComparison.OrdinalIgnoreCase) || name.EndsWith(".yml", StringComparison.OrdinalIgnoreCase);

    /// <summary>Finds the files under the paths, sorted by relative path (ordinal), without duplicates.</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="paths">Files and folders to look in.</param>
    /// <param name="included">Whether a relative path is checked; it may be asked from several threads at once.</param>
    /// <param name="shown">How each path is named in messages, by position (the path itself when not given).</param>
    public static DiscoveryResult Find(string root, IEnumerable<string> paths, Func<string, bool>? included = null, IReadOnlyList<string>? shown = null)
    {
        var files = new DiscoveredFiles.Builder(root);
        var findings = new List<Finding>();
        var missing = new List<string>();
        var outside = new List<string>();
        var listed = new List<(string RelativePath, bool MaybeLink)>();
        void Add((DiscoveredFile? File, IReadOnlyList<Finding> Findings) considered)
        {
            if (considered.File is { } f) files.Add(f.RelativePath, "", f.FullPath);
            findings.AddRange(considered.Findings);
        }
        var position = 0;
        foreach (var p in paths)
        {
            var named = shown is not null && position < shown.Count ? shown[position] : p;
            position++;
            var full = Path.GetFullPath(p);
            if ((File.Exists(full) || Directory.Exists(full)) && !RepositoryRoot.Contains(root, full))
            {
                outside.Add(named);
                continue;
            }
            if (File.Exists(full)) Add(Consider(root, full, included));
            else if (Directory.Exists(full) && !RepositoryRoot.IsInside(root, full))
            {
                var b = new FindingBuilder(RepositoryRoot.Relative(root, full));
                b.Add(EngineMessages.FolderLiesSymbolicLink, SourceSpan.FileStart, "",
                    ("target", "a path outside the repository"));
                findings.AddRange(b.Findings);
            }
            else if (Directory.Exists(full)) Walk(root, full, listed);
            else missing.Add(named);
        }
        // The configuration's globs are matched against every listed file: thousands of them go faster in parallel.
        var considered = new (bool Keep, IReadOnlyList<Finding> Findings)[listed.Count];
        if (listed.Count >= ParallelFrom) Parallel.For(0, listed.Count, i => considered[i] = Consider(root, listed[i].RelativePath, included, listed[i].MaybeLink));
        else for (var i = 0; i < listed.Count; i++) considered[i] = Consider(root, listed[i].RelativePath, included, listed[i].MaybeLink);
        for (var i = 0; i < considered.Length; i++)
        {
            if (considered[i].Keep) files.Add(listed[i].RelativePath, "");
            findings.AddRange(considered[i].Findings);
        }
        return new DiscoveryResult(files.Build(), findings.OrderBy(f => f, Finding.Order).ToList(), missing) { Outside = outside };
    }

    private const int ParallelFrom = 256;

    /// <summary>
    /// Lists the YAML files under a folder by relative path, skipping hidden and build folders and links out of the root or
    /// to an ancestor.
    /// </summary>
    private static void Walk(string root, string dir, List<(string RelativePath, bool MaybeLink)> listed)
    {
        // Hidden files are listed too (only folders starting with a dot are skipped, by name).
        var options = new EnumerationOptions { AttributesToSkip = 0, IgnoreInaccessible = true, RecurseSubdirectories = false };
        // The listing without links: the type of each entry comes with the listing, so that a file costs no call to the
        // file system here (reading its attributes did: 10,000 lstat calls for 10,000 motors, docs/performance.md).
        var noLinks = new EnumerationOptions { AttributesToSkip = FileAttributes.ReparsePoint, IgnoreInaccessible = true, RecurseSubdirectories = false };
        var pending = new Stack<string>();
        pending.Push(dir);
        while (pending.Count > 0)
        {
            var current = pending.Pop();
            List<(string? FullPath, string Name, bool IsDirectory)> entries;
            bool anyLink;
            try
            {
                entries = List(current, noLinks);
                // Counted with the links: a folder that holds one is listed again whole, and each of its files looked at as
                // a possible link. A link that came while a file went between the two listings is not listed at all, as
                // if it came after discovery: nothing is ever read through a link that was not looked at.
                anyLink = new FileSystemEnumerable<bool>(current, static (ref FileSystemEntry _) => true, options).Count() != entries.Count;
                if (anyLink) entries = List(current, options);
            }
            catch (Exception ex) when (ex is UnauthorizedAccessException or IOException)
            {
                continue;
            }
            // Each file's relative path is made from its folder's, without its full path (a walked folder lies below the root).
            var folder = RepositoryRoot.Relative(root, current);
            var prefix = folder == "." ? "" : folder + "/";
            foreach (var (path, name, isDirectory) in entries)
            {
                if (isDirectory)
                {
                    // A link to a folder lists as a folder; only folders have their attributes read here.
                    if (name.StartsWith('.') || name is "bin" or "obj" or "node_modules") continue;
                    var d = new DirectoryInfo(path!);
                    if (d.Attributes.HasFlag(FileAttributes.ReparsePoint) && d.LinkTarget is not null)
                    {
                        var target = d.ResolveLinkTarget(returnFinalTarget: true)?.FullName;
                        if (target is null || !RepositoryRoot.Contains(root, target)) continue; // a link out of the root is never followed
                        if (RepositoryRoot.Contains(target, current)) continue; // a link to an ancestor would loop
                    }
                    pending.Push(path!);
                }
                else if (IsYaml(name))
                {
                    listed.Add((prefix + name, anyLink));
                }
            }
        }
    }

    // A folder's full path, a file's name only.
    private static List<(string? FullPath, string Name, bool IsDirectory)> List(string folder, EnumerationOptions options) =>
        [.. new FileSystemEnumerable<(string?, string, bool)>(folder, static (ref FileSystemEntry e) => (e.IsDirectory ? e.ToFullPath() : null, e.FileName.ToString(), e.IsDirectory), options)];

    /// <summary>A file named on the command line to check, or the finding of a link that is not followed, or nothing (not YAML, not included).</summary>
    private static (DiscoveredFile? File, IReadOnlyList<Finding> Findings) Consider(string root, string full, Func<string, bool>? included)
    {
        var rel = RepositoryRoot.Relative(root, full);
        if (!RepositoryRoot.Contains(root, full)) return (null, []);
        if (included is not null && !included(rel)) return (null, []);
        if (RefusedLink(root, full, rel) is { } refused) return (null, refused);
        // A walked folder never leaves the root (links out are not followed); a named file may, through a linked folder.
        if (!RepositoryRoot.IsInside(root, Path.GetDirectoryName(full)!))
        {
            // Named through a linked folder that points out of the root.
            var b = new FindingBuilder(rel);
            b.Add(EngineMessages.FileLiesFolderSymbolic, SourceSpan.FileStart, "",
                ("target", "a path outside the repository"));
            return (null, b.Findings);
        }
        return (new DiscoveredFile(full, rel), []);
    }

    /// <summary>A YAML file listed under a walked folder, by its relative path: to check, or a link refused, or nothing (not included).</summary>
    /// <param name="maybeLink">False when the listing showed the file is no link, so that it needs no call to the file system.</param>
    private static (bool Keep, IReadOnlyList<Finding> Findings) Consider(string root, string rel, Func<string, bool>? included, bool maybeLink)
    {
        if (included is not null && !included(rel)) return (false, []);
        if (maybeLink && RefusedLink(root, RepositoryRoot.Full(root, rel), rel) is { } refused) return (false, refused);
        return (true, []);
    }

    /// <summary>The finding of a file that is a link out of the root or to no file; null when it is no such link.</summary>
    private static IReadOnlyList<Finding>? RefusedLink(string root, string full, string rel)
    {
        var info = new FileInfo(full);
        if (!info.Attributes.HasFlag(FileAttributes.ReparsePoint) || info.LinkTarget is null) return null;
        var target = info.ResolveLinkTarget(returnFinalTarget: true)?.FullName;
        var outside = target is null || !RepositoryRoot.Contains(root, target);
        if (!outside && File.Exists(target)) return null;
        var b = new FindingBuilder(rel);
        if (outside)
        {
            b.Add(EngineMessages.FileSymbolicLinkOutside, SourceSpan.FileStart, "",
                ("target", target is null ? "an unreadable target" : "a path outside the repository"));
        }
        else
        {
            b.Add(EngineMessages.FileSymbolicLinkWhich, SourceSpan.FileStart, "",
                ("target", RepositoryRoot.Relative(root, target!)));
        }
        return b.Findings;
    }
}
