namespace SettingLint.Reporting.Tests;

public sealed class ReportersTests
{
    [Theory]
    [InlineData("text", typeof(TextReporter))]
    [InlineData("json", typeof(JsonReporter))]
    [InlineData("sarif", typeof(SarifReporter))]
    [InlineData("markdown", typeof(MarkdownReporter))]
    [InlineData("code-quality", typeof(CodeQualityReporter))]
    [InlineData("junit", typeof(JUnitReporter))]
    public void Each_format_has_its_reporter(string format, Type type) =>
        Assert.IsType(type, Reporters.For(format));

    [Fact]
    public void Formats_lists_text_first() => Assert.Equal(["text", "json", "sarif", "markdown", "code-quality", "junit"], Reporters.Formats.ToArray());

    [Theory]
    [InlineData("SARIF")]
    [InlineData("md")]
    [InlineData("")]
    public void An_unknown_format_is_refused_with_the_known_ones(string format)
    {
        var e = Assert.Throws<ArgumentException>(() => Reporters.For(format));
        Assert.Contains("text, json, sarif", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Rule_help_links_are_made_from_the_information_uri()
    {
        Assert.Equal("https://settinglint.invalid/rules/README.md#sl201", Samples.Tool.HelpUri(Samples.Instantaneous).AbsoluteUri);
        var noSlash = Samples.Tool with { InformationUri = new Uri("https://example.invalid/docs") };
        Assert.Equal("https://example.invalid/docs/rules/README.md#sl201", noSlash.HelpUri(Samples.Instantaneous).AbsoluteUri);
    }
}
