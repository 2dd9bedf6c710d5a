using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>Tests that change the process's current directory: they run alone, one after another.</summary>
[CollectionDefinition("cwd", DisableParallelization = true)]
public sealed class CurrentDirectoryCollection;

/// <summary>Text output: `path:line:col: level id: message` with paths relative to the current directory (GNU "Formatting Error Messages").</summary>
[Collection("cwd")]
public sealed class TextOutputTests
{
    private static CliRun InDirectory(string directory, params string[] args)
    {
        var previous = Directory.GetCurrentDirectory();
        Directory.SetCurrentDirectory(directory);
        try
        {
            return Cli.Run(args);
        }
        finally
        {
            Directory.SetCurrentDirectory(previous);
        }
    }

    private static TempRepo WithError() => Cli.Repo(Samples.MotorWith("full_load_current: 58 A", "full_load_current: 58"));

    [Fact]
    public void From_the_root_with_no_path_the_current_folder_is_checked()
    {
        using var repo = WithError();
        var run = InDirectory(repo.Root, "check");
        Assert.Equal(1, run.Exit);
        var lines = run.Stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(4, lines.Length);
        Assert.StartsWith("motors/m-1.yaml:9:22: error SL006: '58' has no unit", lines[0], StringComparison.Ordinal);
        Assert.Equal("  SL006  A unit is missing, unknown, of the wrong dimension, or does not say primary or secondary.  (" + SettingLint.Reporting.ToolCommand.Current + " rules show SL006)", lines[2]);
        Assert.Equal("1 error, 0 warnings, 0 notes in 2 files (1 motor)", lines[3]);
    }

    [Fact]
    public void From_a_subfolder_paths_are_relative_to_it()
    {
        using var repo = WithError();
        var run = InDirectory(repo.PathOf("buses"), "check", "..");
        Assert.Equal(1, run.Exit);
        Assert.StartsWith("../motors/m-1.yaml:9:22: error SL006:", run.Stdout, StringComparison.Ordinal);
    }

    [Fact]
    public void A_relative_file_path_is_checked_from_the_current_folder()
    {
        using var repo = WithError();
        var run = InDirectory(repo.PathOf("motors"), "check", "m-1.yaml", "--format", "json");
        Assert.Equal(1, run.Exit);
        Assert.Equal([("SL006", "motors/m-1.yaml", 9, 22)], run.Findings);
    }

    [Fact]
    public void A_clean_repository_prints_only_the_summary()
    {
        using var repo = Cli.Repo();
        var run = InDirectory(repo.Root, "check", ".");
        Assert.Equal(0, run.Exit);
        Assert.Equal("0 errors, 0 warnings, 0 notes in 2 files (1 motor)\n", run.Stdout);
    }
}
