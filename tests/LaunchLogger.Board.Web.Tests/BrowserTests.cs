using System.Globalization;
using System.Text.Json.Nodes;
using LaunchLogger.Tests.Shared;
using PuppeteerSharp;
using static LaunchLogger.Tests.Shared.PageFixtures;

namespace LaunchLogger.Board.Web.Tests;

/// <summary>The card and the live board as a real browser shows them (Debian's chromium, headless).</summary>
public class BrowserTests
{
    private const string ShownNumbers = "Array.from(document.querySelectorAll('article.card [data-src]')).map(e => [e.getAttribute('data-src'), e.textContent])";

    private static readonly WaitForFunctionOptions Patiently = new() { Timeout = 120_000, PollingInterval = 100 };

    private static async Task<List<PageNumbers.Shown>> Numbers(IPage page) =>
        (await page.EvaluateExpressionAsync<string[][]>(ShownNumbers)).Select(p => new PageNumbers.Shown(p[0], p[1])).ToList();

    [ChromiumFact]
    public async Task A_card_renders_cleanly_and_shows_the_report_documents_numbers()
    {
        using var temp = new Scratch();
        string log = WriteLog(temp.Path, "hatch.log", Hatch);
        string card = temp.File("card.html");
        CliOk("card", log, "--out", card);
        JsonNode report = ReportJson(log);

        await using IBrowser browser = await HeadlessChromium.LaunchAsync(temp.File("profile"));
        await using IPage page = await browser.NewPageAsync();
        List<string> errors = HeadlessChromium.WatchErrors(page);
        await page.SetViewportAsync(new ViewPortOptions { Width = 1000, Height = 1400 });
        await page.GoToAsync(new Uri(card).AbsoluteUri, WaitUntilNavigation.Load);

        List<PageNumbers.Shown> numbers = await Numbers(page);
        Assert.True(PageNumbers.CheckAll(numbers, report["runs"]![0]!, report, imperial: true) > 40);
        Assert.Equal(report["runs"]![0]!["verdict"]!["level"]!.GetValue<string>(), await page.EvaluateExpressionAsync<string>("document.querySelector('[data-role=verdict]').textContent"));

        // Laid out as meant: the plots fill the card's width, and the print stylesheet is in force when printing.
        Assert.True(await page.EvaluateExpressionAsync<double>("document.querySelector('figure.plot svg').getBoundingClientRect().width") > 500);
        await page.EmulateMediaTypeAsync(PuppeteerSharp.Media.MediaType.Print);
        Assert.Equal("none", await page.EvaluateExpressionAsync<string>("getComputedStyle(document.querySelector('.card')).borderTopStyle"));
        await page.EmulateMediaTypeAsync(PuppeteerSharp.Media.MediaType.Screen);

        HeadlessChromium.AssertNotBlank(await page.ScreenshotDataAsync(new ScreenshotOptions { FullPage = true }));
        Assert.Empty(errors);
    }

    [ChromiumFact]
    public async Task The_board_redraws_itself_when_a_run_is_filed_and_each_card_is_a_click_away()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        CliOk("driver", "add", "Ash Fenn", "--archive", archive);
        await using BoardServer server = await BoardServerTests.Start(archive);
        await using IBrowser browser = await HeadlessChromium.LaunchAsync(temp.File("profile"));
        await using IPage page = await browser.NewPageAsync();
        List<string> errors = HeadlessChromium.WatchErrors(page);
        await page.SetViewportAsync(new ViewPortOptions { Width = 1000, Height = 900 });
        await page.GoToAsync(server.BoardAddress.AbsoluteUri, WaitUntilNavigation.Load);
        await page.WaitForFunctionAsync("() => document.documentElement.getAttribute('data-live') === 'open'", Patiently);
        Assert.Equal(1, await page.EvaluateExpressionAsync<int>("document.querySelectorAll('#board tr[data-run]').length"));

        // A second driver's run is filed while the page is open: the board redraws itself.
        CliOk("import", WriteLog(temp.Path, "hatch2.log", SecondHatch), "--event", HostileEvent, "--car", HostileCar, "--driver", "Ash Fenn", "--archive", archive);
        await page.WaitForFunctionAsync("() => document.querySelectorAll('#board tr[data-run]').length === 2", Patiently);
        Assert.True(await page.EvaluateExpressionAsync<int>("Number(document.documentElement.getAttribute('data-redrawn'))") >= 1);

        // The board's figures are the archive's (run list --json), each row by its run.
        JsonNode runs = JsonNode.Parse(CliOk("run", "list", "--json", "--archive", archive))!;
        string[][] rows = await page.EvaluateExpressionAsync<string[][]>(
            "Array.from(document.querySelectorAll('#board tr[data-run]')).map(r => [r.getAttribute('data-run'), r.querySelector('[data-role=value]').textContent])");
        Assert.Equal(2, rows.Length);
        foreach (string[] row in rows)
        {
            JsonNode run = runs.AsArray().Single(r => r!["run"]!.GetValue<long>().ToString(CultureInfo.InvariantCulture) == row[0])!;
            (double si, double half) = PageNumbers.ToSi(row[1], imperial: true);
            Assert.InRange(si, run["0_60mph_standstill_s"]!.GetValue<double>() - half, run["0_60mph_standstill_s"]!.GetValue<double>() + half);
        }

        HeadlessChromium.AssertNotBlank(await page.ScreenshotDataAsync(new ScreenshotOptions { FullPage = true }), minimumColours: 20, minimumInkShare: 0.01);

        // One click to a run's card, which shows that run's filed report entry.
        string runId = rows[0][0];
        await Task.WhenAll(page.WaitForNavigationAsync(new NavigationOptions { Timeout = 120_000 }), page.ClickAsync($"#board tr[data-run='{runId}'] a"));
        Assert.EndsWith("/run/" + runId, page.Url, StringComparison.Ordinal);
        JsonNode shown = JsonNode.Parse(CliOk("run", "show", runId, "--json", "--archive", archive))!;
        Assert.True(PageNumbers.CheckAll(await Numbers(page), shown["report"]!, null, imperial: true) > 30);
        HeadlessChromium.AssertNotBlank(await page.ScreenshotDataAsync(new ScreenshotOptions { FullPage = true }));
        Assert.Empty(errors);
    }
}
