using System.Text;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Pages;

/// <summary>An event's results in one file: the event, the board per class, then every run's
/// card (each starts a new printed page).</summary>
public static class EventSheet
{
    /// <summary>The page for <paramref name="eventName"/>, ranked as <paramref name="request"/>
    /// asks (its filter's event is set here).</summary>
    /// <exception cref="ArchiveException">No such event.</exception>
    public static string Page(SessionArchive archive, string eventName, BoardRequest request, DisplayUnits units, string toolVersion, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(archive);
        ArgumentNullException.ThrowIfNull(request);
        var facts = archive.EventFacts(eventName);
        request = request with { Filter = request.Filter with { Event = facts.Name } };
        BoardResult board = archive.Board(request);
        IReadOnlyList<long> runs = archive.RunIds(new RunFilter { Event = facts.Name });
        var html = new StringBuilder(65536);
        html.Append("<header class=\"sheet\" id=\"event\"><h1>").Append(HtmlPage.Encode(facts.Name)).Append("</h1>\n<dl class=\"facts\">\n");
        Cells.Fact(html, "Date", HtmlPage.Encode(facts.Date));
        Cells.Fact(html, "Venue", HtmlPage.Encode(facts.Venue ?? "not given") + (facts.Surface is null ? "" : ", " + HtmlPage.Encode(facts.Surface)));
        Cells.Fact(html, "Weather", facts.Weather is null ? "not given" : HtmlPage.Encode(facts.Weather) + " (°C, hPa, % RH)");
        Cells.Fact(html, "Runs filed", runs.Count.ToString(System.Globalization.CultureInfo.InvariantCulture));
        html.Append("</dl>\n<p class=\"note\">Every card below gives each figure twice: timed from standstill and after the rollout. ± is one standard deviation.</p></header>\n");
        BoardPage.Append(html, board, new BoardPage.Layout($"Board: {facts.Name}", request, units, run => $"#run-{run}", null));
        foreach (long runId in runs)
        {
            cancel.ThrowIfCancellationRequested();
            CardInput? card = ArchiveCards.Card(archive, runId, units, toolVersion, out _, cancel);
            html.Append("<div id=\"run-").Append(runId).Append("\">");
            if (card is null)
            {
                html.Append(ArchiveCards.FailedCard(archive.FiledRun(runId)));
            }
            else
            {
                RunCard.Append(html, card);
            }

            html.Append("</div>\n");
        }

        return HtmlPage.Document($"Results: {facts.Name}", html.ToString(), RunCard.FootNote(toolVersion));
    }
}
