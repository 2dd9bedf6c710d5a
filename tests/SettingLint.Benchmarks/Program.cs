// SettingLint benchmark harness: parse-only floor vs full check on generated repositories,
// plus an optional one-file CLI start-up measurement. Plain Stopwatch, no BenchmarkDotNet.
using System.Diagnostics;
using System.Globalization;
using SettingLint.Core.Engine;
using YamlDotNet.RepresentationModel;
using SettingLint.Benchmarks;

CultureInfo.DefaultThreadCurrentCulture = CultureInfo.InvariantCulture;
CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;

// The parse-only floor as a process of its own, for the process runs (--native): parse every file under DIR and exit.
if (args is ["--floor", var floorDir])
{
    ParseFloor(floorDir);
    return 0;
}

// A generated repository of N motors, left in the temporary folder; its path is printed. For measuring by hand.
if (args is ["--generate", var count])
{
    Console.WriteLine(Generator.Write(int.Parse(count, CultureInfo.InvariantCulture)));
    return 0;
}

// What a finding costs a run that keeps it to the end: the heap a check's result holds, with a finding on every motor and on none.
if (args is ["--finding-cost", var costCount])
{
    FindingCost(int.Parse(costCount, CultureInfo.InvariantCulture));
    return 0;
}

var sizes = new[] { 100, 1000, 10000 };
string? cli = null;
string? hello = null;
var rounds = 3;
var keep = false;
string? native = null;
string? floorExe = null;
var gcModes = false;
var changed = 0;
var others = new List<string>();
for (var i = 0; i < args.Length; i++)
{
    switch (args[i])
    {
        case "--native": native = args[++i]; break;
        case "--floor-exe": floorExe = args[++i]; break;
        case "--also": others.Add(args[++i]); break;
        case "--gc-modes": gcModes = true; break;
        case "--changed": changed = int.Parse(args[++i], CultureInfo.InvariantCulture); break;
        case "--sizes": sizes = args[++i].Split(',', StringSplitOptions.RemoveEmptyEntries).Select(int.Parse).ToArray(); break;
        case "--cli": cli = args[++i]; break;
        case "--hello": hello = args[++i]; break;
        case "--rounds": rounds = int.Parse(args[++i]); break;
        case "--keep": keep = true; break;
        default: Console.Error.WriteLine($"unknown argument {args[i]}"); return 2;
    }
}

// Process runs of a published CLI (the native executable): floor and check as processes, GC modes, a changed-files run, start-up.
if (native is not null)
{
    Console.WriteLine($"SettingLint process benchmarks  |  {Environment.ProcessorCount} logical CPUs  |  {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC  |  rounds={rounds}");
    if (floorExe is not null) ProcessRuns.Repositories(native, floorExe, sizes, rounds, gcModes, others);
    if (changed > 0) ProcessRuns.ChangedSince(native, changed, rounds);
    if (hello is not null) StartUp(native, hello);
    return 0;
}

Console.WriteLine($"SettingLint benchmarks  |  {Environment.ProcessorCount} logical CPUs, {RuntimeInformationText()}, Server GC={System.Runtime.GCSettings.IsServerGC}");
Console.WriteLine($"rounds={rounds} (interleaved floor/check; median reported)");
Console.WriteLine();

// Warm-up on a tiny repository so JIT, schema compilation and rule loading are out of the first timed size.
{
    var warm = Generator.Write(20);
    ParseFloor(warm);
    _ = Session.Open([warm]).Check([warm], null);
    Directory.Delete(warm, true);
}

var rows = new List<Row>();
foreach (var n in sizes)
{
    var dir = Generator.Write(n);
    var files = Directory.EnumerateFiles(dir, "*.yaml", SearchOption.AllDirectories).Count();
    var floor = new List<double>();
    var check = new List<double>();
    var loader = new List<double>();
    var open = new List<double>();
    var cpu = new List<double>();
    var floorCpu = new List<double>();
    var checkCpu = new List<double>();
    long heapPeak = 0, livePeak = 0;
    var floorAlloc = new List<double>();
    var checkAlloc = new List<double>();
    int findings = 0, checkedFiles = 0, exit = 0, notes = 0;
    var gcBefore = GC.CollectionCount(0) + GC.CollectionCount(1) * 1000 + GC.CollectionCount(2) * 1000000;
    for (var r = 0; r < rounds; r++)
    {
        GC.Collect(); GC.WaitForPendingFinalizers(); GC.Collect();
        var a0 = GC.GetTotalAllocatedBytes(true);
        var f0 = Process.GetCurrentProcess().TotalProcessorTime;
        var sw = Stopwatch.StartNew();
        ParseFloor(dir);
        floorCpu.Add((Process.GetCurrentProcess().TotalProcessorTime - f0).TotalMilliseconds);
        floor.Add(sw.Elapsed.TotalMilliseconds);
        floorAlloc.Add(GC.GetTotalAllocatedBytes(true) - a0);

        GC.Collect(); GC.WaitForPendingFinalizers(); GC.Collect();
        sw.Restart();
        LoaderOnly(dir);
        loader.Add(sw.Elapsed.TotalMilliseconds);

        GC.Collect(); GC.WaitForPendingFinalizers(); GC.Collect();
        using (var sampler = new HeapSampler())
        {
            var cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
            var c0 = GC.GetTotalAllocatedBytes(true);
            sw.Restart();
            var session = Session.Open([dir]);
            open.Add(sw.Elapsed.TotalMilliseconds);
            var result = session.Check([dir], null);
            check.Add(sw.Elapsed.TotalMilliseconds);
            checkAlloc.Add(GC.GetTotalAllocatedBytes(true) - c0);
            checkCpu.Add((Process.GetCurrentProcess().TotalProcessorTime - cpu0).TotalMilliseconds);
            cpu.Add(checkCpu[^1] / sw.Elapsed.TotalMilliseconds);
            findings = result.Findings.Length;
            checkedFiles = result.FilesChecked;
            exit = result.ExitCode;
            notes = result.Notifications.Length;
            heapPeak = Math.Max(heapPeak, Math.Max(sampler.Peak, GC.GetGCMemoryInfo().HeapSizeBytes));
            livePeak = Math.Max(livePeak, sampler.LivePeak);
            if (r == 0 && n == sizes[0]) PrintFindingSummary(result);
        }
    }
    var row = new Row(n, files, checkedFiles, findings, notes, exit, Median(floor), Median(check), Process.GetCurrentProcess().PeakWorkingSet64, heapPeak, floor, check)
    {
        LivePeak = livePeak,
        RoundRatio = Median([.. check.Zip(floor, (c, f) => c / f)]),
    };
    rows.Add(row);
    Console.WriteLine($"N={n,6}: files={files} checked={checkedFiles} findings={findings} notifications={notes} exit={exit}  floor=[{string.Join(", ", floor.Select(x => x.ToString("F0")))}] ms  check=[{string.Join(", ", check.Select(x => x.ToString("F0")))}] ms");
    Console.WriteLine($"           per round check/floor=[{string.Join(", ", check.Zip(floor, (c, f) => (c / f).ToString("F2")))}]  allocated per file: floor {Median(floorAlloc) / files / 1024:F1} KB, check {Median(checkAlloc) / files / 1024:F1} KB  CPU ms: floor {Median(floorCpu):F0}, check {Median(checkCpu):F0} ({Median(checkCpu) / Median(floorCpu):F2}x)");
    Console.WriteLine($"           diagnostic: SettingLint YamlLoader.LoadFile only=[{string.Join(", ", loader.Select(x => x.ToString("F0")))}] ms (median {Median(loader):F0})  Session.Open part of check=[{string.Join(", ", open.Select(x => x.ToString("F0")))}] ms  check CPU/wall=[{string.Join(", ", cpu.Select(x => x.ToString("F2")))}] (max {Environment.ProcessorCount})");
    if (!keep) Directory.Delete(dir, true); else Console.WriteLine($"   kept {dir}");
}

Console.WriteLine();
Console.WriteLine("| motors | yaml files | floor ms (median) | check ms (median) | check/floor | check/floor (median of rounds) | check files/s | floor files/s | peak WS MB (process) | peak GC heap MB (check) | peak heap after a GC MB (check) | findings |");
Console.WriteLine("|-------:|-----------:|------------------:|------------------:|------------:|------------:|--------------:|--------------:|---------------------:|------------------------:|------------------------:|---------:|");
foreach (var r in rows)
{
    Console.WriteLine($"| {r.N,6} | {r.Files,10} | {r.Floor,17:F1} | {r.Check,17:F1} | {r.Check / r.Floor,11:F2}x | {r.RoundRatio,11:F2}x | {r.Files / (r.Check / 1000),13:F0} | {r.Files / (r.Floor / 1000),13:F0} | {r.PeakWs / 1048576.0,20:F0} | {r.HeapPeak / 1048576.0,23:F0} | {r.LivePeak / 1048576.0,23:F0} | {r.Findings,8} |");
}
var k1 = rows.FirstOrDefault(r => r.N == 1000);
var k10 = rows.FirstOrDefault(r => r.N == 10000);
if (k1 is not null && k10 is not null)
{
    Console.WriteLine();
    Console.WriteLine($"check 1k -> 10k time ratio: {k10.Check / k1.Check:F2}x (10x the motors; linear = 10x)   floor ratio: {k10.Floor / k1.Floor:F2}x");
}
Console.WriteLine("(peak WS is cumulative for the process: each row includes the sizes before it)");

if (cli is not null) StartUp(cli, hello);
return 0;

static void FindingCost(int n)
{
    long Held(int plantedEvery, out int findings)
    {
        var dir = Generator.Write(n, plantedEvery);
        try
        {
            _ = Session.Open([dir]).Check([dir], null); // warm: rules and schemas loaded, tables filled
            GC.Collect(); GC.WaitForPendingFinalizers(); GC.Collect();
            var before = GC.GetTotalMemory(true);
            var result = Session.Open([dir]).Check([dir], null);
            GC.Collect(); GC.WaitForPendingFinalizers(); GC.Collect();
            var held = GC.GetTotalMemory(true) - before;
            findings = result.Findings.Length;
            GC.KeepAlive(result);
            return held;
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }
    var with = Held(1, out var many);
    var without = Held(0, out var none);
    Console.WriteLine($"{n} motors: result with {many} findings holds {with / 1024.0:F0} KiB, with {none} findings {without / 1024.0:F0} KiB: {(with - without) / (double)Math.Max(1, many - none):F0} bytes per finding");
}

static void ParseFloor(string dir)
{
    var files = Directory.EnumerateFiles(dir, "*.yaml", SearchOption.AllDirectories).ToArray();
    Parallel.ForEach(files, f =>
    {
        var text = File.ReadAllText(f);
        new YamlStream().Load(new StringReader(text));
    });
}

static void LoaderOnly(string dir)
{
    var files = Directory.EnumerateFiles(dir, "*.yaml", SearchOption.AllDirectories).ToArray();
    Parallel.ForEach(files, f => SettingLint.Core.Loading.YamlLoader.LoadFile(f, Path.GetRelativePath(dir, f), SettingLint.Core.Loading.LoadLimits.Default));
}

static double Median(List<double> xs)
{
    var s = xs.OrderBy(x => x).ToArray();
    return s.Length % 2 == 1 ? s[s.Length / 2] : (s[s.Length / 2 - 1] + s[s.Length / 2]) / 2;
}

static string RuntimeInformationText() => System.Runtime.InteropServices.RuntimeInformation.FrameworkDescription;

static void PrintFindingSummary(SettingLint.Core.Findings.CheckResult result)
{
    var byRule = result.Findings.GroupBy(f => (f.RuleId, f.Level)).OrderBy(g => g.Key.RuleId).Select(g => $"{g.Key.RuleId}/{g.Key.Level}:{g.Count()}");
    Console.WriteLine("findings by rule on the smallest size (generated files are meant to be clean-ish): " + string.Join(" ", byRule));
    foreach (var n in result.Notifications.Take(3)) Console.WriteLine("  notification: " + n.Message);
}

static void StartUp(string cli, string? hello)
{
    Console.WriteLine();
    var dir = Generator.Write(20);
    var motor = Path.Combine(dir, "motors", "p-00001.yaml");
    // Interleaved: each round runs every command once, so that a busy moment of the machine falls on all of them alike.
    var commands = new List<(string Label, string Exe, string[] Args)>();
    if (hello is not null) commands.Add(("hello world (" + hello + ")", hello, []));
    commands.Add(("settinglint --version", cli, ["--version"]));
    commands.Add(("settinglint check <motor> (text)", cli, ["check", motor]));
    commands.Add(("settinglint check <motor> --format sarif", cli, ["check", motor, "--format", "sarif"]));
    const int Runs = 15;
    Console.WriteLine($"start-up, one motor file, {Runs} interleaved runs each ({cli}):");
    Console.WriteLine("| command | median ms | min ms | max ms | x hello world | exit |");
    Console.WriteLine("|---|---:|---:|---:|---:|---:|");
    var times = commands.Select(_ => new List<double>()).ToArray();
    var codes = new int[commands.Count];
    foreach (var c in commands) RunOnce(c.Exe, c.Args, dir); // warm the disk cache
    for (var i = 0; i < Runs; i++)
    {
        for (var k = 0; k < commands.Count; k++)
        {
            var sw = Stopwatch.StartNew();
            codes[k] = RunOnce(commands[k].Exe, commands[k].Args, dir);
            times[k].Add(sw.Elapsed.TotalMilliseconds);
        }
    }
    var baseline = hello is null ? (double?)null : Median(times[0]);
    for (var k = 0; k < commands.Count; k++)
    {
        var ratio = baseline is { } b ? (Median(times[k]) / b).ToString("F1") + " x" : "-";
        Console.WriteLine($"| {commands[k].Label} | {Median(times[k]):F0} | {times[k].Min():F0} | {times[k].Max():F0} | {ratio} | {codes[k]} |");
    }
    Directory.Delete(dir, true);
}

static int RunOnce(string exe, string[] a, string cwd)
{
    var psi = new ProcessStartInfo(exe) { RedirectStandardOutput = true, RedirectStandardError = true, WorkingDirectory = cwd, UseShellExecute = false };
    foreach (var x in a) psi.ArgumentList.Add(x);
    using var p = Process.Start(psi)!;
    var o = p.StandardOutput.ReadToEndAsync();
    var e = p.StandardError.ReadToEndAsync();
    p.WaitForExit();
    _ = o.Result; _ = e.Result;
    return p.ExitCode;
}

sealed record Row(int N, int Files, int Checked, int Findings, int Notes, int Exit, double Floor, double Check, long PeakWs, long HeapPeak, List<double> Floors, List<double> Checks)
{
    /// <summary>The largest heap left after any collection during the check: what it holds, without the garbage not yet collected.</summary>
    public long LivePeak { get; init; }

    /// <summary>The median of each round's check/floor: floor and check of a round share the machine's state, so it moves less on a busy VM.</summary>
    public double RoundRatio { get; init; }
}

/// <summary>Samples the GC heap every 5 ms while a check runs, to catch its peak.</summary>
sealed class HeapSampler : IDisposable
{
    private readonly CancellationTokenSource _cts = new();
    private readonly Thread _thread;
    private long _peak;
    private long _livePeak;
    private readonly long _startIndex = GC.GetGCMemoryInfo(GCKind.Any).Index;

    public HeapSampler()
    {
        _thread = new Thread(() =>
        {
            while (!_cts.IsCancellationRequested)
            {
                var v = GC.GetTotalMemory(false);
                if (v > Interlocked.Read(ref _peak)) Interlocked.Exchange(ref _peak, v);
                var info = GC.GetGCMemoryInfo(GCKind.Any);
                if (info.Index > _startIndex && info.HeapSizeBytes - info.FragmentedBytes > _livePeak) _livePeak = info.HeapSizeBytes - info.FragmentedBytes;
                Thread.Sleep(5);
            }
        }) { IsBackground = true, Priority = ThreadPriority.AboveNormal };
        _thread.Start();
    }

    public long Peak => Math.Max(Interlocked.Read(ref _peak), GC.GetTotalMemory(false));

    public long LivePeak => _livePeak;

    public void Dispose()
    {
        _cts.Cancel();
        _thread.Join();
    }
}
