using System.Collections.Immutable;
using SettingLint.Core.Discovery;

namespace SettingLint.Core.Engine;

/// <summary>One bus with the motors the quick read finds on it: what a full run loads, evaluates and lets go together.</summary>
/// <param name="Bus">The bus file's root-relative path, as the motors' references resolve it.</param>
/// <param name="File">The bus file when it was discovered and is not a motor (else it is loaded through the motors' references).</param>
/// <param name="Motors">The motor files that name it, in discovery order, root-relative (<see cref="BusGroups.Motor"/> gives each as discovered).</param>
internal sealed record BusGroup(string Bus, DiscoveredFile? File, List<string> Motors);

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
/// <param name="Root">The repository root (absolute).</param>
/// <param name="Elsewhere">The full path of each motor of a group that discovery did not find at the root joined with its relative path.</param>
internal sealed record BusGroups(Dictionary<string, BusGroup> Buses, List<DiscoveredFile> First, List<DiscoveredFile> Others, string Root, Dictionary<string, string> Elsewhere)
{
    /// <summary>A motor of a group as discovered, its full path made again from the root.</summary>
    public DiscoveredFile Motor(string relativePath) =>
        Elsewhere.TryGetValue(relativePath, out var full) ? new(full, relativePath) : DiscoveredFile.Under(Root, relativePath);

    /// <summary>Divides the files by what the quick read found.</summary>
    /// <param name="root">The repository root (absolute).</param>
    /// <param name="files">The discovered files.</param>
    /// <param name="motors">The quick read's references of the motors among them.</param>
    /// <param name="uncertain">The files the quick read was not sure of.</param>
    public static BusGroups Of(string root, IReadOnlyList<DiscoveredFile> files, ImmutableArray<MotorReferences> motors, ImmutableArray<string> uncertain)
    {
        var busOf = new Dictionary<string, string?>(motors.Length, StringComparer.Ordinal);
        foreach (var m in motors) busOf[m.File] = m.Bus;
        var unsure = uncertain.ToHashSet(StringComparer.Ordinal);
        var buses = new Dictionary<string, BusGroup>(StringComparer.Ordinal);
        var first = new List<DiscoveredFile>();
        var others = new List<DiscoveredFile>();
        var elsewhere = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var f in files)
        {
            if (unsure.Contains(f.RelativePath) || (busOf.TryGetValue(f.RelativePath, out var bus) && bus is null)) first.Add(f);
            else if (bus is not null)
            {
                // A group holds its motors' relative paths only (kept for the result anyway), not their full paths too: at
                // 100,000 motors those were 17 MB held until the group ran (peak RSS, native, --no-suggest: 136-140 MiB, 130-134 without).
                (buses.TryGetValue(bus, out var g) ? g : buses[bus] = new BusGroup(bus, null, [])).Motors.Add(f.RelativePath);
                if (!f.IsUnder(root)) elsewhere[f.RelativePath] = f.FullPath;
            }
        }
        foreach (var f in files)
        {
            if (unsure.Contains(f.RelativePath) || busOf.ContainsKey(f.RelativePath)) continue;
            if (buses.TryGetValue(f.RelativePath, out var g)) buses[f.RelativePath] = g with { File = f };
            else others.Add(f);
        }
        return new BusGroups(buses, first, others, root, elsewhere);
    }
}
