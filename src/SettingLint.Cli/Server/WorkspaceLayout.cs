using SettingLint.Core.Configuration;
using SettingLint.Core.Discovery;

namespace SettingLint.Cli.Server;

/// <summary>Which run a document belongs to: the folder `check` would be given for it, and that run's repository root.</summary>
/// <param name="CheckedPath">The nearest folder upward that holds a configuration file (not above the git root), else the git root, else the workspace folder or the document's folder.</param>
/// <param name="Root">The repository root of a check of that folder (<see cref="RepositoryRoot.Find(string)"/>).</param>
public sealed record CheckScope(string CheckedPath, string Root);

/// <summary>Finds the check scope of a document, so that the server checks it with the configuration `check` would use.</summary>
public static class WorkspaceLayout
{
    /// <summary>The scope of a file; <paramref name="workspaceFolders"/> are the client's folders (absolute paths).</summary>
    public static CheckScope ScopeOf(string filePath, IReadOnlyList<string> workspaceFolders)
    {
        ArgumentNullException.ThrowIfNull(workspaceFolders);
        var dir = Path.GetDirectoryName(Path.GetFullPath(filePath)) ?? "/";
        var gitRoot = GitRoot(dir);
        for (var d = dir; d is not null; d = Path.GetDirectoryName(d))
        {
            if (SettingsConfig.FileNames.Any(name => File.Exists(Path.Combine(d, name))))
            {
                return new CheckScope(d, RepositoryRoot.Find(d));
            }
            if (gitRoot is not null && d == gitRoot) break;
        }
        var folder = gitRoot
            ?? workspaceFolders.Where(w => RepositoryRoot.Contains(w, dir)).OrderByDescending(w => w.Length).FirstOrDefault()
            ?? dir;
        return new CheckScope(folder, RepositoryRoot.Find(folder));
    }

    private static string? GitRoot(string dir)
    {
        for (var d = dir; d is not null; d = Path.GetDirectoryName(d))
        {
            var git = Path.Combine(d, ".git");
            if (Directory.Exists(git) || File.Exists(git)) return d;
        }
        return null;
    }

    /// <summary>The local path of a file: URI, or null for other schemes (an untitled buffer).</summary>
    public static string? PathOf(string uri)
    {
        if (!Uri.TryCreate(uri, UriKind.Absolute, out var u) || !u.IsFile) return null;
        return Path.GetFullPath(u.LocalPath);
    }
}
