using System.Collections.Immutable;

namespace SettingLint.Cli.Server;

/// <summary>The state of one server session, shared by the RPC handlers and the diagnostics worker.</summary>
internal sealed class ServerState
{
    public ServerState(ServerOptions options, Action<int, string> log)
    {
        Log = log;
        Worker = new DiagnosticsWorker(this, options);
    }

    /// <summary>The buffers the client has open.</summary>
    public OpenDocuments Documents { get; } = new();

    /// <summary>Checks open files and publishes their diagnostics.</summary>
    public DiagnosticsWorker Worker { get; }

    /// <summary>Writes window/logMessage (type 1 error ... 4 log).</summary>
    public Action<int, string> Log { get; }

    /// <summary>The client's workspace folders (absolute paths), from initialize.</summary>
    public ImmutableArray<string> WorkspaceFolders { get; set; } = [];

    /// <summary>shutdown came before exit.</summary>
    public bool ShutdownRequested { get; set; }

    /// <summary>Completed by exit, with the process's exit code.</summary>
    public TaskCompletionSource<int> Exited { get; } = new(TaskCreationOptions.RunContinuationsAsynchronously);

    /// <summary>Runs a notification's work; an exception is logged, never thrown back into the connection.</summary>
    public void Guard(string what, Action work)
    {
        try
        {
            work();
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            Log(1, "settinglint: " + what + " failed: " + ex);
        }
    }

    /// <summary>Runs a request's work; an exception is logged and the answer is the default (null: no hover).</summary>
    public T? Guard<T>(string what, Func<T?> work)
    {
        try
        {
            return work();
        }
        catch (Exception ex) when (ex is not OutOfMemoryException)
        {
            Log(1, "settinglint: " + what + " failed: " + ex);
            return default;
        }
    }
}

/// <summary>How a server session runs.</summary>
/// <param name="Debounce">How long to wait after a change for more before checking (typing produces a change per key).</param>
public sealed record ServerOptions(TimeSpan Debounce)
{
    /// <summary>The defaults of `settinglint server`: 150 ms, below what a person notices as lag after a pause in typing (common practice).</summary>
    public static ServerOptions Default { get; } = new(TimeSpan.FromMilliseconds(150));

    /// <summary>Called before each check with the checked folder; tests make it throw to see the server survive.</summary>
    internal Action<string>? BeforeCheck { get; init; }
}
