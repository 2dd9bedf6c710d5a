namespace SettingLint.Reporting;

/// <summary>
/// How to run this tool again, for messages that name a command ("settinglint rules show SL201"): `settinglint` when
/// that is on the PATH (the installed tool), else the way this process was started, such as
/// `dotnet /src/SettingLint.Cli/bin/Debug/net10.0/settinglint.dll` after a `dotnet run`, which a user can paste.
/// </summary>
public static class ToolCommand
{
    /// <summary>The name the installed tool has on the PATH.</summary>
    public const string Installed = "settinglint";

    private static readonly Lazy<string> Resolved = new(() => Resolve(
        Environment.GetEnvironmentVariable("PATH") ?? "",
        Environment.ProcessPath,
        Path.Combine(AppContext.BaseDirectory, Installed + ".dll")));

    /// <summary>The command for this process (looked up once).</summary>
    public static string Current => Resolved.Value;

    /// <summary>The command, given the PATH, the process's executable and the tool's main assembly.</summary>
    public static string Resolve(string pathVariable, string? processPath, string? mainAssembly)
    {
        foreach (var dir in pathVariable.Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            if (File.Exists(Path.Combine(dir, Installed)) || File.Exists(Path.Combine(dir, Installed + ".exe"))) return Installed;
        }
        if (processPath is null) return Installed;
        var host = Path.GetFileNameWithoutExtension(processPath);
        if (host == "dotnet") return mainAssembly is null ? Installed : "dotnet " + Quote(mainAssembly);
        return Quote(processPath);
    }

    // POSIX shell quoting, only when needed: a path with a space stays one word when pasted.
    private static string Quote(string path) =>
        path.All(c => char.IsAsciiLetterOrDigit(c) || c is '/' or '.' or '-' or '_' or '\\' or ':') ? path : "'" + path.Replace("'", "'\\''", StringComparison.Ordinal) + "'";
}
