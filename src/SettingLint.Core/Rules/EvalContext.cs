using System.Collections.Concurrent;
using SettingLint.Core.Model;

namespace SettingLint.Core.Rules;

/// <summary>What an expression is evaluated against: one motor, its repository, the rule's parameters and lets, and a relay range.</summary>
/// <remarks>
/// One context serves every rule of a motor (the rule set sets the parameters, lets and range before each evaluation),
/// so that each key path of the motor and its bus is looked up once per motor, not once per use.
/// </remarks>
public sealed class EvalContext(MotorProtection motor, RepositoryIndex index, double[] parameters, Val[] lets)
{
    // Values read so far, by the slot the compiler gave their path; filled on first use.
    private Val[]? _motorValues;
    private bool[]? _motorRead;
    private Val[]? _busValues;
    private bool[]? _busRead;

    public MotorProtection Motor { get; private set; } = motor;

    public RepositoryIndex Index { get; private set; } = index;

    public double[] Parameters { get; internal set; } = parameters;

    public Val[] Lets { get; internal set; } = lets;

    /// <summary>The relay range of a for_each rule: value, min, max, step in SI for this motor.</summary>
    public RangeItem? Item { get; internal set; }

    /// <summary>Results kept for the whole run (aggregates over a bus); null outside a rule set's run.</summary>
    internal RunCache? Run { get; set; }

    /// <summary>The same context for another motor (aggregates), with fresh lets.</summary>
    public EvalContext For(MotorProtection other) => new(other, Index, Parameters, new Val[Lets.Length]) { Item = null, Run = Run };

    /// <summary>
    /// Makes this context one for another motor, keeping its arrays: a rule set reuses one context per thread, so that a
    /// motor's evaluation allocates nothing but what its findings need.
    /// </summary>
    internal void Reset(MotorProtection motor, RepositoryIndex index, RunCache run, int lets)
    {
        Motor = motor;
        Index = index;
        Run = run;
        Parameters = [];
        Item = null;
        if (Lets.Length < lets) Lets = new Val[lets];
        // Only the flags: a value is read again before it is used. Arrays from before more paths were numbered are dropped.
        if (_motorValues is not null && _motorValues.Length < PathTable.Motor.Count) (_motorValues, _motorRead) = (null, null);
        if (_busValues is not null && _busValues.Length < PathTable.Bus.Count) (_busValues, _busRead) = (null, null);
        if (_motorRead is not null) Array.Clear(_motorRead);
        if (_busRead is not null) Array.Clear(_busRead);
    }

    /// <summary>Drops the references to the motor and the run, so that a context kept for reuse holds no repository alive.</summary>
    internal void Release()
    {
        Motor = null!;
        Index = null!;
        Run = null;
        Item = null;
        Parameters = [];
    }

    /// <summary>A motor key path's value, looked up once per context.</summary>
    internal Val ReadMotor(PathSlot slot) => Cached(ref _motorValues, ref _motorRead, slot, Motor.Document);

    /// <summary>A bus key path's value, looked up once per context.</summary>
    internal Val ReadBus(PathSlot slot) => Cached(ref _busValues, ref _busRead, slot, Motor.Bus?.Document);

    /// <summary>
    /// Reads the values of these paths now, one after the other: a motor's values are seldom in the processor's cache, and
    /// independent lookups in a row wait for memory together, where lookups spread over the rules wait one at a time.
    /// </summary>
    internal void Prefetch(PathSlot[] motorSlots, PathSlot[] busSlots, RangeInfo[] ranges)
    {
        foreach (var s in motorSlots) ReadMotor(s);
        foreach (var r in ranges) ReadMotor(r.Path);
        if (Motor.Bus is not null)
        {
            foreach (var s in busSlots) ReadBus(s);
        }
    }

    private static Val Cached(ref Val[]? values, ref bool[]? read, PathSlot slot, BoundDocument? doc)
    {
        if (values is null || slot.Index >= values.Length)
        {
            // Paths are numbered as rules compile; a path compiled after this context was made is not worth a bigger array.
            if (values is not null) return Compiler.Read(doc, slot.Path);
            var n = slot.Table.Count;
            values = new Val[n];
            read = new bool[n];
        }
        if (read![slot.Index]) return values[slot.Index];
        var v = Compiler.Read(doc, slot.Path);
        values[slot.Index] = v;
        read[slot.Index] = true;
        return v;
    }
}

/// <summary>One relay range resolved for a motor.</summary>
public sealed record RangeItem(string Setting, Val Value, Val Min, Val Max, Val Step);

/// <summary>A key path with the number it has in its table, so that a context caches its value in an array.</summary>
internal sealed record PathSlot(PathTable Table, int Index, string Path);

/// <summary>Numbers the key paths rules read, process-wide, so that rules compiled by different compilers share slots.</summary>
internal sealed class PathTable
{
    private readonly ConcurrentDictionary<string, PathSlot> _slots = new(StringComparer.Ordinal);
    private readonly Lock _gate = new();
    private int _count;

    /// <summary>Paths into a motor's own document.</summary>
    public static PathTable Motor { get; } = new();

    /// <summary>Paths into a motor's bus document.</summary>
    public static PathTable Bus { get; } = new();

    /// <summary>How many paths have a slot.</summary>
    public int Count => Volatile.Read(ref _count);

    public PathSlot Of(string path)
    {
        if (_slots.TryGetValue(path, out var s)) return s;
        lock (_gate)
        {
            if (_slots.TryGetValue(path, out s)) return s;
            s = new PathSlot(this, _count, path);
            // The count first: a thread that finds the slot without the lock (a relay range's path, numbered while other
            // motors are evaluated) sizes its arrays by the count, and must find the slot's index inside them.
            Volatile.Write(ref _count, _count + 1);
            _slots[path] = s;
            return s;
        }
    }
}
