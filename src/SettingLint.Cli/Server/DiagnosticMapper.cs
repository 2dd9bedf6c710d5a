using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Reporting;

namespace SettingLint.Cli.Server;

/// <summary>Findings as LSP diagnostics: the same rule id, level, place and message as `check`, with the rule's help link.</summary>
public static class DiagnosticMapper
{
    /// <summary>The source every diagnostic names.</summary>
    public const string Source = "settinglint";

    /// <summary>The diagnostics of one file: its findings (those accepted in the file left out) and the notifications that name it.</summary>
    public static IReadOnlyList<Diagnostic> Of(CheckResult result, string relativePath, ToolInfo tool)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(tool);
        var rules = result.Rules.ToDictionary(r => r.Id, StringComparer.Ordinal);
        var list = new List<Diagnostic>();
        foreach (var f in result.Findings)
        {
            // An accepted finding has a reason written in the file; the editor does not nag about it again.
            if (f.File != relativePath || f.Suppression is not null || f.Level == Level.None) continue;
            var help = rules.TryGetValue(f.RuleId, out var rule) ? new CodeDescription(tool.HelpUri(rule).AbsoluteUri) : null;
            list.Add(new Diagnostic(RangeOf(f.Span), Severity(f.Level), f.RuleId, help, Source, f.Message));
        }
        foreach (var n in result.Notifications)
        {
            if (n.File != relativePath) continue;
            var what = n.Kind == NotificationKind.Internal ? "internal error: " : "";
            list.Add(new Diagnostic(RangeOf(n.Span ?? SourceSpan.FileStart), 1, null, null, Source, what + n.Message));
        }
        return list;
    }

    /// <summary>LSP severity: error 1, warning 2, information 3 (a note).</summary>
    public static int Severity(Level level) => level switch
    {
        Level.Error => 1,
        Level.Warning => 2,
        _ => 3,
    };

    /// <summary>A 1-based span with an exclusive end column as a 0-based LSP range (columns are UTF-16 in both).</summary>
    public static LspRange RangeOf(SourceSpan span)
    {
        var startLine = Math.Max(0, span.StartLine - 1);
        var startChar = Math.Max(0, span.StartColumn - 1);
        var endLine = Math.Max(startLine, span.EndLine - 1);
        var endChar = Math.Max(0, span.EndColumn - 1);
        if (endLine == startLine && endChar < startChar) endChar = startChar;
        return new LspRange(new LspPosition(startLine, startChar), new LspPosition(endLine, endChar));
    }

    /// <summary>Whether a 0-based LSP position lies in a 1-based span (start inclusive, end exclusive, an empty span holds its own point).</summary>
    public static bool Contains(SourceSpan span, LspPosition p)
    {
        ArgumentNullException.ThrowIfNull(p);
        var line = p.Line + 1;
        var col = p.Character + 1;
        if (line < span.StartLine || line > span.EndLine) return false;
        if (line == span.StartLine && col < span.StartColumn) return false;
        if (line == span.EndLine && col >= span.EndColumn && !(span.EndLine == span.StartLine && span.EndColumn <= span.StartColumn && col == span.StartColumn)) return false;
        return true;
    }
}
