using System.Diagnostics;

namespace SettingLint.Tests.Shared;

/// <summary>
/// Runs git in a test's temporary work tree, without the developer's own configuration (hooks path, templates,
/// signing), which must not change a test, and with a fixed author and default branch.
/// </summary>
public static class GitProcess
{
    /// <summary>Runs git in a folder with extra environment variables; returns the exit code and both streams.</summary>
    public static (int Code, string Output, string Error) Run(string folder, IEnumerable<string> args, IReadOnlyDictionary<string, string>? environment = null)
    {
        var start = new ProcessStartInfo("git")
        {
            WorkingDirectory = folder,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var a in (string[])["-c", "user.name=t", "-c", "user.email=t@example.invalid", "-c", "commit.gpgsign=false", "-c", "init.defaultBranch=main"])
        {
            start.ArgumentList.Add(a);
        }
        foreach (var a in args) start.ArgumentList.Add(a);
        start.Environment["GIT_CONFIG_GLOBAL"] = "/dev/null";
        start.Environment["GIT_CONFIG_NOSYSTEM"] = "1";
        foreach (var (k, v) in environment ?? new Dictionary<string, string>()) start.Environment[k] = v;
        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEndAsync();
        var output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        return (process.ExitCode, output, error.Result);
    }

    /// <summary>Runs git in a folder and returns its output; throws with git's error when it fails.</summary>
    public static string Checked(string folder, params string[] args)
    {
        var (code, output, error) = Run(folder, args);
        if (code != 0) throw new InvalidOperationException("git " + string.Join(' ', args) + " failed (" + code + "): " + error);
        return output;
    }
}
