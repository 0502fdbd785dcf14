using System.Text;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Pages;

/// <summary>Numbers as the pages show them: formatted as the command line formats them
/// (<see cref="Format"/>), each in a span whose <c>data-src</c> names the report document's field
/// it shows (a path of JSON names and indexes, relative to the run's entry, or from the
/// document's root when it starts with "/"), so a reader — or a test — can trace every number on
/// a page back to <c>report --json</c>.</summary>
internal static class Cells
{
    /// <summary>A missing value.</summary>
    public const string Dash = "—";

    /// <summary>A number's span.</summary>
    public static string Span(string path, string text, string? cssClass = null) =>
        $"<span{(cssClass is null ? "" : $" class=\"{cssClass}\"")} data-src=\"{HtmlPage.Encode(path)}\">{HtmlPage.Encode(text)}</span>";

    /// <summary>A duration with its σ in milliseconds, or a dash.</summary>
    public static string Seconds(string path, double? seconds, string sigmaPath, double? sigma) => seconds is not { } s
        ? Dash
        : Span(path, Format.Seconds(s)) + (sigma is { } u ? " " + Span(sigmaPath, "± " + Format.Milliseconds(u), "sigma") : "");

    /// <summary>A speed in the reader's unit, with its σ when given.</summary>
    public static string Speed(string path, double? mps, DisplayUnits units, string? sigmaPath = null, double? sigma = null) => mps is null
        ? Dash
        : Span(path, Format.Speed(mps, units)) + (sigma is not null && sigmaPath is not null ? " " + Span(sigmaPath, Format.SpeedSigma(sigma, units), "sigma") : "");

    /// <summary>A distance in the reader's unit, with its σ when given.</summary>
    public static string Distance(string path, double? metres, DisplayUnits units, string? sigmaPath = null, double? sigma = null) => metres is not { } m
        ? Dash
        : Span(path, Format.Distance(m, units)) + (sigma is { } u && sigmaPath is not null ? " " + Span(sigmaPath, "± " + Format.Distance(u, units), "sigma") : "");

    /// <summary>An acceleration in m/s² and g.</summary>
    public static string Accel(string path, double? mps2) => mps2 is null ? Dash : Span(path, Format.Accel(mps2));

    /// <summary>Appends a table row of already-made cells; the first is a heading cell.</summary>
    public static void Row(StringBuilder html, string head, params string[] cells)
    {
        html.Append("<tr><th scope=\"row\">").Append(head).Append("</th>");
        foreach (string cell in cells)
        {
            html.Append("<td class=\"n\">").Append(cell).Append("</td>");
        }

        html.Append("</tr>\n");
    }

    /// <summary>Appends one fact of a definition list (both parts already HTML).</summary>
    public static void Fact(StringBuilder html, string term, string value) =>
        html.Append("<dt>").Append(term).Append("</dt><dd>").Append(value).Append("</dd>\n");
}
