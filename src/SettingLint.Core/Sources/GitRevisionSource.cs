using System.Collections.Immutable;
using SettingLint.Core.Discovery;

namespace SettingLint.Core.Sources;

/// <summary>
/// The repository as it was at a git revision, read from git's object store (<c>git ls-tree</c> for the listing,
/// <c>git cat-file --batch</c> for contents); nothing is copied or checked out. Symbolic links and submodules of the
/// revision are not read (a link is absent in this view).
/// </summary>
public sealed class GitRevisionSource : IFileSource
{
    private readonly GitRepository _git;
    private readonly string _commit;

    // Root-relative path of each regular file at the revision, to its path relative to git's top level.
    private readonly ImmutableSortedDictionary<string, string> _files;
    private readonly ImmutableHashSet<string> _folders;

    // Every YAML file under the root is read in one call to git on first need: a run reads nearly all of them.
    private readonly Lazy<IReadOnlyDictionary<string, byte[]>> _yaml;

    private GitRevisionSource(string root, GitRepository git, string commit, string revision, ImmutableSortedDictionary<string, string> files)
    {
        Root = root;
        Revision = revision;
        _git = git;
        _commit = commit;
        _files = files;
        var folders = ImmutableHashSet.CreateBuilder<string>(StringComparer.Ordinal);
        folders.Add("");
        foreach (var f in files.Keys)
        {
            for (var slash = f.IndexOf('/', StringComparison.Ordinal); slash >= 0; slash = f.IndexOf('/', slash + 1)) folders.Add(f[..slash]);
        }
        _folders = folders.ToImmutable();
        _yaml = new(() =>
        {
            var wanted = _files.Where(e => FileDiscovery.IsYaml(e.Key)).ToList();
            var contents = _git.Show(_commit, wanted.Select(e => e.Value));
            return wanted.Where(e => contents.ContainsKey(e.Value)).ToDictionary(e => e.Key, e => contents[e.Value], StringComparer.Ordinal);
        }, LazyThreadSafetyMode.ExecutionAndPublication);
    }

    /// <summary>The revision as it was named.</summary>
    public string Revision { get; }

    public string Root { get; }

    /// <summary>
    /// The repository root <paramref name="root"/> (absolute, inside a git work tree) as it was at a revision; a
    /// <see cref="GitException"/> says why it cannot be read (no git, no work tree, no such revision).
    /// </summary>
    public static GitRevisionSource At(string root, string revision)
    {
        var (git, resolved) = GitRepository.Open(root, revision);
        var commit = resolved ?? throw GitRepository.NotARevision(revision);
        var files = ImmutableSortedDictionary.CreateBuilder<string, string>(StringComparer.Ordinal);
        foreach (var (mode, gitPath) in git.Tree(commit))
        {
            // 100644 and 100755 are regular files; 120000 a link, 160000 a submodule.
            if (!mode.StartsWith("100", StringComparison.Ordinal)) continue;
            var full = Path.GetFullPath(Path.Combine(git.TopLevel, gitPath));
            if (RepositoryRoot.Contains(root, full) && full != root) files[RepositoryRoot.Relative(root, full)] = gitPath;
        }
        return new GitRevisionSource(root, git, commit, revision, files.ToImmutable());
    }

    public EntryKind Probe(string fullPath)
    {
        if (!RepositoryRoot.Contains(Root, fullPath)) return EntryKind.Missing;
        var rel = Rel(fullPath);
        // The root itself is a folder at every revision.
        if (rel.Length == 0) return EntryKind.Folder;
        return _files.ContainsKey(rel) ? EntryKind.File : _folders.Contains(rel) ? EntryKind.Folder : EntryKind.Missing;
    }

    public byte[]? Read(string relativePath)
    {
        if (!_files.TryGetValue(relativePath, out var gitPath)) return null;
        if (FileDiscovery.IsYaml(relativePath)) return _yaml.Value.GetValueOrDefault(relativePath);
        return _git.Show(_commit, [gitPath]).GetValueOrDefault(gitPath);
    }

    public DiscoveryResult Discover(IReadOnlyList<string> paths, IReadOnlyList<string> shown, Func<string, bool>? included)
    {
        var found = new SortedDictionary<string, DiscoveredFile>(StringComparer.Ordinal);
        var missing = new List<string>();
        var outside = new List<string>();
        for (var i = 0; i < paths.Count; i++)
        {
            var full = paths[i];
            if (!RepositoryRoot.Contains(Root, full))
            {
                outside.Add(shown[i]);
                continue;
            }
            IEnumerable<string> files = Probe(full) switch
            {
                EntryKind.File => [Rel(full)],
                EntryKind.Folder => SourcePaths.YamlUnder(Root, full, _files.Keys),
                _ => [],
            };
            if (Probe(full) == EntryKind.Missing) missing.Add(shown[i]);
            foreach (var f in files)
            {
                if (included is null || included(f)) found.TryAdd(f, DiscoveredFile.Under(Root, f));
            }
        }
        return new DiscoveryResult([.. found.Values], [], missing) { Outside = outside };
    }

    public IReadOnlyList<string> FindFiles(string relativeFolder, string fileName)
    {
        var prefix = relativeFolder.Length == 0 ? "" : relativeFolder.TrimEnd('/') + "/";
        return [.. _files.Keys.Where(k => k.StartsWith(prefix, StringComparison.Ordinal) && (k == fileName || k.EndsWith("/" + fileName, StringComparison.Ordinal)))];
    }

    private string Rel(string fullPath)
    {
        var rel = RepositoryRoot.Relative(Root, fullPath);
        return rel == "." ? "" : rel;
    }
}
