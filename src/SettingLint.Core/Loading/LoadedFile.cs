using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Loading;

/// <summary>One file after loading: its tree when it parsed within the limits, and the findings of loading.</summary>
/// <param name="Path">Absolute path.</param>
/// <param name="RelativePath">Relative to the repository root, with forward slashes.</param>
/// <param name="Root">The document's root node; null when it did not load or is empty.</param>
/// <param name="Findings">SL001, SL002, SL005 and SL008 findings of loading.</param>
/// <param name="Lines">The file's lines as decoded, for comment markers; empty when it did not decode.</param>
public sealed record LoadedFile(
    string Path,
    string RelativePath,
    YNode? Root,
    IReadOnlyList<Finding> Findings,
    IReadOnlyList<string> Lines)
{
    /// <summary>The value of the root's `kind` key when the root is a mapping that has one.</summary>
    public YNode? KindNode => (Root as YMapping)?["kind"];

    /// <summary>Whether the file is a setting file: its YAML has a `kind` key, or it failed to load at all.</summary>
    public bool IsSettingFile => KindNode is not null || MisspeltKindKey is not null || (Root as YMapping)?.Find("format") is not null;

    /// <summary>A top-level key that is probably `kind` misspelt (`kidn`, `Kind`): such a file is reported, not skipped.</summary>
    public YScalar? MisspeltKindKey =>
        KindNode is null && Root is YMapping m
            ? m.Entries.Select(e => e.Key).FirstOrDefault(k => k.Value.Length is >= 3 and <= 6 && Documents.Suggestions.Distance(k.Value.ToLowerInvariant(), "kind") <= 1)
            : null;

    /// <summary>Whether loading failed before a tree could be had (syntax, encoding or a limit).</summary>
    public bool Failed => Root is null && Findings.Count > 0;
}
