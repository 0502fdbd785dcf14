using System.Globalization;
using System.Text;
using LaunchLogger.Archive.Board;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Pages;

/// <summary>The board as HTML: one table per class, ranked by the archive's own board
/// (<c>SessionArchive.Board</c>), each run's card a link away.</summary>
public static class BoardPage
{
    /// <summary>How a board is shown.</summary>
    /// <param name="Title">The heading, e.g. the event's name (plain text).</param>
    /// <param name="Request">What the board ranks by (for the choice form).</param>
    /// <param name="Units">The reader's units.</param>
    /// <param name="CardLink">The address of a run's card (already URL-safe), or null for none.</param>
    /// <param name="FormFields">Hidden fields the choice form carries along (event, access key), or
    /// null for no form (a printed board).</param>
    public sealed record Layout(string Title, BoardRequest Request, DisplayUnits Units, Func<long, string>? CardLink, IReadOnlyList<(string Name, string Value)>? FormFields);

    /// <summary>Appends the board as a <c>section</c> with id "board".</summary>
    public static void Append(StringBuilder html, BoardResult board, Layout layout, string? stamp = null)
    {
        ArgumentNullException.ThrowIfNull(html);
        ArgumentNullException.ThrowIfNull(board);
        ArgumentNullException.ThrowIfNull(layout);
        string convention = board.Convention switch { "standstill" => ", timed from standstill", "rollout" => ", timed after the rollout", _ => "" };
        html.Append("<section class=\"sheet\" id=\"board\"").Append(stamp is null ? "" : $" data-stamp=\"{HtmlPage.Encode(stamp)}\"").Append(">\n")
            .Append("<h1>").Append(HtmlPage.Encode(layout.Title)).Append("</h1>\n<p data-role=\"what\">")
            .Append(HtmlPage.Encode($"{board.Description}{convention}; {(board.BestPerDriver ? "each driver's best run" : "every run")}; verdicts accepted: {board.Accept}."))
            .Append("</p>\n");
        if (layout.FormFields is { } fields)
        {
            Choices(html, layout.Request, fields);
        }

        if (board.Sections.Count == 0)
        {
            html.Append("<p class=\"note\" data-role=\"empty\">No run has this figure yet.</p>\n");
        }

        foreach (BoardSection section in board.Sections)
        {
            html.Append("<div class=\"board-class\" data-class=\"").Append(HtmlPage.Encode(section.Class ?? "")).Append("\"><h2>Class ")
                .Append(HtmlPage.Encode(section.Class ?? "(none)")).Append("</h2>\n<table><thead><tr><th class=\"n\">Place</th><th>Driver</th><th>Car</th><th class=\"n\">")
                .Append(HtmlPage.Encode(board.Description)).Append("</th><th class=\"n\">±</th><th>Verdict</th><th class=\"n\">Runs</th><th>Card</th></tr></thead><tbody>\n");
            foreach (BoardRow row in section.Rows)
            {
                html.Append("<tr data-run=\"").Append(row.Run.ToString(CultureInfo.InvariantCulture)).Append("\"><td class=\"n\">").Append(row.Rank.ToString(CultureInfo.InvariantCulture))
                    .Append("</td><td>").Append(HtmlPage.Encode(row.Driver ?? "—")).Append("</td><td>").Append(HtmlPage.Encode(row.Car ?? "—"))
                    .Append("</td><td class=\"n\" data-role=\"value\">").Append(HtmlPage.Encode(Format.BoardValue(board.Unit, row.Value, layout.Units)))
                    .Append("</td><td class=\"n sigma\">").Append(HtmlPage.Encode(Format.BoardValue(board.Unit, row.Uncertainty, layout.Units, sigma: true)))
                    .Append("</td><td>").Append(HtmlPage.Encode(row.Verdict)).Append("</td><td class=\"n\">").Append(row.Runs.ToString(CultureInfo.InvariantCulture)).Append("</td><td>");
                AppendCardLink(html, row.Run, layout.CardLink);
                html.Append("</td></tr>\n");
            }

            html.Append("</tbody></table></div>\n");
        }

        if (board.NotCounted.Count > 0)
        {
            html.Append("<h2>Not counted</h2>\n<ul class=\"reasons\">\n");
            foreach (BoardRow row in board.NotCounted)
            {
                html.Append("<li data-run=\"").Append(row.Run.ToString(CultureInfo.InvariantCulture)).Append("\">")
                    .Append(HtmlPage.Encode($"{row.Driver ?? row.Car ?? "unassigned"} ({Format.BoardValue(board.Unit, row.Value, layout.Units)}): {row.Standing}: {row.StandingReason}")).Append(' ');
                AppendCardLink(html, row.Run, layout.CardLink);
                html.Append("</li>\n");
            }

            html.Append("</ul>\n");
        }

        if (board.LeftOutForVerdict > 0)
        {
            html.Append("<p class=\"note\">").Append(board.LeftOutForVerdict.ToString(CultureInfo.InvariantCulture))
                .Append(" run(s) with this figure left out for their verdict.</p>\n");
        }

        html.Append("<p class=\"note\">Ties: ").Append(HtmlPage.Encode(board.Ties)).Append(".</p>\n</section>\n");
    }

    private static void AppendCardLink(StringBuilder html, long run, Func<long, string>? link)
    {
        if (link is null)
        {
            html.Append("run ").Append(run.ToString(CultureInfo.InvariantCulture));
        }
        else
        {
            html.Append("<a href=\"").Append(HtmlPage.Encode(link(run))).Append("\">run ").Append(run.ToString(CultureInfo.InvariantCulture)).Append("</a>");
        }
    }

    private static void Choices(StringBuilder html, BoardRequest request, IReadOnlyList<(string Name, string Value)> fields)
    {
        html.Append("<nav><form method=\"get\" class=\"live\">Rank by <select name=\"figure\">");
        foreach (BoardFigure figure in BoardFigures.All)
        {
            html.Append("<option value=\"").Append(HtmlPage.Encode(figure.Code)).Append('"').Append(figure == request.Figure ? " selected" : "").Append('>')
                .Append(HtmlPage.Encode(figure.Description)).Append("</option>");
        }

        html.Append("</select> timed <select name=\"from\">")
            .Append(Option("standstill", "from standstill", request.Convention == Convention.Standstill))
            .Append(Option("rollout", "after the rollout", request.Convention == Convention.Rollout))
            .Append("</select> counting <select name=\"accept\">")
            .Append(Option("valid", "valid runs", request.Accept == Acceptance.Valid))
            .Append(Option("doubtful", "valid and doubtful runs", request.Accept == Acceptance.Doubtful))
            .Append(Option("all", "every run", request.Accept == Acceptance.All))
            .Append("</select> ");
        foreach ((string name, string value) in fields)
        {
            html.Append("<input type=\"hidden\" name=\"").Append(HtmlPage.Encode(name)).Append("\" value=\"").Append(HtmlPage.Encode(value)).Append("\">");
        }

        html.Append("<button type=\"submit\">Show</button></form></nav>\n");
    }

    private static string Option(string value, string text, bool selected) =>
        $"<option value=\"{value}\"{(selected ? " selected" : "")}>{HtmlPage.Encode(text)}</option>";
}
