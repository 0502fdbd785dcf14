using PuppeteerSharp;
using StbImageSharp;

namespace LaunchLogger.Board.Web.Tests;

/// <summary>Debian's chromium, driven headless over its DevTools protocol (PuppeteerSharp, which
/// here never downloads a browser of its own).</summary>
internal static class HeadlessChromium
{
    /// <summary>The browser: <c>LAUNCHLOGGER_CHROMIUM</c> when set, else Debian's package.</summary>
    public static string Executable => Environment.GetEnvironmentVariable("LAUNCHLOGGER_CHROMIUM") is { Length: > 0 } path ? path : "/usr/bin/chromium";

    /// <summary>Starts the browser with a fresh profile in <paramref name="profile"/>: headless, no
    /// sandbox (CI runs as root), no GPU, and nothing that reaches the network by itself.</summary>
    public static Task<IBrowser> LaunchAsync(string profile) => Puppeteer.LaunchAsync(new LaunchOptions
    {
        ExecutablePath = Executable,
        Headless = true,
        UserDataDir = profile,
        Timeout = 120_000,
        ProtocolTimeout = 120_000,
        Args =
        [
            "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
            "--disable-background-networking", "--disable-component-update", "--disable-sync",
            "--disable-dev-shm-usage",
        ],
    });

    /// <summary>Everything a page reports as wrong: console errors, uncaught script errors and
    /// failed requests (the live board's update stream, cut on leaving the page, excepted).</summary>
    public static List<string> WatchErrors(IPage page)
    {
        var errors = new List<string>();
        page.Console += (_, e) =>
        {
            if (e.Message.Type == ConsoleType.Error)
            {
                lock (errors)
                {
                    errors.Add("console: " + e.Message.Text);
                }
            }
        };
        page.PageError += (_, e) =>
        {
            lock (errors)
            {
                errors.Add("script: " + e.Message);
            }
        };
        page.RequestFailed += (_, e) =>
        {
            if (!e.Request.Url.Contains("/updates", StringComparison.Ordinal))
            {
                lock (errors)
                {
                    errors.Add("request failed: " + e.Request.Url + " " + e.Request.FailureText);
                }
            }
        };
        return errors;
    }

    /// <summary>Decodes a PNG screenshot (StbImageSharp) and checks that it shows something: many
    /// colours (text, rules, plots), and a good share of pixels unlike the most common one.</summary>
    public static void AssertNotBlank(byte[] png, int minimumColours = 40, double minimumInkShare = 0.02)
    {
        ImageResult image = ImageResult.FromMemory(png, ColorComponents.RedGreenBlue);
        Assert.True(image.Width > 100 && image.Height > 100, $"screenshot {image.Width}×{image.Height}");
        var counts = new Dictionary<int, int>();
        for (int i = 0; i < image.Data.Length; i += 3)
        {
            int colour = (image.Data[i] << 16) | (image.Data[i + 1] << 8) | image.Data[i + 2];
            counts[colour] = counts.GetValueOrDefault(colour) + 1;
        }

        int pixels = image.Width * image.Height;
        double ink = 1 - ((double)counts.Values.Max() / pixels);
        Assert.True(counts.Count >= minimumColours, $"the screenshot has only {counts.Count} colours");
        Assert.True(ink >= minimumInkShare, $"only {ink:P1} of the screenshot differs from its background");
    }
}

/// <summary>A test that needs Debian's chromium: skipped, saying so, when it is not installed.</summary>
public sealed class ChromiumFactAttribute : FactAttribute
{
    public ChromiumFactAttribute()
    {
        if (!File.Exists(HeadlessChromium.Executable))
        {
            Skip = $"no browser at {HeadlessChromium.Executable}: install Debian's chromium (apt-get install -y chromium; .ci/run does) or set LAUNCHLOGGER_CHROMIUM (DEVELOPERS.md, 'Browser tests')";
        }
    }
}
