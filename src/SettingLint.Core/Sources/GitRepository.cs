using System.Collections.Immutable;
using System.Diagnostics;
using System.Text;

namespace SettingLint.Core.Sources;

/// <summary>A git command failed or git is not there; the message is for the user (exit 2).</summary>
public sealed class GitException(string message) : Exception(message);

/// <summary>One file changed between a revision and the working tree or the index, by its path relative to the git top level.</summary>
/// <param name="Path">Forward slashes, relative to the top level of the work tree.</param>
/// <param name="Deleted">The file is gone on the new side.</param>
public sealed record GitChange(string Path, bool Deleted);

/// <summary>The git command line, run as a process in one work tree; no library, so any installed git works.</summary>
public sealed class GitRepository
{
    private GitRepository(string topLevel) => TopLevel = topLevel;

    /// <summary>The absolute path of the work tree's top level.</summary>
    public string TopLevel { get; }

    /// <summary>The work tree that holds a folder; a <see cref="GitException"/> says why there is none.</summary>
    public static GitRepository Open(string directory)
    {
        var (code, output, error) = Run(directory, ["rev-parse", "--show-toplevel"]);
        if (code != 0) throw NotAWorkTree(directory, error);
        var top = Encoding.UTF8.GetString(output).Trim();
        return new GitRepository(Path.GetFullPath(top).TrimEnd(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar));
    }

    /// <summary>
    /// The work tree that holds a folder and the commit a revision names in it (null when it names none), asked of git
    /// in one process: a changed-files run starts git several times, and each start counts on a pre-commit hook.
    /// </summary>
    public static (GitRepository Git, string? Commit) Open(string directory, string revision)
    {
        // rev-parse prints the top level as it meets the option, then the verified revision; a revision that names no
        // commit leaves the top level alone on the output (exit 1), a folder outside a work tree prints nothing (exit 128).
        var (code, output, error) = Run(directory, ["rev-parse", "--show-toplevel", "--verify", "--quiet", "--end-of-options", revision + "^{commit}"]);
        var lines = Encoding.UTF8.GetString(output).Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (lines.Length == 0) throw NotAWorkTree(directory, error);
        var git = new GitRepository(Path.GetFullPath(lines[0]).TrimEnd(Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar));
        return (git, code == 0 && lines.Length == 2 ? lines[1] : null);
    }

    /// <summary>The error for a revision that names no commit.</summary>
    public static GitException NotARevision(string revision) =>
        new($"'{revision}' is not a revision of this repository (a commit, branch or tag such as HEAD~1 or origin/main).");

    private static GitException NotAWorkTree(string directory, string error)
    {
        var why = error.Trim().Split('\n')[0];
        return new GitException($"'{directory}' is not inside a git work tree" + (why.Length > 0 ? " (git: " + why + ")" : "") + ".");
    }

    /// <summary>
    /// The files changed since a commit: against the index when <paramref name="staged"/>, else against the working tree
    /// plus the untracked files that git does not ignore. A null commit means "before the first commit": everything staged.
    /// </summary>
    public ImmutableArray<GitChange> Changes(string? commit, bool staged)
    {
        var changes = new SortedDictionary<string, GitChange>(StringComparer.Ordinal);
        // The untracked files are asked for while the diff runs: the two processes share nothing. At 10,000 motors the
        // listing took some 10 ms of CPU and the diff 50 ms (docs/performance.md, changed files, 2026-12-05).
        var untracked = staged ? null : Task.Run(() => Lines(["ls-files", "-z", "--others", "--exclude-standard"]));
        if (commit is null)
        {
            foreach (var p in Lines(["ls-files", "-z", "--cached"])) changes[p] = new GitChange(p, false);
        }
        else
        {
            List<string> args = ["diff", "--name-status", "-z", "--no-renames", "--no-ext-diff"];
            if (staged) args.Add("--cached");
            args.Add(commit);
            args.Add("--");
            var fields = Lines(args);
            for (var i = 0; i + 1 < fields.Count; i += 2)
            {
                changes[fields[i + 1]] = new GitChange(fields[i + 1], fields[i].StartsWith('D'));
            }
        }
        if (untracked is not null)
        {
            foreach (var p in untracked.GetAwaiter().GetResult()) changes[p] = new GitChange(p, false);
        }
        return [.. changes.Values];
    }

    /// <summary>Files whose working-tree content differs from the index, or that the index does not hold (untracked).</summary>
    public (ImmutableArray<string> Modified, ImmutableArray<string> Untracked) WorkTreeDifferences()
    {
        var modified = Lines(["diff", "--name-only", "-z", "--no-ext-diff"]);
        var untracked = Lines(["ls-files", "-z", "--others", "--exclude-standard"]);
        return ([.. modified], [.. untracked]);
    }

    /// <summary>
    /// The contents of files at a revision ("" for the index), read in one <c>git cat-file --batch</c>;
    /// a file that is not there has no entry.
    /// </summary>
    public IReadOnlyDictionary<string, byte[]> Show(string revision, IEnumerable<string> paths)
    {
        var wanted = paths.Distinct(StringComparer.Ordinal).ToList();
        var result = new Dictionary<string, byte[]>(StringComparer.Ordinal);
        if (wanted.Count == 0) return result;
        var input = new StringBuilder();
        foreach (var p in wanted) input.Append(revision).Append(':').Append(p).Append('\n');
        var (code, output, error) = Run(TopLevel, ["cat-file", "--batch"], Encoding.UTF8.GetBytes(input.ToString()));
        if (code != 0) throw new GitException("git cat-file failed: " + error.Trim());
        var pos = 0;
        foreach (var p in wanted)
        {
            var eol = Array.IndexOf(output, (byte)'\n', pos);
            if (eol < 0) break;
            var header = Encoding.UTF8.GetString(output, pos, eol - pos).Split(' ');
            pos = eol + 1;
            if (header.Length != 3 || header[2] is not { } sizeText || !int.TryParse(sizeText, System.Globalization.CultureInfo.InvariantCulture, out var size))
            {
                continue; // "<name> missing": not at that revision
            }
            if (header[1] == "blob") result[p] = output[pos..(pos + size)];
            pos += size + 1;
        }
        return result;
    }

    /// <summary>Every file of a commit's tree (recursively), with its mode, by its path relative to the top level.</summary>
    public IReadOnlyList<(string Mode, string Path)> Tree(string commit)
    {
        var entries = new List<(string, string)>();
        foreach (var line in Lines(["ls-tree", "-r", "-z", "--full-tree", commit]))
        {
            // "<mode> <type> <object>\t<path>"
            var tab = line.IndexOf('\t', StringComparison.Ordinal);
            var space = line.IndexOf(' ', StringComparison.Ordinal);
            if (tab < 0 || space < 0) continue;
            entries.Add((line[..space], line[(tab + 1)..]));
        }
        return entries;
    }

    /// <summary>Where git keeps this work tree's hooks (honours core.hooksPath), as an absolute path.</summary>
    public string HooksDirectory()
    {
        var (code, output, error) = Run(TopLevel, ["rev-parse", "--git-path", "hooks"]);
        if (code != 0) throw new GitException("git rev-parse --git-path hooks failed: " + error.Trim());
        return Path.GetFullPath(Path.Combine(TopLevel, Encoding.UTF8.GetString(output).Trim()));
    }

    private List<string> Lines(List<string> args)
    {
        var (code, output, error) = Run(TopLevel, args);
        if (code != 0) throw new GitException("git " + args[0] + " failed: " + error.Trim());
        return [.. Encoding.UTF8.GetString(output).Split('\0', StringSplitOptions.RemoveEmptyEntries)];
    }

    private static (int Code, byte[] Output, string Error) Run(string directory, List<string> args, byte[]? input = null)
    {
        var start = new ProcessStartInfo("git")
        {
            WorkingDirectory = directory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = input is not null,
            UseShellExecute = false,
            CreateNoWindow = true,
        };
        // Paths as bytes, not quoted; no pager, no prompt for credentials.
        foreach (var a in (string[])["-c", "core.quotepath=off", "--no-pager"]) start.ArgumentList.Add(a);
        foreach (var a in args) start.ArgumentList.Add(a);
        start.Environment["GIT_TERMINAL_PROMPT"] = "0";
        Process process;
        try
        {
            process = Process.Start(start) ?? throw new GitException("git could not be started.");
        }
        catch (System.ComponentModel.Win32Exception ex)
        {
            throw new GitException("git is not installed or not on PATH (" + ex.Message + ").");
        }
        using (process)
        {
            var error = process.StandardError.ReadToEndAsync();
            var output = new MemoryStream();
            var copy = process.StandardOutput.BaseStream.CopyToAsync(output);
            if (input is not null)
            {
                process.StandardInput.BaseStream.Write(input);
                process.StandardInput.Close();
            }
            copy.GetAwaiter().GetResult();
            process.WaitForExit();
            return (process.ExitCode, output.ToArray(), error.GetAwaiter().GetResult());
        }
    }
}
