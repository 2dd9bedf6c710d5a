using System.Diagnostics.CodeAnalysis;
using System.Text.Json.Serialization;
using StreamJsonRpc;

namespace SettingLint.Cli.Server;

/// <summary>Runs one LSP session over a pair of streams: JSON-RPC with LSP's Content-Length headers (StreamJsonRpc).</summary>
public static class LanguageServerHost
{
    /// <summary>Serves until the client sends exit or closes the connection; returns the exit code (0 after shutdown, else 1).</summary>
    public static async Task<int> RunAsync(Stream input, Stream output, ServerOptions options, TextWriter errors, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(errors);
        JsonRpc? connection = null;
        var state = new ServerState(options, (type, message) =>
        {
            lock (errors) errors.WriteLine(message);
            if (connection is { IsDisposed: false } c) _ = Notify(c, "window/logMessage", new LogMessageParams(type, message));
        });
        using var rpc = connection = Connect(input, output, state);
        state.Worker.Publish = p => Notify(rpc, "textDocument/publishDiagnostics", p);
        rpc.StartListening();

        using var stop = CancellationTokenSource.CreateLinkedTokenSource(cancel);
        var worker = Task.Run(() => state.Worker.RunAsync(stop.Token), CancellationToken.None);
        var ended = await Task.WhenAny(state.Exited.Task, rpc.Completion).ConfigureAwait(false);
        await stop.CancelAsync().ConfigureAwait(false);
        state.Worker.Stop();
        try
        {
            await worker.ConfigureAwait(false);
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            errors.WriteLine("settinglint: the diagnostics worker ended with: " + ex.Message);
        }
        // A client that closes the connection without exit is treated as exit without shutdown.
        return ended == state.Exited.Task ? state.Exited.Task.Result : state.ShutdownRequested ? 0 : 1;
    }

    // StreamJsonRpc 2.26.150 marks the System.Text.Json formatter's constructor RequiresUnreferencedCode and
    // RequiresDynamicCode ("not hardened"), and RpcTargetMetadata.FromClass RequiresDynamicCode; its NativeAOT guide
    // names exactly this set-up (the formatter with a source-generated TypeInfoResolver, FromClass with the class and
    // interfaces given) as the supported one. The NativeAOT-published CLI was run as a server (initialize, diagnostics,
    // hover, an InvalidParams answer, shutdown and exit) and behaved as the JIT build does.
    [UnconditionalSuppressMessage("Trimming", "IL2026", Justification = "Protocol types are source generated (LspJson); the AOT build was run as a server.")]
    [UnconditionalSuppressMessage("AOT", "IL3050", Justification = "Handlers take JsonElement and return source-generated types; the AOT build was run as a server.")]
    private static JsonRpc Connect(Stream input, Stream output, ServerState state)
    {
        // System.Text.Json with the source-generated protocol types: no reflection over our types.
        var formatter = new SystemTextJsonFormatter();
        formatter.JsonSerializerOptions.TypeInfoResolver = LspJson.Default;
        formatter.JsonSerializerOptions.PropertyNamingPolicy = System.Text.Json.JsonNamingPolicy.CamelCase;
        formatter.JsonSerializerOptions.DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull;
        var rpc = new JsonRpc(new HeaderDelimitedMessageHandler(output, input, formatter));
        rpc.AddLocalRpcTarget(
            RpcTargetMetadata.FromClass(typeof(SettingLanguageServer), new RpcTargetMetadata.ClassAndInterfaces(typeof(SettingLanguageServer))),
            new SettingLanguageServer(state),
            new JsonRpcTargetOptions { DisposeOnDisconnect = false });
        return rpc;
    }

    // Notifications are sent with named arguments of declared types, so that the formatter serializes them through
    // the source-generated context (an LSP params object, not an array).
    private static Task Notify(JsonRpc rpc, string method, PublishDiagnosticsParams p)
    {
        var args = new Dictionary<string, object?> { ["uri"] = p.Uri, ["diagnostics"] = p.Diagnostics };
        var types = new Dictionary<string, Type> { ["uri"] = typeof(string), ["diagnostics"] = typeof(IReadOnlyList<Diagnostic>) };
        if (p.Version is { } version)
        {
            args["version"] = version;
            types["version"] = typeof(int);
        }
        return rpc.NotifyWithParameterObjectAsync(method, args, types);
    }

    private static Task Notify(JsonRpc rpc, string method, LogMessageParams p) =>
        rpc.NotifyWithParameterObjectAsync(method,
            new Dictionary<string, object?> { ["type"] = p.Type, ["message"] = p.Message },
            new Dictionary<string, Type> { ["type"] = typeof(int), ["message"] = typeof(string) });
}
