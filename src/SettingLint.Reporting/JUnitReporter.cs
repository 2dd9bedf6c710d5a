using System.Globalization;
using System.Text;
using System.Xml;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>
/// JUnit XML, which most CI servers show as a test report: one test suite per motor file with one test case per rule
/// (passed, or a failure for each finding that fails the gate), then a suite for each other file with findings (a bus,
/// a relay model, a file that does not load) with a case per rule that fired there. Findings that do not fail the
/// gate (below fail-on, in the baseline, accepted in the source) are listed in the case's system-out, so they stay
/// visible without turning the case red. Problems of the run are errors in a first suite named "run".
/// </summary>
public sealed class JUnitReporter : IReporter
{
    private static readonly XmlWriterSettings Settings = new()
    {
        Indent = true,
        IndentChars = "  ",
        NewLineChars = "\n",
        Encoding = new UTF8Encoding(false),
        OmitXmlDeclaration = false,
    };

    /// <inheritdoc />
    public void Write(CheckResult result, ReportContext context, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(context);
        ArgumentNullException.ThrowIfNull(output);
        var suites = Suites(result, context);
        var text = new StringWriterUtf8();
        using (var xml = XmlWriter.Create(text, Settings))
        {
            xml.WriteStartDocument();
            xml.WriteStartElement("testsuites");
            xml.WriteAttributeString("name", context.Tool.Name);
            xml.WriteAttributeString("tests", Number(suites.Sum(s => s.Cases.Count)));
            xml.WriteAttributeString("failures", Number(suites.Sum(s => s.Cases.Count(c => c.Failures.Count > 0))));
            xml.WriteAttributeString("errors", Number(suites.Sum(s => s.Cases.Count(c => c.Error is not null))));
            foreach (var suite in suites) WriteSuite(xml, suite);
            xml.WriteEndElement();
            xml.WriteEndDocument();
        }
        output.Write(text.ToString());
        output.Write('\n');
    }

    private sealed record Case(string ClassName, string Name, List<Finding> Failures, List<string> Out, string? Error = null);

    private sealed record Suite(string Name, string? File, List<Case> Cases);

    private static List<Suite> Suites(CheckResult result, ReportContext context)
    {
        var suites = new List<Suite>();
        if (!result.Notifications.IsEmpty)
        {
            var run = new Suite("run", null, []);
            foreach (var n in result.Notifications)
            {
                var kind = n.Kind == NotificationKind.Internal ? "internal error" : "configuration error";
                var where = n.File is { } f ? f + (n.Span is { } s ? ":" + Number(s.StartLine) : "") + ": " : "";
                run.Cases.Add(new Case("run", kind + (n.File is { } file ? " in " + file : ""), [], [], where + n.Message));
            }
            suites.Add(run);
        }

        var byFile = result.Findings
            .Where(f => !(context.OmitSuppressed && f.Suppression is not null))
            .GroupBy(f => f.File, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => g.ToList(), StringComparer.Ordinal);
        var titles = result.Rules.ToDictionary(r => r.Id, r => r.Title, StringComparer.Ordinal);
        string CaseName(string id) => titles.TryGetValue(id, out var title) ? id + " " + title : id;

        var motorFiles = new HashSet<string>(StringComparer.Ordinal);
        for (var m = 0; m < result.Files.MotorCount; m++)
        {
            var (file, tag) = (result.Files.MotorFile(m), result.Files.MotorName(m));
            motorFiles.Add(file);
            var mine = byFile.GetValueOrDefault(file) ?? [];
            var suite = new Suite(tag, file, []);
            // Every rule of the run, and any other rule that fired on the file (an engine rule outside the list).
            var ids = result.Rules.Select(r => r.Id).Concat(mine.Select(f => f.RuleId)).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal);
            foreach (var id in ids) suite.Cases.Add(MakeCase(result, tag, CaseName(id), mine.Where(f => f.RuleId == id)));
            suites.Add(suite);
        }
        foreach (var (file, findings) in byFile.Where(kv => !motorFiles.Contains(kv.Key)).OrderBy(kv => kv.Key, StringComparer.Ordinal))
        {
            var suite = new Suite(file, file, []);
            foreach (var group in findings.GroupBy(f => f.RuleId, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal))
            {
                suite.Cases.Add(MakeCase(result, file, CaseName(group.Key), group));
            }
            suites.Add(suite);
        }
        return suites;
    }

    private static Case MakeCase(CheckResult result, string className, string name, IEnumerable<Finding> findings)
    {
        var c = new Case(className, name, [], []);
        foreach (var f in findings)
        {
            if (result.Fails(f)) c.Failures.Add(f);
            else c.Out.Add(Why(f) + ": " + Line(f));
        }
        return c;
    }

    private static string Why(Finding f) =>
        f.Suppression is { } s ? "accepted in the source (" + s.Justification + ")"
        : f.BaselineState == BaselineState.Unchanged ? "in the baseline"
        : f.RuleId == EngineRules.GateChange ? "change to the gate, for the reviewer"
        : f.Level.Token() + ", below fail-on";

    private static string Line(Finding f) =>
        f.File + ":" + Number(f.Span.StartLine) + ":" + Number(f.Span.StartColumn) + (f.KeyPath.Length > 0 ? " " + f.KeyPath : "") + ": " + f.Message;

    private static void WriteSuite(XmlWriter xml, Suite suite)
    {
        xml.WriteStartElement("testsuite");
        xml.WriteAttributeString("name", suite.Name);
        xml.WriteAttributeString("tests", Number(suite.Cases.Count));
        xml.WriteAttributeString("failures", Number(suite.Cases.Count(c => c.Failures.Count > 0)));
        xml.WriteAttributeString("errors", Number(suite.Cases.Count(c => c.Error is not null)));
        xml.WriteAttributeString("skipped", "0");
        if (suite.File is { } file) xml.WriteAttributeString("file", file);
        foreach (var c in suite.Cases)
        {
            xml.WriteStartElement("testcase");
            xml.WriteAttributeString("name", c.Name);
            xml.WriteAttributeString("classname", c.ClassName);
            // No `file` on a test case: junit-10.xsd allows it on the suite only, which carries it.
            foreach (var failure in c.Failures)
            {
                xml.WriteStartElement("failure");
                xml.WriteAttributeString("type", failure.RuleId);
                xml.WriteAttributeString("message", Clean(failure.Message));
                xml.WriteString(Clean(failure.Level.Token() + " " + Line(failure)));
                xml.WriteEndElement();
            }
            if (c.Error is { } error)
            {
                xml.WriteStartElement("error");
                xml.WriteAttributeString("message", Clean(error));
                xml.WriteString(Clean(error));
                xml.WriteEndElement();
            }
            if (c.Out.Count > 0) xml.WriteElementString("system-out", Clean(string.Join("\n", c.Out)));
            xml.WriteEndElement();
        }
        xml.WriteEndElement();
    }

    // XML 1.0 §2.2 admits no control characters but tab, line feed and carriage return; a message quoting a broken
    // file may hold one, which is shown as U+FFFD rather than making the report unreadable.
    private static string Clean(string text)
    {
        if (text.All(XmlConvert.IsXmlChar)) return text;
        var b = new StringBuilder(text.Length);
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1])) { b.Append(c).Append(text[++i]); continue; }
            b.Append(XmlConvert.IsXmlChar(c) ? c : '\uFFFD');
        }
        return b.ToString();
    }

    private static string Number(int n) => n.ToString(CultureInfo.InvariantCulture);

    // A StringWriter reports UTF-16; the declaration must say UTF-8, the encoding the report is written in.
    private sealed class StringWriterUtf8 : StringWriter
    {
        public StringWriterUtf8() : base(CultureInfo.InvariantCulture) { }

        public override Encoding Encoding => new UTF8Encoding(false);
    }
}
