using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Discovery;

/// <summary>A file found for checking, or a link that was refused.</summary>
/// <param name="FullPath">Absolute path (the link's own path for a refused link).</param>
/// <param name="RelativePath">Relative to the repository root, forward slashes.</param>
public sealed record DiscoveredFile(string FullPath, string RelativePath);

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
    public static DiscoveryResult Find(string root, IEnumerable<string> paths, Func<string, bool>? included = null)
    {
        var files = new SortedDictionary<string, DiscoveredFile>(StringComparer.Ordinal);
        var findings = new List<Finding>();
        var missing = new List<string>();
        var outside = new List<string>();
        foreach (var p in paths)
        {
            var full = Path.GetFullPath(p);
            if ((File.Exists(full) || Directory.Exists(full)) && !RepositoryRoot.Contains(root, full))
            {
                outside.Add(p);
                continue;
            }
            if (File.Exists(full)) Consider(root, full, files, findings, included, explicitFile: true);
            else if (Directory.Exists(full) && !RepositoryRoot.IsInside(root, full))
            {
                var b = new FindingBuilder(RepositoryRoot.Relative(root, full));
                b.Add(EngineRules.Reference, SourceSpan.FileStart, "",
                    "This folder is (or lies in) a symbolic link to {target}, outside the repository root; it is not read.",
                    ("target", "a path outside the repository"));
                findings.AddRange(b.Findings);
            }
            else if (Directory.Exists(full)) Walk(root, full, files, findings, included);
            else missing.Add(p);
        }
        return new DiscoveryResult([.. files.Values], findings.OrderBy(f => f, Finding.Order).ToList(), missing) { Outside = outside };
    }

    private static void Walk(string root, string dir, SortedDictionary<string, DiscoveredFile> files, List<Finding> findings, Func<string, bool>? included)
    {
        var pending = new Stack<string>();
        pending.Push(dir);
        while (pending.Count > 0)
        {
            var current = pending.Pop();
            IEnumerable<FileSystemInfo> entries;
            try
            {
                entries = new DirectoryInfo(current).EnumerateFileSystemInfos();
            }
            catch (Exception ex) when (ex is UnauthorizedAccessException or IOException)
            {
                continue;
            }
            foreach (var entry in entries)
            {
                if (entry is DirectoryInfo d)
                {
                    if (d.Name.StartsWith('.') || d.Name is "bin" or "obj" or "node_modules") continue;
                    if (d.Attributes.HasFlag(FileAttributes.ReparsePoint) && d.LinkTarget is not null)
                    {
                        var target = d.ResolveLinkTarget(returnFinalTarget: true)?.FullName;
                        if (target is null || !RepositoryRoot.Contains(root, target)) continue; // a link out of the root is never followed
                        if (RepositoryRoot.Contains(target, current)) continue; // a link to an ancestor would loop
                    }
                    pending.Push(d.FullName);
                }
                else if (entry is FileInfo f && IsYaml(f.Name))
                {
                    Consider(root, f.FullName, files, findings, included, explicitFile: false);
                }
            }
        }
    }

    private static void Consider(string root, string full, SortedDictionary<string, DiscoveredFile> files, List<Finding> findings, Func<string, bool>? included, bool explicitFile)
    {
        if (!explicitFile && !IsYaml(full)) return;
        var rel = RepositoryRoot.Relative(root, full);
        if (!RepositoryRoot.Contains(root, full)) return;
        if (included is not null && !included(rel)) return;
        var info = new FileInfo(full);
        if (info.Attributes.HasFlag(FileAttributes.ReparsePoint) && info.LinkTarget is not null)
        {
            var target = info.ResolveLinkTarget(returnFinalTarget: true)?.FullName;
            var outside = target is null || !RepositoryRoot.Contains(root, target);
            if (outside || !File.Exists(target))
            {
                var b = new FindingBuilder(rel);
                if (outside)
                {
                    b.Add(EngineRules.Reference, SourceSpan.FileStart, "",
                        "This file is a symbolic link to {target}, outside the repository root; it is not followed.",
                        ("target", target is null ? "an unreadable target" : "a path outside the repository"));
                }
                else
                {
                    b.Add(EngineRules.Reference, SourceSpan.FileStart, "",
                        "This file is a symbolic link to {target}, which does not exist; it is not followed.",
                        ("target", RepositoryRoot.Relative(root, target!)));
                }
                findings.AddRange(b.Findings);
                return;
            }
        }
        // A walked folder never leaves the root (links out are not followed); a named file may, through a linked folder.
        if (explicitFile && !RepositoryRoot.IsInside(root, Path.GetDirectoryName(full)!))
        {
            // Named through a linked folder that points out of the root.
            var b = new FindingBuilder(rel);
            b.Add(EngineRules.Reference, SourceSpan.FileStart, "",
                "This file lies in a folder that is a symbolic link to {target}, outside the repository root; it is not read.",
                ("target", "a path outside the repository"));
            findings.AddRange(b.Findings);
            return;
        }
        files.TryAdd(rel, new DiscoveredFile(full, rel));
    }
}
