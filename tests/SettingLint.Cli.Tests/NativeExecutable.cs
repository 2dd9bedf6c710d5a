using System.Diagnostics;
using SettingLint.Tests.Shared;

namespace SettingLint.Cli.Tests;

/// <summary>
/// The NativeAOT executable that `.ci/run` publishes once (`dotnet publish src/SettingLint.Cli -c Release -r linux-x64`)
/// and names in SETTINGLINT_NATIVE. A test never publishes it itself: that takes minutes.
/// </summary>
internal static class NativeExecutable
{
    /// <summary>The environment variable that names the native executable (set by .ci/run).</summary>
    public const string Variable = "SETTINGLINT_NATIVE";

    /// <summary>The executable named by <see cref="Variable"/>, or null when the variable is absent or empty.</summary>
    public static string? Find() =>
        Environment.GetEnvironmentVariable(Variable) is { Length: > 0 } path ? Path.GetFullPath(path) : null;

    /// <summary>Why the native tests skip, or null when they run: never skipped in CI, where a missing executable fails them instead.</summary>
    public static string? SkipReason() => ToolFacts.SkipReason(Find() is not null,
        "No native executable: set " + Variable + " to a NativeAOT publish of the CLI (`dotnet publish src/SettingLint.Cli -c Release -r linux-x64 -o OUT`, then OUT/settinglint), as .ci/run does.");

    /// <summary>Runs the native executable with the arguments in a working folder: exit code and the raw bytes of both streams.</summary>
    public static ProcessRun Run(string workingDirectory, params string[] args)
    {
        var exe = Find() ?? throw new InvalidOperationException("The native executable is required in CI and " + Variable + " is not set (.ci/run publishes it).");
        Assert.True(File.Exists(exe), Variable + " names " + exe + ", which does not exist.");
        return ProcessRun.Start(exe, [], workingDirectory, args);
    }

    /// <summary>Runs the JIT build beside the test assembly (`dotnet settinglint.dll`) the same way.</summary>
    public static ProcessRun RunJit(string workingDirectory, params string[] args) =>
        ProcessRun.Start("dotnet", [Path.Combine(AppContext.BaseDirectory, "settinglint.dll")], workingDirectory, args);
}

/// <summary>One run of a process: exit code and the bytes it wrote, undecoded, so that a comparison sees every byte.</summary>
internal sealed record ProcessRun(int Exit, byte[] Stdout, byte[] Stderr)
{
    public static ProcessRun Start(string exe, string[] prefix, string workingDirectory, string[] args)
    {
        var start = new ProcessStartInfo(exe) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = workingDirectory };
        foreach (var a in prefix) start.ArgumentList.Add(a);
        foreach (var a in args) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException("Could not start " + exe);
        using var stdout = new MemoryStream();
        using var stderr = new MemoryStream();
        var o = process.StandardOutput.BaseStream.CopyToAsync(stdout);
        var e = process.StandardError.BaseStream.CopyToAsync(stderr);
        if (!process.WaitForExit(TimeSpan.FromSeconds(120)))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException(exe + " did not finish within 120 s.");
        }
        Task.WaitAll(o, e);
        return new ProcessRun(process.ExitCode, stdout.ToArray(), stderr.ToArray());
    }

    /// <summary>For assertion messages.</summary>
    public override string ToString() =>
        "exit " + Exit + "\n--- stdout\n" + System.Text.Encoding.UTF8.GetString(Stdout) + "\n--- stderr\n" + System.Text.Encoding.UTF8.GetString(Stderr);
}

/// <summary>A fact that needs the native executable: skipped, with the reason, only when it is not named outside CI.</summary>
[AttributeUsage(AttributeTargets.Method)]
internal sealed class NativeFactAttribute : FactAttribute
{
    public NativeFactAttribute()
    {
        if (NativeExecutable.SkipReason() is { } reason) Skip = reason;
    }
}

/// <summary>A theory that needs the native executable, skipped like <see cref="NativeFactAttribute"/>.</summary>
[AttributeUsage(AttributeTargets.Method)]
internal sealed class NativeTheoryAttribute : TheoryAttribute
{
    public NativeTheoryAttribute()
    {
        if (NativeExecutable.SkipReason() is { } reason) Skip = reason;
    }
}
