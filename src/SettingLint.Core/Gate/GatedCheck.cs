using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;

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
public static class GatedCheck
{
    /// <summary>Runs the check of a session with the gate's options; problems with git or the baseline give exit 2.</summary>
    public static CheckResult Run(Session session, IReadOnlyList<string> paths, Level threshold, bool parallel, GateOptions gate)
    {
        var root = session.Root;
        Baseline? baseline = null;
        string? baselineRel = null;
        string? baselineFull = null;
        if (gate.BaselineFile is { } given)
        {
            baselineFull = Path.GetFullPath(given);
            baselineRel = RepositoryRoot.Contains(root, baselineFull) ? RepositoryRoot.Relative(root, baselineFull) : baselineFull.Replace('\\', '/');
        }

        ChangeSet? changes = null;
        FileOverlay? overlay = null;
        if (gate.Revision is { } revision)
        {
            try
            {
                var git = GitRepository.Open(root);
                changes = ChangeSet.Detect(git, root, revision, gate.Staged, session.Config.Packs, baselineRel);
                if (gate.Staged) overlay = StagedView(git, root, changes, baselineRel);
            }
            catch (GitException ex)
            {
                var option = gate.ChangedSince is null ? "--staged" : "--changed-since";
                return Problem(session, threshold, option + " needs git: " + ex.Message);
            }
        }

        if (baselineFull is not null)
        {
            var bytes = overlay is not null && baselineRel is not null && RepositoryRoot.Contains(root, baselineFull)
                ? overlay.Read(root, baselineRel)
                : File.Exists(baselineFull) ? File.ReadAllBytes(baselineFull) : null;
            if (bytes is null)
            {
                return Problem(session, threshold, $"The baseline '{gate.BaselineFile}' does not exist; write it with 'settinglint baseline --output {gate.BaselineFile}'.");
            }
            var (parsed, problems) = Baseline.Parse(Encoding.UTF8.GetString(bytes));
            if (parsed is null)
            {
                return Problem(session, threshold, [.. problems.Select(p =>
                    new Notification(NotificationKind.Configuration, "Baseline: " + p.Message, baselineRel, Documents.SourceSpan.At(p.Line, 1)))]);
            }
            baseline = parsed;
        }

        var options = new CheckOptions(paths, threshold, Parallel: parallel, Include: session.Config.Includes,
            Accept: gate.Accept, Changes: gate.AllFiles ? null : changes, Overlay: overlay, ElectricalCode: session.Config.ElectricalCodeOf);
        var result = new Checker(session.Rules).Run(options);

        if (changes is not null)
        {
            Func<string, byte[]?> readNew = overlay is not null
                ? rel => overlay.Read(root, rel)
                : rel => File.Exists(Full(root, rel)) ? File.ReadAllBytes(Full(root, rel)) : null;
            var levels = session.Rules.Rules.ToDictionary(r => r.Id, r => r.Descriptor.DefaultLevel, StringComparer.Ordinal);
            var gateFindings = GateChanges.Find(root, changes, readNew, session.Config.Packs, baselineRel,
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
            Func<string, bool> exists = overlay is not null ? rel => overlay.Read(root, rel) is not null : rel => File.Exists(Full(root, rel));
            result = baseline.Apply(result, baselineRel!, exists);
        }
        return result;
    }

    private static string Full(string root, string rel) => Path.Combine(root, rel.Replace('/', Path.DirectorySeparatorChar));

    // The index as the check sees it: staged contents where they differ from the disk, untracked and unstaged-deleted files hidden.
    private static FileOverlay StagedView(GitRepository git, string root, ChangeSet changes, string? baselineRel)
    {
        var (modified, untracked) = git.WorkTreeDifferences();
        string? RootRel(string gitPath)
        {
            var full = Path.GetFullPath(Path.Combine(git.TopLevel, gitPath));
            return RepositoryRoot.Contains(root, full) ? RepositoryRoot.Relative(root, full) : null;
        }
        string GitRel(string rel) => RepositoryRoot.Relative(git.TopLevel, Full(root, rel));
        bool Relevant(string rel) => FileDiscovery.IsYaml(rel) || rel == baselineRel;
        var differing = modified.Select(RootRel).OfType<string>().Concat(changes.Changed).Where(Relevant).Distinct(StringComparer.Ordinal).ToList();
        var staged = git.Show("", differing.Select(GitRel));
        var contents = ImmutableDictionary.CreateBuilder<string, byte[]>(StringComparer.Ordinal);
        var hidden = ImmutableHashSet.CreateBuilder<string>(StringComparer.Ordinal);
        foreach (var rel in differing)
        {
            if (staged.TryGetValue(GitRel(rel), out var bytes)) contents[rel] = bytes;
            else hidden.Add(rel);
        }
        hidden.UnionWith(untracked.Select(RootRel).OfType<string>());
        hidden.UnionWith(changes.Deleted);
        return new FileOverlay(contents.ToImmutable(), hidden.ToImmutable());
    }

    private static CheckResult Problem(Session session, Level threshold, string message) =>
        Problem(session, threshold, [new Notification(NotificationKind.Configuration, message)]);

    private static CheckResult Problem(Session session, Level threshold, ImmutableArray<Notification> problems) =>
        new(session.Root, [], [.. EngineRules.All.Concat(session.Rules.Descriptors).OrderBy(r => r.Id, StringComparer.Ordinal)], problems, 0, [], threshold);
}
