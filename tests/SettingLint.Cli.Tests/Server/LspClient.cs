using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace SettingLint.Cli.Tests.Server;

/// <summary>
/// A minimal LSP client that writes and reads the wire format itself (Content-Length headers, JSON-RPC 2.0 objects),
/// so that the tests see exactly what a client would see and do not share the server's JSON-RPC library.
/// </summary>
internal sealed class LspClient : IAsyncDisposable
{
    private readonly Stream _stream;
    private readonly SemaphoreSlim _write = new(1, 1);
    private readonly Lock _gate = new();
    private readonly Dictionary<int, TaskCompletionSource<JsonObject>> _pending = [];
    private readonly List<JsonObject> _notifications = [];
    private TaskCompletionSource _arrived = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private readonly Task _reader;
    private int _nextId;

    public LspClient(Stream stream)
    {
        _stream = stream;
        _reader = Task.Run(ReadLoop);
    }

    /// <summary>How long any wait may take before the test fails: generous, for a loaded two-core machine.</summary>
    public static TimeSpan Timeout { get; } = TimeSpan.FromSeconds(60);

    /// <summary>Every notification received so far, in order.</summary>
    public IReadOnlyList<JsonObject> Notifications
    {
        get
        {
            lock (_gate) return [.. _notifications];
        }
    }

    /// <summary>Drops the notifications received so far (a long test would otherwise measure its own log).</summary>
    public void Forget()
    {
        lock (_gate) _notifications.Clear();
    }

    /// <summary>Sends a request and returns the whole response (with result or error).</summary>
    public async Task<JsonObject> Request(string method, JsonNode? parameters = null)
    {
        var id = Interlocked.Increment(ref _nextId);
        var tcs = new TaskCompletionSource<JsonObject>(TaskCreationOptions.RunContinuationsAsynchronously);
        lock (_gate) _pending[id] = tcs;
        var message = new JsonObject { ["jsonrpc"] = "2.0", ["id"] = id, ["method"] = method };
        if (parameters is not null) message["params"] = parameters;
        await Send(message);
        return await tcs.Task.WaitAsync(Timeout);
    }

    /// <summary>Sends a notification.</summary>
    public Task Notify(string method, JsonNode? parameters = null)
    {
        var message = new JsonObject { ["jsonrpc"] = "2.0", ["method"] = method };
        if (parameters is not null) message["params"] = parameters;
        return Send(message);
    }

    /// <summary>Sends raw bytes as one message body (for malformed input).</summary>
    public Task SendRaw(string body) => SendBytes(Encoding.UTF8.GetBytes(body));

    /// <summary>Waits for the first notification from index <paramref name="from"/> on that matches.</summary>
    public async Task<JsonObject> WaitFor(Func<JsonObject, bool> match, int from = 0)
    {
        var deadline = DateTime.UtcNow + Timeout;
        while (true)
        {
            Task arrived;
            lock (_gate)
            {
                for (var i = from; i < _notifications.Count; i++)
                {
                    if (match(_notifications[i])) return _notifications[i];
                }
                arrived = _arrived.Task;
            }
            var left = deadline - DateTime.UtcNow;
            if (left <= TimeSpan.Zero) throw new TimeoutException("No matching notification within " + Timeout + "; received:\n" + string.Join("\n", Notifications.Select(n => n.ToJsonString())));
            await Task.WhenAny(arrived, Task.Delay(left));
        }
    }

    /// <summary>Waits for diagnostics of a document at a version (null: any version) and returns them.</summary>
    public async Task<JsonArray> Diagnostics(string uri, int? version = null, int from = 0)
    {
        var n = await WaitFor(m => (string?)m["method"] == "textDocument/publishDiagnostics" && (string?)m["params"]!["uri"] == uri
            && (version is null || (int?)m["params"]!["version"] == version), from);
        return n["params"]!["diagnostics"]!.AsArray();
    }

    private async Task Send(JsonObject message) => await SendBytes(Encoding.UTF8.GetBytes(message.ToJsonString()));

    private async Task SendBytes(byte[] body)
    {
        var header = Encoding.ASCII.GetBytes("Content-Length: " + body.Length.ToString(CultureInfo.InvariantCulture) + "\r\n\r\n");
        await _write.WaitAsync();
        try
        {
            await _stream.WriteAsync(header);
            await _stream.WriteAsync(body);
            await _stream.FlushAsync();
        }
        finally
        {
            _write.Release();
        }
    }

    private async Task ReadLoop()
    {
        try
        {
            while (await ReadMessage() is { } message)
            {
                if (message["id"] is { } id && message["method"] is null)
                {
                    TaskCompletionSource<JsonObject>? tcs;
                    lock (_gate) _pending.Remove(id.GetValue<int>(), out tcs);
                    tcs?.TrySetResult(message);
                    continue;
                }
                lock (_gate)
                {
                    _notifications.Add(message);
                    var done = _arrived;
                    _arrived = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
                    done.TrySetResult();
                }
            }
        }
        catch (Exception ex) when (ex is IOException or ObjectDisposedException or OperationCanceledException or InvalidOperationException)
        {
            // The server closed the connection.
        }
    }

    private async Task<JsonObject?> ReadMessage()
    {
        var length = -1;
        var line = new StringBuilder();
        var one = new byte[1];
        while (true)
        {
            if (await _stream.ReadAsync(one) == 0) return null;
            if (one[0] == '\n')
            {
                var text = line.ToString().TrimEnd('\r');
                line.Clear();
                if (text.Length == 0) break;
                if (text.StartsWith("Content-Length:", StringComparison.OrdinalIgnoreCase)) length = int.Parse(text["Content-Length:".Length..].Trim(), CultureInfo.InvariantCulture);
                continue;
            }
            line.Append((char)one[0]);
        }
        var body = new byte[length];
        await _stream.ReadExactlyAsync(body);
        return JsonNode.Parse(body)!.AsObject();
    }

    public async ValueTask DisposeAsync()
    {
        await _stream.DisposeAsync();
        try
        {
            await _reader.WaitAsync(TimeSpan.FromSeconds(10));
        }
        catch (TimeoutException)
        {
            // A reader still blocked on a closed stream ends with the test process.
        }
        _write.Dispose();
    }
}
