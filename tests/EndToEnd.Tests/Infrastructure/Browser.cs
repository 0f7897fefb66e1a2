using Microsoft.Playwright;

namespace Patchproof.EndToEnd.Tests.Infrastructure;

/// <summary>Headless Chromium from Debian's <c>chromium</c> package, driven by Playwright.</summary>
/// <remarks>
/// Playwright's own browser download is not used: the tests launch the system Chromium. Without it
/// the browser tests skip with the reason, unless <c>PATCHPROOF_REQUIRE_BROWSER=1</c> (set by CI),
/// in which case they fail, so a CI run can never pass with its browser tests silently skipped.
/// </remarks>
public sealed class Browser : IAsyncLifetime
{
    private IPlaywright? playwright;
    private IBrowser? browser;

    /// <summary>Where screenshots and timings go: <c>artifacts/e2e</c> under the repository root.</summary>
    public static string ArtifactsFolder { get; } = Directory.CreateDirectory(
        Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "artifacts", "e2e")).FullName;

    /// <summary>The Chromium binary: <c>PATCHPROOF_CHROMIUM</c>, else Debian's <c>/usr/bin/chromium</c>.</summary>
    public static string ExecutablePath { get; } = Environment.GetEnvironmentVariable("PATCHPROOF_CHROMIUM") is { Length: > 0 } path ? path : "/usr/bin/chromium";

    /// <summary>The reason the browser tests cannot run here, or null when they can.</summary>
    public static string? UnavailableReason =>
        File.Exists(ExecutablePath) ? null : $"Chromium not found at {ExecutablePath}: install Debian's chromium package (apt-get install chromium) or set PATCHPROOF_CHROMIUM.";

    private static bool IsRequired => Environment.GetEnvironmentVariable("PATCHPROOF_REQUIRE_BROWSER") == "1";

    /// <summary>Skips the calling test when no browser is available (or fails it when CI requires one).</summary>
    public static void RequireBrowser()
    {
        if (UnavailableReason is { } reason)
        {
            if (IsRequired)
            {
                Assert.Fail("PATCHPROOF_REQUIRE_BROWSER=1 but " + reason);
            }

            Assert.Skip(reason);
        }
    }

    public async ValueTask InitializeAsync()
    {
        if (UnavailableReason is not null)
        {
            return;
        }

        playwright = await Playwright.CreateAsync();
        browser = await playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = ExecutablePath,
            Headless = true,
            // Running as root needs the sandbox off; the networking flags keep Chromium from calling out of a closed network.
            Args = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"],
        });
    }

    /// <summary>A fresh page of 1280 by 800, the smallest screen the app is laid out for.</summary>
    public async Task<IPage> NewPageAsync()
    {
        RequireBrowser();
        var context = await browser!.NewContextAsync(new BrowserNewContextOptions { ViewportSize = new ViewportSize { Width = 1280, Height = 800 } });
        return await context.NewPageAsync();
    }

    /// <summary>Saves a full-page screenshot as <c>artifacts/e2e/NAME.png</c>.</summary>
    public static async Task SaveScreenshotAsync(IPage page, string name) =>
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(ArtifactsFolder, name + ".png"), FullPage = true, Timeout = 120_000 });

    public async ValueTask DisposeAsync()
    {
        if (browser is not null)
        {
            await browser.DisposeAsync();
        }

        playwright?.Dispose();
    }
}
