using System.Xml;
using System.Xml.Linq;
using System.Xml.Schema;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;

namespace SettingLint.Reporting.Tests;

/// <summary>
/// The JUnit report against the JUnit XML schema as the CI servers read it. JUnit itself publishes no schema; the one
/// most servers follow is Jenkins' xunit plugin's junit-10.xsd (src/main/resources/org/jenkinsci/plugins/xunit/types/
/// model/xsd/junit-10.xsd, MIT), from Maven Surefire's reports. The schema below states the part of it our report
/// uses, in our own words: `testsuites` holding `testsuite`s (name, tests, failures and errors required); a
/// `testsuite` (its `file` attribute allowed) holding `testcase`s (name required, classname, time: no `file`, which
/// junit-10.xsd does not allow on a case); a `testcase` holding `failure`, `error`,
/// `skipped`, `system-out` and `system-err` (message and type attributes). Counts must match the elements.
/// </summary>
public sealed class JUnitReporterTests
{
    private const string Schema = """
        <xs:schema xmlns:xs="http://www.w3.org/2001/XMLSchema">
          <xs:complexType name="outcome" mixed="true">
            <xs:attribute name="type" type="xs:string"/>
            <xs:attribute name="message" type="xs:string"/>
          </xs:complexType>
          <xs:element name="testcase">
            <xs:complexType>
              <xs:choice minOccurs="0" maxOccurs="unbounded">
                <xs:element name="skipped" type="outcome"/>
                <xs:element name="error" type="outcome"/>
                <xs:element name="failure" type="outcome"/>
                <xs:element name="system-out" type="xs:string"/>
                <xs:element name="system-err" type="xs:string"/>
              </xs:choice>
              <xs:attribute name="name" type="xs:string" use="required"/>
              <xs:attribute name="classname" type="xs:string"/>
              <xs:attribute name="time" type="xs:string"/>
            </xs:complexType>
          </xs:element>
          <xs:element name="testsuite">
            <xs:complexType>
              <xs:choice minOccurs="0" maxOccurs="unbounded">
                <xs:element ref="testcase"/>
                <xs:element name="system-out" type="xs:string"/>
                <xs:element name="system-err" type="xs:string"/>
              </xs:choice>
              <xs:attribute name="name" type="xs:string" use="required"/>
              <xs:attribute name="tests" type="xs:nonNegativeInteger" use="required"/>
              <xs:attribute name="failures" type="xs:nonNegativeInteger" use="required"/>
              <xs:attribute name="errors" type="xs:nonNegativeInteger" use="required"/>
              <xs:attribute name="skipped" type="xs:nonNegativeInteger"/>
              <xs:attribute name="file" type="xs:string"/>
              <xs:attribute name="time" type="xs:string"/>
              <xs:attribute name="timestamp" type="xs:string"/>
            </xs:complexType>
          </xs:element>
          <xs:element name="testsuites">
            <xs:complexType>
              <xs:sequence>
                <xs:element ref="testsuite" minOccurs="0" maxOccurs="unbounded"/>
              </xs:sequence>
              <xs:attribute name="name" type="xs:string"/>
              <xs:attribute name="tests" type="xs:nonNegativeInteger"/>
              <xs:attribute name="failures" type="xs:nonNegativeInteger"/>
              <xs:attribute name="errors" type="xs:nonNegativeInteger"/>
              <xs:attribute name="time" type="xs:string"/>
            </xs:complexType>
          </xs:element>
        </xs:schema>
        """;

    /// <summary>The schema errors of a report, and the count attributes that do not match their elements.</summary>
    internal static List<string> Problems(string report)
    {
        var problems = new List<string>();
        var schemas = new XmlSchemaSet();
        using (var reader = XmlReader.Create(new StringReader(Schema))) schemas.Add(null, reader);
        var settings = new XmlReaderSettings { ValidationType = ValidationType.Schema, Schemas = schemas };
        settings.ValidationEventHandler += (_, e) => problems.Add(e.Severity + ": " + e.Message);
        using (var reader = XmlReader.Create(new StringReader(report), settings))
        {
            while (reader.Read()) { }
        }
        var doc = XDocument.Parse(report);
        foreach (var suite in doc.Descendants("testsuite"))
        {
            var cases = suite.Elements("testcase").ToList();
            if ((int?)suite.Attribute("tests") != cases.Count) problems.Add(suite.Attribute("name") + ": tests");
            if ((int?)suite.Attribute("failures") != cases.Count(c => c.Element("failure") is not null)) problems.Add(suite.Attribute("name") + ": failures");
            if ((int?)suite.Attribute("errors") != cases.Count(c => c.Element("error") is not null)) problems.Add(suite.Attribute("name") + ": errors");
        }
        var root = doc.Root!;
        if ((int?)root.Attribute("tests") is { } tests && tests != doc.Descendants("testcase").Count()) problems.Add("testsuites: tests");
        return problems;
    }

    private static CheckResult WithMotors(CheckResult result) => result with
    {
        Files = RunFiles.Of([], [("motors/K-201.yaml", "K-201", null), ("motors/P-101A.yaml", "P-101A", null), ("motors/P-102 spare.yaml", "P-102", null)]),
    };

    private static XDocument Render(CheckResult result, bool omitSuppressed = false)
    {
        var text = Samples.Render(new JUnitReporter(), result, Samples.Context(omitSuppressed: omitSuppressed));
        Assert.Empty(Problems(text));
        Assert.StartsWith("<?xml version=\"1.0\" encoding=\"utf-8\"?>", text, StringComparison.Ordinal);
        return XDocument.Parse(text);
    }

    [Fact]
    public void The_schema_check_refuses_a_report_a_server_would_not_read()
    {
        Assert.NotEmpty(Problems("""<testsuites><testsuite name="a" tests="1" failures="0"><testcase name="x"/></testsuite></testsuites>"""));
        Assert.NotEmpty(Problems("""<testsuites><testsuite name="a" tests="1" failures="0" errors="0"><testcase/></testsuite></testsuites>"""));
        Assert.NotEmpty(Problems("""<testsuites><testsuite name="a" tests="2" failures="0" errors="0"><testcase name="x"/></testsuite></testsuites>"""));
        Assert.NotEmpty(Problems("""<testsuites><testsuite name="a" tests="1" failures="0" errors="0"><testcase name="x"><failure/></testcase></testsuite></testsuites>"""));
        Assert.Empty(Problems("""<testsuites><testsuite name="a" tests="1" failures="1" errors="0"><testcase name="x"><failure message="m"/></testcase></testsuite></testsuites>"""));
    }

    [Fact]
    public void One_case_per_motor_and_rule_and_a_failure_for_each_finding_that_fails_the_gate()
    {
        var doc = Render(WithMotors(Samples.Result()));
        var suites = doc.Root!.Elements("testsuite").ToList();
        Assert.Equal(["K-201", "P-101A", "P-102"], suites.Select(s => (string)s.Attribute("name")!));
        Assert.All(suites, s => Assert.Equal(["SL112", "SL201", "SL305"], s.Elements("testcase").Select(c => ((string)c.Attribute("name")!).Split(' ')[0])));
        Assert.Equal(9, (int)doc.Root.Attribute("tests")!);

        // fail-on is warning: the SL201 error fails; the SL112 warning is accepted in the source; the SL305 note is below fail-on.
        var p101 = suites[1];
        Assert.Equal(1, (int)p101.Attribute("failures")!);
        var sl201 = p101.Elements("testcase").Single(c => ((string)c.Attribute("name")!).StartsWith("SL201 ", StringComparison.Ordinal));
        var failure = Assert.Single(sl201.Elements("failure"));
        Assert.Equal("SL201", (string)failure.Attribute("type")!);
        Assert.Contains("motors/P-101A.yaml:4:3 protection.50.pickup", failure.Value, StringComparison.Ordinal);
        Assert.Equal("P-101A", (string)sl201.Attribute("classname")!);
        var sl112 = p101.Elements("testcase").Single(c => ((string)c.Attribute("name")!).StartsWith("SL112 ", StringComparison.Ordinal));
        Assert.Null(sl112.Element("failure"));
        Assert.StartsWith("accepted in the source (accepted for the 2024 outage", sl112.Element("system-out")!.Value, StringComparison.Ordinal);

        var p102 = suites[2];
        Assert.Equal(0, (int)p102.Attribute("failures")!);
        Assert.StartsWith("note, below fail-on: motors/P-102 spare.yaml:12:7", p102.Descendants("system-out").Single().Value, StringComparison.Ordinal);
        Assert.Equal(1, (int)doc.Root.Attribute("failures")!);
    }

    [Fact]
    public void A_finding_in_a_file_that_is_not_a_motor_gets_a_suite_of_its_own_and_run_problems_are_errors()
    {
        var bus = new Finding(EngineRules.WrongType, Level.Error, "buses/b-1.yaml", new SourceSpan(3, 1, 3, 5), "nominal_voltage", "bad \u0001 value", System.Collections.Immutable.ImmutableSortedDictionary<string, FindingValue>.Empty);
        var result = WithMotors(Samples.Result(Samples.BadConfig)) with { Findings = [.. Samples.Result().Findings, bus] };
        var doc = Render(result);
        var suites = doc.Root!.Elements("testsuite").ToList();
        Assert.Equal("run", (string)suites[0].Attribute("name")!);
        Assert.Equal(1, (int)suites[0].Attribute("errors")!);
        Assert.Contains(".settinglint.yaml:3: unknown rule id SL999", suites[0].Descendants("error").Single().Value, StringComparison.Ordinal);
        var busSuite = suites.Single(s => (string)s.Attribute("name")! == "buses/b-1.yaml");
        var only = Assert.Single(busSuite.Elements("testcase"));
        // A control character in a message is not allowed in XML 1.0 (§2.2): it is shown as U+FFFD.
        Assert.Equal("bad \uFFFD value", (string)only.Element("failure")!.Attribute("message")!);
    }

    [Fact]
    public void Accepted_findings_can_be_left_out()
    {
        var doc = Render(WithMotors(Samples.Result()), omitSuppressed: true);
        Assert.DoesNotContain(doc.Descendants("system-out"), o => o.Value.Contains("accepted", StringComparison.Ordinal));
    }
}
