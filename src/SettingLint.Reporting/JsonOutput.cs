using System.Buffers;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;

namespace SettingLint.Reporting;

/// <summary>How every JSON document of ours is written: indented with "\n", readable text, one final newline.</summary>
internal static class JsonOutput
{
    private static readonly JsonWriterOptions Options = new()
    {
        Indented = true,
        NewLine = "\n",
        // The report is a file, not HTML: keep non-ASCII text and symbols such as '<' and '+' readable.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    /// <summary>The document that <paramref name="write"/> writes, followed by a newline.</summary>
    public static string Render(Action<Utf8JsonWriter> write, int initialCapacity = 4096)
    {
        var buffer = new ArrayBufferWriter<byte>(initialCapacity);
        using (var json = new Utf8JsonWriter(buffer, Options))
        {
            write(json);
        }
        return Encoding.UTF8.GetString(buffer.WrittenSpan) + "\n";
    }
}
