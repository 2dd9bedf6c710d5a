using System.Collections.Immutable;

namespace SettingLint.Core.Gate;

/// <summary>A view of the repository other than the working tree: contents to read instead of the disk, and files to treat as absent.</summary>
/// <param name="Contents">Root-relative path to the bytes to check instead of the file on disk.</param>
/// <param name="Hidden">Root-relative paths of files on disk that are not part of the view (untracked, or deleted in it).</param>
public sealed record FileOverlay(ImmutableDictionary<string, byte[]> Contents, ImmutableHashSet<string> Hidden)
{
    /// <summary>The bytes of a root-relative file in this view: the overlay's, none when hidden, else the disk's (null when absent).</summary>
    public byte[]? Read(string root, string relativePath)
    {
        if (Contents.TryGetValue(relativePath, out var bytes)) return bytes;
        if (Hidden.Contains(relativePath)) return null;
        var full = Path.Combine(root, relativePath.Replace('/', Path.DirectorySeparatorChar));
        return File.Exists(full) ? File.ReadAllBytes(full) : null;
    }
}
