namespace SettingLint.Core.Discovery;

/// <summary>Finds the repository root: the nearest folder upward that holds `.git`, or the checked folder itself.</summary>
public static class RepositoryRoot
{
    /// <summary>The root for a checked path (file or folder), as an absolute path without trailing separator.</summary>
    public static string Find(string checkedPath)
    {
        var full = Path.GetFullPath(checkedPath);
        var start = Directory.Exists(full) ? full : Path.GetDirectoryName(full) ?? full;
        for (var dir = start; dir is not null; dir = Path.GetDirectoryName(dir))
        {
            var git = Path.Combine(dir, ".git");
            if (Directory.Exists(git) || File.Exists(git)) return Trim(dir);
        }
        return Trim(start);
    }

    /// <summary>Whether a full path lies inside the root (or is the root).</summary>
    public static bool Contains(string root, string fullPath)
    {
        var r = Trim(root);
        var p = Trim(fullPath);
        return p == r || p.StartsWith(r + Path.DirectorySeparatorChar, StringComparison.Ordinal);
    }

    /// <summary>A path relative to the root with forward slashes.</summary>
    public static string Relative(string root, string fullPath) =>
        Path.GetRelativePath(root, fullPath).Replace('\\', '/');

    private static string Trim(string p) =>
        p.Length > 1 ? p.TrimEnd(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar) : p;
}
