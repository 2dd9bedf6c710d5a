using System.Text;
using static SettingLint.Reporting.Svg.Markup;

namespace SettingLint.Reporting.Html;

/// <summary>The frame every page of the report shares: inline style, header, the caution, footer. No scripts, fonts or network assets.</summary>
internal static class HtmlPage
{
    // Our own restrained style: system fonts, a slate header, status colours that stay readable in print.
    private const string Style = """
        :root { --ink: #1d2733; --muted: #5b6573; --line: #d8dde3; --paper: #fbfaf7; --panel: #ffffff; --accent: #24536e;
          --fail: #b3261e; --fail-bg: #fbe9e7; --near: #8a5a00; --near-bg: #fff3d6; --pass: #2e7d4f; --pass-bg: #e6f4ea;
          --note: #3b5b7a; --note-bg: #e8eef5; }
        * { box-sizing: border-box; }
        html { background: var(--paper); color: var(--ink); }
        body { margin: 0; font: 14px/1.45 system-ui, -apple-system, "Segoe UI", Roboto, Helvetica, Arial, sans-serif; }
        header.bar { background: var(--ink); color: #f3f5f7; padding: 10px 24px; display: flex; gap: 18px; align-items: baseline; }
        header.bar .brand { font-weight: 700; letter-spacing: .04em; }
        header.bar a { color: #cfe3f1; }
        main { max-width: 1080px; margin: 0 auto; padding: 16px 24px 40px; }
        h1 { font-size: 24px; margin: 18px 0 4px; }
        h1 .sub { font-weight: 400; color: var(--muted); font-size: 18px; }
        h2 { font-size: 18px; margin: 28px 0 8px; padding-bottom: 4px; border-bottom: 2px solid var(--line); }
        p.meta { color: var(--muted); margin: 2px 0 12px; }
        a { color: var(--accent); }
        code { font: 12px/1.3 ui-monospace, "SFMono-Regular", Menlo, Consolas, monospace; background: #eef1f4; padding: 1px 4px; border-radius: 3px; }
        .caution { background: #fff7e0; border-left: 5px solid #c98a00; padding: 8px 12px; margin: 12px 0; color: #4a3700; }
        .chips { display: flex; flex-wrap: wrap; gap: 8px; margin: 10px 0; }
        .chip { border: 1px solid var(--line); background: var(--panel); border-radius: 14px; padding: 3px 12px; }
        .chip b { font-size: 15px; }
        table { border-collapse: collapse; width: 100%; background: var(--panel); margin: 6px 0 12px; }
        th, td { text-align: left; padding: 5px 8px; border-bottom: 1px solid var(--line); vertical-align: top; }
        th { background: #eef1f4; font-weight: 600; font-size: 13px; }
        td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
        td.ratio, th.ratio { white-space: nowrap; }
        td.message { color: var(--muted); font-size: 13px; padding-top: 0; }
        tr:has(+ tr[data-message-of]) td { border-bottom: none; }
        tr.failed td { background: var(--fail-bg); }
        tr.near td { background: var(--near-bg); }
        .badge { display: inline-block; border-radius: 3px; padding: 0 6px; font-size: 12px; font-weight: 600; white-space: nowrap; }
        .b-error, .b-failed { background: var(--fail); color: #fff; }
        .b-warning, .b-near { background: #e0a100; color: #2b1d00; }
        .b-note { background: var(--note-bg); color: var(--note); }
        .b-passed { background: var(--pass-bg); color: var(--pass); }
        .b-changed, .b-new { background: #24536e; color: #fff; }
        .b-fixed { background: var(--pass-bg); color: var(--pass); }
        .b-added { background: #4b3a8f; color: #fff; }
        .b-removed, .b-empty { background: #5b6573; color: #fff; }
        .b-notrun { background: #fff; color: #6a4a00; border: 1px dashed #6a4a00; }
        td.notrun { color: #6a4a00; font-weight: 600; }
        .was { color: var(--muted); font-size: 12px; display: block; }
        .suggested { display: block; font-size: 12px; }
        .path { white-space: nowrap; }
        figure { margin: 12px 0 20px; background: var(--panel); border: 1px solid var(--line); padding: 8px; overflow-x: auto; }
        figure svg { display: block; max-width: 100%; height: auto; }
        figcaption { color: var(--muted); font-size: 13px; margin-top: 4px; }
        nav.toc { font-size: 13px; margin: 8px 0; }
        nav.toc a { margin-right: 12px; }
        footer { max-width: 1080px; margin: 0 auto; padding: 12px 24px 28px; color: var(--muted); font-size: 12px; border-top: 1px solid var(--line); }
        @media print { header.bar { background: none; color: var(--ink); } figure { break-inside: avoid; } }
        """;

    /// <summary>A whole page: head with the inline style, header bar, caution, the body given, footer with the caution again.</summary>
    public static string Render(string title, string headerLinks, string body, ToolInfo tool, string caution)
    {
        var sb = new StringBuilder(body.Length + 8192);
        sb.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<meta name=\"generator\" content=\"").Append(Escape(tool.Name + " " + tool.Version)).Append("\">\n")
            .Append("<title>").Append(Escape(title)).Append("</title>\n<style>\n").Append(Style).Append("\n</style>\n</head>\n<body>\n")
            .Append("<header class=\"bar\"><span class=\"brand\">").Append(Escape(tool.Name)).Append("</span><span>settings review report</span>")
            .Append(headerLinks).Append("</header>\n<main>\n")
            .Append("<aside class=\"caution\" role=\"note\"><strong>Caution.</strong> ").Append(Escape(caution)).Append("</aside>\n")
            .Append(body)
            .Append("</main>\n<footer>Made by ").Append(Escape(tool.Name + " " + tool.Version)).Append(" from the setting files; values in SI units, currents in primary amperes unless marked sec. ")
            .Append(Escape(caution)).Append("</footer>\n</body>\n</html>\n");
        return sb.ToString();
    }
}
