using System.Text.Json;
using System.Text.Json.Serialization.Metadata;
using StreamJsonRpc;
using StreamJsonRpc.Protocol;

namespace SettingLint.Cli.Server;

/// <summary>
/// The LSP methods the server answers, as StreamJsonRpc targets. Each handler is short and guarded: a notification
/// that fails is logged and dropped, a request that fails answers null, so that no bad message ends the session.
/// The checking itself runs on <see cref="DiagnosticsWorker"/>, never on the RPC thread.
/// </summary>
public sealed class SettingLanguageServer
{
    private readonly ServerState _state;

    internal SettingLanguageServer(ServerState state) => _state = state;

    /// <summary>initialize: remembers the workspace folders and says what the server offers.</summary>
    [JsonRpcMethod("initialize", UseSingleObjectParameterDeserialization = true)]
    public InitializeResult Initialize(JsonElement parameters)
    {
        var p = Read(parameters, LspJson.Default.InitializeParams);
        var folders = new List<string>();
        foreach (var uri in (p.WorkspaceFolders ?? []).Select(f => f.Uri).Append(p.RootUri))
        {
            if (uri is not null && WorkspaceLayout.PathOf(uri) is { } path) folders.Add(path);
        }
        if (folders.Count == 0 && p.RootPath is { Length: > 0 } rootPath) folders.Add(Path.GetFullPath(rootPath));
        _state.WorkspaceFolders = [.. folders.Distinct(StringComparer.Ordinal)];
        // Full text on every change: setting files are small, and a whole-file overlay is what the engine reads.
        // Code actions: the checked value of each finding on a setting, as a quick fix.
        return new InitializeResult(new ServerCapabilities(new TextDocumentSyncOptions(true, 1, new SaveOptions(false)), HoverProvider: true, CodeActionProvider: true),
            new ServerInfo("settinglint", CheckCommand.Version));
    }

    /// <summary>initialized: nothing to do.</summary>
    [JsonRpcMethod("initialized", UseSingleObjectParameterDeserialization = true)]
    public void Initialized(JsonElement p)
    {
        _ = p;
    }

    /// <summary>shutdown: stops checking; the answer is null.</summary>
    [JsonRpcMethod("shutdown")]
    public object? Shutdown()
    {
        _state.ShutdownRequested = true;
        _state.Worker.Stop();
        return null;
    }

    /// <summary>exit: ends the session (exit code 0 after shutdown, else 1, as LSP says).</summary>
    [JsonRpcMethod("exit")]
    public void Exit() => _state.Exited.TrySetResult(_state.ShutdownRequested ? 0 : 1);

    /// <summary>textDocument/didOpen.</summary>
    [JsonRpcMethod("textDocument/didOpen", UseSingleObjectParameterDeserialization = true)]
    public void DidOpen(JsonElement parameters) => _state.Guard("didOpen", () =>
    {
        var p = Read(parameters, LspJson.Default.DidOpenTextDocumentParams);
        _state.Documents.Open(p.TextDocument.Uri, p.TextDocument.Version, p.TextDocument.Text);
        _state.Worker.Request();
    });

    /// <summary>textDocument/didChange.</summary>
    [JsonRpcMethod("textDocument/didChange", UseSingleObjectParameterDeserialization = true)]
    public void DidChange(JsonElement parameters) => _state.Guard("didChange", () =>
    {
        var p = Read(parameters, LspJson.Default.DidChangeTextDocumentParams);
        if (_state.Documents.Change(p.TextDocument.Uri, p.TextDocument.Version, p.ContentChanges)) _state.Worker.Request();
    });

    /// <summary>textDocument/didSave: a saved configuration or rule file applies from now, so every open file is checked again.</summary>
    [JsonRpcMethod("textDocument/didSave", UseSingleObjectParameterDeserialization = true)]
    public void DidSave(JsonElement parameters) => _state.Guard("didSave", () =>
    {
        var p = Read(parameters, LspJson.Default.DidSaveTextDocumentParams);
        _state.Documents.Saved(p.TextDocument.Uri, p.Text);
        _state.Worker.Request();
    });

    /// <summary>textDocument/didClose: the file's diagnostics are cleared.</summary>
    [JsonRpcMethod("textDocument/didClose", UseSingleObjectParameterDeserialization = true)]
    public void DidClose(JsonElement parameters) => _state.Guard("didClose", () =>
    {
        var p = Read(parameters, LspJson.Default.DidCloseTextDocumentParams);
        if (_state.Documents.Close(p.TextDocument.Uri)) _state.Worker.Closed(p.TextDocument.Uri);
        _state.Worker.Request();
    });

    /// <summary>workspace/didChangeWatchedFiles: files changed on disk (a checkout, another editor); check again.</summary>
    [JsonRpcMethod("workspace/didChangeWatchedFiles", UseSingleObjectParameterDeserialization = true)]
    public void DidChangeWatchedFiles(JsonElement parameters) => _state.Guard("didChangeWatchedFiles", () =>
    {
        var p = Read(parameters, LspJson.Default.DidChangeWatchedFilesParams);
        _ = p;
        _state.Worker.Request();
    });

    /// <summary>textDocument/hover: on a quantity or an element key of an open motor, from its last check.</summary>
    [JsonRpcMethod("textDocument/hover", UseSingleObjectParameterDeserialization = true)]
    public Hover? Hover(JsonElement parameters)
    {
        var p = Read(parameters, LspJson.Default.TextDocumentPositionParams);
        return _state.Guard("hover", () => _state.Worker.Facts.TryGetValue(p.TextDocument.Uri, out var facts) ? HoverText.At(facts, p.Position) : null);
    }

    /// <summary>
    /// textDocument/codeAction: the fixes of the last check of the document (the value every rule on a setting accepts,
    /// confirmed by a second check), each a quick fix that replaces exactly the value's characters. Only while the buffer
    /// is still the one checked: after an edit, the next check brings new fixes.
    /// </summary>
    [JsonRpcMethod("textDocument/codeAction", UseSingleObjectParameterDeserialization = true)]
    public IReadOnlyList<CodeAction> CodeAction(JsonElement parameters)
    {
        var p = Read(parameters, LspJson.Default.CodeActionParams);
        return _state.Guard("codeAction", () =>
        {
            if (!_state.Worker.Fixes.TryGetValue(p.TextDocument.Uri, out var checkedFixes)) return [];
            if (!_state.Documents.Snapshot().TryGetValue(p.TextDocument.Uri, out var doc) || doc.Version != checkedFixes.Version) return [];
            return FixActions.Of(p.TextDocument.Uri, checkedFixes.Findings, p.Range);
        }) ?? [];
    }

    /// <summary>
    /// Reads a message's parameters with the source-generated types. Parameters of the wrong shape are the client's
    /// error: the request is answered with InvalidParams (a notification's is logged), and the session goes on.
    /// </summary>
    private static T Read<T>(JsonElement parameters, JsonTypeInfo<T> type)
    {
        T? value;
        try
        {
            value = parameters.Deserialize(type);
        }
        catch (JsonException ex)
        {
            throw new LocalRpcException("Invalid parameters: " + ex.Message) { ErrorCode = (int)JsonRpcErrorCode.InvalidParams };
        }
        return value ?? throw new LocalRpcException("Invalid parameters: none given.") { ErrorCode = (int)JsonRpcErrorCode.InvalidParams };
    }
}
