using System.Collections.Immutable;
using System.Runtime.InteropServices;

namespace SettingLint.Core.Model;

/// <summary>The relations between setting files: the motors of a run and the motors on each bus.</summary>
public sealed class RepositoryIndex
{
    // Arrays, not immutable arrays, in a plain dictionary: their code is the runtime's own shared code, ready at start,
    // and a frozen dictionary costs more to make (once per run) than a run's lookups save. Handed out as immutable arrays.
    private readonly Dictionary<string, MotorProtection[]> _byBus;

    public RepositoryIndex(IEnumerable<MotorProtection> motors)
    {
        Motors = [.. motors.OrderBy(m => m.Document.RelativePath, StringComparer.Ordinal)];
        _byBus = Motors.Where(m => m.Bus is not null)
            .GroupBy(BusKey, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => g.ToArray(), StringComparer.Ordinal);
    }

    /// <summary>Every motor, by file path.</summary>
    public ImmutableArray<MotorProtection> Motors { get; }

    /// <summary>The motors fed from the same bus as this one, this one included.</summary>
    public ImmutableArray<MotorProtection> MotorsOnBusOf(MotorProtection motor) =>
        motor.Bus is null ? [motor] : _byBus.TryGetValue(BusKey(motor), out var group) ? ImmutableCollectionsMarshal.AsImmutableArray(group) : [motor];

    // An inline bus is its motor's own: it is keyed by the motor file so it is shared with no other motor.
    private static string BusKey(MotorProtection m) =>
        m.Bus!.Document.RelativePath + "#" + (m.Bus.Document.Path == m.Document.Path ? m.Document.RelativePath : "");
}
