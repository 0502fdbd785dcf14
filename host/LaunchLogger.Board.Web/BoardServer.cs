using System.Net;
using System.Security.Cryptography;
using System.Text;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Records;
using LaunchLogger.Pages;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Primitives;

namespace LaunchLogger.Board.Web;

/// <summary>The live board: a small read-only web server over one archive.</summary>
/// <remarks>
/// <para>Pages: <c>/</c> the board per class (query: <c>event</c>, <c>figure</c>, <c>from</c>,
/// <c>accept</c>, as the board verb's options), <c>/run/ID</c> a run's card, <c>/updates</c> a
/// server-sent event stream that sends an <c>archive</c> event whenever the archive changes
/// (the board page's script listens and redraws the board).</para>
/// <para>Read-only: the archive is opened read-only, and any method but GET and HEAD is
/// refused (405). On the LAN every request must carry the start-up key, as the query
/// parameter <c>key</c> or the header <c>X-LaunchLogger-Key</c>: without one 401, with a
/// wrong one 403.</para>
/// </remarks>
public sealed class BoardServer : IAsyncDisposable
{
    /// <summary>The query parameter that carries the key.</summary>
    public const string KeyParameter = "key";

    /// <summary>The header that may carry the key instead.</summary>
    public const string KeyHeader = "X-LaunchLogger-Key";

    private readonly WebApplication app;
    private readonly ArchiveWatcher watcher;
    private readonly CancellationTokenSource stopping = new();
    private readonly Task watching;

    private BoardServer(WebApplication app, ArchiveWatcher watcher, Uri address, string? key)
    {
        this.app = app;
        this.watcher = watcher;
        Address = address;
        Key = key;
        watching = watcher.RunAsync(stopping.Token);
    }

    /// <summary>Where the server listens: 127.0.0.1 and the real port (also when 0 was asked
    /// for); on the LAN, every interface at that port.</summary>
    public Uri Address { get; }

    /// <summary>The key every request must carry on the LAN; null on localhost.</summary>
    public string? Key { get; }

    /// <summary>The board's address with the key when one is needed.</summary>
    public Uri BoardAddress => Key is null ? Address : new Uri(Address, "/?" + KeyParameter + "=" + Key);

    /// <summary>Opens the archive read-only and starts listening.</summary>
    /// <exception cref="ArchiveException">The archive cannot be read.</exception>
    /// <exception cref="IOException">The port is taken or cannot be bound.</exception>
    public static async Task<BoardServer> StartAsync(BoardServerOptions options, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(options);
        var watcher = new ArchiveWatcher(options.ArchivePath, options.Poll);
        string? key = options.Lan ? Convert.ToHexStringLower(RandomNumberGenerator.GetBytes(16)) : null;
        WebApplicationBuilder builder = WebApplication.CreateSlimBuilder(new WebApplicationOptions { ApplicationName = typeof(BoardServer).Assembly.GetName().Name });
        builder.Logging.ClearProviders();
        builder.Services.Configure<HostOptions>(o => o.ShutdownTimeout = TimeSpan.FromSeconds(5));
        builder.WebHost.ConfigureKestrel(k =>
        {
            k.AddServerHeader = false;
            if (options.Lan)
            {
                k.ListenAnyIP(options.Port);
            }
            else
            {
                k.Listen(IPAddress.Loopback, options.Port);
            }
        });
        WebApplication app = builder.Build();
        var server = new Pages(options, watcher, key);
        app.Use(server.Guard);
        app.MapGet("/", server.Board);
        app.MapGet("/run/{id:long}", server.Card);
        app.MapGet("/updates", server.Updates);
        try
        {
            await app.StartAsync(cancel);
        }
        catch (Exception e) when (e is IOException or System.Net.Sockets.SocketException or InvalidOperationException)
        {
            await app.DisposeAsync();
            watcher.Dispose();
            throw new IOException($"cannot listen on port {options.Port}: {e.Message}", e);
        }

        string bound = app.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses.First();
        int port = new Uri(bound.Replace("[::]", "localhost", StringComparison.Ordinal).Replace("0.0.0.0", "localhost", StringComparison.Ordinal)).Port;
        var result = new BoardServer(app, watcher, new Uri($"http://127.0.0.1:{port}/"), key);
        server.Stopping = result.stopping.Token;
        return result;
    }

    /// <summary>The addresses other machines can use on the LAN (one per IPv4 interface that is up).</summary>
    public IReadOnlyList<Uri> LanAddresses() => System.Net.NetworkInformation.NetworkInterface.GetAllNetworkInterfaces()
        .Where(n => n.OperationalStatus == System.Net.NetworkInformation.OperationalStatus.Up)
        .SelectMany(n => n.GetIPProperties().UnicastAddresses)
        .Where(a => a.Address.AddressFamily == System.Net.Sockets.AddressFamily.InterNetwork && !IPAddress.IsLoopback(a.Address))
        .Select(a => new Uri($"http://{a.Address}:{Address.Port}/?{KeyParameter}={Key}"))
        .ToList();

    /// <summary>Stops listening: open update streams end, requests under way finish.</summary>
    public async Task StopAsync()
    {
        await stopping.CancelAsync();
        await app.StopAsync();
        await watching;
    }

    /// <summary>Stops (when still running) and lets go of the archive.</summary>
    public async ValueTask DisposeAsync()
    {
        if (!stopping.IsCancellationRequested)
        {
            await StopAsync();
        }

        await app.DisposeAsync();
        watcher.Dispose();
        stopping.Dispose();
    }

    /// <summary>The request handlers.</summary>
    private sealed class Pages(BoardServerOptions options, ArchiveWatcher watcher, string? key)
    {
        private readonly byte[]? keyBytes = key is null ? null : Encoding.ASCII.GetBytes(key);

        public CancellationToken Stopping { get; set; }

        /// <summary>Read-only and, on the LAN, keyed; every answer uncached and not framed.</summary>
        public async Task Guard(HttpContext context, RequestDelegate next)
        {
            HttpResponse response = context.Response;
            response.Headers.CacheControl = "no-store";
            response.Headers.XContentTypeOptions = "nosniff";
            response.Headers["Referrer-Policy"] = "no-referrer";
            response.Headers.XFrameOptions = "DENY";
            response.Headers.ContentSecurityPolicy = "default-src 'none'; style-src 'unsafe-inline'; script-src 'unsafe-inline'; connect-src 'self'; img-src data:; form-action 'self'; base-uri 'none'";
            if (!HttpMethods.IsGet(context.Request.Method) && !HttpMethods.IsHead(context.Request.Method))
            {
                response.Headers.Allow = "GET, HEAD";
                await Plain(context, StatusCodes.Status405MethodNotAllowed, "read-only: only GET is served");
                return;
            }

            if (keyBytes is not null)
            {
                string? given = context.Request.Query[KeyParameter].FirstOrDefault() ?? context.Request.Headers[KeyHeader].FirstOrDefault();
                if (string.IsNullOrEmpty(given))
                {
                    await Plain(context, StatusCodes.Status401Unauthorized, "this board listens on the LAN: add ?key=… with the key printed when it started");
                    return;
                }

                if (!CryptographicOperations.FixedTimeEquals(Encoding.ASCII.GetBytes(given), keyBytes))
                {
                    await Plain(context, StatusCodes.Status403Forbidden, "wrong key");
                    return;
                }
            }

            await next(context);
        }

        public async Task Board(HttpContext context)
        {
            IQueryCollection query = context.Request.Query;
            string? eventName = Value(query["event"]) ?? options.Event;
            BoardRequest request;
            try
            {
                request = BoardRequest.Parse(Value(query["figure"]) ?? "0-60mph", Value(query["from"]) ?? "standstill", Value(query["accept"]) ?? "valid", new RunFilter { Event = eventName });
            }
            catch (FormatException e)
            {
                await Plain(context, StatusCodes.Status400BadRequest, e.Message.Replace("--", "", StringComparison.Ordinal));
                return;
            }

            string stamp = watcher.Stamp;
            BoardResult board;
            try
            {
                using SessionArchive archive = SessionArchive.OpenReadOnly(options.ArchivePath);
                board = archive.Board(request);
            }
            catch (ArchiveException e)
            {
                await Plain(context, StatusCodes.Status404NotFound, e.Message);
                return;
            }

            var fields = new List<(string, string)>();
            if (eventName is not null)
            {
                fields.Add(("event", eventName));
            }

            if (key is not null)
            {
                fields.Add((KeyParameter, key));
            }

            var html = new StringBuilder(16384);
            BoardPage.Append(html, board, new BoardPage.Layout(eventName is null ? "Board: every run in the archive" : "Board: " + eventName, request, options.Units, run => CardLink(run), fields), stamp);
            html.Append("<p class=\"live sheet\" id=\"live-status\" data-role=\"live\">Live: the board redraws itself as runs are filed.</p>\n");
            await Html(context, HtmlPage.Document(eventName is null ? "Board" : "Board: " + eventName, html.ToString(), RunCard.FootNote(options.ToolVersion), LiveScript));
        }

        public async Task Card(HttpContext context, long id)
        {
            string page;
            try
            {
                using SessionArchive archive = SessionArchive.OpenReadOnly(options.ArchivePath);
                CardInput? card = ArchiveCards.Card(archive, id, options.Units, options.ToolVersion, out _, context.RequestAborted);
                string back = "<nav class=\"sheet live\"><a href=\"/" + (key is null ? "" : "?" + KeyParameter + "=" + key) + "\">← the board</a></nav>\n";
                if (card is null)
                {
                    page = HtmlPage.Document($"Archive run {id}", back + ArchiveCards.FailedCard(archive.FiledRun(id)), RunCard.FootNote(options.ToolVersion));
                }
                else
                {
                    var html = new StringBuilder(back, 32768);
                    RunCard.Append(html, card);
                    page = HtmlPage.Document(RunCard.Title(card), html.ToString(), RunCard.FootNote(options.ToolVersion));
                }
            }
            catch (ArchiveException e)
            {
                await Plain(context, StatusCodes.Status404NotFound, e.Message);
                return;
            }

            await Html(context, page);
        }

        /// <summary>Server-sent events: an <c>archive</c> event (data: the new stamp) whenever the
        /// archive changes, at once when it changed since the page's stamp (<c>since</c>), and a
        /// comment line when idle.</summary>
        public async Task Updates(HttpContext context)
        {
            HttpResponse response = context.Response;
            response.ContentType = "text/event-stream";
            response.Headers.CacheControl = "no-cache, no-store";
            using var both = CancellationTokenSource.CreateLinkedTokenSource(context.RequestAborted, Stopping);
            CancellationToken cancel = both.Token;
            string known = Value(context.Request.Query["since"]) ?? watcher.Stamp;
            try
            {
                await response.WriteAsync("retry: 1000\n: watching the archive\n\n", cancel);
                await response.Body.FlushAsync(cancel);
                while (!cancel.IsCancellationRequested)
                {
                    string? changed = await watcher.ChangedAsync(known, options.Heartbeat, cancel);
                    if (changed is null)
                    {
                        await response.WriteAsync(": idle\n\n", cancel);
                    }
                    else
                    {
                        known = changed;
                        await response.WriteAsync($"event: archive\ndata: {changed}\n\n", cancel);
                    }

                    await response.Body.FlushAsync(cancel);
                }
            }
            catch (OperationCanceledException)
            {
                // The browser left or the server is stopping: the stream just ends.
            }
        }

        private string CardLink(long run) => $"/run/{run}" + (key is null ? "" : $"?{KeyParameter}={key}");

        private static string? Value(StringValues values) => values.Count > 0 && !string.IsNullOrEmpty(values[0]) ? values[0] : null;

        private static Task Html(HttpContext context, string page)
        {
            context.Response.ContentType = "text/html; charset=utf-8";
            return context.Response.WriteAsync(page, context.RequestAborted);
        }

        private static Task Plain(HttpContext context, int status, string text)
        {
            context.Response.StatusCode = status;
            context.Response.ContentType = "text/plain; charset=utf-8";
            return context.Response.WriteAsync(text + "\n", context.RequestAborted);
        }
    }

    /// <summary>The board page's script: listens to the update stream and, on each change,
    /// fetches the page again and swaps in the new board. The page reads fine without it.</summary>
    internal const string LiveScript =
        """
        (function () {
          var status = document.getElementById('live-status');
          var params = new URLSearchParams(location.search);
          var key = params.get('key');
          function stamp() { var b = document.getElementById('board'); return b ? b.getAttribute('data-stamp') || '' : ''; }
          var url = '/updates?since=' + encodeURIComponent(stamp()) + (key ? '&key=' + encodeURIComponent(key) : '');
          var source = new EventSource(url);
          var busy = false, again = false;
          function redraw() {
            if (busy) { again = true; return; }
            busy = true;
            fetch(location.href, { cache: 'no-store' })
              .then(function (r) { return r.text(); })
              .then(function (text) {
                var fresh = new DOMParser().parseFromString(text, 'text/html').getElementById('board');
                var old = document.getElementById('board');
                if (fresh && old) { old.replaceWith(fresh); }
                document.documentElement.setAttribute('data-redrawn', String(Number(document.documentElement.getAttribute('data-redrawn') || '0') + 1));
                status.textContent = 'Live: board redrawn at ' + new Date().toLocaleTimeString() + '.';
              })
              .catch(function () { status.textContent = 'Live: could not redraw the board; retrying on the next change.'; })
              .then(function () { busy = false; if (again) { again = false; redraw(); } });
          }
          source.addEventListener('archive', redraw);
          source.onopen = function () { document.documentElement.setAttribute('data-live', 'open'); status.textContent = 'Live: the board redraws itself as runs are filed.'; };
          source.onerror = function () { status.textContent = 'Live: connection to the server lost; reconnecting…'; };
        })();
        """;
}
