using System.Collections.Immutable;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Gate;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Linting;

/// <summary>
/// One check, as every front end asks for it (the command line, the pre-commit hook, the report, the rule fixtures,
/// the language server): what to check, where its files come from, the options and who listens.
/// </summary>
/// <param name="WorkingDirectory">
/// The absolute folder that relative paths (and the baseline's) are resolved against. The engine never uses the
/// process's current folder.
/// </param>
/// <param name="Paths">Files or folders to check, absolute or relative to the working folder; none is the working folder.</param>
public sealed record CheckRequest(string WorkingDirectory, IReadOnlyList<string> Paths)
{
    /// <summary>Where files are read: null is the disk at <see cref="Root"/>. See <see cref="DiskSource"/>, <see cref="OverlaySource"/>, <see cref="GitRevisionSource"/>.</summary>
    public IFileSource? Source { get; init; }

    /// <summary>The repository root for the disk when no source is given (absolute or relative to the working folder); null finds it upward from the first path (the nearest folder with .git).</summary>
    public string? Root { get; init; }

    /// <summary>The gate's threshold; null takes the configuration's fail_on, else error.</summary>
    public Level? FailOn { get; init; }

    /// <summary>Load and evaluate files in parallel (the result does not depend on it).</summary>
    public bool Parallel { get; init; } = true;

    /// <summary>The options of the gate: acceptance comments, baseline, changed files since a revision, staged contents.</summary>
    public GateOptions Options { get; init; } = new();

    /// <summary>Who listens to the run for what findings do not carry: the motors as bound and every rule outcome.</summary>
    public ImmutableArray<ICheckObserver> Observers { get; init; } = [];

    /// <summary>Rules to apply instead of those the configuration names (the rule fixtures test a pack of their own); null reads the configuration.</summary>
    public RuleSet? Rules { get; init; }

    /// <summary>
    /// Work out, from this run's own rule outcomes and motors, a checked value for each unsuppressed finding on a setting:
    /// the findings carry it (<see cref="Finding.Fix"/>), an empty window is an SL020 finding, and every observer is given
    /// the whole <see cref="SuggestionSet"/> (<see cref="ICheckObserver.OnFixes"/>). The values are confirmed by a second
    /// check of the changed files in memory, through the same file source (the staged contents with --staged).
    /// </summary>
    public bool Suggest { get; init; }

    /// <summary>With <see cref="Suggest"/>: suggest values only for the findings of these rules; empty for all.</summary>
    public IReadOnlySet<string> SuggestRules { get; init; } = ImmutableHashSet<string>.Empty;
}
