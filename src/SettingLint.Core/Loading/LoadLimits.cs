namespace SettingLint.Core.Loading;

/// <summary>The loader's safety limits (SL008). A real setting file is far below each of them.</summary>
public sealed record LoadLimits(long MaxFileBytes, int MaxNodes, long MaxAliasExpansion, int MaxDepth)
{
    /// <summary>The limits of the contract: 4 MiB, 100,000 nodes, 10,000 nodes through aliases, depth 64.</summary>
    public static LoadLimits Default { get; } = new(4L * 1024 * 1024, 100_000, 10_000, 64);
}
