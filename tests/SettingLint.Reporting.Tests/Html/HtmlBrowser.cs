using System.Diagnostics;

namespace SettingLint.Reporting.Tests.Html;

/// <summary>
/// Headless Chromium, with the flags that keep it off the network and out of the user's profile. Found at
/// SETTINGLINT_CHROMIUM, /usr/bin/chromium or on PATH; `.ci/run` installs Debian's chromium package.
/// </summary>
internal static class HtmlBrowser
{
    public static string? Find()
    {
        var candidates = new List<string>();
        if (Environment.GetEnvironmentVariable("SETTINGLINT_CHROMIUM") is { Length: > 0 } given) candidates.Add(given);
        candidates.Add("/usr/bin/chromium");
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            candidates.Add(Path.Combine(dir, "chromium"));
            candidates.Add(Path.Combine(dir, "chromium-browser"));
        }
        return candidates.FirstOrDefault(File.Exists);
    }

    /// <summary>Why the browser tests skip, or null when they run: never skipped in CI, where a missing browser fails them instead.</summary>
    public static string? SkipReason() =>
        Find() is null && Environment.GetEnvironmentVariable("CI") != "true"
            ? "No Chromium found (SETTINGLINT_CHROMIUM, /usr/bin/chromium or PATH); install it with 'apt-get install chromium' to run the browser test. In CI (CI=true) this test fails instead."
            : null;

    /// <summary>Runs Chromium headless on a page with extra arguments (--screenshot=..., --dump-dom) and returns its standard output.</summary>
    public static string Run(string page, params string[] extra)
    {
        var exe = Find() ?? throw new InvalidOperationException("Chromium is required in CI (.ci/run installs it) and was not found.");
        var profile = Path.Combine(Path.GetTempPath(), "settinglint-chromium-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(profile);
        try
        {
            var start = new ProcessStartInfo(exe) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
            foreach (var a in (string[])["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--hide-scrollbars", "--force-device-scale-factor=1", "--user-data-dir=" + profile, "--window-size=1280,2000"])
            {
                start.ArgumentList.Add(a);
            }
            foreach (var a in extra) start.ArgumentList.Add(a);
            start.ArgumentList.Add(new Uri(page).AbsoluteUri);
            using var process = Process.Start(start)!;
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(TimeSpan.FromSeconds(90)))
            {
                process.Kill(entireProcessTree: true);
                throw new TimeoutException("Chromium did not finish within 90 s.");
            }
            Assert.True(process.ExitCode == 0, "Chromium exited with " + process.ExitCode + ": " + stderr.Result);
            return stdout.Result;
        }
        finally
        {
            try
            {
                Directory.Delete(profile, recursive: true);
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
            {
                // Chromium may still hold a lock file for a moment; a temp folder left behind is harmless.
            }
        }
    }
}

/// <summary>A fact that needs a browser: skipped, with the reason, only when none can be found outside CI.</summary>
[AttributeUsage(AttributeTargets.Method)]
internal sealed class BrowserFactAttribute : FactAttribute
{
    public BrowserFactAttribute()
    {
        if (HtmlBrowser.SkipReason() is { } reason) Skip = reason;
    }
}
