using SettingLint.Core.Quantities;
using SettingLint.Core.Validation;

namespace SettingLint.Sheets.Import;

/// <summary>One key of a kind's contract as a sheet column sees it: its path, schema and, for a quantity, its dimension.</summary>
public sealed record ContractKey(string Path, SchemaNode Schema, int Order)
{
    /// <summary>The dimension of a quantity key; null for text, numbers and flags.</summary>
    public Dimension? Dimension => SchemaFacts.DimensionOf(Schema);

    /// <summary>Whether the key takes a plain number (an integer or a float).</summary>
    public bool IsNumber => Dimension is null && (Schema.Names(JsonType.Number) || Schema.Names(JsonType.Integer)) && !Schema.Allows(JsonType.String);

    /// <summary>The one value the key allows (the kind and format of a file), or null.</summary>
    public string? FixedValue => Schema.Enum is [var only] ? only.ToString() : null;

    /// <summary>Whether the key allows one value only.</summary>
    public bool IsFixed => FixedValue is not null;

    /// <summary>Whether the key is a flag.</summary>
    public bool IsFlag => Dimension is null && Schema.Names(JsonType.Boolean) && !Schema.Allows(JsonType.String);
}

/// <summary>
/// The key paths of a kind, read off its JSON Schema (never a list written here): a key added to the schema is a column
/// that import reads and sheet writes with no change to this code.
/// </summary>
public sealed class ContractKeys
{
    private readonly Dictionary<string, ContractKey> _byPath;

    private ContractKeys(string kind, IReadOnlyList<ContractKey> keys)
    {
        Kind = kind;
        All = keys;
        _byPath = keys.ToDictionary(k => k.Path, StringComparer.Ordinal);
    }

    /// <summary>The kind (motor-protection, bus, relay-model).</summary>
    public string Kind { get; }

    /// <summary>Every leaf key, in the schema's order.</summary>
    public IReadOnlyList<ContractKey> All { get; }

    /// <summary>The keys of a kind in the shared schema set.</summary>
    public static ContractKeys Of(string kind, SchemaSet? schemas = null)
    {
        var schema = (schemas ?? SchemaSet.Shared).Get(kind);
        return new ContractKeys(kind, [.. SchemaFacts.Leaves(schema).Select((l, i) => new ContractKey(l.Path, l.Schema, i))]);
    }

    /// <summary>The key of a path, when the contract has it.</summary>
    public ContractKey? Find(string path) => _byPath.GetValueOrDefault(path);

    /// <summary>The known path nearest to an unknown one, for "did you mean".</summary>
    public string? Nearest(string path)
    {
        var best = All.Select(k => (k.Path, Distance: SettingLint.Core.Documents.Suggestions.Distance(k.Path, path))).MinBy(p => p.Distance);
        return best.Path is not null && best.Distance <= Math.Max(2, path.Length / 5) ? best.Path : null;
    }
}
