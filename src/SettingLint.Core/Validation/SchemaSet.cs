using System.Collections.Concurrent;

namespace SettingLint.Core.Validation;

/// <summary>The JSON Schemas of the file kinds, loaded once from the assembly and shared by every file of a run.</summary>
public sealed class SchemaSet
{
    public const string MotorProtection = "motor-protection";
    public const string Bus = "bus";
    public const string RelayModel = "relay-model";
    public const string Config = "config";
    public const string Rule = "rule";

    private int _warmed;

    private readonly ConcurrentDictionary<string, Lazy<SchemaNode>> _schemas = new(StringComparer.Ordinal);

    /// <summary>The kinds of setting file the format defines.</summary>
    public static IReadOnlyList<string> SettingKinds { get; } = [MotorProtection, Bus, RelayModel];

    /// <summary>The one set of a process: schemas are immutable once read, so sharing them is safe.</summary>
    public static SchemaSet Shared { get; } = new();

    /// <summary>The schema of a kind (motor-protection, bus, relay-model, config, rule).</summary>
    public SchemaNode Get(string name) =>
        _schemas.GetOrAdd(name, static n => new Lazy<SchemaNode>(() => Read(n), LazyThreadSafetyMode.ExecutionAndPublication)).Value;

    /// <summary>Starts reading the configuration and setting schemas on the thread pool, so the first validation does not wait for them.</summary>
    public void Warm()
    {
        // The CLI, the session and the checker each ask, so that any of them works alone; the reads start once.
        if (Interlocked.Exchange(ref _warmed, 1) == 1) return;
        // The configuration is read first in a run, so its schema is asked for first.
        foreach (var kind in (string[])[Config, .. SettingKinds])
        {
            _ = Task.Run(() => Get(kind));
        }
    }

    /// <summary>The text of an embedded schema file.</summary>
    public static string Text(string name)
    {
        using var stream = typeof(SchemaSet).Assembly.GetManifestResourceStream("schema/" + name + ".schema.json")
            ?? throw new InvalidOperationException("The schema " + name + " is not embedded in the assembly.");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }

    private static SchemaNode Read(string name) => SchemaNode.Read(Text(name), name);
}
