namespace SettingLint.Reporting;

/// <summary>Path and URI spelling shared by the reporters: forward slashes everywhere, whatever the platform.</summary>
internal static class ReportPaths
{
    /// <summary>A repository-relative file as seen from the current directory.</summary>
    public static string FromCurrentDirectory(string repositoryRoot, string file, string currentDirectory)
    {
        var full = Path.GetFullPath(Path.Combine(repositoryRoot, file));
        return Relative(currentDirectory, full);
    }

    /// <summary>The repository root as seen from the current directory ("." when they are the same).</summary>
    public static string RootFromCurrentDirectory(string repositoryRoot, string currentDirectory) =>
        Relative(currentDirectory, Path.GetFullPath(repositoryRoot));

    /// <summary>A repository-relative file as a relative URI reference: each segment percent-encoded, forward slashes.</summary>
    public static string UriReference(string file)
    {
        var segments = ForwardSlashes(file).Split('/');
        // Escaping every segment keeps spaces, '#', '%' and a colon in the first segment from changing the meaning.
        return string.Join('/', segments.Select(Uri.EscapeDataString));
    }

    /// <summary>The file URI of a directory, ending with a slash, as SARIF's originalUriBaseIds requires.</summary>
    public static string DirectoryFileUri(string directory)
    {
        var path = ForwardSlashes(Path.GetFullPath(directory));
        var segments = path.Split('/', StringSplitOptions.RemoveEmptyEntries);
        var escaped = segments.Select(static (s, i) => i == 0 && IsDriveLetter(s) ? s : Uri.EscapeDataString(s));
        return "file:///" + string.Join('/', escaped) + (segments.Length > 0 ? "/" : "");
    }

    private static string Relative(string currentDirectory, string fullPath)
    {
        var relative = Path.GetRelativePath(Path.GetFullPath(currentDirectory), fullPath);
        return ForwardSlashes(relative);
    }

    private static string ForwardSlashes(string path) =>
        Path.DirectorySeparatorChar == '\\' ? path.Replace('\\', '/') : path;

    private static bool IsDriveLetter(string segment) =>
        segment.Length == 2 && segment[1] == ':' && char.IsAsciiLetter(segment[0]);
}
