using SettingLint.Core.Discovery;
using SettingLint.Core.Loading;

namespace SettingLint.Core.Sources;

/// <summary>What a path of a file source is.</summary>
public enum EntryKind
{
    /// <summary>Nothing is there (or the source hides it).</summary>
    Missing,

    /// <summary>A file that can be read.</summary>
    File,

    /// <summary>A folder.</summary>
    Folder,

    /// <summary>A file reached through a symbolic link that leads out of the root: it is never read.</summary>
    LinkOutside,
}

/// <summary>
/// The files a check reads: the disk, a git revision, or contents held in memory over another source (unsaved
/// editor buffers, the staged contents). Every read of a run goes through one source, so that the same engine
/// checks any of them. Paths are absolute (under <see cref="Root"/>) or relative to the root with forward slashes.
/// Implementations are safe to call from several threads at once.
/// </summary>
public interface IFileSource
{
    /// <summary>The absolute path of the repository root the source shows (a revision shows it at that revision).</summary>
    string Root { get; }

    /// <summary>What an absolute path inside the root is.</summary>
    EntryKind Probe(string fullPath);

    /// <summary>The bytes of a root-relative file; null when it is not there.</summary>
    byte[]? Read(string relativePath);

    /// <summary>
    /// Reads a root-relative file into a buffer that the caller keeps from file to file (replaced by a larger one when
    /// too small), for a reader that looks at every file once and keeps none: the plan of a changed-files run.
    /// </summary>
    /// <param name="fullPath">Absolute path, as <see cref="Load"/> takes it.</param>
    /// <param name="relativePath">The same, root-relative.</param>
    /// <param name="maxBytes">A longer file is measured, not read.</param>
    /// <param name="buffer">The caller's buffer; on return, the file's bytes are its first bytes.</param>
    /// <returns>The file's length; -1 when it is not there.</returns>
    long ReadInto(string fullPath, string relativePath, long maxBytes, ref byte[] buffer) => FileBytes.CopyInto(Read(relativePath), maxBytes, ref buffer);

    /// <summary>Loads a file with the loader's limits (a missing file loads as an empty one without findings).</summary>
    LoadedFile Load(string fullPath, string relativePath, LoadLimits limits) =>
        Read(relativePath) is { } bytes ? YamlLoader.Load(bytes, fullPath, relativePath, limits) : new LoadedFile(fullPath, relativePath, null, [], []);

    /// <summary>Finds the YAML files under absolute paths, as <see cref="FileDiscovery.Find"/> does on disk.</summary>
    /// <param name="paths">Absolute paths of files and folders.</param>
    /// <param name="shown">How each path is named in messages (as the user gave it), by position.</param>
    /// <param name="included">Whether a root-relative path is checked; may be asked from several threads.</param>
    DiscoveryResult Discover(IReadOnlyList<string> paths, IReadOnlyList<string> shown, Func<string, bool>? included);

    /// <summary>Root-relative paths of the files with a name under a root-relative folder ("" is the root), sorted.</summary>
    IReadOnlyList<string> FindFiles(string relativeFolder, string fileName);
}
