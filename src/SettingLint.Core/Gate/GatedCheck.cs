using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Gate;

/// <summary>What the gate adds to a check run.</summary>
/// <param name="Accept">Apply the acceptance comments of the files (false for audits: --no-suppress).</param>
/// <param name="BaselineFile">The baseline file as given (relative to the current folder); null for none.</param>
/// <param name="ChangedSince">The git revision to compare with; null for a run over every file (HEAD with <paramref name="Staged"/>).</param>
/// <param name="Staged">Check the contents staged for commit, against the revision.</param>
/// <param name="AllFiles">With a revision: check and report every file, and still report the changes to the gate.</param>
public sealed record GateOptions(bool Accept = true, string? BaselineFile = null, string? ChangedSince = null, bool Staged = false, bool AllFiles = false)
{
    /// <summary>The revision a changed-files run compares with; null when it is no such run.</summary>
    public string? Revision => ChangedSince ?? (Staged ? "HEAD" : null);
}

/// <summary>A check with the gate: the changed files and their dependants, the changes to the gate, then the baseline.</summary>
internal static class GatedCheck
{
    /// <summary>
    /// Runs the check of a session with the gate's options, reading through a source; problems with git or the
    /// baseline give exit 2.
    /// </summary>
    /// <param name="session">Configuration and rules (the rules may carry a report's listeners).</param>
    /// <param name="source">Where the files are read (the disk, an overlay, a revision).</param>
    /// <param name="workingDirectory">The absolute folder that relative paths and the baseline's path are resolved against.</param>
    /// <param name="paths">Files or folders to check, as the user named them.</param>
    /// <param name="threshold">The gate's threshold.</param>
    /// <param name="parallel">Load and evaluate files in parallel.</param>
    /// <param name="gate">The gate's options.</param>
    /// <param name="viewed">Given the source the files were read through (the staged contents over the source with --staged), for what runs after the gate.</param>
    public static CheckResult Run(Session session, IFileSource source, string workingDirectory, IReadOnlyList<string> paths, Level threshold, bool parallel, GateOptions gate,
        Action<IFileSource>? viewed = null)
    {
        ArgumentNullException.ThrowIfNull(session);
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(gate);
        var root = source.Root;
        Baseline? baseline = null;
        string? baselineRel = null;
        string? baselineFull = null;
        if (gate.BaselineFile is { } given)
        {
            baselineFull = SourcePaths.Absolute(given, workingDirectory);
            baselineRel = RepositoryRoot.Contains(root, baselineFull) ? RepositoryRoot.Relative(root, baselineFull) : baselineFull.Replace('\\', '/');
        }

        ChangeSet? changes = null;
        var view = source;
        if (gate.Revision is { } revision)
        {
            try
            {
                var (git, commit) = GitRepository.Open(root, revision);
                changes = ChangeSet.Detect(git, commit, root, revision, gate.Staged, session.Config.Packs, baselineRel);
                if (gate.Staged) view = StagedView(git, source, changes, baselineRel);
            }
            catch (GitException ex)
            {
                var option = gate.ChangedSince is null ? "--staged" : "--changed-since";
                return session.Stopped(threshold, [new Notification(NotificationKind.Configuration, option + " needs git: " + ex.Message)]);
            }
        }

        if (baselineFull is not null)
        {
            var bytes = baselineRel is not null && RepositoryRoot.Contains(root, baselineFull)
                ? view.Read(baselineRel)
                : File.Exists(baselineFull) ? File.ReadAllBytes(baselineFull) : null;
            if (bytes is null)
            {
                return session.Stopped(threshold, [new Notification(NotificationKind.Configuration,
                    $"The baseline '{gate.BaselineFile}' does not exist; write it with 'settinglint baseline --output {gate.BaselineFile}'.")]);
            }
            var (parsed, problems) = Baseline.Parse(Encoding.UTF8.GetString(bytes));
            if (parsed is null)
            {
                return session.Stopped(threshold, [.. problems.Select(p =>
                    new Notification(NotificationKind.Configuration, "Baseline: " + p.Message, baselineRel, Documents.SourceSpan.At(p.Line, 1)))]);
            }
            baseline = parsed;
        }

        viewed?.Invoke(view);
        var options = session.Options(paths, threshold, parallel) with
        {
            Accept = gate.Accept,
            Changes = gate.AllFiles ? null : changes,
            Source = view,
            WorkingDirectory = workingDirectory,
        };
        var result = new Checker(session.RunRules).Run(options);
        // A folder's configuration with problems is met only as its files are discovered; it stops the run as the root's does.
        if (session.Finish(result) is var finished && !ReferenceEquals(finished, result)) return finished;

        if (changes is not null)
        {
            var levels = session.Rules.Rules.ToDictionary(r => r.Id, r => r.Descriptor.DefaultLevel, StringComparer.Ordinal);
            var gateFindings = GateChanges.Find(root, changes, view.Read, session.Config.Packs, baselineRel,
                id => levels.TryGetValue(id, out var l) ? l : EngineRules.All.FirstOrDefault(r => r.Id == id)?.DefaultLevel, result.Findings);
            result = result with { Findings = [.. result.Findings.Concat(gateFindings).OrderBy(f => f, Finding.Order)] };
            if (gate.AllFiles)
            {
                result = result with
                {
                    Scope = new ChangeScope(changes.Revision, changes.Staged, [.. changes.Changed], [.. changes.Deleted], [], "every file was asked for (--all-files)"),
                };
            }
        }

        if (baseline is not null)
        {
            result = baseline.Apply(result, baselineRel!, rel => view.Probe(SourcePaths.Full(root, rel)) == EntryKind.File);
        }
        return result;
    }

    // The index as the check sees it: staged contents where they differ from the source, untracked and unstaged-deleted files hidden.
    private static OverlaySource StagedView(GitRepository git, IFileSource source, ChangeSet changes, string? baselineRel)
    {
        var root = source.Root;
        var (modified, untracked) = git.WorkTreeDifferences();
        string? RootRel(string gitPath)
        {
            var full = Path.GetFullPath(Path.Combine(git.TopLevel, gitPath));
            return RepositoryRoot.Contains(root, full) ? RepositoryRoot.Relative(root, full) : null;
        }
        string GitRel(string rel) => RepositoryRoot.Relative(git.TopLevel, SourcePaths.Full(root, rel));
        bool Relevant(string rel) => FileDiscovery.IsYaml(rel) || rel == baselineRel;
        var differing = modified.Select(RootRel).OfType<string>().Concat(changes.Changed).Where(Relevant).Distinct(StringComparer.Ordinal).ToList();
        var staged = git.Show("", differing.Select(GitRel));
        var contents = new Dictionary<string, byte[]>(StringComparer.Ordinal);
        var hidden = new HashSet<string>(StringComparer.Ordinal);
        foreach (var rel in differing)
        {
            if (staged.TryGetValue(GitRel(rel), out var bytes)) contents[rel] = bytes;
            else hidden.Add(rel);
        }
        hidden.UnionWith(untracked.Select(RootRel).OfType<string>());
        hidden.UnionWith(changes.Deleted);
        return new OverlaySource(source, contents, hidden);
    }
}
