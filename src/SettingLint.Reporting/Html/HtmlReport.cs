using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Reporting.Svg;
using static SettingLint.Reporting.Svg.Markup;

namespace SettingLint.Reporting.Html;

/// <summary>
/// Writes the report as a folder: index.html (every motor with its counts and worst margin), one page per motor
/// (findings, plots, setting windows, margins, changes), the plots as standalone SVG files, and report.json.
/// </summary>
public static class HtmlReport
{
    /// <summary>The caution on every page and every plot.</summary>
    public const string Caution = SettingLint.Core.Findings.Caution.Text;

    /// <summary>The page of a motor, relative to the report folder.</summary>
    public static string PagePath(MotorReport motor) => "motors/" + motor.Slug + ".html";

    /// <summary>The standalone time-current plot of a motor, relative to the report folder.</summary>
    public static string TimeCurrentPath(MotorReport motor) => "svg/" + motor.Slug + "-time-current.svg";

    /// <summary>The standalone thermal-level plot of a motor, relative to the report folder.</summary>
    public static string ThermalLevelPath(MotorReport motor) => "svg/" + motor.Slug + "-thermal-level.svg";

    /// <summary>Every file of the report, by path relative to the report folder, in the order they are written.</summary>
    public static ImmutableArray<(string Path, string Content)> Render(ReportModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        var files = ImmutableArray.CreateBuilder<(string, string)>();
        files.Add(("index.html", Index(model)));
        foreach (var motor in model.Motors)
        {
            var tcc = TimeCurrentPlot.Render(motor.Plot, "tcc-" + motor.Slug, Caution);
            var level = ThermalLevelPlot.Render(motor.Plot, "level-" + motor.Slug, Caution);
            files.Add((PagePath(motor), MotorPage(model, motor, tcc, level)));
            files.Add((TimeCurrentPath(motor), Standalone(tcc)));
            if (level is not null) files.Add((ThermalLevelPath(motor), Standalone(level)));
        }
        files.Add(("report.json", ReportJson.Render(model)));
        return files.ToImmutable();
    }

    /// <summary>Writes the report into a folder (created when missing; files of an older report with the same names are replaced).</summary>
    public static ImmutableArray<string> Write(ReportModel model, string folder)
    {
        ArgumentNullException.ThrowIfNull(folder);
        var written = ImmutableArray.CreateBuilder<string>();
        var utf8 = new UTF8Encoding(false);
        foreach (var (path, content) in Render(model))
        {
            var full = Path.Combine(folder, path.Replace('/', Path.DirectorySeparatorChar));
            Directory.CreateDirectory(Path.GetDirectoryName(full)!);
            File.WriteAllText(full, content, utf8);
            written.Add(full);
        }
        return written.ToImmutable();
    }

    // A standalone SVG file is an XML document: it gets the declaration that the inline copy must not have.
    private static string Standalone(string svg) => "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" + svg;

    private static string Index(ReportModel model)
    {
        var r = model.Result;
        var summary = ReportSummary.Of(r);
        var sb = new StringBuilder();
        var rootName = Path.GetFileName(r.RepositoryRoot.TrimEnd('/', '\\'));
        sb.Append("<h1>Settings review <span class=\"sub\">").Append(Escape(rootName)).Append("</span></h1>\n");
        sb.Append("<p class=\"meta\">").Append(Escape(summary.ToSentence())).Append(". Near miss: passed, but inside ")
            .Append(Escape(ReportValues.Ratio(model.NearMiss).TrimStart('+'))).Append(" of a limit.");
        if (model.ChangedSince is { } rev) sb.Append(" Changes since <code>").Append(Escape(rev)).Append("</code>.");
        sb.Append("</p>\n");
        sb.Append("<div class=\"chips\">").Append(Chip(summary.Errors, "errors", "b-error")).Append(Chip(summary.Warnings, "warnings", "b-warning"))
            .Append(Chip(summary.Notes, "notes", "b-note")).Append(Chip(model.Motors.Sum(m => m.NearMisses), "near misses", "b-near"))
            .Append(Chip(summary.Suppressed, "suppressed", "b-passed"));
        if (summary.NotRun > 0) sb.Append(Chip(summary.NotRun, "checks not run for missing data", "b-notrun"));
        sb.Append("</div>\n");

        sb.Append("<h2 id=\"motors\">Motors</h2>\n<table class=\"motors\">\n<thead><tr><th>Motor</th><th>Title</th><th>Bus</th><th class=\"num\">Errors</th><th class=\"num\">Warnings</th>")
            .Append("<th class=\"num\">Notes</th><th class=\"num\">Near misses</th><th class=\"num\">Rules passed</th><th class=\"num\">Not run</th><th>Worst margin</th>");
        if (model.ChangedSince is not null) sb.Append("<th>Change</th>");
        sb.Append("</tr></thead>\n<tbody>\n");
        foreach (var m in model.Motors)
        {
            // Near misses are counted, not tinted: nearly every motor has some, and a tint on every row tells nothing.
            var rowClass = m.Count(Level.Error) > 0 ? " class=\"failed\"" : m.Count(Level.Warning) > 0 ? " class=\"near\"" : "";
            sb.Append("<tr").Append(rowClass).Append(" data-motor=\"").Append(Escape(m.Tag)).Append("\"><td><a href=\"").Append(Escape(PagePath(m))).Append("\">")
                .Append(Escape(m.Tag)).Append("</a><span class=\"was path\">").Append(Escape(m.File)).Append("</span></td>")
                .Append("<td>").Append(Escape(m.Title)).Append("</td><td>").Append(Escape(m.Bus ?? "(none)")).Append("</td>")
                .Append("<td class=\"num\">").Append(Int(m.Count(Level.Error))).Append("</td>")
                .Append("<td class=\"num\">").Append(Int(m.Count(Level.Warning))).Append("</td>")
                .Append("<td class=\"num\">").Append(Int(m.Count(Level.Note))).Append("</td>")
                .Append("<td class=\"num\">").Append(Int(m.NearMisses)).Append("</td>")
                .Append("<td class=\"num\">").Append(Int(m.Passed)).Append(" / ").Append(Int(m.Margins.Length)).Append("</td>")
                .Append("<td class=\"num").Append(m.NotRun.IsEmpty ? "" : " notrun").Append("\" title=\"").Append(Escape(string.Join("; ", m.NotRun.Select(n => n.RuleId + ": " + n.MissingText))))
                .Append("\">").Append(Int(m.NotRun.Length)).Append("</td>")
                .Append("<td>").Append(WorstText(m)).Append("</td>");
            if (model.ChangedSince is not null) sb.Append("<td>").Append(ChangeBadge(m.Change)).Append("</td>");
            sb.Append("</tr>\n");
        }
        sb.Append("</tbody>\n</table>\n");
        if (model.Motors.IsEmpty) sb.Append("<p>No motor files were found.</p>\n");
        else sb.Append("<p class=\"meta\">Worst margin: the failed or tightest rule at level error or warning (a motor with only notes shows its first note); every rule is on the motor's page.</p>\n");

        if (!model.RemovedMotors.IsEmpty)
        {
            sb.Append("<h2 id=\"removed\">Motors removed since <code>").Append(Escape(model.ChangedSince)).Append("</code></h2>\n<ul>\n");
            foreach (var m in model.RemovedMotors)
            {
                sb.Append("<li><span class=\"badge b-removed\">removed</span> ").Append(Escape(m.Tag)).Append(" <code>").Append(Escape(m.File)).Append("</code></li>\n");
            }
            sb.Append("</ul>\n");
        }

        var others = model.OtherFindings.ToList();
        if (others.Count > 0)
        {
            sb.Append("<h2 id=\"other-files\">Findings in other files</h2>\n");
            FindingsTable(sb, others, null, withFile: true);
        }
        if (!r.Notifications.IsEmpty)
        {
            sb.Append("<h2 id=\"notifications\">Notifications</h2>\n<ul>\n");
            foreach (var n in r.Notifications)
            {
                sb.Append("<li><span class=\"badge ").Append(n.Kind == NotificationKind.Internal ? "b-error\">internal error" : "b-warning\">configuration")
                    .Append("</span> ").Append(n.File is { } f ? "<code>" + Escape(f) + "</code> " : "").Append(Escape(n.Message)).Append("</li>\n");
            }
            sb.Append("</ul>\n");
        }
        sb.Append("<p class=\"meta\">Machine-readable: <a href=\"report.json\">report.json</a> (margins and setting windows of every motor).</p>\n");
        return HtmlPage.Render("Settings review: " + rootName, "", sb.ToString(), model.Tool, Caution);
    }

    private static string MotorPage(ReportModel model, MotorReport m, string tcc, string? level)
    {
        var sb = new StringBuilder();
        sb.Append("<h1>").Append(Escape(m.Tag));
        if (m.Title is { } t) sb.Append(" <span class=\"sub\">").Append(Escape(t)).Append("</span>");
        sb.Append("</h1>\n<p class=\"meta\"><code>").Append(Escape(m.File)).Append("</code> · bus ").Append(Escape(m.Bus ?? "(none)"))
            .Append(" · relay model ").Append(Escape(m.RelayModel ?? "(none)")).Append("</p>\n");
        sb.Append("<div class=\"chips\">").Append(Chip(m.Count(Level.Error), "errors", "b-error")).Append(Chip(m.Count(Level.Warning), "warnings", "b-warning"))
            .Append(Chip(m.Count(Level.Note), "notes", "b-note")).Append(Chip(m.NearMisses, "near misses", "b-near"))
            .Append(Chip(m.Passed, "of " + Int(m.Margins.Length) + " rules passed", "b-passed"));
        if (!m.NotRun.IsEmpty) sb.Append(Chip(m.NotRun.Length, "not run for missing data", "b-notrun"));
        if (m.Change is { } ch) sb.Append("<span class=\"chip\">").Append(ChangeBadge(ch)).Append(" since <code>").Append(Escape(model.ChangedSince)).Append("</code></span>");
        sb.Append("</div>\n");
        sb.Append("<nav class=\"toc\">");
        if (m.Change is not null) sb.Append("<a href=\"#changes\">Changes</a>");
        if (!m.NotRun.IsEmpty) sb.Append("<a href=\"#not-run\">Not run</a>");
        sb.Append("<a href=\"#findings\">Findings</a><a href=\"#plots\">Plots</a><a href=\"#windows\">Setting windows</a><a href=\"#margins\">Margins</a></nav>\n");

        if (m.Change is { } change) Changes(sb, model, m, change);

        NotRunSection(sb, model, m);

        sb.Append("<h2 id=\"findings\">Findings</h2>\n");
        if (m.Findings.IsEmpty) sb.Append("<p>No findings.</p>\n");
        else FindingsTable(sb, m.Findings, m.Change, withFile: false);

        sb.Append("<h2 id=\"plots\">Plots</h2>\n");
        sb.Append("<figure id=\"time-current\">\n").Append(tcc).Append("<figcaption>Time-current characteristic, log-log, current in primary amperes. Hover a line or point for its values. ")
            .Append("Standalone: <a href=\"../").Append(Escape(TimeCurrentPath(m))).Append("\">").Append(Escape(TimeCurrentPath(m))).Append("</a>.</figcaption>\n</figure>\n");
        if (level is not null)
        {
            sb.Append("<figure id=\"thermal-level\">\n").Append(level).Append("<figcaption>Thermal level of the IEC 60255-149 model through a cold and a hot start. ")
                .Append("Standalone: <a href=\"../").Append(Escape(ThermalLevelPath(m))).Append("\">").Append(Escape(ThermalLevelPath(m))).Append("</a>.</figcaption>\n</figure>\n");
        }
        else
        {
            sb.Append("<p>No thermal-level plot: the thermal element is off, or the full-load current, locked-rotor current or acceleration time is missing.</p>\n");
        }

        sb.Append("<h2 id=\"windows\">Setting windows</h2>\n");
        var shared = m.SharedWindows.ToList();
        if (shared.Count == 0)
        {
            sb.Append("<p>No setting is bounded by two or more rules here.</p>\n");
        }
        else
        {
            sb.Append("<p class=\"meta\">What the rules leave each setting that several of them bound, derived from their comparisons: the highest lower bound and the lowest upper bound.</p>\n");
            sb.Append("<table class=\"windows\">\n<thead><tr><th>Setting</th><th>At least / above</th><th>At most / below</th><th>Set</th><th>Status</th><th>Suggested</th></tr></thead>\n<tbody>\n");
            foreach (var w in shared)
            {
                var status = w.Window.IsEmpty ? "<span class=\"badge b-empty\">no room</span>" : w.Window.Holds ? "<span class=\"badge b-passed\">inside</span>" : "<span class=\"badge b-failed\">outside</span>";
                sb.Append("<tr").Append(w.Window.Holds ? "" : " class=\"failed\"").Append(" data-setting=\"").Append(Escape(w.Window.Setting)).Append("\"><td>")
                    .Append(Escape(w.Name)).Append("<span class=\"was\"><code>").Append(Escape(w.Window.Setting)).Append("</code></span></td><td>")
                    .Append(Escape(w.LowerText ?? "-")).Append("</td><td>").Append(Escape(w.UpperText ?? "-")).Append("</td><td class=\"num\">").Append(Escape(w.Set))
                    .Append("</td><td>").Append(status).Append("</td><td>").Append(FixOf(m, w.Window.Setting) is { } fix ? Suggested(fix) : "-").Append("</td></tr>\n");
            }
            sb.Append("</tbody>\n</table>\n<ul class=\"window-sentences\">\n");
            foreach (var w in shared)
            {
                sb.Append("<li>").Append(Escape(w.Sentence));
                if (FixOf(m, w.Window.Setting) is { } fix) sb.Append("; ").Append(Suggested(fix));
                sb.Append("</li>\n");
            }
            sb.Append("</ul>\n");
        }

        sb.Append("<h2 id=\"margins\">Margins</h2>\n");
        sb.Append("<p class=\"meta\">Every rule that applied: failures first, then tightest first. Margin is how far inside the limit (negative outside); near miss: inside ")
            .Append(Escape(ReportValues.Ratio(model.NearMiss).TrimStart('+'))).Append(" of the limit.</p>\n");
        if (m.Margins.IsEmpty)
        {
            sb.Append("<p>No rule applied to this motor.</p>\n");
        }
        else
        {
            sb.Append("<table class=\"margins\">\n<thead><tr><th>Status</th><th>Rule</th><th>Subject</th><th class=\"num\">Actual</th><th class=\"num\">Limit</th><th class=\"num\">Margin</th><th class=\"num\">Margin %</th></tr></thead>\n<tbody>\n");
            foreach (var row in m.Margins)
            {
                var changed = m.Change?.OutcomeOf(row.Key);
                var (cls, badge) = row.Status switch
                {
                    // A failed note is a point for the reviewer to judge, not an error: it is not tinted as one.
                    MarginStatus.Failed => (row.Outcome.Level == Level.Note ? " class=\"noted\"" : " class=\"failed\"",
                        "<span class=\"badge b-" + (row.Outcome.Level == Level.Error ? "failed" : row.Outcome.Level.Token()) + "\">" + row.Outcome.Level.Token() + "</span>"),
                    MarginStatus.NearMiss => (" class=\"near\"", "<span class=\"badge b-near\">near miss</span>"),
                    _ => ("", "<span class=\"badge b-passed\">pass</span>"),
                };
                if (changed is not null) badge += " <span class=\"badge b-changed\">changed</span>";
                sb.Append("<tr").Append(cls).Append(" data-rule=\"").Append(Escape(row.Outcome.RuleId)).Append("\" data-status=\"").Append(row.Status.ToString().ToLowerInvariant())
                    .Append("\"><td>").Append(badge).Append("</td><td><b>").Append(Escape(row.Outcome.RuleId)).Append("</b> ").Append(Escape(row.Title))
                    .Append("</td><td><code>").Append(Escape(row.Outcome.Subject)).Append("</code></td>")
                    .Append("<td class=\"num\">").Append(Cell(row.Actual, changed?.Old?.Actual)).Append("</td>")
                    .Append("<td class=\"num\">").Append(Cell(row.Limit, changed?.Old?.Limit)).Append("</td>")
                    .Append("<td class=\"num\">").Append(Cell(row.Margin, changed?.Old?.Margin)).Append("</td>")
                    .Append("<td class=\"num ratio\">").Append(Cell(row.Ratio, changed?.Old?.Ratio)).Append("</td></tr>\n");
                if (row.Message is { } msg)
                {
                    sb.Append("<tr").Append(cls).Append(" data-message-of=\"").Append(Escape(row.Outcome.RuleId)).Append("\"><td></td><td colspan=\"6\" class=\"message\">")
                        .Append(Escape(msg)).Append("</td></tr>\n");
                }
            }
            sb.Append("</tbody>\n</table>\n");
        }
        var links = " <a href=\"../index.html\">All motors</a>";
        return HtmlPage.Render(m.Tag + ": settings review", links, sb.ToString(), model.Tool, Caution);
    }

    // Before the findings: a motor with no findings must not read as checked where a rule could not run.
    private static void NotRunSection(StringBuilder sb, ReportModel model, MotorReport m)
    {
        if (m.NotRun.IsEmpty) return;
        sb.Append("<h2 id=\"not-run\">Checks not run for missing data</h2>\n");
        sb.Append("<p class=\"meta\">These rules apply to this motor but could not be evaluated, because the data they need is missing. ")
            .Append("Give the data, or know that these points are not checked.</p>\n");
        sb.Append("<table class=\"not-run\">\n<thead><tr><th>Rule</th><th>Level</th><th>Missing</th></tr></thead>\n<tbody>\n");
        var titles = model.Result.Rules.ToLookup(r => r.Id, r => r.Title, StringComparer.Ordinal);
        foreach (var n in m.NotRun)
        {
            sb.Append("<tr data-rule=\"").Append(Escape(n.RuleId)).Append("\"><td><b>").Append(Escape(n.RuleId)).Append("</b> ").Append(Escape(titles[n.RuleId].FirstOrDefault() ?? ""))
                .Append("</td><td>").Append(Escape(n.Level.Token())).Append("</td><td>")
                .Append(string.Join(", ", n.MissingPaths.Select(p => "<code>" + Escape(p) + "</code>"))).Append("</td></tr>\n");
        }
        sb.Append("</tbody>\n</table>\n");
    }

    private static void Changes(StringBuilder sb, ReportModel model, MotorReport m, MotorChange c)
    {
        sb.Append("<h2 id=\"changes\">Changes since <code>").Append(Escape(model.ChangedSince)).Append("</code></h2>\n");
        if (c.Kind == ChangeKind.Added) sb.Append("<p><span class=\"badge b-added\">added</span> This motor file is new since the revision.</p>\n");
        if (c.Kind == ChangeKind.Unchanged)
        {
            sb.Append("<p>Nothing changed for this motor: same settings, same outcomes, same findings.</p>\n");
            return;
        }
        if (!c.Settings.IsEmpty)
        {
            sb.Append("<table class=\"setting-changes\">\n<thead><tr><th>Value</th><th>Before</th><th>Now</th></tr></thead>\n<tbody>\n");
            foreach (var s in c.Settings)
            {
                sb.Append("<tr data-path=\"").Append(Escape(s.Path)).Append("\"><td><code>").Append(Escape(s.Path)).Append("</code></td><td>")
                    .Append(Escape(s.Old ?? "(absent)")).Append("</td><td><b>").Append(Escape(s.New ?? "(absent)")).Append("</b></td></tr>\n");
            }
            sb.Append("</tbody>\n</table>\n");
        }
        var fixes = m.Findings.Where(f => f.Fix is not null && f.Suppression is null).GroupBy(f => f.KeyPath, StringComparer.Ordinal).Select(g => g.First()).ToList();
        if (fixes.Count > 0)
        {
            sb.Append("<p>What <code>settinglint fix</code> would write, each value checked against every rule on its setting:</p>\n");
            sb.Append("<table class=\"fix-changes\">\n<thead><tr><th>Setting</th><th>Line</th><th>Now</th><th>Fix writes</th></tr></thead>\n<tbody>\n");
            foreach (var f in fixes)
            {
                var now = ValueNow(c, f.KeyPath);
                sb.Append("<tr data-path=\"").Append(Escape(f.KeyPath)).Append("\"><td><code>").Append(Escape(f.KeyPath)).Append("</code></td><td><code>")
                    .Append(Int(f.Fix!.Region.StartLine)).Append(':').Append(Int(f.Fix.Region.StartColumn)).Append("</code></td><td>").Append(Escape(now ?? f.Values.GetValueOrDefault("actual")?.Text ?? "-"))
                    .Append("</td><td>").Append(Suggested(f.Fix)).Append("</td></tr>\n");
            }
            sb.Append("</tbody>\n</table>\n");
        }
        if (!c.Outcomes.IsEmpty)
        {
            sb.Append("<table class=\"outcome-changes\">\n<thead><tr><th>Rule</th><th>Subject</th><th>Before</th><th class=\"num\">Actual</th><th class=\"num\">Limit</th><th class=\"num\">Margin</th>")
                .Append("<th>Now</th><th class=\"num\">Actual</th><th class=\"num\">Limit</th><th class=\"num\">Margin</th></tr></thead>\n<tbody>\n");
            foreach (var o in c.Outcomes)
            {
                var any = o.New ?? o.Old!;
                sb.Append("<tr data-rule=\"").Append(Escape(any.Outcome.RuleId)).Append("\"><td><b>").Append(Escape(any.Outcome.RuleId)).Append("</b></td><td><code>")
                    .Append(Escape(any.Outcome.Subject)).Append("</code></td>");
                Side(sb, o.Old);
                Side(sb, o.New);
                sb.Append("</tr>\n");
            }
            sb.Append("</tbody>\n</table>\n");
        }
        if (!c.Windows.IsEmpty)
        {
            sb.Append("<table class=\"window-changes\">\n<thead><tr><th>Setting window</th><th>Before</th><th>Now</th></tr></thead>\n<tbody>\n");
            foreach (var (setting, old, now) in c.Windows)
            {
                sb.Append("<tr><td><code>").Append(Escape(setting)).Append("</code></td><td>").Append(Escape(old ?? "(none)")).Append("</td><td>").Append(Escape(now ?? "(none)")).Append("</td></tr>\n");
            }
            sb.Append("</tbody>\n</table>\n");
        }
        if (!c.FixedFindings.IsEmpty)
        {
            sb.Append("<p>Findings gone since the revision:</p>\n<ul>\n");
            foreach (var f in c.FixedFindings)
            {
                sb.Append("<li><span class=\"badge b-fixed\">fixed</span> <b>").Append(Escape(f.RuleId)).Append("</b> ").Append(Escape(f.Message)).Append("</li>\n");
            }
            sb.Append("</ul>\n");
        }
        if (!c.NewFindings.IsEmpty) sb.Append("<p>").Append(Int(c.NewFindings.Length)).Append(" finding(s) are new since the revision; they are marked <span class=\"badge b-new\">new</span> below.</p>\n");
    }

    private static void Side(StringBuilder sb, MarginRow? row)
    {
        if (row is null)
        {
            sb.Append("<td>did not apply</td><td></td><td></td><td></td>");
            return;
        }
        var status = row.Status switch { MarginStatus.Failed => "b-failed\">fail", MarginStatus.NearMiss => "b-near\">near miss", _ => "b-passed\">pass" };
        sb.Append("<td><span class=\"badge ").Append(status).Append("</span></td><td class=\"num\">").Append(Escape(row.Actual)).Append("</td><td class=\"num\">").Append(Escape(row.Limit)).Append("</td><td class=\"num\">")
            .Append(Escape(row.Margin)).Append(row.Ratio.Length > 0 ? " (" + Escape(row.Ratio) + ")" : "").Append("</td>");
    }

    private static void FindingsTable(StringBuilder sb, IEnumerable<Finding> findings, MotorChange? change, bool withFile)
    {
        sb.Append("<table class=\"findings\">\n<thead><tr><th>Level</th><th>Rule</th><th>").Append(withFile ? "File" : "Line").Append("</th><th>Message</th></tr></thead>\n<tbody>\n");
        foreach (var f in findings)
        {
            var level = f.Suppression is not null ? "<span class=\"badge b-passed\">suppressed</span>" : "<span class=\"badge b-" + f.Level.Token() + "\">" + f.Level.Token() + "</span>";
            if (change?.IsNew(f) == true) level += " <span class=\"badge b-new\">new</span>";
            var where = withFile ? Escape(f.File) + ":" + Int(f.Span.StartLine) : Int(f.Span.StartLine) + ":" + Int(f.Span.StartColumn);
            sb.Append("<tr data-rule=\"").Append(Escape(f.RuleId)).Append("\"><td>").Append(level).Append("</td><td><b>").Append(Escape(f.RuleId)).Append("</b></td><td><code>")
                .Append(where).Append("</code></td><td>").Append(Escape(f.Message));
            if (f.Suppression is { } s) sb.Append("<span class=\"was\">Accepted: ").Append(Escape(s.Justification)).Append("</span>");
            if (f.Fix is { } fix) sb.Append(Suggested(fix));
            sb.Append("</td></tr>\n");
        }
        sb.Append("</tbody>\n</table>\n");
    }

    // A finding's checked value, as `check` shows it: what would be written, and the value primary and secondary.
    private static string Suggested(FindingFix fix) =>
        "<span class=\"suggested\" data-value=\"" + Escape(fix.Inserted) + "\">suggested: <b>" + Escape(fix.Inserted) + "</b>"
        + (fix.Shown.Length > 0 && fix.Shown != fix.Inserted ? " (" + Escape(fix.Shown) + ")" : "") + "</span>";

    private static FindingFix? FixOf(MotorReport m, string setting) =>
        m.Findings.FirstOrDefault(f => f.KeyPath == setting && f.Fix is not null && f.Suppression is null)?.Fix;

    private static string? ValueNow(MotorChange c, string path) => c.Settings.FirstOrDefault(s => s.Path == path)?.New;

    private static string Cell(string now, string? before) =>
        before is null || before == now ? Escape(now) : Escape(now) + "<span class=\"was\">was " + Escape(before.Length > 0 ? before : "-") + "</span>";

    private static string WorstText(MotorReport m) => m.Worst is not { } w ? "-"
        : (w.Ratio.Length > 0 ? Escape(w.Ratio) : w.Status == MarginStatus.Failed ? "fails" : "passes") + " <span class=\"was\">" + Escape(w.Outcome.RuleId + " " + ReportValues.SettingName(w.Outcome.Subject)) + "</span>";

    private static string ChangeBadge(MotorChange? c) => c?.Kind switch
    {
        ChangeKind.Added => "<span class=\"badge b-added\">added</span>",
        ChangeKind.Changed => "<span class=\"badge b-changed\">changed</span>",
        ChangeKind.Removed => "<span class=\"badge b-removed\">removed</span>",
        _ => "unchanged",
    };

    private static string Chip(int n, string label, string badge) =>
        "<span class=\"chip\"><b>" + Int(n) + "</b> <span class=\"badge " + badge + "\">" + Escape(label) + "</span></span>";
}
