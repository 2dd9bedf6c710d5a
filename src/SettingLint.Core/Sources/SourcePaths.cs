using SettingLint.Core.Discovery;

namespace SettingLint.Core.Sources;

/// <summary>Paths of a source: root-relative with forward slashes, or absolute under the root.</summary>
public static class SourcePaths
{
    /// <summary>The absolute path of a root-relative one ("" is the root).</summary>
    public static string Full(string root, string relativePath) => RepositoryRoot.Full(root, relativePath);

    /// <summary>
    /// A path as the user gave it made absolute against a working folder that the caller names; the process's current
    /// folder is never used, so that a long-lived host can check for several clients.
    /// </summary>
    public static string Absolute(string path, string? workingDirectory)
    {
        if (Path.IsPathFullyQualified(path)) return Path.GetFullPath(path);
        if (workingDirectory is null || !Path.IsPathFullyQualified(workingDirectory))
        {
            throw new ArgumentException("The relative path '" + path + "' needs an absolute working folder to be resolved against.", nameof(workingDirectory));
        }
        return Path.GetFullPath(path, workingDirectory);
    }

    /// <summary>
    /// The YAML files among root-relative file paths that lie under an absolute folder, skipping hidden and build folders
    /// below it as the disk's discovery does.
    /// </summary>
    public static IEnumerable<string> YamlUnder(string root, string folder, IEnumerable<string> files)
    {
        var prefix = RepositoryRoot.Relative(root, folder);
        prefix = prefix == "." ? "" : prefix + "/";
        foreach (var f in files)
        {
            if (!f.StartsWith(prefix, StringComparison.Ordinal) || !FileDiscovery.IsYaml(f)) continue;
            var below = f[prefix.Length..].Split('/');
            var skipped = false;
            for (var i = 0; i < below.Length - 1; i++)
            {
                if (below[i].StartsWith('.') || below[i] is "bin" or "obj" or "node_modules") skipped = true;
            }
            if (!skipped) yield return f;
        }
    }
}
