using SettingLint.Core.Findings;

namespace SettingLint.Cli.Server;

/// <summary>Fixes as LSP code actions: one quick fix per finding with a checked value, replacing exactly the value's characters.</summary>
public static class FixActions
{
    /// <summary>The actions of the findings (of one document) whose line lies in the asked range, one per setting, in file order.</summary>
    public static IReadOnlyList<CodeAction> Of(string uri, IEnumerable<Finding> findings, LspRange asked)
    {
        ArgumentNullException.ThrowIfNull(findings);
        ArgumentNullException.ThrowIfNull(asked);
        var actions = new List<CodeAction>();
        // Several rules on one setting share its fix: one action resolves all their diagnostics.
        foreach (var group in findings.Where(f => f.Fix is not null && Touches(f, asked)).GroupBy(f => f.KeyPath, StringComparer.Ordinal))
        {
            var fix = group.First().Fix!;
            var rules = string.Join(", ", group.Select(f => f.RuleId).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal));
            var edit = new TextEdit(DiagnosticMapper.RangeOf(fix.Region), fix.Inserted);
            var shown = fix.Shown.Length > 0 && fix.Shown != fix.Inserted ? " (" + fix.Shown + ")" : "";
            actions.Add(new CodeAction(
                $"Set {group.Key} to {fix.Inserted}{shown}: {rules}",
                "quickfix",
                [.. group.Select(f => new Diagnostic(DiagnosticMapper.RangeOf(f.Span), DiagnosticMapper.Severity(f.Level), f.RuleId, null, DiagnosticMapper.Source, f.Message))],
                IsPreferred: true,
                Edit: new WorkspaceEdit(new Dictionary<string, IReadOnlyList<TextEdit>>(StringComparer.Ordinal) { [uri] = [edit] })));
        }
        return actions;
    }

    // A finding is asked about when its line, or its value's, lies within the asked lines (editors ask for the cursor's line or a diagnostic's range).
    private static bool Touches(Finding f, LspRange asked)
    {
        var first = asked.Start.Line + 1;
        var last = asked.End.Line + 1;
        return (f.Span.StartLine <= last && f.Span.EndLine >= first) || (f.Fix!.Region.StartLine >= first && f.Fix.Region.StartLine <= last);
    }
}
