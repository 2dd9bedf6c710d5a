using SettingLint.Cli.Server;
using SettingLint.Core.Documents;

namespace SettingLint.Cli.Tests.Server;

/// <summary>Positions: LSP counts lines from 0 and characters in UTF-16 code units; SettingLint spans are 1-based with an exclusive end.</summary>
public sealed class ProtocolTests
{
    [Fact]
    public void A_span_becomes_a_zero_based_range_with_the_same_exclusive_end()
    {
        var r = DiagnosticMapper.RangeOf(new SourceSpan(46, 13, 46, 21));
        Assert.Equal(new LspRange(new LspPosition(45, 12), new LspPosition(45, 20)), r);
        Assert.Equal(new LspRange(new LspPosition(0, 0), new LspPosition(0, 0)), DiagnosticMapper.RangeOf(SourceSpan.FileStart));
    }

    [Fact]
    public void A_position_is_inside_a_span_up_to_its_end_exclusive()
    {
        var span = new SourceSpan(3, 5, 3, 9);
        Assert.False(DiagnosticMapper.Contains(span, new LspPosition(2, 3)));
        Assert.True(DiagnosticMapper.Contains(span, new LspPosition(2, 4)));
        Assert.True(DiagnosticMapper.Contains(span, new LspPosition(2, 7)));
        Assert.False(DiagnosticMapper.Contains(span, new LspPosition(2, 8)));
        Assert.False(DiagnosticMapper.Contains(span, new LspPosition(3, 4)));
    }

    [Fact]
    public void An_incremental_change_counts_utf16_code_units()
    {
        // U+1F600 is two UTF-16 code units (a surrogate pair), as LSP's default position encoding counts it.
        var text = "a: \U0001F600x\r\nb: 2\n";
        var edited = OpenDocuments.Apply(text, new LspRange(new LspPosition(0, 5), new LspPosition(0, 6)), "y");
        Assert.Equal("a: \U0001F600y\r\nb: 2\n", edited);
        Assert.Equal("a: \U0001F600x\r\nb: 3\n", OpenDocuments.Apply(text, new LspRange(new LspPosition(1, 3), new LspPosition(1, 4)), "3"));
        // Past the end of a line is the line's end (before its CR LF); past the last line is the end of the text.
        Assert.Equal(text.IndexOf('\r', StringComparison.Ordinal), OpenDocuments.Offset(text, new LspPosition(0, 99)));
        Assert.Equal(text.Length, OpenDocuments.Offset(text, new LspPosition(9, 0)));
    }
}
