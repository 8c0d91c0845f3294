using Microsoft.Playwright;

namespace LoopWatch.Dashboard.Tests.Infrastructure;

/// <summary>
/// Debian's Chromium driven by Playwright for .NET: headless, no sandbox (tests run as root), no browser download.
/// A missing /usr/bin/chromium fails the test; ./test.sh installs the package.
/// </summary>
public sealed class Chromium : IAsyncDisposable
{
    public const string Path = "/usr/bin/chromium";

    private readonly IPlaywright _playwright;

    private Chromium(IPlaywright playwright, IBrowser browser)
    {
        _playwright = playwright;
        Browser = browser;
    }

    public IBrowser Browser { get; }

    /// <summary>Where screenshots go: kept as test artefacts under the test output folder.</summary>
    public static string ArtefactDir
    {
        get
        {
            var dir = System.IO.Path.Combine(AppContext.BaseDirectory, "TestResults", "screenshots");
            Directory.CreateDirectory(dir);
            return dir;
        }
    }

    public static async Task<Chromium> LaunchAsync()
    {
        if (!File.Exists(Path)) throw new InvalidOperationException($"{Path} is missing: run ./test.sh, which installs the Debian package 'chromium'");
        var playwright = await Playwright.CreateAsync();
        var browser = await playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = Path,
            Headless = true,
            Args = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking",
                "--disable-component-update", "--disable-sync"],
        });
        return new Chromium(playwright, browser);
    }

    /// <summary>A new page whose waits allow for a loaded 2-core CI machine (Playwright's default is 30 s).</summary>
    public async Task<IPage> NewPageAsync(BrowserNewPageOptions? options = null)
    {
        var page = await Browser.NewPageAsync(options);
        page.SetDefaultTimeout(120_000);
        page.SetDefaultNavigationTimeout(120_000);
        return page;
    }

    public static async Task ShotAsync(IPage page, string name) =>
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = System.IO.Path.Combine(ArtefactDir, name + ".png"), FullPage = true });

    public async ValueTask DisposeAsync()
    {
        await Browser.DisposeAsync();
        _playwright.Dispose();
    }
}
