using System.CommandLine;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Sources;

namespace SettingLint.Cli;

/// <summary>The options of `hook install`, parsed once.</summary>
/// <param name="Directory">A folder inside the git work tree.</param>
/// <param name="Force">Replace a pre-commit hook that SettingLint did not write.</param>
/// <param name="Baseline">A baseline file for the hook's check, relative to the work tree's top level.</param>
/// <param name="Command">The command the hook runs (the SETTINGLINT environment variable overrides it).</param>
public sealed record HookOptionsRecord(string Directory, bool Force, string? Baseline, string Command);

/// <summary>`settinglint hook install|uninstall`: a git pre-commit hook that checks the staged setting files.</summary>
public static class HookCommand
{
    /// <summary>The line that marks a hook as written by SettingLint; a hook without it is not ours to replace.</summary>
    public const string Marker = "# Written by 'settinglint hook install'";

    /// <summary>The environment variable that overrides the hook's command, such as "dotnet /path/to/settinglint.dll".</summary>
    public const string CommandVariable = "SETTINGLINT";

    private const string BackupSuffix = ".settinglint-old";

    public static Command Create(TextWriter stdout, TextWriter stderr)
    {
        var hook = new Command("hook", "Install or remove the git pre-commit hook that checks the staged setting files.");
        var dir = new Argument<string>("dir") { Description = "A folder of the git work tree (default: the current folder).", Arity = ArgumentArity.ZeroOrOne, DefaultValueFactory = _ => "." };
        var force = new Option<bool>("--force") { Description = "Replace a pre-commit hook that settinglint did not write (it is kept as pre-commit" + BackupSuffix + ")." };
        var baseline = new Option<string?>("--baseline") { Description = "A baseline file for the hook's check, relative to the top of the work tree." };
        var command = new Option<string>("--command") { Description = "The command the hook runs (default: settinglint; the " + CommandVariable + " environment variable overrides it).", DefaultValueFactory = _ => "settinglint" };
        var install = new Command("install", "Write .git/hooks/pre-commit: each commit checks the staged setting files and their dependants, and is refused on errors.")
        {
            dir, force, baseline, command,
        };
        install.SetAction(parse => Install(new HookOptionsRecord(parse.GetValue(dir) ?? ".", parse.GetValue(force), parse.GetValue(baseline), parse.GetValue(command) ?? "settinglint"), stdout, stderr));
        var uninstallDir = new Argument<string>("dir") { Description = "A folder of the git work tree (default: the current folder).", Arity = ArgumentArity.ZeroOrOne, DefaultValueFactory = _ => "." };
        var uninstall = new Command("uninstall", "Remove the pre-commit hook that settinglint wrote (a replaced hook is put back).") { uninstallDir };
        uninstall.SetAction(parse => Uninstall(parse.GetValue(uninstallDir) ?? ".", stdout, stderr));
        hook.Subcommands.Add(install);
        hook.Subcommands.Add(uninstall);
        return hook;
    }

    /// <summary>The hook script: POSIX sh, as git runs hooks on every platform.</summary>
    public static string Script(string? baseline, string command)
    {
        var args = "check --staged" + (baseline is null ? "" : " --baseline " + Quote(baseline));
        return $$"""
            #!/bin/sh
            {{Marker}}; 'settinglint hook uninstall' removes it.
            # Checks the setting files staged for this commit and the files that depend on them (the motors on a
            # changed bus, the users of a changed relay model), and refuses the commit when they fail the gate.
            # {{CommandVariable}} overrides the command, for example SETTINGLINT="dotnet /path/to/settinglint.dll".
            default_command={{Quote(command)}}
            command="${{{CommandVariable}}:-$default_command}"
            eval "$command {{args}}"
            status=$?
            case $status in
              0) exit 0 ;;
              1) echo "settinglint: commit refused: the staged setting files have findings that fail the gate (listed above)." >&2
                 echo "settinglint: fix them, or accept one with its reason on the line before it: # {{AcceptComments.Marker}} SLnnn: why" >&2 ;;
              127) echo "settinglint: '$command' was not found; install it (dotnet tool install --global SettingLint) or set {{CommandVariable}}." >&2 ;;
              *) echo "settinglint: the check could not run (exit $status, see above)." >&2 ;;
            esac
            echo "settinglint: to commit once without this check: git commit --no-verify" >&2
            exit $status

            """;
    }

    private static int Install(HookOptionsRecord options, TextWriter stdout, TextWriter stderr)
    {
        if (Hooks(options.Directory, stderr) is not { } hooks) return ExitCodes.Usage;
        var path = Path.Combine(hooks, "pre-commit");
        if (File.Exists(path) && !File.ReadAllText(path).Contains(Marker, StringComparison.Ordinal))
        {
            if (!options.Force)
            {
                stderr.WriteLine($"settinglint: {path} is a pre-commit hook that settinglint did not write; it was left alone.");
                stderr.WriteLine($"settinglint: replace it with --force (it is kept as pre-commit{BackupSuffix}), or call 'settinglint check --staged' from it.");
                return ExitCodes.Usage;
            }
            File.Move(path, path + BackupSuffix, overwrite: true);
        }
        Directory.CreateDirectory(hooks);
        File.WriteAllText(path, Script(options.Baseline, options.Command), new System.Text.UTF8Encoding(false));
        if (!OperatingSystem.IsWindows())
        {
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute
                | UnixFileMode.GroupRead | UnixFileMode.GroupExecute | UnixFileMode.OtherRead | UnixFileMode.OtherExecute);
        }
        stdout.WriteLine($"Installed the pre-commit hook {path}: each commit checks the staged setting files and their dependants.");
        stdout.WriteLine("To commit once without it: git commit --no-verify. To remove it: settinglint hook uninstall.");
        return ExitCodes.Clean;
    }

    private static int Uninstall(string directory, TextWriter stdout, TextWriter stderr)
    {
        if (Hooks(directory, stderr) is not { } hooks) return ExitCodes.Usage;
        var path = Path.Combine(hooks, "pre-commit");
        if (!File.Exists(path))
        {
            stdout.WriteLine("There is no pre-commit hook to remove.");
            return ExitCodes.Clean;
        }
        if (!File.ReadAllText(path).Contains(Marker, StringComparison.Ordinal))
        {
            stderr.WriteLine($"settinglint: {path} was not written by settinglint; it was left alone.");
            return ExitCodes.Usage;
        }
        File.Delete(path);
        if (File.Exists(path + BackupSuffix))
        {
            File.Move(path + BackupSuffix, path);
            stdout.WriteLine($"Removed the settinglint pre-commit hook and put back the one it replaced ({path}).");
        }
        else
        {
            stdout.WriteLine($"Removed the settinglint pre-commit hook ({path}).");
        }
        return ExitCodes.Clean;
    }

    private static string? Hooks(string directory, TextWriter stderr)
    {
        try
        {
            return GitRepository.Open(Path.GetFullPath(directory)).HooksDirectory();
        }
        catch (GitException ex)
        {
            stderr.WriteLine("settinglint: a hook needs a git work tree: " + ex.Message);
            return null;
        }
    }

    // Single quotes keep everything literal in sh; a single quote itself is closed, escaped and reopened.
    private static string Quote(string text) => "'" + text.Replace("'", "'\\''", StringComparison.Ordinal) + "'";
}
