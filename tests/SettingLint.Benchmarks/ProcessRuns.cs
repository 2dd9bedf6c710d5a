using System.Diagnostics;
using System.Globalization;

namespace SettingLint.Benchmarks;

/// <summary>
/// Whole-process measurements of a published CLI (the NativeAOT executable as it ships): wall time by Stopwatch, CPU
/// time (user + system) and peak resident set size from GNU time (`/usr/bin/time -f "%U %S %M"`), which reads them
/// from wait4's rusage of the child. The parse-only floor runs as a process too (this harness's `--floor DIR`, published
/// the same way), so that both sides pay a process start and are built alike.
/// </summary>
public static class ProcessRuns
{
    /// <summary>One run: wall and CPU milliseconds, peak RSS in KiB, exit code.</summary>
    public sealed record Sample(double Wall, double Cpu, long RssKiB, int Exit);

    /// <summary>A collector setting of the CLI, given through the runtime's environment variables.</summary>
    public sealed record GcMode(string Name, IReadOnlyDictionary<string, string> Environment);

    /// <summary>
    /// The settings compared: the shipped one (workstation GC, concurrent, from the project file since the measurement of
    /// 2026-12-05), workstation non-concurrent, server, server with DATAS (dynamic adaptation of the number of heaps) and
    /// server with conserve-memory. Each server mode sets DOTNET_gcServer itself, as the project no longer does.
    /// </summary>
    public static readonly GcMode[] GcModes =
    [
        new("as shipped (workstation)", new Dictionary<string, string>()),
        new("workstation, non-concurrent", new Dictionary<string, string> { ["DOTNET_gcConcurrent"] = "0" }),
        new("server", new Dictionary<string, string> { ["DOTNET_gcServer"] = "1" }),
        new("server + DATAS", new Dictionary<string, string> { ["DOTNET_gcServer"] = "1", ["DOTNET_GCDynamicAdaptationMode"] = "1" }),
        new("server + conserve memory 5", new Dictionary<string, string> { ["DOTNET_gcServer"] = "1", ["DOTNET_GCConserveMemory"] = "5" }),
    ];

    public static Sample Time(string exe, IEnumerable<string> args, string cwd, IReadOnlyDictionary<string, string>? environment = null)
    {
        var report = Path.GetTempFileName();
        try
        {
            var start = new ProcessStartInfo("/usr/bin/time") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = cwd };
            foreach (var a in (string[])["-f", "%U %S %M", "-o", report, exe]) start.ArgumentList.Add(a);
            foreach (var a in args) start.ArgumentList.Add(a);
            foreach (var (k, v) in environment ?? new Dictionary<string, string>()) start.Environment[k] = v;
            var sw = Stopwatch.StartNew();
            using var p = Process.Start(start)!;
            var o = p.StandardOutput.BaseStream.CopyToAsync(Stream.Null);
            var e = p.StandardError.BaseStream.CopyToAsync(Stream.Null);
            p.WaitForExit();
            Task.WaitAll(o, e);
            var wall = sw.Elapsed.TotalMilliseconds;
            // GNU time writes "Command exited with non-zero status N" first when the child fails; the figures are last.
            var f = File.ReadAllLines(report).Last(l => l.Length > 0).Split(' ');
            var cpu = (double.Parse(f[0], CultureInfo.InvariantCulture) + double.Parse(f[1], CultureInfo.InvariantCulture)) * 1000;
            return new Sample(wall, cpu, long.Parse(f[2], CultureInfo.InvariantCulture), p.ExitCode);
        }
        finally
        {
            File.Delete(report);
        }
    }

    /// <summary>
    /// Floor and check of each size as processes, interleaved round by round with every GC mode, so that a busy moment
    /// of the shared machine falls on all of them alike. Prints medians and the median of the per-round ratios.
    /// </summary>
    /// <param name="others">Other builds of the CLI (such as the code before a change), run in the same rounds with the shipped setting.</param>
    public static void Repositories(string cli, string floorExe, int[] sizes, int rounds, bool gcModes, IReadOnlyList<string>? others = null)
    {
        var modes = gcModes ? GcModes : GcModes[..1];
        others ??= [];
        Console.WriteLine($"process runs: floor {floorExe} --floor DIR; check {cli} check DIR (text to a pipe); {rounds} rounds, interleaved");
        Console.WriteLine("| motors | run | wall ms (median) | CPU ms (median) | peak RSS MiB (median) | wall / floor (median of rounds) | CPU / floor (median of rounds) | RSS / floor | exit |");
        Console.WriteLine("|---:|---|---:|---:|---:|---:|---:|---:|---:|");
        foreach (var n in sizes)
        {
            var dir = Generator.Write(n);
            var floor = new List<Sample>();
            var checks = modes.Select(_ => new List<Sample>()).ToArray();
            var otherChecks = others.Select(_ => new List<Sample>()).ToArray();
            for (var r = 0; r < rounds; r++)
            {
                floor.Add(Time(floorExe, ["--floor", dir], dir));
                for (var m = 0; m < modes.Length; m++) checks[m].Add(Time(cli, ["check", dir], dir, modes[m].Environment));
                for (var k = 0; k < others.Count; k++) otherChecks[k].Add(Time(others[k], ["check", dir], dir));
            }
            Print(n, "parse-only floor", floor, floor);
            for (var m = 0; m < modes.Length; m++) Print(n, "check, " + modes[m].Name, checks[m], floor);
            for (var k = 0; k < others.Count; k++) Print(n, "check, " + others[k], otherChecks[k], floor);
            Directory.Delete(dir, true);
        }
    }

    /// <summary>
    /// `check --changed-since HEAD` after one motor of a committed repository is changed: the pre-commit and
    /// pull-request case on a large plant.
    /// </summary>
    public static void ChangedSince(string cli, int motors, int rounds)
    {
        var dir = Generator.Write(motors);
        Directory.Delete(Path.Combine(dir, ".git"), true);
        Git(dir, "init", "-q");
        Git(dir, "add", "-A");
        Git(dir, "-c", "user.name=bench", "-c", "user.email=bench@example.invalid", "commit", "-q", "-m", "generated");
        var motor = Path.Combine(dir, "motors", "p-00017.yaml");
        File.WriteAllText(motor, File.ReadAllText(motor).Replace("delay: 6.5 s", "delay: 6.0 s", StringComparison.Ordinal));
        var runs = new List<Sample>();
        Time(cli, ["check", dir, "--changed-since", "HEAD"], dir); // warm the disk cache
        for (var r = 0; r < rounds; r++) runs.Add(Time(cli, ["check", dir, "--changed-since", "HEAD"], dir));
        Console.WriteLine($"check --changed-since HEAD, one motor changed of {motors}: wall ms [{string.Join(", ", runs.Select(s => s.Wall.ToString("F0", CultureInfo.InvariantCulture)))}], median {Median(runs.Select(s => s.Wall)):F0} ms, CPU {Median(runs.Select(s => s.Cpu)):F0} ms, peak RSS {Median(runs.Select(s => (double)s.RssKiB)) / 1024:F0} MiB, exit {runs[^1].Exit}");
        try
        {
            Directory.Delete(dir, true);
        }
        catch (IOException)
        {
            // git may still be packing its objects in the background; a temp folder left behind is harmless.
        }
    }

    private static void Print(int n, string label, List<Sample> runs, List<Sample> floor)
    {
        var wall = Median(runs.Select(s => s.Wall));
        var cpu = Median(runs.Select(s => s.Cpu));
        var rss = Median(runs.Select(s => (double)s.RssKiB));
        var wallRatio = Median(runs.Zip(floor, (c, f) => c.Wall / f.Wall));
        var cpuRatio = Median(runs.Zip(floor, (c, f) => c.Cpu / f.Cpu));
        var rssRatio = rss / Median(floor.Select(s => (double)s.RssKiB));
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"| {n:N0} | {label} | {wall:F0} | {cpu:F0} | {rss / 1024:F0} | {wallRatio:F2} x | {cpuRatio:F2} x | {rssRatio:F2} x | {runs[^1].Exit} |"));
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"|  | (rounds) | {string.Join(" ", runs.Select(s => s.Wall.ToString("F0", CultureInfo.InvariantCulture)))} | {string.Join(" ", runs.Select(s => s.Cpu.ToString("F0", CultureInfo.InvariantCulture)))} | {string.Join(" ", runs.Select(s => (s.RssKiB / 1024).ToString(CultureInfo.InvariantCulture)))} | | | | |"));
    }

    private static double Median(IEnumerable<double> values)
    {
        var s = values.Order().ToArray();
        return s.Length % 2 == 1 ? s[s.Length / 2] : (s[s.Length / 2 - 1] + s[s.Length / 2]) / 2;
    }

    private static void Git(string dir, params string[] args)
    {
        var start = new ProcessStartInfo("git") { WorkingDirectory = dir, UseShellExecute = false };
        foreach (var a in args) start.ArgumentList.Add(a);
        using var p = Process.Start(start)!;
        p.WaitForExit();
        if (p.ExitCode != 0) throw new InvalidOperationException("git " + string.Join(' ', args) + " failed");
    }
}
