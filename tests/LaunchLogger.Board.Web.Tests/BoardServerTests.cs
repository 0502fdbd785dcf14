using System.Net;
using System.Security.Cryptography;
using System.Text.Json.Nodes;
using AngleSharp.Dom;
using AngleSharp.Html.Dom;
using AngleSharp.Html.Parser;
using LaunchLogger.Archive;
using LaunchLogger.Tests.Shared;
using static LaunchLogger.Tests.Shared.PageFixtures;

namespace LaunchLogger.Board.Web.Tests;

public class BoardServerTests
{
    internal static Task<BoardServer> Start(string archive, bool lan = false) => BoardServer.StartAsync(new BoardServerOptions
    {
        ArchivePath = archive,
        Port = 0,
        Lan = lan,
        ToolVersion = "test",
        Poll = TimeSpan.FromMilliseconds(100),
        Heartbeat = TimeSpan.FromSeconds(1),
    });

    private static IHtmlDocument Parse(string html) => new HtmlParser().ParseDocument(html);

    [Fact]
    public async Task The_board_and_each_runs_card_are_served_read_only_on_localhost()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        byte[] before = SHA256.HashData(File.ReadAllBytes(archive));
        await using (BoardServer server = await Start(archive))
        {
            Assert.Equal("127.0.0.1", server.Address.Host);
            Assert.NotEqual(0, server.Address.Port);
            Assert.Null(server.Key);
            using var client = new HttpClient { BaseAddress = server.Address };

            HttpResponseMessage board = await client.GetAsync("/");
            Assert.Equal(HttpStatusCode.OK, board.StatusCode);
            Assert.Equal("text/html", board.Content.Headers.ContentType!.MediaType);
            IHtmlDocument page = Parse(await board.Content.ReadAsStringAsync());
            Assert.Empty(page.QuerySelectorAll("img"));
            IElement row = Assert.Single(page.QuerySelectorAll("#board tr[data-run]"));
            Assert.Contains(HostileDriver, row.TextContent, StringComparison.Ordinal);
            Assert.Equal(HostileClass, page.QuerySelector(".board-class")!.GetAttribute("data-class"));
            string link = row.QuerySelector("a")!.GetAttribute("href")!;
            Assert.Equal("/run/1", link);

            // One click away: the run's card, its numbers the archive's report entry.
            IHtmlDocument card = Parse(await client.GetStringAsync(link));
            IElement article = Assert.Single(card.QuerySelectorAll("article.card"));
            JsonNode shown = JsonNode.Parse(CliOk("run", "show", "1", "--json", "--archive", archive))!;
            var numbers = article.QuerySelectorAll("[data-src]").Select(e => new PageNumbers.Shown(e.GetAttribute("data-src")!, e.TextContent));
            Assert.True(PageNumbers.CheckAll(numbers, shown["report"]!, null, imperial: true) > 30);
            Assert.Equal(3, article.QuerySelectorAll("figure.plot svg").Length);

            // Read-only: nothing but GET; unknown runs and pages are 404.
            foreach (HttpMethod method in new[] { HttpMethod.Post, HttpMethod.Put, HttpMethod.Delete, HttpMethod.Patch })
            {
                HttpResponseMessage refused = await client.SendAsync(new HttpRequestMessage(method, "/"));
                Assert.Equal(HttpStatusCode.MethodNotAllowed, refused.StatusCode);
            }

            Assert.Equal(HttpStatusCode.NotFound, (await client.GetAsync("/run/999")).StatusCode);
            Assert.Equal(HttpStatusCode.BadRequest, (await client.GetAsync("/?figure=nonsense")).StatusCode);
        }

        Assert.Equal(before, SHA256.HashData(File.ReadAllBytes(archive)));
    }

    [Fact]
    public async Task The_update_stream_announces_a_run_filed_while_it_is_open()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        await using BoardServer server = await Start(archive);
        using var client = new HttpClient { BaseAddress = server.Address, Timeout = Timeout.InfiniteTimeSpan };
        using var giveUp = new CancellationTokenSource(TimeSpan.FromMinutes(2));
        using HttpResponseMessage response = await client.GetAsync("/updates", HttpCompletionOption.ResponseHeadersRead, giveUp.Token);
        Assert.Equal("text/event-stream", response.Content.Headers.ContentType!.MediaType);
        using var reader = new StreamReader(await response.Content.ReadAsStreamAsync(giveUp.Token));
        await ReadUntil(reader, line => line.Length == 0, giveUp.Token);

        CliOk("import", WriteLog(temp.Path, "hatch2.log", SecondHatch), "--event", HostileEvent, "--car", HostileCar, "--driver", HostileDriver, "--archive", archive);
        string data = await ReadUntil(reader, line => line.StartsWith("data: ", StringComparison.Ordinal), giveUp.Token, after: "event: archive");
        Assert.False(giveUp.IsCancellationRequested);
        Assert.NotEmpty(data);

        // The board now counts the driver's two runs.
        IHtmlDocument page = Parse(await client.GetStringAsync("/"));
        IElement row = Assert.Single(page.QuerySelectorAll("#board tr[data-run]"));
        Assert.Equal("2", row.Children[6].TextContent);
    }

    /// <summary>Reads lines until one matches (after a line equal to <paramref name="after"/>, when given).</summary>
    private static async Task<string> ReadUntil(StreamReader reader, Func<string, bool> match, CancellationToken cancel, string? after = null)
    {
        bool armed = after is null;
        while (true)
        {
            string? line = await reader.ReadLineAsync(cancel);
            Assert.True(line is not null, "the update stream ended");
            if (armed && match(line!))
            {
                return line!;
            }

            armed |= line == after;
        }
    }

    [Fact]
    public async Task On_the_LAN_every_request_needs_the_start_up_key()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        await using BoardServer server = await Start(archive, lan: true);
        string key = Assert.IsType<string>(server.Key);
        Assert.Equal(32, key.Length);
        using var client = new HttpClient { BaseAddress = server.Address };
        Assert.Equal(HttpStatusCode.Unauthorized, (await client.GetAsync("/")).StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, (await client.GetAsync("/run/1")).StatusCode);
        Assert.Equal(HttpStatusCode.Unauthorized, (await client.GetAsync("/updates")).StatusCode);
        Assert.Equal(HttpStatusCode.Forbidden, (await client.GetAsync("/?key=" + new string('0', 32))).StatusCode);
        Assert.Equal(HttpStatusCode.Forbidden, (await client.GetAsync("/?key=" + key[..31])).StatusCode);

        HttpResponseMessage withKey = await client.GetAsync("/?key=" + key);
        Assert.Equal(HttpStatusCode.OK, withKey.StatusCode);
        var request = new HttpRequestMessage(HttpMethod.Get, "/run/1");
        request.Headers.Add(BoardServer.KeyHeader, key);
        Assert.Equal(HttpStatusCode.OK, (await client.SendAsync(request)).StatusCode);

        // The page's links carry the key on, so a browser on the LAN can click through.
        IHtmlDocument page = Parse(await withKey.Content.ReadAsStringAsync());
        Assert.Equal("/run/1?key=" + key, page.QuerySelector("#board a")!.GetAttribute("href"));
        Assert.Equal(key, page.QuerySelector("input[name=key]")!.GetAttribute("value"));
        Assert.Equal("/?key=" + key, server.BoardAddress.PathAndQuery);
    }

    [Fact]
    public async Task A_missing_archive_is_refused_and_not_created()
    {
        using var temp = new Scratch();
        string missing = temp.File("none.db");
        await Assert.ThrowsAsync<ArchiveException>(() => Start(missing));
        Assert.False(File.Exists(missing));
    }
}
