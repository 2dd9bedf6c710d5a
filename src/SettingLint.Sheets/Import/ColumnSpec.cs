using SettingLint.Core.Quantities;
using SettingLint.Sheets.Tables;

namespace SettingLint.Sheets.Import;

/// <summary>What a column of the sheet holds: a key path with an optional unit, or nothing (ignored by the map).</summary>
/// <param name="Header">The header cell.</param>
/// <param name="Key">The contract key; null for an ignored column.</param>
/// <param name="Unit">The unit of bare numbers in the column, from `[unit]` in the header or the map.</param>
public sealed record ColumnSpec(SheetCell Header, ContractKey? Key, string? Unit)
{
    /// <summary>How the column is named in messages: its letter, and its header.</summary>
    public string Describe() => "column " + Header.ColumnName + " (" + Header.Text.Trim() + ")";
}

/// <summary>Reads a header text: `key.path` or `key.path [unit]`.</summary>
public static class HeaderText
{
    /// <summary>The path and the unit (null when none) of a header text.</summary>
    public static (string Path, string? Unit) Split(string header)
    {
        ArgumentNullException.ThrowIfNull(header);
        var t = header.Trim();
        var open = t.IndexOf('[', StringComparison.Ordinal);
        if (open < 0 || !t.EndsWith(']')) return (t, null);
        return (t[..open].Trim(), t[(open + 1)..^1].Trim());
    }

    /// <summary>Null when a unit fits a key (its dimension and the units its place accepts), else why not.</summary>
    public static string? UnitProblem(ContractKey key, string unit)
    {
        if (key.Dimension is not { } dimension) return $"'{key.Path}' takes no unit (it is {(key.IsNumber ? "a plain number" : key.IsFlag ? "true or false" : "text")}).";
        var context = UnitContexts.Of(key.Path);
        var parse = QuantityParser.Parse("1 " + unit, dimension, context);
        return parse.Ok ? null : QuantityParser.Explain(parse, "1 " + unit, dimension, context);
    }
}
