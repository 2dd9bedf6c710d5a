using SettingLint.Core.Gate;

namespace SettingLint.Cli;

/// <summary>
/// A temporary copy of the repository's YAML files as they were at a revision, for the report's change view: the working
/// tree's files, with every file that differs since the revision replaced by its old content (`git cat-file`), or removed
/// when it did not exist then. Nothing in the repository itself is touched. Deleted on dispose.
/// </summary>
internal sealed class ReportRevision : IDisposable
{
    // Build output and tool folders hold no setting files and can be large.
    private static readonly HashSet<string> SkippedFolders = new(StringComparer.Ordinal) { ".git", "bin", "obj", "node_modules" };

    private ReportRevision(string root) => Root = root;

    /// <summary>The copy's root: it has a .git folder, so that the copy is its own repository root.</summary>
    public string Root { get; }

    /// <summary>Copies the repository at <paramref name="root"/> as it was at a revision; throws <see cref="GitException"/> with a message for the user.</summary>
    public static ReportRevision At(string root, string revision)
    {
        var git = GitRepository.Open(root);
        var commit = git.ResolveCommit(revision);
        var copy = new ReportRevision(Path.Combine(Path.GetTempPath(), "settinglint-report-" + Guid.NewGuid().ToString("N")));
        try
        {
            Directory.CreateDirectory(Path.Combine(copy.Root, ".git"));
            foreach (var file in YamlFiles(root))
            {
                var target = Path.Combine(copy.Root, Path.GetRelativePath(root, file));
                Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                File.Copy(file, target);
            }
            var changed = new Dictionary<string, string>(StringComparer.Ordinal);
            foreach (var change in git.Changes(commit, staged: false))
            {
                var full = Path.GetFullPath(Path.Combine(git.TopLevel, change.Path));
                var relative = Path.GetRelativePath(root, full);
                if (relative.StartsWith("..", StringComparison.Ordinal) || Path.IsPathRooted(relative) || !IsYaml(full)) continue;
                changed[change.Path] = relative;
            }
            var old = git.Show(commit, changed.Keys);
            foreach (var (gitPath, relative) in changed)
            {
                var target = Path.Combine(copy.Root, relative);
                if (old.TryGetValue(gitPath, out var bytes))
                {
                    Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                    File.WriteAllBytes(target, bytes);
                }
                else if (File.Exists(target))
                {
                    File.Delete(target); // added since the revision
                }
            }
            return copy;
        }
        catch
        {
            copy.Dispose();
            throw;
        }
    }

    /// <summary>The path in the copy that corresponds to a path of the repository.</summary>
    public string Map(string repositoryRoot, string path) =>
        Path.GetFullPath(Path.Combine(Root, Path.GetRelativePath(repositoryRoot, Path.GetFullPath(path))));

    public void Dispose()
    {
        try
        {
            if (Directory.Exists(Root)) Directory.Delete(Root, recursive: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A temp folder left behind does not change the report.
        }
    }

    private static bool IsYaml(string path) =>
        path.EndsWith(".yaml", StringComparison.OrdinalIgnoreCase) || path.EndsWith(".yml", StringComparison.OrdinalIgnoreCase);

    private static IEnumerable<string> YamlFiles(string root)
    {
        var pending = new Stack<string>();
        pending.Push(root);
        while (pending.Count > 0)
        {
            var dir = pending.Pop();
            IEnumerable<string> files, dirs;
            try
            {
                files = Directory.GetFiles(dir);
                dirs = Directory.GetDirectories(dir);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                continue;
            }
            foreach (var f in files.Order(StringComparer.Ordinal))
            {
                if (IsYaml(f)) yield return f;
            }
            foreach (var d in dirs)
            {
                // Linked folders are not followed (a link can make a cycle); the checker refuses what reaches outside through them anyway.
                if (!SkippedFolders.Contains(Path.GetFileName(d)) && new DirectoryInfo(d).LinkTarget is null) pending.Push(d);
            }
        }
    }
}
