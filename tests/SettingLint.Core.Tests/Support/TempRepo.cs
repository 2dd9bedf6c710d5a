using System.Text;

namespace SettingLint.Tests.Support;

/// <summary>
/// A throw-away repository under the system temp folder: an outer folder (for files "outside the repository")
/// holding <c>repo/</c>, which has a <c>.git</c> folder so that it is the repository root. Deleted on dispose.
/// </summary>
public sealed class TempRepo : IDisposable
{
    private static readonly UTF8Encoding Utf8NoBom = new(encoderShouldEmitUTF8Identifier: false);

    public TempRepo(bool git = true)
    {
        Outer = Path.Combine(Path.GetTempPath(), "settinglint-tests-" + Guid.NewGuid().ToString("N"));
        Root = Path.Combine(Outer, "repo");
        Directory.CreateDirectory(Root);
        if (git) Directory.CreateDirectory(Path.Combine(Root, ".git"));
    }

    /// <summary>The folder that holds the repository; files here lie outside it.</summary>
    public string Outer { get; }

    /// <summary>The repository root (absolute, no trailing separator).</summary>
    public string Root { get; }

    /// <summary>The absolute path of a repository-relative path written with forward slashes.</summary>
    public string PathOf(string relative) => Path.Combine(Root, relative.Replace('/', Path.DirectorySeparatorChar));

    /// <summary>Writes a text file (UTF-8 without BOM, line ends as given) and returns its absolute path.</summary>
    public string Write(string relative, string text) => WriteBytes(relative, Utf8NoBom.GetBytes(text));

    /// <summary>Writes a file's bytes and returns its absolute path.</summary>
    public string WriteBytes(string relative, byte[] bytes)
    {
        var full = PathOf(relative);
        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        File.WriteAllBytes(full, bytes);
        return full;
    }

    /// <summary>Writes a text file next to the repository (outside its root) and returns its absolute path.</summary>
    public string WriteOutside(string relative, string text)
    {
        var full = Path.Combine(Outer, relative.Replace('/', Path.DirectorySeparatorChar));
        Directory.CreateDirectory(Path.GetDirectoryName(full)!);
        File.WriteAllBytes(full, Utf8NoBom.GetBytes(text));
        return full;
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Outer, recursive: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A temp folder left behind is not a test failure.
        }
    }
}
