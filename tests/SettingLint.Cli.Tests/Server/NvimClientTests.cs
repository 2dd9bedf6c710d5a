using System.Diagnostics;

namespace SettingLint.Cli.Tests.Server;

/// <summary>Debian's Neovim, found at SETTINGLINT_NVIM, /usr/bin/nvim or on PATH; `.ci/run` installs the neovim package.</summary>
internal static class Nvim
{
    public static string? Find()
    {
        var candidates = new List<string>();
        if (Environment.GetEnvironmentVariable("SETTINGLINT_NVIM") is { Length: > 0 } given) candidates.Add(given);
        candidates.Add("/usr/bin/nvim");
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            candidates.Add(Path.Combine(dir, "nvim"));
        }
        return candidates.FirstOrDefault(File.Exists);
    }

    /// <summary>Why the test skips, or null when it runs: never skipped in CI, where a missing Neovim fails it instead.</summary>
    public static string? SkipReason() =>
        Find() is null && Environment.GetEnvironmentVariable("CI") != "true"
            ? "No Neovim found (SETTINGLINT_NVIM, /usr/bin/nvim or PATH); install it with 'apt-get install neovim' to run the editor-client test. In CI (CI=true) this test fails instead."
            : null;
}

/// <summary>A fact that needs Neovim: skipped, with the reason, only when none can be found outside CI.</summary>
[AttributeUsage(AttributeTargets.Method)]
internal sealed class NvimFactAttribute : FactAttribute
{
    public NvimFactAttribute()
    {
        if (Nvim.SkipReason() is { } reason) Skip = reason;
    }
}

/// <summary>A real editor's LSP client (Neovim's built-in one, headless) shows the demo's findings and their change after an edit.</summary>
public sealed class NvimClientTests
{
    [NvimFact]
    public void Neovim_shows_the_demo_findings_and_their_change_after_an_edit()
    {
        var nvim = Nvim.Find() ?? throw new InvalidOperationException("Neovim is required in CI (.ci/run installs it) and was not found.");
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        var lines = File.ReadAllLines(motor);
        var editLine = Array.IndexOf(lines, "    pickup: 46 A pri") + 1;
        Assert.True(editLine > 0);
        var output = Path.Combine(repo.Outer, "nvim-out");
        var state = Path.Combine(repo.Outer, "nvim-state");
        Directory.CreateDirectory(output);
        Directory.CreateDirectory(state);

        // The built CLI beside the tests, as GateHookTests runs it.
        var server = string.Join('\n', "dotnet", Path.Combine(AppContext.BaseDirectory, "settinglint.dll"), "server");
        var start = new ProcessStartInfo(nvim)
        {
            WorkingDirectory = repo.Root,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        foreach (var a in (string[])["--headless", "-n", "-i", "NONE", "-u", Path.Combine(RepositoryPaths.Root(), "tests", "SettingLint.Cli.Tests", "Server", "nvim", "init.lua"), motor])
        {
            start.ArgumentList.Add(a);
        }
        start.Environment["SETTINGLINT_SERVER"] = server;
        start.Environment["SETTINGLINT_ROOT"] = repo.Root;
        start.Environment["SETTINGLINT_OUT"] = output;
        start.Environment["SETTINGLINT_EDIT_LINE"] = editLine.ToString(System.Globalization.CultureInfo.InvariantCulture);
        start.Environment["SETTINGLINT_EDIT_FROM"] = "    pickup: 46 A pri";
        start.Environment["SETTINGLINT_EDIT_TO"] = "    pickup: 46 A sec";
        // Neovim's own state (its LSP log among it) stays in the test's folder.
        foreach (var v in (string[])["XDG_STATE_HOME", "XDG_CACHE_HOME", "XDG_DATA_HOME", "XDG_CONFIG_HOME"]) start.Environment[v] = state;

        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(TimeSpan.FromSeconds(150)))
        {
            process.Kill(entireProcessTree: true);
            Assert.Fail("Neovim did not finish within 150 s. " + stderr.Result);
        }
        var error = Path.Combine(output, "error.txt");
        Assert.False(File.Exists(error), File.Exists(error) ? File.ReadAllText(error) + "\n" + stderr.Result : "");
        var first = File.ReadAllLines(Path.Combine(output, "first.txt"));
        var second = File.ReadAllLines(Path.Combine(output, "second.txt"));

        // The findings `check` shows for P-202, the planted SL201 at the same 1-based place.
        var onDisk = LanguageServerTests.CheckCodes(repo, "motors/p-202.yaml");
        Assert.Equal(onDisk, first.Select(l => l.Split(' ')[0]).Order(StringComparer.Ordinal));
        Assert.Contains(first, l => l.StartsWith("SL201 " + editLine + ":13 error Short-circuit pickup 46 A pri (1.15 A sec) is below 1.76 kA pri", StringComparison.Ordinal));
        // After the edit (46 A secondary, 1840 A primary through the 200/5 A CT) the pickup findings are gone.
        Assert.Equal(onDisk.Where(c => c is not ("SL108" or "SL201")), second.Select(l => l.Split(' ')[0]).Order(StringComparer.Ordinal));
        Assert.Contains("SL102", second.Select(l => l.Split(' ')[0]));
    }

    [Fact]
    public void The_skip_reason_is_never_given_in_ci()
    {
        if (Environment.GetEnvironmentVariable("CI") == "true") Assert.Null(Nvim.SkipReason());
        else Assert.True(Nvim.SkipReason() is null == Nvim.Find() is not null);
    }
}
