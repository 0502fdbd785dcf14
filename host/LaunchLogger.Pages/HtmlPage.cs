using System.Globalization;
using System.Net;
using System.Text;

namespace LaunchLogger.Pages;

/// <summary>The shell every page shares: one self-contained HTML5 document with its stylesheet
/// inline (screen and print), the safety caution in the footer, and nothing fetched from
/// elsewhere. Everything that comes from outside the program (names from the archive, file
/// names, reasons) goes through <see cref="Encode"/>.</summary>
public static class HtmlPage
{
    /// <summary>The caution every page ends with (README, "Safety").</summary>
    public const string SafetyCaution =
        "Closed courses only — never on public roads. Follow the venue's rules, the organiser's instructions and the law. " +
        "Keep the box's wiring clear of brake lines, hoses and ABS sensors and fuse it; secure the box so it cannot fly loose; " +
        "nobody operates it or reads a screen while the car is moving.";

    /// <summary>Text made safe for HTML element content and quoted attribute values.</summary>
    public static string Encode(string? text) => WebUtility.HtmlEncode(text ?? "");

    /// <summary>A whole page.</summary>
    /// <param name="title">The document title (plain text; encoded here).</param>
    /// <param name="body">The body's inner HTML, already encoded.</param>
    /// <param name="footerNote">Plain text for the footer beside the caution (encoded here).</param>
    /// <param name="script">An optional inline script (the live board's); null for static pages.</param>
    public static string Document(string title, string body, string footerNote, string? script = null)
    {
        var html = new StringBuilder(body.Length + 8192);
        html.Append(Head(title)).Append(body).Append(Foot(footerNote, script));
        return html.ToString();
    }

    /// <summary>A page's start, up to and including <c>&lt;body&gt;</c>: with <see cref="Foot"/>,
    /// a page written piece by piece (a long one is never held whole), the same as <see cref="Document"/>.</summary>
    /// <param name="title">The document title (plain text; encoded here).</param>
    public static string Head(string title) =>
        new StringBuilder(Stylesheet.Length + 512)
            .Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<meta name=\"generator\" content=\"launchlogger\">\n")
            .Append("<link rel=\"icon\" href=\"data:,\">\n")
            .Append("<title>").Append(Encode(title)).Append("</title>\n")
            .Append("<style>\n").Append(Stylesheet).Append("</style>\n</head>\n<body>\n")
            .ToString();

    /// <summary>A page's end after its body: the footer with the safety caution, the script, the closing tags.</summary>
    /// <param name="footerNote">Plain text for the footer beside the caution (encoded here).</param>
    /// <param name="script">An optional inline script (the live board's); null for static pages.</param>
    public static string Foot(string footerNote, string? script = null)
    {
        var html = new StringBuilder(1024);
        html.Append("<footer class=\"page-foot\"><p class=\"caution\"><strong>Safety.</strong> ").Append(Encode(SafetyCaution)).Append("</p>")
            .Append("<p class=\"made\">").Append(Encode(footerNote)).Append("</p></footer>\n");
        if (script is not null)
        {
            html.Append("<script>\n").Append(script).Append("\n</script>\n");
        }

        html.Append("</body>\n</html>\n");
        return html.ToString();
    }

    /// <summary>An invariant-culture number.</summary>
    public static string Number(double value, string format) => value.ToString(format, CultureInfo.InvariantCulture);

    /// <summary>The stylesheet. Screen: a sheet of cards on a grey desk. Print: black on white,
    /// 12 mm margins, each card from a new page, tables and plots never split; every block is
    /// at most 186 mm wide, which fits both A4 (210 mm wide) and US Letter (215.9 mm) less the
    /// margins without scaling; the paper is the one chosen in the print dialogue.</summary>
    public const string Stylesheet =
        """
        :root { --ink: #1d232b; --muted: #5c6773; --rule: #c9d1da; --paper: #ffffff; --desk: #eef1f4;
                --ok: #1f6f43; --warn: #8a5a00; --bad: #a32020; --accent: #24508f; }
        * { box-sizing: border-box; }
        body { margin: 0; padding: 16px; background: var(--desk); color: var(--ink);
               font: 14px/1.45 "DejaVu Sans", "Liberation Sans", Arial, sans-serif; }
        h1 { font-size: 20px; margin: 0 0 4px; }
        h2 { font-size: 15px; margin: 14px 0 6px; border-bottom: 1px solid var(--rule); padding-bottom: 2px; }
        h3 { font-size: 13px; margin: 10px 0 4px; }
        p { margin: 4px 0; }
        a { color: var(--accent); }
        .sheet, .card { max-width: 186mm; margin: 0 auto 16px; background: var(--paper); padding: 14px 18px;
                        border: 1px solid var(--rule); border-radius: 6px; }
        .ident { display: flex; flex-wrap: wrap; justify-content: space-between; gap: 8px; align-items: baseline; }
        .ident .who { font-size: 13px; color: var(--muted); }
        .badge { display: inline-block; padding: 2px 10px; border-radius: 12px; font-weight: bold; border: 2px solid currentColor; }
        .badge.valid { color: var(--ok); } .badge.doubtful { color: var(--warn); } .badge.invalid, .badge.failed { color: var(--bad); }
        table { border-collapse: collapse; width: 100%; margin: 4px 0 8px; font-variant-numeric: tabular-nums; }
        th, td { padding: 3px 6px; border-bottom: 1px solid var(--rule); text-align: left; vertical-align: top; }
        th { font-size: 12px; color: var(--muted); font-weight: 600; }
        td.n, th.n { text-align: right; white-space: nowrap; }
        .sigma { color: var(--muted); font-size: 12px; }
        .twin th.conv { border-bottom: 2px solid var(--ink); }
        .facts { display: grid; grid-template-columns: max-content 1fr; gap: 2px 14px; margin: 4px 0 8px; }
        .facts dt { color: var(--muted); } .facts dd { margin: 0; }
        ul.reasons { margin: 4px 0 8px; padding-left: 20px; }
        ul.reasons li.invalid { color: var(--bad); } ul.reasons li.doubtful { color: var(--warn); }
        .code { font-family: "DejaVu Sans Mono", monospace; font-size: 11px; color: var(--muted); }
        figure.plot { margin: 8px 0; } figure.plot svg { width: 100%; height: auto; display: block; }
        figure.plot.missing { border: 1px dashed var(--rule); padding: 10px; color: var(--muted); font-size: 12px; }
        .note { color: var(--muted); font-size: 12px; }
        .board-class { margin-bottom: 14px; } .board-class td:last-child { white-space: nowrap; }
        .live { font-size: 12px; color: var(--muted); }
        .page-foot { max-width: 186mm; margin: 8px auto; font-size: 11px; color: var(--muted); }
        .page-foot .caution { color: var(--ink); }
        @page { size: auto; margin: 12mm; }
        @media print {
          body { background: #fff; padding: 0; font-size: 10.5pt; }
          .sheet, .card { border: none; border-radius: 0; padding: 0; margin: 0; max-width: 186mm; }
          .card { break-before: page; break-inside: avoid; }
          table, .facts, figure.plot { break-inside: avoid; }
          figure.plot svg { max-height: 70mm; }
          a { color: inherit; text-decoration: none; }
          .live, nav { display: none; }
          .badge { border-width: 1.5pt; }
        }
        """;
}
