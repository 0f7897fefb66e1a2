using System.Diagnostics;

namespace Patchproof.Server.Rendering;

/// <summary>Renders the start page once as soon as the server listens, so the first person to open it does not wait.</summary>
/// <remarks>
/// The start page is rendered on the server (see <see cref="StartPagePrerendering"/>), and a fresh process spends
/// about a second of CPU compiling what the first rendering runs: the page's components, the API calls it makes over
/// loopback, their database queries. Asking for the page itself moves that cost to the moment the server starts. It
/// only reads. A server without a socket (the tests' in-memory one) has nothing to ask and skips it.
/// </remarks>
internal sealed partial class StartPageWarmUp(
    IHostApplicationLifetime lifetime,
    LoopbackApiAddress address,
    IHttpClientFactory clients,
    ILogger<StartPageWarmUp> logger) : BackgroundService
{
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        try
        {
            var started = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
            using (lifetime.ApplicationStarted.Register(() => started.TrySetResult()))
            {
                await started.Task.WaitAsync(stoppingToken);
            }

            if (address.BaseAddress is not { } baseAddress)
            {
                return;
            }

            var stopwatch = Stopwatch.StartNew();
            using var client = clients.CreateClient();
            using var response = await client.GetAsync(baseAddress, stoppingToken);
            response.EnsureSuccessStatusCode();
            await response.Content.ReadAsByteArrayAsync(stoppingToken);
            Warmed(logger, stopwatch.ElapsedMilliseconds);
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
        {
            // Stopped before or during the warm-up: nothing to report.
        }
        catch (Exception ex) when (ex is HttpRequestException or TaskCanceledException)
        {
            // Nothing is lost: the first person's request does the same work, a second later.
            WarmUpFailed(logger, ex.Message);
        }
    }

    [LoggerMessage(Level = LogLevel.Information, Message = "Start page warm-up: rendered in {ElapsedMs} ms")]
    private static partial void Warmed(ILogger logger, long elapsedMs);

    [LoggerMessage(Level = LogLevel.Warning, Message = "Start page warm-up failed: {Reason}")]
    private static partial void WarmUpFailed(ILogger logger, string reason);
}
