using System.Diagnostics;

namespace SettingLint.Tests.Support;

/// <summary>
/// A real git work tree in a temporary folder (<c>git init</c> in a <see cref="TempRepo"/>), for in-process tests of
/// the gate's changed-files and staged runs. Git runs without the user's own configuration (hooks, signing).
/// </summary>
public sealed class GitWorkTree : IDisposable
{
    public GitWorkTree()
    {
        Temp = new TempRepo(git: false);
        Git("init", "-q");
    }

    public TempRepo Temp { get; }

    public string Root => Temp.Root;

    public void Write(string rel, string text) => Temp.Write(rel, text);

    public string Read(string rel) => File.ReadAllText(Temp.PathOf(rel));

    /// <summary>Stages everything and commits.</summary>
    public void Commit(string message = "commit")
    {
        Git("add", "-A");
        Git("commit", "-q", "--no-verify", "-m", message);
    }

    /// <summary>Runs git in the work tree and returns its output; throws when it fails.</summary>
    public string Git(params string[] args)
    {
        var start = new ProcessStartInfo("git")
        {
            WorkingDirectory = Root,
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
        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEndAsync();
        var output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException("git " + string.Join(' ', args) + " failed: " + error.Result);
        return output;
    }

    public void Dispose() => Temp.Dispose();
}
