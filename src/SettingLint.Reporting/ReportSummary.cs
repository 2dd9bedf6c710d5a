using SettingLint.Core.Findings;

namespace SettingLint.Reporting;

/// <summary>The counts every report's summary shows.</summary>
/// <param name="Errors">Unsuppressed findings at level error.</param>
/// <param name="Warnings">Unsuppressed findings at level warning.</param>
/// <param name="Notes">Unsuppressed findings at level note.</param>
/// <param name="Suppressed">Suppressed findings, whatever their level.</param>
/// <param name="Files">Setting files checked.</param>
/// <param name="Motors">Motors checked.</param>
/// <param name="ConfigurationErrors">Configuration notifications.</param>
/// <param name="InternalErrors">Internal-error notifications.</param>
public sealed record ReportSummary(
    int Errors,
    int Warnings,
    int Notes,
    int Suppressed,
    int Files,
    int Motors,
    int ConfigurationErrors,
    int InternalErrors)
{
    /// <summary>Rules that applied to a motor but were not evaluated because input data is missing.</summary>
    public int NotRun { get; init; }

    /// <summary>Counts the findings and notifications of a result.</summary>
    public static ReportSummary Of(CheckResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        int errors = 0, warnings = 0, notes = 0, suppressed = 0;
        foreach (var finding in result.Findings)
        {
            if (finding.Suppression is not null) { suppressed++; continue; }
            switch (finding.Level)
            {
                case Level.Error: errors++; break;
                case Level.Warning: warnings++; break;
                case Level.Note: notes++; break;
            }
        }
        var configuration = result.Notifications.Count(static n => n.Kind == NotificationKind.Configuration);
        var internalErrors = result.Notifications.Count(static n => n.Kind == NotificationKind.Internal);
        return new ReportSummary(errors, warnings, notes, suppressed, result.FilesChecked, result.MotorCount, configuration, internalErrors)
        {
            NotRun = result.NotRun.Length,
        };
    }

    /// <summary>One line for people, such as "3 errors, 1 warning, 0 notes in 12 files (7 motors); 1 suppressed; 2 checks not run for missing data".</summary>
    public string ToSentence()
    {
        var text = $"{Count(Errors, "error")}, {Count(Warnings, "warning")}, {Count(Notes, "note")} in {Count(Files, "file")} ({Count(Motors, "motor")})";
        if (Suppressed > 0) text += "; " + Suppressed.ToString(System.Globalization.CultureInfo.InvariantCulture) + " suppressed";
        if (ConfigurationErrors > 0) text += "; " + Count(ConfigurationErrors, "configuration error");
        if (InternalErrors > 0) text += "; " + Count(InternalErrors, "internal error");
        // Clean must not silently mean "not checked": the count is there whenever a rule could not run.
        if (NotRun > 0) text += "; " + Count(NotRun, "check") + " not run for missing data";
        return text;
    }

    private static string Count(int n, string noun) =>
        n.ToString(System.Globalization.CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? "" : "s");
}
