using System.Text;
using System.Text.Json;

namespace SettingLint.Reporting.Tests;

/// <summary>A JSON report goes to its writer piece by piece, with the same text as the whole document would have.</summary>
public sealed class JsonOutputTests
{
    /// <summary>Records the text written and the longest single piece.</summary>
    private sealed class PieceWriter : StringWriter
    {
        public int Longest { get; private set; }

        public int Pieces { get; private set; }

        public override void Write(char[] buffer, int index, int count)
        {
            Longest = Math.Max(Longest, count);
            Pieces++;
            base.Write(buffer, index, count);
        }

        public override void Write(string? value)
        {
            Longest = Math.Max(Longest, value?.Length ?? 0);
            Pieces++;
            base.Write(value);
        }
    }

    // Characters of one to four UTF-8 bytes, so that many fall across the end of a piece.
    private static void Document(Utf8JsonWriter json)
    {
        json.WriteStartArray();
        for (var i = 0; i < 20000; i++) json.WriteStringValue(i + " Ω µs ≥ 1.15 × FLC 𝛼");
        json.WriteEndArray();
    }

    [Fact]
    public void A_long_document_is_written_in_pieces_with_the_text_of_the_whole()
    {
        var whole = JsonOutput.Render(Document);
        using var writer = new PieceWriter();
        JsonOutput.Write(writer, Document);

        Assert.True(whole.Length > 500_000, "document: " + whole.Length);
        Assert.Equal(whole, writer.ToString());
        // No piece near the size of the document: it is never held whole as text.
        Assert.True(writer.Longest <= 32 * 1024, "longest piece: " + writer.Longest);
        Assert.True(writer.Pieces > 10, "pieces: " + writer.Pieces);
        Assert.EndsWith("]\n", writer.ToString(), StringComparison.Ordinal);
    }
}
