using System.Text.Json;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Contracts.Fits;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Fits;

/// <summary>Runs queued fit jobs on this process's workers: claim, run with heartbeats, write the outcome.</summary>
/// <remarks>
/// On shutdown a running job is asked to stop and, if it does, goes back to the queue for another
/// process; if it does not stop, heartbeats end with the process and its lease runs out, which
/// returns it to the queue just as a crash would.
/// </remarks>
internal sealed partial class FitJobRunner(
    FitJobQueue queue,
    FitJobSignal signal,
    IDbContextFactory<PatchproofDbContext> contexts,
    CaptureStore store,
    IOptions<PatchproofOptions> options,
    ILogger<FitJobRunner> logger,
    IFitJobExecutor? executor = null) : BackgroundService
{
    private readonly string owner = $"{Environment.MachineName}:{Environment.ProcessId}:{Guid.NewGuid():N}";

    private FitJobSettings Settings => options.Value.Fits;

    protected override Task ExecuteAsync(CancellationToken stoppingToken)
    {
        if (executor is null || Settings.Workers <= 0)
        {
            LogNotRunning(logger);
            return Task.CompletedTask;
        }

        var workers = Enumerable.Range(0, Settings.Workers).Select(_ => Task.Run(() => WorkAsync(executor, stoppingToken), CancellationToken.None));
        return Task.WhenAll(workers);
    }

    private async Task WorkAsync(IFitJobExecutor fitExecutor, CancellationToken stoppingToken)
    {
        while (!stoppingToken.IsCancellationRequested)
        {
            try
            {
                var claim = await queue.TryClaimAsync(owner, stoppingToken);
                if (claim is null)
                {
                    await signal.WaitAsync(Settings.PollInterval, stoppingToken);
                    continue;
                }

                await RunAsync(fitExecutor, claim, stoppingToken);
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
            {
                return;
            }
            catch (Exception exception) when (exception is DbUpdateException or InvalidOperationException or System.Data.Common.DbException)
            {
                // The database went away for a moment: a lease not renewed returns the job to the queue.
                LogQueueError(logger, exception);
                await Task.Delay(Settings.PollInterval, CancellationToken.None);
            }
        }
    }

    private async Task RunAsync(IFitJobExecutor fitExecutor, FitJobClaim claim, CancellationToken stoppingToken)
    {
        if (claim.CancelRequested)
        {
            await queue.CompleteAsync(claim, FitState.Cancelled, null, null, CancellationToken.None);
            return;
        }

        var input = await LoadInputAsync(claim, stoppingToken);
        if (input is null)
        {
            await queue.CompleteAsync(claim, FitState.Failed, null, "A capture or the design version of this fit is no longer stored.", CancellationToken.None);
            return;
        }

        using var execution = CancellationTokenSource.CreateLinkedTokenSource(stoppingToken);
        FitJobProgress? latest = null;
        var progress = new LatestValueProgress<FitJobProgress>(p => Interlocked.Exchange(ref latest, p));
        var running = Task.Run(() => fitExecutor.ExecuteAsync(input, progress, execution.Token), CancellationToken.None);

        var lost = false;
        var cancelRequested = false;
        while (!running.IsCompleted && !stoppingToken.IsCancellationRequested)
        {
            await Task.WhenAny(running, Task.Delay(Settings.HeartbeatInterval, stoppingToken).ContinueWith(_ => { }, TaskScheduler.Default));
            if (running.IsCompleted || stoppingToken.IsCancellationRequested)
            {
                break;
            }

            var heartbeat = await queue.HeartbeatAsync(claim, Interlocked.Exchange(ref latest, null), CancellationToken.None);
            if (!heartbeat.StillOwned || heartbeat.CancelRequested)
            {
                lost = !heartbeat.StillOwned;
                cancelRequested = heartbeat.StillOwned;
                await execution.CancelAsync();
                break;
            }
        }

        if (stoppingToken.IsCancellationRequested && !cancelRequested)
        {
            await execution.CancelAsync();
        }

        FitJobOutcome? outcome;
        try
        {
            outcome = await running;
        }
        catch (OperationCanceledException)
        {
            outcome = null;
        }
        catch (Exception exception)
        {
            LogExecutorError(logger, claim.FitId, exception);
            outcome = FitJobOutcome.Failed("The fit engine stopped with an internal error; the server log has the details.");
        }

        if (lost)
        {
            LogLeaseLost(logger, claim.FitId);
            return;
        }

        if (cancelRequested)
        {
            await queue.CompleteAsync(claim, FitState.Cancelled, null, null, CancellationToken.None);
        }
        else if (stoppingToken.IsCancellationRequested && outcome is null)
        {
            await queue.ReleaseAsync(claim, CancellationToken.None);
        }
        else if (outcome?.Result is { } result)
        {
            await queue.CompleteAsync(claim, FitState.Succeeded, JsonSerializer.Serialize(result), null, CancellationToken.None);
        }
        else
        {
            await queue.CompleteAsync(claim, FitState.Failed, null, outcome?.Error ?? "The fit stopped without a result.", CancellationToken.None);
        }
    }

    private async Task<FitJobInput?> LoadInputAsync(FitJobClaim claim, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        var job = await db.FitJobs.AsNoTracking()
            .Include(j => j.DesignVersion)
            .Include(j => j.Captures).ThenInclude(c => c.Capture)
            .SingleOrDefaultAsync(j => j.Id == claim.FitId, cancellationToken);
        if (job?.DesignVersion is null || job.Captures.Any(c => c.Capture is null))
        {
            return null;
        }

        var captures = job.Captures.OrderBy(c => c.Position)
            .Select(c => new FitJobCapture(c.CaptureId, c.Capture!.FileName, store.CsvPathOf(c.Capture.Sha256), store.SamplesPathOf(c.Capture.Sha256)))
            .ToList();
        if (captures.Any(c => !File.Exists(c.CsvPath)))
        {
            return null;
        }

        var benchId = await db.Boards.AsNoTracking().Where(b => b.Id == job.BoardId).Select(b => (Guid?)b.BenchId).SingleOrDefaultAsync(cancellationToken);
        return new FitJobInput(job.Id, job.BoardId, job.DesignVersion.Version, job.DesignVersion.Document, captures, claim.Attempt, benchId, job.IgnoreBenchCalibration,
            FitMappingJson.Read(job.MappingJson));
    }

    [LoggerMessage(Level = LogLevel.Information, Message = "Fit jobs are not run by this process (no fit engine registered, or Patchproof:Fits:Workers is 0).")]
    private static partial void LogNotRunning(ILogger logger);

    [LoggerMessage(Level = LogLevel.Warning, Message = "The fit job queue could not be read; retrying.")]
    private static partial void LogQueueError(ILogger logger, Exception exception);

    [LoggerMessage(Level = LogLevel.Error, Message = "Fit {FitId} failed inside the fit engine.")]
    private static partial void LogExecutorError(ILogger logger, Guid fitId, Exception exception);

    [LoggerMessage(Level = LogLevel.Warning, Message = "Fit {FitId}: this process lost its lease; the newer run's outcome stands.")]
    private static partial void LogLeaseLost(ILogger logger, Guid fitId);

    /// <summary>An <see cref="IProgress{T}"/> that hands each report straight to a callback, on the reporting thread.</summary>
    private sealed class LatestValueProgress<T>(Action<T> onReport) : IProgress<T>
    {
        public void Report(T value) => onReport(value);
    }
}
