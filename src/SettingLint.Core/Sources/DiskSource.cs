using SettingLint.Core.Discovery;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Sources;

/// <summary>The working tree on disk: files as they are saved, links checked so that nothing outside the root is read.</summary>
public sealed class DiskSource : IFileSource
{
    /// <summary>A source over the folder <paramref name="root"/> (absolute).</summary>
    public DiskSource(string root)
    {
        if (!Path.IsPathRooted(root)) throw new ArgumentException("The root of a source is an absolute path: " + root, nameof(root));
        Root = root.Length > 1 ? root.TrimEnd(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar) : root;
    }

    public string Root { get; }

    public EntryKind Probe(string fullPath) =>
        Directory.Exists(fullPath) ? EntryKind.Folder
        : !File.Exists(fullPath) ? EntryKind.Missing
        : !RepositoryRoot.IsInside(Root, fullPath) ? EntryKind.LinkOutside
        : EntryKind.File;

    public byte[]? Read(string relativePath)
    {
        var full = SourcePaths.Full(Root, relativePath);
        return File.Exists(full) ? File.ReadAllBytes(full) : null;
    }

    // Every file of a changed-files run passes through here once (its plan): one open, no array per file.
    public long ReadInto(string fullPath, string relativePath, long maxBytes, ref byte[] buffer) => FileBytes.ReadInto(fullPath, maxBytes, ref buffer);

    // The size limit is checked before anything is read.
    public LoadedFile Load(string fullPath, string relativePath, LoadLimits limits) => YamlLoader.LoadFile(fullPath, relativePath, limits);

    public DiscoveryResult Discover(IReadOnlyList<string> paths, IReadOnlyList<string> shown, Func<string, bool>? included) =>
        FileDiscovery.Find(Root, paths, included, shown);

    public IReadOnlyList<string> FindFiles(string relativeFolder, string fileName)
    {
        var folder = SourcePaths.Full(Root, relativeFolder);
        if (!Directory.Exists(folder)) return [];
        return [.. Directory.EnumerateFiles(folder, fileName, SearchOption.AllDirectories)
            .Select(f => RepositoryRoot.Relative(Root, f))
            .Order(StringComparer.Ordinal)];
    }
}
