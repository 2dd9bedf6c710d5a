using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>Renders the result of one run in one output format.</summary>
public interface IReporter
{
    /// <summary>Writes the whole report for a result to the output, ending with a newline.</summary>
    void Write(CheckResult result, ReportContext context, TextWriter output);
}
