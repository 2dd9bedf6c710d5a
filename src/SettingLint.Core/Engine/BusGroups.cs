using System.Collections.Immutable;
using SettingLint.Core.Discovery;

namespace SettingLint.Core.Engine;

/// <summary>One bus with the motors the quick read finds on it: what a full run loads, evaluates and lets go together.</summary>
/// <param name="Bus">The bus file's root-relative path, as the motors' references resolve it.</param>
/// <param name="File">The bus file when it was discovered and is not a motor (else it is loaded through the motors' references).</param>
/// <param name="Motors">The motor files that name it, in discovery order.</param>
internal sealed record BusGroup(string Bus, DiscoveredFile? File, List<DiscoveredFile> Motors);

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
internal sealed record BusGroups(Dictionary<string, BusGroup> Buses, List<DiscoveredFile> First, List<DiscoveredFile> Others)
{
    /// <summary>Divides the files by what the quick read found.</summary>
    public static BusGroups Of(IReadOnlyList<DiscoveredFile> files, ImmutableArray<MotorReferences> motors, ImmutableArray<string> uncertain)
    {
        var busOf = new Dictionary<string, string?>(motors.Length, StringComparer.Ordinal);
        foreach (var m in motors) busOf[m.File] = m.Bus;
        var unsure = uncertain.ToHashSet(StringComparer.Ordinal);
        var buses = new Dictionary<string, BusGroup>(StringComparer.Ordinal);
        var first = new List<DiscoveredFile>();
        var others = new List<DiscoveredFile>();
        foreach (var f in files)
        {
            if (unsure.Contains(f.RelativePath) || (busOf.TryGetValue(f.RelativePath, out var bus) && bus is null)) first.Add(f);
            else if (bus is not null) (buses.TryGetValue(bus, out var g) ? g : buses[bus] = new BusGroup(bus, null, [])).Motors.Add(f);
        }
        foreach (var f in files)
        {
            if (unsure.Contains(f.RelativePath) || busOf.ContainsKey(f.RelativePath)) continue;
            if (buses.TryGetValue(f.RelativePath, out var g)) buses[f.RelativePath] = g with { File = f };
            else others.Add(f);
        }
        return new BusGroups(buses, first, others);
    }
}
