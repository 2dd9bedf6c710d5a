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

    /// <summary>
    /// Writes the document that <paramref name="write"/> writes, followed by a newline, to <paramref name="output"/> as it
    /// goes, some KB at a time: a report is never held whole (its bytes, then its text, then the text and a newline).
    /// </summary>
    public static void Write(TextWriter output, Action<Utf8JsonWriter> write)
    {
        using (var json = new Utf8JsonWriter(new TextBufferWriter(output), Options))
        {
            write(json);
        }
        output.Write('\n');
    }

    /// <summary>A buffer that hands each piece the JSON writer finishes to a text writer, decoded, and is then used again.</summary>
    /// <remarks>
    /// At 100,000 motors (a 3.5 MB SARIF log) rendering whole held some 18 MB at the end of the run; the peak RSS of that run
    /// comes earlier, while groups are checked, and did not move (169 MiB before and after, native, --no-suggest).
    /// </remarks>
    private sealed class TextBufferWriter(TextWriter output) : IBufferWriter<byte>
    {
        private const int PieceBytes = 16 * 1024;
        private readonly Decoder _decoder = Encoding.UTF8.GetDecoder();
        private byte[] _bytes = new byte[PieceBytes];
        private char[] _chars = new char[PieceBytes];

        public void Advance(int count)
        {
            // A character cut between two pieces stays in the decoder until the next.
            var length = _decoder.GetCharCount(_bytes, 0, count, flush: false);
            if (_chars.Length < length) _chars = new char[length];
            var chars = _decoder.GetChars(_bytes, 0, count, _chars, 0, flush: false);
            output.Write(_chars, 0, chars);
        }

        public Memory<byte> GetMemory(int sizeHint = 0)
        {
            if (_bytes.Length < sizeHint) _bytes = new byte[sizeHint];
            return _bytes;
        }

        public Span<byte> GetSpan(int sizeHint = 0) => GetMemory(sizeHint).Span;
    }

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
