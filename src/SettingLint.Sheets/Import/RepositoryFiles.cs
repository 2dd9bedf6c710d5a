using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Loading;

namespace SettingLint.Sheets.Import;

/// <summary>The setting files already in a repository, by kind and tag: where a sheet's bus tags point and which motors exist.</summary>
public sealed class RepositoryFiles
{
    private readonly Dictionary<(string Kind, string Tag), string> _byTag = [];

    private RepositoryFiles()
    {
    }

    /// <summary>Reads the kind and tag of every YAML file under the root (only their top-level keys are looked at).</summary>
    public static RepositoryFiles Scan(string root)
    {
        var files = new RepositoryFiles();
        if (!Directory.Exists(root)) return files;
        foreach (var file in FileDiscovery.Find(root, [root]).Files)
        {
            var loaded = YamlLoader.LoadFile(file.FullPath, file.RelativePath, LoadLimits.Default);
            if (loaded.Root is YMapping m && m["kind"] is YScalar kind && m["tag"] is YScalar tag)
            {
                files._byTag.TryAdd((kind.Value, tag.Value), file.FullPath);
            }
        }
        return files;
    }

    /// <summary>The full path of the file of a kind with a tag, when there is one.</summary>
    public string? Find(string kind, string tag) => _byTag.GetValueOrDefault((kind, tag));

    /// <summary>The tags of a kind, sorted, for messages.</summary>
    public IEnumerable<string> Tags(string kind) => _byTag.Keys.Where(k => k.Kind == kind).Select(k => k.Tag).Order(StringComparer.Ordinal);

    /// <summary>The kind written in a file, when it is a setting file that loads.</summary>
    public static string? KindOf(string fullPath)
    {
        try
        {
            var loaded = YamlLoader.LoadFile(fullPath, fullPath, LoadLimits.Default);
            return ((loaded.Root as YMapping)?["kind"] as YScalar)?.Value;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }
}
