using System.Collections.Immutable;
using System.Text;
using System.Text.RegularExpressions;
using SettingLint.Core.Findings;

namespace SettingLint.Core.Gate;

/// <summary>One finding accepted by a baseline file.</summary>
/// <param name="RuleId">The rule.</param>
/// <param name="File">The setting file, relative to the repository root.</param>
/// <param name="KeyPath">The key path of the finding's subject.</param>
/// <param name="Fingerprint">The fingerprint of file, rule and key path (<see cref="Fingerprints.Of"/>).</param>
/// <param name="Message">The message written in the comment above the entry; empty when there is none.</param>
/// <param name="Line">The entry's line in the baseline file.</param>
public sealed record BaselineEntry(string RuleId, string File, string KeyPath, string Fingerprint, string Message, int Line);

/// <summary>A problem of a baseline file that stops the run (exit 2), at its line.</summary>
public sealed record BaselineProblem(int Line, string Message);

/// <summary>
/// A baseline: the findings accepted as they stood when it was written, matched by fingerprint (file, rule and key
/// path, never line numbers). The file is plain text of our own: a header line, then one entry a line
/// (<c>rule file key-path fingerprint</c>, a value with spaces in double quotes), each under a comment with its message.
/// </summary>
public sealed partial record Baseline(ImmutableArray<BaselineEntry> Entries)
{
    /// <summary>The line that opens the entries, with the format version.</summary>
    public const string Header = "settinglint-baseline 1";

    /// <summary>The file name the documentation suggests.</summary>
    public const string SuggestedFileName = "settinglint.baseline";

    /// <summary>The text of a baseline of these findings, in a stable order so that rewriting it gives a small diff.</summary>
    public static string Write(IEnumerable<Finding> findings)
    {
        var sb = new StringBuilder();
        sb.Append("# SettingLint baseline: findings accepted as they stood when this file was written.\n");
        sb.Append("# 'settinglint check --baseline FILE' reports them as unchanged and fails only on findings not listed here.\n");
        sb.Append("# One entry a line: rule, file, key path, fingerprint (a hash of the three; line numbers are not used, so\n");
        sb.Append("# editing the lines around a finding keeps it matched). The comment above an entry is the finding's message.\n");
        sb.Append("# Delete an entry once its finding is fixed, or rewrite the file: settinglint baseline PATH --output FILE\n");
        sb.Append(Header).Append('\n');
        var ordered = findings
            .OrderBy(f => f.File, StringComparer.Ordinal)
            .ThenBy(f => f.KeyPath, StringComparer.Ordinal)
            .ThenBy(f => f.RuleId, StringComparer.Ordinal)
            .ThenBy(f => f.Message, StringComparer.Ordinal);
        foreach (var f in ordered)
        {
            sb.Append('\n');
            sb.Append("# ").Append(f.Level.Token()).Append(": ").Append(f.Message.ReplaceLineEndings(" ")).Append('\n');
            sb.Append(Token(f.RuleId)).Append(' ').Append(Token(f.File)).Append(' ').Append(Token(f.KeyPath)).Append(' ').Append(f.Fingerprint).Append('\n');
        }
        return sb.ToString();
    }

    /// <summary>Reads a baseline file's text; null with the problems when it is not a valid baseline.</summary>
    public static (Baseline? Baseline, ImmutableArray<BaselineProblem> Problems) Parse(string text)
    {
        var entries = ImmutableArray.CreateBuilder<BaselineEntry>();
        var problems = ImmutableArray.CreateBuilder<BaselineProblem>();
        var lines = text.ReplaceLineEndings("\n").Split('\n');
        var headerSeen = false;
        var comment = "";
        for (var i = 0; i < lines.Length; i++)
        {
            var line = lines[i].Trim();
            var lineNo = i + 1;
            if (line.Length == 0) { comment = ""; continue; }
            if (line[0] == '#') { comment = line[1..].Trim(); continue; }
            if (!headerSeen)
            {
                if (line != Header)
                {
                    problems.Add(new BaselineProblem(lineNo, $"This is not a SettingLint baseline: its first line that is not a comment must be '{Header}'."));
                    break;
                }
                headerSeen = true;
                continue;
            }
            var tokens = Tokens(line);
            if (tokens is not [var rule, var file, var keyPath, var fingerprint])
            {
                problems.Add(new BaselineProblem(lineNo, "A baseline entry is four values: rule, file, key path, fingerprint (a value with spaces in double quotes)."));
                continue;
            }
            if (!RuleId().IsMatch(rule))
            {
                problems.Add(new BaselineProblem(lineNo, $"'{rule}' is not a rule id (SLnnn, or a pack's prefix and three digits)."));
                continue;
            }
            if (fingerprint != Fingerprints.Of(file, rule, keyPath))
            {
                problems.Add(new BaselineProblem(lineNo, "The fingerprint does not match the entry's rule, file and key path; rewrite the baseline with 'settinglint baseline' rather than editing an entry."));
                continue;
            }
            entries.Add(new BaselineEntry(rule, file, keyPath, fingerprint, StripLevel(comment), lineNo));
            comment = "";
        }
        if (!headerSeen && problems.Count == 0)
        {
            problems.Add(new BaselineProblem(1, $"This is not a SettingLint baseline: the line '{Header}' is missing."));
        }
        return problems.Count > 0 ? (null, problems.ToImmutable()) : (new Baseline(entries.ToImmutable()), []);
    }

    /// <summary>
    /// Marks every finding new or unchanged (each entry matches one finding of its fingerprint) and lists the entries
    /// that matched nothing as absent, for files that were checked or no longer exist.
    /// </summary>
    /// <param name="result">The run's result.</param>
    /// <param name="baselineFile">The baseline's path relative to the root, for reports.</param>
    /// <param name="fileExists">Whether a root-relative file exists.</param>
    public CheckResult Apply(CheckResult result, string baselineFile, Func<string, bool> fileExists)
    {
        var remaining = Entries.GroupBy(e => e.Fingerprint, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => new Queue<BaselineEntry>(g), StringComparer.Ordinal);
        var findings = result.Findings.Select(f =>
        {
            var known = remaining.TryGetValue(f.Fingerprint, out var queue) && queue.TryDequeue(out _);
            return f with { BaselineState = known ? BaselineState.Unchanged : BaselineState.New };
        }).ToImmutableArray();
        var absent = remaining.Values.SelectMany(q => q)
            .Where(e => result.Files.Contains(e.File) || !fileExists(e.File))
            .OrderBy(e => e.Line)
            .Select(e => new AbsentResult(e.RuleId, e.File, e.KeyPath, e.Fingerprint, e.Message, e.Line))
            .ToImmutableArray();
        return result with { Findings = findings, Absent = absent, BaselineFile = baselineFile };
    }

    // "error: message" in the comment: the level is for the reader of the file, the message for the report.
    private static string StripLevel(string comment)
    {
        foreach (var level in (string[])["error: ", "warning: ", "note: "])
        {
            if (comment.StartsWith(level, StringComparison.Ordinal)) return comment[level.Length..];
        }
        return comment;
    }

    private static string Token(string value)
    {
        var plain = value.Length > 0 && value[0] != '#' && !value.Any(c => char.IsWhiteSpace(c) || c is '"' or '\\');
        if (plain) return value;
        return "\"" + value.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("\"", "\\\"", StringComparison.Ordinal) + "\"";
    }

    private static List<string>? Tokens(string line)
    {
        var tokens = new List<string>();
        var i = 0;
        while (i < line.Length)
        {
            if (char.IsWhiteSpace(line[i])) { i++; continue; }
            var sb = new StringBuilder();
            if (line[i] == '"')
            {
                i++;
                var closed = false;
                while (i < line.Length)
                {
                    var c = line[i++];
                    if (c == '\\' && i < line.Length) { sb.Append(line[i++]); continue; }
                    if (c == '"') { closed = true; break; }
                    sb.Append(c);
                }
                if (!closed) return null;
            }
            else
            {
                while (i < line.Length && !char.IsWhiteSpace(line[i])) sb.Append(line[i++]);
            }
            tokens.Add(sb.ToString());
        }
        return tokens;
    }

    // SLnnn, or a company pack's prefix and three digits (ACME101).
    [GeneratedRegex("^[A-Z]{2,8}[0-9]{3}$", RegexOptions.CultureInvariant)]
    private static partial Regex RuleId();
}
