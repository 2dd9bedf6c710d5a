using System.Collections.Concurrent;
using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Fixes;
using SettingLint.Core.Gate;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Core.Validation;

namespace SettingLint.Core.Linting;

/// <summary>The one way into the engine: every front end checks through <see cref="Check"/>.</summary>
public static class Linter
{
    /// <summary>
    /// Checks what the request names: configuration and rules (read through the request's source), discovery,
    /// loading, validation, binding, rules, then the gate (acceptances, changed files, baseline). Never throws for
    /// bad input: configuration problems are notifications (exit 2), an internal failure is one (exit 3).
    /// </summary>
    public static CheckResult Check(CheckRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (!Path.IsPathFullyQualified(request.WorkingDirectory))
        {
            throw new ArgumentException("The working folder of a check is an absolute path: " + request.WorkingDirectory, nameof(request));
        }
        IReadOnlyList<string> paths = request.Paths.Count == 0 ? ["."] : request.Paths;
        var first = SourcePaths.Absolute(paths[0], request.WorkingDirectory);
        var source = request.Source ?? new DiskSource(request.Root is { } root ? SourcePaths.Absolute(root, request.WorkingDirectory) : RepositoryRoot.Find(first, request.WorkingDirectory));
        var session = request.Rules is { } rules
            ? new Session(source.Root, Configuration.SettingsConfig.Default, rules, [])
            : Session.Open(source, first, SchemaSet.Shared);
        var threshold = request.FailOn ?? session.Config.FailOn ?? Level.Error;
        if (!session.Problems.IsEmpty) return session.Stopped(threshold, session.Problems);
        var observers = request.Observers;
        // Suggestions come from this run's own outcomes and motors: a collector listens beside the caller's observers.
        using var collector = request.Suggest ? new FixCollector() : null;
        if (collector is not null) observers = observers.Add(collector);
        var ruleSet = session.Rules;
        if (!observers.IsEmpty)
        {
            // The same compiled rules, with the observers listening: the one run gives findings and what reports draw.
            session = session with
            {
                Rules = new RuleSet(ruleSet.Rules)
                {
                    Outcomes = o => { foreach (var x in observers) x.OnOutcome(o); },
                    Motors = m => { foreach (var x in observers) x.OnMotor(m); },
                },
            };
        }
        IFileSource view = source;
        var result = GatedCheck.Run(session, source, request.WorkingDirectory, paths, threshold, request.Parallel, request.Options, v => view = v);
        if (collector is null || !result.Notifications.IsEmpty) return result;
        // Confirmed by a check of the changed files in memory, over the files as this run read them (the index with --staged).
        var set = FixFinder.Compute(ruleSet, view, session.Includes, result.Findings, request.SuggestRules, session.ElectricalCodeOf,
            collector.Settings, session.Scopes, result);
        foreach (var o in request.Observers) o.OnFixes(set);
        return set.ApplyTo(result);
    }

    /// <summary>
    /// Keeps, for a run's suggestions, the windows and facts of the settings that failed a rule (<see cref="SettingFacts"/>):
    /// a suggestion is made only for a finding, and its window needs every rule's outcome on that setting. They are taken
    /// when a motor's outcomes are all in, and the motor and its outcomes are let go, so that a run keeps neither a
    /// failing motor's document, bus and relay model nor its outcomes until the suggestions are made.
    /// </summary>
    /// <remarks>
    /// A rule set calls <see cref="OnMotor"/> and then each of the motor's outcomes on one thread, one motor after the
    /// other: each thread's current motor is held until its next one (or the end) tells that its outcomes are all in.
    /// Keeping the failing motors and their outcomes to the end instead cost some 45 KB per failing motor: peak RSS of a
    /// check with suggestions fell from 89 to 77 MiB at 10,000 generated motors and from 383 to 296 MiB at 100,000 (2,000
    /// failing; medians of 4-5 runs, native build, 2026-12-05; without suggestions 72-75 and 219-235 MiB).
    /// </remarks>
    private sealed class FixCollector : ICheckObserver, IDisposable
    {
        private readonly ConcurrentDictionary<(string File, string Setting), SettingFacts> _settings = new();
        private readonly ThreadLocal<Current> _current = new(() => new Current(), trackAllValues: true);

        /// <summary>The kept settings; read once the run is over.</summary>
        public IEnumerable<SettingFacts> Settings
        {
            get
            {
                foreach (var current in _current.Values) Flush(current);
                return _settings.Values;
            }
        }

        public void OnMotor(MotorProtection motor)
        {
            var current = _current.Value!;
            Flush(current);
            current.Motor = motor;
        }

        // Only an outcome that bounds its own subject can make a window (SettingWindows.Derive reads no other). With the
        // windows derived only for settings with a finding (now: that a rule failed on, SettingFacts.Of), peak RSS at
        // 10,000 motors fell from 721 to 563 MiB and CPU from 8.1 x to 6.7 x the parse-only floor's (docs/performance.md,
        // 2026-12-05, third measurement).
        public void OnOutcome(RuleOutcome outcome)
        {
            var current = _current.Value!;
            // Every subject a rule failed on, bounding it or not: a finding's setting gets a fix from the window other rules
            // leave it (a value off the relay's step, say) even when the failing rule's own check bounds nothing.
            if (!outcome.Passed) current.Failed.Add(outcome.Subject);
            foreach (var b in outcome.Bounds)
            {
                if (b.Path == outcome.Subject && (b.IsLower || b.IsUpper))
                {
                    current.Outcomes.Add(outcome);
                    return;
                }
            }
        }

        public void Dispose() => _current.Dispose();

        private void Flush(Current current)
        {
            if (current.Failed.Count > 0 && current.Motor is { } motor)
            {
                // One entry per setting, as the plan makes one fix per setting.
                foreach (var s in SettingFacts.Of(motor, current.Outcomes, current.Failed)) _settings.TryAdd((s.MotorFile, s.Setting), s);
            }
            current.Motor = null;
            current.Outcomes.Clear();
            current.Failed.Clear();
        }

        /// <summary>A thread's motor under evaluation, its outcomes that bound their subject so far, and the subjects of its failed outcomes.</summary>
        private sealed class Current
        {
            public MotorProtection? Motor { get; set; }

            public List<RuleOutcome> Outcomes { get; } = [];

            public HashSet<string> Failed { get; } = new(StringComparer.Ordinal);
        }
    }

    /// <summary>
    /// The repository root for a path (absolute, or relative to the working folder): the nearest folder upward with .git,
    /// else the outermost with a configuration, else the working folder when the path lies below it, else the path's folder.
    /// The process's current folder plays no part.
    /// </summary>
    public static string FindRoot(string workingDirectory, string path) => RepositoryRoot.Find(SourcePaths.Absolute(path, workingDirectory), workingDirectory);
}
