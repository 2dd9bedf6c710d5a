using SettingLint.Tests.Shared;

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
    public string Git(params string[] args) => GitProcess.Checked(Root, args);

    public void Dispose() => Temp.Dispose();
}
