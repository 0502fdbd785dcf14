using System.Text.Json.Nodes;
using AngleSharp.Dom;
using AngleSharp.Html.Dom;
using AngleSharp.Html.Parser;
using LaunchLogger.Tests.Shared;
using static LaunchLogger.Tests.Shared.PageFixtures;

namespace LaunchLogger.Pages.Tests;

public class CardPageTests
{
    private static IHtmlDocument Parse(string path) => new HtmlParser().ParseDocument(File.ReadAllText(path));

    private static List<PageNumbers.Shown> Numbers(IElement card) =>
        card.QuerySelectorAll("[data-src]").Select(e => new PageNumbers.Shown(e.GetAttribute("data-src")!, e.TextContent)).ToList();

    private static JsonNode RunEntry(JsonNode document, IElement card) =>
        document["runs"]!.AsArray().Single(r => r!["index"]!.GetValue<int>().ToString(System.Globalization.CultureInfo.InvariantCulture) == card.GetAttribute("data-index"))!;

    [Theory]
    [InlineData("imperial")]
    [InlineData("metric")]
    public void A_card_from_a_log_shows_the_report_documents_numbers(string units)
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        string page = temp.File("card.html");
        CliOk("card", log, "--out", page, "--units", units, "--weather", "18.5,1008,62");
        JsonNode report = JsonNode.Parse(CliOk("report", log, "--json", "--weather", "18.5,1008,62"))!;

        IHtmlDocument html = Parse(page);
        IElement card = Assert.Single(html.QuerySelectorAll("article.card"));
        JsonNode run = RunEntry(report, card);
        int checkedNumbers = PageNumbers.CheckAll(Numbers(card), run, report, imperial: units == "imperial");

        // Every interval and mark of the report is on the card under both conventions, and the
        // corrections and the box are there too.
        int figures = run["speed_intervals"]!.AsArray().Count + run["distance_marks"]!.AsArray().Count;
        Assert.True(checkedNumbers > 2 * figures, $"only {checkedNumbers} numbers checked");
        Assert.Contains(Numbers(card), n => n.Path.EndsWith("from_rollout_s", StringComparison.Ordinal));
        Assert.Contains(Numbers(card), n => n.Path.StartsWith("corrections/", StringComparison.Ordinal));
        Assert.Contains(Numbers(card), n => n.Path == "/weather/density_kg_per_m3");
        Assert.Contains(Numbers(card), n => n.Path == "box/pulses_per_revolution");
        Assert.Contains(Numbers(card), n => n.Path == "braking/stopping_distance_m");
        Assert.Equal(run["verdict"]!["level"]!.GetValue<string>(), card.QuerySelector("[data-role=verdict]")!.TextContent);
        Assert.Equal(["From standstill", "After rollout"], card.QuerySelector("table[data-role=speed_intervals]")!.QuerySelectorAll("th.conv").Select(t => t.TextContent));

        // The run's trace, its start close up and its stop are drawn inline.
        Assert.Equal(3, card.QuerySelectorAll("figure.plot svg").Length);
    }

    [Fact]
    public void The_number_check_catches_a_figure_one_digit_off()
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        CliOk("card", log, "--out", temp.File("card.html"));
        JsonNode report = ReportJson(log);
        IElement card = Parse(temp.File("card.html")).QuerySelector("article.card")!;
        JsonNode run = RunEntry(report, card);
        PageNumbers.CheckAll(Numbers(card), run, report, imperial: true);

        // 0-60 mph moved by 2 ms (two units of the last digit shown): the check must fail.
        JsonNode interval = run["speed_intervals"]!.AsArray().First(i => i!["label"]!.GetValue<string>() == "0-60 mph")!;
        interval["from_standstill_s"] = interval["from_standstill_s"]!.GetValue<double>() + 0.002;
        Assert.ThrowsAny<Xunit.Sdk.XunitException>(() => PageNumbers.CheckAll(Numbers(card), run, report, imperial: true));
    }

    [Fact]
    public void A_card_from_a_saved_report_document_shows_the_same_numbers_as_one_from_the_log()
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        string json = temp.File("report.json");
        File.WriteAllText(json, CliOk("report", log, "--json"));
        CliOk("card", "--report-json", json, "--out", temp.File("from-json.html"));
        CliOk("card", log, "--out", temp.File("from-log.html"));
        List<PageNumbers.Shown> fromJson = Numbers(Parse(temp.File("from-json.html")).QuerySelector("article.card")!);
        List<PageNumbers.Shown> fromLog = Numbers(Parse(temp.File("from-log.html")).QuerySelector("article.card")!);
        Assert.NotEmpty(fromJson);
        Assert.Equal(fromLog, fromJson);
    }

    [Fact]
    public void An_archived_runs_card_encodes_every_name_and_shows_the_filed_report_entry()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        string page = temp.File("card.html");
        CliOk("card", "--archived", "1", "--archive", archive, "--out", page);
        string raw = File.ReadAllText(page);
        IHtmlDocument html = Parse(page);

        // Markup in names shows as text: no element of theirs, every name readable as typed.
        Assert.Empty(html.QuerySelectorAll("script"));
        Assert.Empty(html.QuerySelectorAll("img, b, i, u"));
        Assert.DoesNotContain("<script>alert", raw, StringComparison.Ordinal);
        IElement card = Assert.Single(html.QuerySelectorAll("article.card"));
        string who = card.QuerySelector("[data-role=who]")!.TextContent;
        Assert.Contains(HostileDriver, who, StringComparison.Ordinal);
        Assert.Contains(HostileCar, who, StringComparison.Ordinal);
        Assert.Contains(HostileClass, who, StringComparison.Ordinal);
        Assert.Contains(HostileEvent, card.QuerySelector("[data-role=where]")!.TextContent, StringComparison.Ordinal);
        Assert.Contains(HostileEvent, html.Title, StringComparison.Ordinal);

        // The numbers are the archive's current result for the run (what `run show --json` gives).
        JsonNode shown = JsonNode.Parse(CliOk("run", "show", "1", "--json", "--archive", archive))!;
        Assert.True(PageNumbers.CheckAll(Numbers(card), shown["report"]!, null, imperial: true) > 30);
    }

    [Fact]
    public void The_event_results_hold_the_board_per_class_and_every_runs_card()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch), WriteLog(temp.Path, "hatch2.log", SecondHatch));
        string page = temp.File("results.html");
        CliOk("results", "--event", HostileEvent, "--archive", archive, "--out", page);
        IHtmlDocument html = Parse(page);
        Assert.Empty(html.QuerySelectorAll("script, img"));
        Assert.Equal(2, html.QuerySelectorAll("article.card").Length);
        IElement board = html.QuerySelector("#board")!;
        IElement section = Assert.Single(board.QuerySelectorAll(".board-class"));
        Assert.Equal(HostileClass, section.GetAttribute("data-class"));

        // The board's value is the driver's best 0-60 mph from standstill among the filed runs.
        JsonNode runs = JsonNode.Parse(CliOk("run", "list", "--json", "--archive", archive))!;
        double best = runs.AsArray().Where(r => r!["verdict"]!.GetValue<string>() == "valid").Min(r => r!["0_60mph_standstill_s"]!.GetValue<double>());
        string shown = section.QuerySelector("[data-role=value]")!.TextContent;
        (double si, double half) = PageNumbers.ToSi(shown, imperial: true);
        Assert.InRange(si, best - half, best + half);

        // Each link on the board leads to a card in the same file.
        foreach (IElement link in board.QuerySelectorAll("a[href]"))
        {
            string target = link.GetAttribute("href")!;
            Assert.StartsWith("#run-", target, StringComparison.Ordinal);
            Assert.NotNull(html.GetElementById(target[1..])?.QuerySelector("article.card"));
        }
    }

    [Fact]
    public void Every_page_is_self_contained_with_a_print_stylesheet()
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        string archive = HostileArchive(temp.Path, log);
        CliOk("card", log, "--out", temp.File("card.html"));
        CliOk("results", "--event", HostileEvent, "--archive", archive, "--out", temp.File("results.html"));
        foreach (string page in new[] { "card.html", "results.html" })
        {
            IHtmlDocument html = Parse(temp.File(page));
            string css = string.Concat(html.QuerySelectorAll("style").Select(s => s.TextContent));
            Assert.Contains("@page", css, StringComparison.Ordinal);
            Assert.Contains("@media print", css, StringComparison.Ordinal);
            Assert.DoesNotContain("@import", css, StringComparison.Ordinal);
            Assert.Empty(html.QuerySelectorAll("link[rel=stylesheet], script[src], iframe, object, embed"));
            foreach (IElement e in html.QuerySelectorAll("*"))
            {
                foreach (string name in new[] { "src", "href", "xlink:href", "action" })
                {
                    string? value = e.GetAttribute(name);
                    Assert.True(value is null || value.StartsWith('#') || value.StartsWith("data:", StringComparison.Ordinal),
                        $"{page}: <{e.LocalName} {name}=\"{value}\"> points outside the file");
                }
            }

            // url(...) in styles and SVG only ever names something inside the file.
            string raw = File.ReadAllText(temp.File(page));
            foreach (System.Text.RegularExpressions.Match m in System.Text.RegularExpressions.Regex.Matches(raw, @"url\(\s*['""]?([^'"")]*)"))
            {
                Assert.True(m.Groups[1].Value.StartsWith('#') || m.Groups[1].Value.StartsWith("data:", StringComparison.Ordinal), $"{page}: {m.Value}");
            }
        }
    }

    [Fact]
    public void The_card_verb_refuses_unclear_sources_and_never_creates_an_archive()
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        Assert.Equal(3, Launch("card", "--out", temp.File("x.html")).Code);
        Assert.Equal(3, Launch("card", log, "--archived", "1", "--out", temp.File("x.html")).Code);
        Assert.Equal(3, Launch("card", log, "--index", "5", "--out", temp.File("x.html")).Code);
        string missing = temp.File("none.db");
        Assert.Equal(2, Launch("card", "--archived", "1", "--archive", missing, "--out", temp.File("x.html")).Code);
        Assert.Equal(2, Launch("results", "--event", "Nope", "--archive", missing, "--out", temp.File("x.html")).Code);
        Assert.False(File.Exists(missing));
        Assert.False(File.Exists(temp.File("x.html")));
    }
}
