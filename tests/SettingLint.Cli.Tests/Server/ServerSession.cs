using System.Text.Json.Nodes;
using Nerdbank.Streams;
using SettingLint.Cli.Server;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Server;

/// <summary>The language server running in this process on one end of an in-memory duplex pipe, a raw client on the other.</summary>
internal sealed class ServerSession : IAsyncDisposable
{
    private ServerSession(LspClient client, Task<int> server, StringWriter errors)
    {
        Client = client;
        Server = server;
        Errors = errors;
    }

    public LspClient Client { get; }

    /// <summary>The server's run; its result is the exit code.</summary>
    public Task<int> Server { get; }

    /// <summary>What the server wrote to standard error.</summary>
    public StringWriter Errors { get; }

    /// <summary>Starts a server (no debounce unless given) and sends initialize and initialized for a workspace folder.</summary>
    public static async Task<ServerSession> Start(string workspace, ServerOptions? options = null)
    {
        var (serverEnd, clientEnd) = FullDuplexStream.CreatePair();
        var errors = new StringWriter();
        var server = Task.Run(() => LanguageServerHost.RunAsync(serverEnd, serverEnd, options ?? new ServerOptions(TimeSpan.Zero), TextWriter.Synchronized(errors)));
        var session = new ServerSession(new LspClient(clientEnd), server, errors);
        var init = await session.Client.Request("initialize", new JsonObject
        {
            ["processId"] = null,
            ["rootUri"] = Uri(workspace),
            ["capabilities"] = new JsonObject(),
        });
        Assert.True(init["result"] is JsonObject, init.ToJsonString());
        await session.Client.Notify("initialized", new JsonObject());
        return session;
    }

    /// <summary>The file: URI of a path, as clients write it.</summary>
    public static string Uri(string path) => new Uri(path).AbsoluteUri;

    public Task Open(string path, string text, int version = 1) => Client.Notify("textDocument/didOpen", new JsonObject
    {
        ["textDocument"] = new JsonObject { ["uri"] = Uri(path), ["languageId"] = "yaml", ["version"] = version, ["text"] = text },
    });

    public Task Change(string path, int version, string text) => Client.Notify("textDocument/didChange", new JsonObject
    {
        ["textDocument"] = new JsonObject { ["uri"] = Uri(path), ["version"] = version },
        ["contentChanges"] = new JsonArray(new JsonObject { ["text"] = text }),
    });

    public Task Save(string path) => Client.Notify("textDocument/didSave", new JsonObject { ["textDocument"] = new JsonObject { ["uri"] = Uri(path) } });

    public Task Close(string path) => Client.Notify("textDocument/didClose", new JsonObject { ["textDocument"] = new JsonObject { ["uri"] = Uri(path) } });

    /// <summary>The hover's markdown at a 0-based position, or null when the answer is null.</summary>
    public async Task<string?> Hover(string path, int line, int character)
    {
        var response = await Client.Request("textDocument/hover", new JsonObject
        {
            ["textDocument"] = new JsonObject { ["uri"] = Uri(path) },
            ["position"] = new JsonObject { ["line"] = line, ["character"] = character },
        });
        Assert.True(response["error"] is null, response.ToJsonString());
        return (string?)response["result"]?["contents"]?["value"];
    }

    /// <summary>shutdown then exit; returns the server's exit code.</summary>
    public async Task<int> ShutdownAndExit()
    {
        var response = await Client.Request("shutdown");
        Assert.True(response.ContainsKey("result") && response["result"] is null, response.ToJsonString());
        await Client.Notify("exit");
        return await Server.WaitAsync(LspClient.Timeout);
    }

    public async ValueTask DisposeAsync() => await Client.DisposeAsync();

    /// <summary>A repository holding a copy of the demo plant (examples/), its configuration at the root.</summary>
    public static TempRepo DemoRepo()
    {
        var repo = new TempRepo();
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        foreach (var file in Directory.EnumerateFiles(examples, "*", SearchOption.AllDirectories))
        {
            repo.WriteBytes(Path.GetRelativePath(examples, file).Replace('\\', '/'), File.ReadAllBytes(file));
        }
        return repo;
    }
}
