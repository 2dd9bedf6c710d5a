using System.Collections.Immutable;
using System.Text;
using System.Threading.Channels;
using SettingLint.Core.Discovery;
using SettingLint.Reporting;

namespace SettingLint.Cli.Server;

/// <summary>
/// Checks the open files after each change and publishes their diagnostics. Requests are coalesced (a channel of one),
/// so a burst of keystrokes gives one check of the latest text. Every open file is checked on every run, so a change to a
/// bus, relay model, configuration or rule file reaches the open motors that depend on it without a dependency walk.
/// </summary>
internal sealed class DiagnosticsWorker
{
    private readonly ServerState _state;
    private readonly ServerOptions _options;
    private readonly Channel<bool> _requests = Channel.CreateBounded<bool>(new BoundedChannelOptions(1) { FullMode = BoundedChannelFullMode.DropWrite });
    private readonly EngineAdapter _engine = new();
    private readonly ToolInfo _tool = ToolInfo.ForVersion(CheckCommand.Version);
    private readonly Lock _gate = new();
    // What was last published per URI (version and diagnostics), to publish only what changed.
    private ImmutableDictionary<string, (int Version, IReadOnlyList<Diagnostic> Diagnostics)> _published =
        ImmutableDictionary.Create<string, (int, IReadOnlyList<Diagnostic>)>(StringComparer.Ordinal);

    public DiagnosticsWorker(ServerState state, ServerOptions options)
    {
        _state = state;
        _options = options;
    }

    /// <summary>Sends textDocument/publishDiagnostics; set by the host once the connection exists.</summary>
    public Func<PublishDiagnosticsParams, Task>? Publish { get; set; }

    /// <summary>The last check's facts of each open motor, by URI, for hover.</summary>
    public ImmutableDictionary<string, MotorFacts> Facts { get; private set; } = ImmutableDictionary.Create<string, MotorFacts>(StringComparer.Ordinal);

    /// <summary>The last check's findings with a fix of each open file, by URI, with the version of the text they are of.</summary>
    public ImmutableDictionary<string, (int Version, ImmutableArray<SettingLint.Core.Findings.Finding> Findings)> Fixes { get; private set; } =
        ImmutableDictionary.Create<string, (int, ImmutableArray<SettingLint.Core.Findings.Finding>)>(StringComparer.Ordinal);

    /// <summary>Asks for a check of every open file.</summary>
    public void Request() => _requests.Writer.TryWrite(true);

    /// <summary>Stops taking requests (shutdown).</summary>
    public void Stop() => _requests.Writer.TryComplete();

    /// <summary>A file was closed: its diagnostics are cleared and its facts dropped.</summary>
    public void Closed(string uri)
    {
        lock (_gate)
        {
            _published = _published.Remove(uri);
            Facts = Facts.Remove(uri);
            Fixes = Fixes.Remove(uri);
        }
        _ = Send(new PublishDiagnosticsParams(uri, null, []));
    }

    /// <summary>Runs until stopped: waits for a request, lets a burst settle, checks, publishes.</summary>
    public async Task RunAsync(CancellationToken cancel)
    {
        try
        {
            while (await _requests.Reader.WaitToReadAsync(cancel).ConfigureAwait(false))
            {
                if (_options.Debounce > TimeSpan.Zero) await Task.Delay(_options.Debounce, cancel).ConfigureAwait(false);
                _requests.Reader.TryRead(out _);
                await CheckOpenFiles().ConfigureAwait(false);
            }
        }
        catch (OperationCanceledException) when (cancel.IsCancellationRequested)
        {
            // The session ended.
        }
    }

    private async Task CheckOpenFiles()
    {
        var docs = _state.Documents.Snapshot();
        var folders = _state.WorkspaceFolders;
        var files = docs.Values.Where(d => d.Path is not null).ToList();
        var facts = ImmutableDictionary.CreateBuilder<string, MotorFacts>(StringComparer.Ordinal);
        var fixes = ImmutableDictionary.CreateBuilder<string, (int, ImmutableArray<SettingLint.Core.Findings.Finding>)>(StringComparer.Ordinal);
        var publish = new List<(OpenDocument Doc, IReadOnlyList<Diagnostic> Diagnostics)>();
        foreach (var group in files.GroupBy(d => WorkspaceLayout.ScopeOf(d.Path!, folders)))
        {
            var scope = group.Key;
            try
            {
                _options.BeforeCheck?.Invoke(scope.CheckedPath);
                // Every open buffer under the root is read from memory, the group's own and any bus or model open beside them.
                var overlays = files.Where(d => RepositoryRoot.Contains(scope.Root, d.Path!))
                    .ToDictionary(d => RepositoryRoot.Relative(scope.Root, d.Path!), d => Encoding.UTF8.GetBytes(d.Text), StringComparer.Ordinal);
                var rels = group.ToDictionary(d => d.Uri, d => RepositoryRoot.Relative(scope.Root, d.Path!), StringComparer.Ordinal);
                var run = _engine.Check(scope.Root, scope.CheckedPath, overlays, rels.Values.ToHashSet(StringComparer.Ordinal));
                var titles = run.Result.Rules.ToDictionary(r => r.Id, r => r.Title, StringComparer.Ordinal);
                foreach (var doc in group)
                {
                    var rel = rels[doc.Uri];
                    publish.Add((doc, DiagnosticMapper.Of(run.Result, rel, _tool)));
                    fixes[doc.Uri] = (doc.Version, [.. run.Result.Findings.Where(f => f.File == rel && f.Fix is not null && f.Suppression is null)]);
                    if (run.Motors.TryGetValue(rel, out var motor))
                    {
                        facts[doc.Uri] = new MotorFacts(motor, [.. run.Outcomes.Where(o => o.MotorFile == rel)],
                            [.. run.Result.Findings.Where(f => f.File == rel)], titles);
                    }
                }
            }
            catch (Exception ex) when (ex is not OutOfMemoryException)
            {
                // The files of this scope keep their last diagnostics; the next change tries again.
                _state.Log(1, "settinglint: checking " + scope.CheckedPath + " failed: " + ex);
            }
        }
        lock (_gate)
        {
            // Facts of files closed meanwhile are not kept.
            var open = _state.Documents.Snapshot();
            Facts = facts.Where(kv => open.ContainsKey(kv.Key)).ToImmutableDictionary(StringComparer.Ordinal);
            Fixes = fixes.Where(kv => open.ContainsKey(kv.Key)).ToImmutableDictionary(StringComparer.Ordinal);
        }
        // Hover facts first, then diagnostics: a client that hovers once the diagnostics came sees the same check.
        foreach (var (doc, diagnostics) in publish) await PublishIfChanged(doc, diagnostics).ConfigureAwait(false);
    }

    private async Task PublishIfChanged(OpenDocument doc, IReadOnlyList<Diagnostic> diagnostics)
    {
        lock (_gate)
        {
            if (_published.TryGetValue(doc.Uri, out var last) && last.Version == doc.Version && last.Diagnostics.SequenceEqual(diagnostics)) return;
            if (!_state.Documents.Snapshot().ContainsKey(doc.Uri)) return;
            _published = _published.SetItem(doc.Uri, (doc.Version, diagnostics));
        }
        await Send(new PublishDiagnosticsParams(doc.Uri, doc.Version, diagnostics)).ConfigureAwait(false);
    }

    private async Task Send(PublishDiagnosticsParams p)
    {
        if (Publish is not { } publish) return;
        try
        {
            await publish(p).ConfigureAwait(false);
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            // The connection may be closing; nothing to publish to.
            Console.Error.WriteLine("settinglint: publishing diagnostics failed: " + ex.Message);
        }
    }
}
