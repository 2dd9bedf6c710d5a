using System.Collections.Immutable;
using SettingLint.Core.Discovery;

namespace SettingLint.Core.Engine;

/// <summary>One bus with the motors the quick read finds on it: what a full run loads, evaluates and lets go together.</summary>
/// <param name="Bus">The bus file's root-relative path, as the motors' references resolve it.</param>
/// <param name="File">The bus file when it was discovered and is not a motor (else it is loaded through the motors' references).</param>
/// <param name="Motors">The motor files that name it, in discovery order, by number (<see cref="BusGroups.Motor"/> gives each as discovered).</param>
internal sealed record BusGroup(string Bus, DiscoveredFile? File, List<int> Motors);

/// <summary>
/// How a full run divides the discovered files, from a quick read of their references (<see cref="QuickScan"/>), before
/// anything is loaded.
/// </summary>
/// <param name="Buses">Each bus that motors name, with those motors.</param>
/// <param name="First">
/// Files to load and bind before the groups: those the quick read is not sure of, and motors with an inline bus or a
/// reference it would not follow. A motor among them then joins the group of the bus it names, or is evaluated alone.
/// </param>
/// <param name="Others">Every other file: relay models, buses that no motor names, files of no kind. Loaded once and kept for the run.</param>
/// <param name="Motors">The motors of the groups, their paths packed, by the numbers the groups hold.</param>
internal sealed record BusGroups(Dictionary<string, BusGroup> Buses, List<DiscoveredFile> First, List<DiscoveredFile> Others, DiscoveredFiles Motors)
{
    /// <summary>A motor of a group as discovered.</summary>
    public DiscoveredFile Motor(int number) => Motors[number];

    /// <summary>Divides the files by what the quick read found (<see cref="QuickScan.Read(string, IReadOnlyList{DiscoveredFile}, QuickScan.Reader, long, bool, bool)"/>).</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="files">The discovered files.</param>
    /// <param name="motors">The quick read's references of the motors among them.</param>
    /// <param name="uncertain">The files the quick read was not sure of.</param>
    public static BusGroups Of(string root, IReadOnlyList<DiscoveredFile> files, ImmutableArray<MotorReferences> motors, ImmutableArray<string> uncertain)
    {
        var busOf = new Dictionary<string, string?>(motors.Length, StringComparer.Ordinal);
        foreach (var m in motors) busOf[m.File] = m.Bus;
        var unsure = uncertain.ToHashSet(StringComparer.Ordinal);
        var scanned = new QuickScan.Scanned[files.Count];
        for (var i = 0; i < files.Count; i++)
        {
            var rel = files[i].RelativePath;
            scanned[i] = new QuickScan.Scanned(unsure.Contains(rel), busOf.TryGetValue(rel, out var bus), bus, null, null);
        }
        return Of(root, files, scanned);
    }

    /// <summary>Divides the files by what the quick read found in each (<see cref="QuickScan.Scan"/>, in the files' order).</summary>
    public static BusGroups Of(string root, IReadOnlyList<DiscoveredFile> files, QuickScan.Scanned[] scanned)
    {
        var buses = new Dictionary<string, BusGroup>(StringComparer.Ordinal);
        var first = new List<DiscoveredFile>();
        var others = new List<DiscoveredFile>();
        // A group holds its motors by number, their paths packed: at 100,000 motors their full paths were 17 MB held until
        // the group ran (peak RSS, native, --no-suggest: 136-140 MiB, 130-134 without), and their relative paths as strings
        // 6 MB more (docs/performance.md, 2026-12-05, "Packed paths and tags").
        var motors = new DiscoveredFiles.Builder(root);
        for (var i = 0; i < files.Count; i++)
        {
            var s = scanned[i];
            if (s.Unsure || (s.IsMotor && s.Bus is null)) first.Add(files[i]);
            else if (s.Bus is { } bus)
            {
                var f = files[i];
                var number = motors.Add(f.RelativePath, "", f.IsUnder(root) ? null : f.FullPath);
                (buses.TryGetValue(bus, out var g) ? g : buses[bus] = new BusGroup(bus, null, [])).Motors.Add(number);
            }
        }
        for (var i = 0; i < files.Count; i++)
        {
            var s = scanned[i];
            if (s.Unsure || s.IsMotor) continue;
            var f = files[i];
            if (buses.TryGetValue(f.RelativePath, out var g)) buses[f.RelativePath] = g with { File = f };
            else others.Add(f);
        }
        return new BusGroups(buses, first, others, motors.Build(sorted: false));
    }
}
