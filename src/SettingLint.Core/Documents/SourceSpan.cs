namespace SettingLint.Core.Documents;

/// <summary>A 1-based region of a source file; columns count UTF-16 code units, as SARIF does by default.</summary>
public readonly record struct SourceSpan(int StartLine, int StartColumn, int EndLine, int EndColumn)
{
    /// <summary>The span of a whole file's first position, for findings that have no better place.</summary>
    public static SourceSpan FileStart { get; } = new(1, 1, 1, 1);

    /// <summary>A span of one position.</summary>
    public static SourceSpan At(int line, int column) => new(line, column, line, column);

    public override string ToString() => $"{StartLine}:{StartColumn}-{EndLine}:{EndColumn}";
}
