namespace SettingLint.Core.Discovery;

/// <summary>
/// Finds the repository root: the nearest folder upward that holds `.git`; outside a git work tree, the outermost that
/// holds a `.settinglint.yaml` (the nearer ones are folders' own configurations); else the current folder when the checked path lies below it, else the checked folder.
/// A file checked on its own outside git (`check motors/p-101.yaml`) thus still reaches `../buses/` beside it.
/// </summary>
public static class RepositoryRoot
{
    /// <summary>The root for a checked path (file or folder), as an absolute path without trailing separator.</summary>
    public static string Find(string checkedPath) => Find(checkedPath, Directory.GetCurrentDirectory());

    /// <summary>The root for a checked path, with the current folder given (for the tests).</summary>
    public static string Find(string checkedPath, string currentDirectory)
    {
        var full = Path.GetFullPath(checkedPath);
        var start = Directory.Exists(full) ? full : Path.GetDirectoryName(full) ?? full;
        for (var dir = start; dir is not null; dir = Path.GetDirectoryName(dir))
        {
            // `.git` is a folder, or a file in a linked work tree or submodule.
            var git = Path.Combine(dir, ".git");
            if (Directory.Exists(git) || File.Exists(git)) return Trim(dir);
        }
        // Outside git, the outermost configuration: a nearer one is a folder's own (scoped) configuration, and taking
        // its folder as the root would cut its files off from the root configuration and from `../` beside them.
        string? configured = null;
        for (var dir = start; dir is not null; dir = Path.GetDirectoryName(dir))
        {
            if (File.Exists(Path.Combine(dir, ".settinglint.yaml")) || File.Exists(Path.Combine(dir, ".settinglint.yml"))) configured = dir;
        }
        if (configured is not null) return Trim(configured);
        var cwd = Trim(Path.GetFullPath(currentDirectory));
        return Contains(cwd, start) ? cwd : Trim(start);
    }

    /// <summary>Whether a full path lies inside the root (or is the root).</summary>
    public static bool Contains(string root, string fullPath)
    {
        var r = Trim(root);
        var p = Trim(fullPath);
        return p == r || p.StartsWith(r + Path.DirectorySeparatorChar, StringComparison.Ordinal);
    }

    /// <summary>
    /// Whether a path lies inside the root and stays there when every symbolic link on the way below the root is
    /// followed (a file named through a linked folder that points out of the root is outside). Components that do not
    /// exist are taken as written.
    /// </summary>
    public static bool IsInside(string root, string fullPath)
    {
        if (!Contains(root, fullPath)) return false;
        var r = Trim(root);
        var current = r;
        foreach (var part in Path.GetRelativePath(r, Trim(fullPath)).Split(Path.DirectorySeparatorChar, StringSplitOptions.RemoveEmptyEntries))
        {
            if (part == ".") continue;
            current = Path.Combine(current, part);
            FileSystemInfo info = Directory.Exists(current) ? new DirectoryInfo(current) : new FileInfo(current);
            // The attribute comes with the stat already made; only a link costs a readlink.
            if (!info.Exists || !info.Attributes.HasFlag(FileAttributes.ReparsePoint) || info.LinkTarget is null) continue;
            var target = info.ResolveLinkTarget(returnFinalTarget: true)?.FullName;
            if (target is null || !Contains(r, target)) return false;
            current = Trim(target);
        }
        return true;
    }

    /// <summary>The absolute path of a root-relative one ("" is the root).</summary>
    public static string Full(string root, string relativePath) =>
        relativePath.Length == 0 ? root : Path.Combine(root, relativePath.Replace('/', Path.DirectorySeparatorChar));

    /// <summary>A path relative to the root with forward slashes.</summary>
    public static string Relative(string root, string fullPath) =>
        Path.GetRelativePath(root, fullPath).Replace('\\', '/');

    private static string Trim(string p) =>
        p.Length > 1 ? p.TrimEnd(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar) : p;
}
