using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Contracts.Fits;
using Patchproof.Server.Data;

namespace Patchproof.Server.Fits;

/// <summary>The fit jobs table used as a work queue shared by every server process on one database.</summary>
/// <remarks>
/// A claim is one conditional UPDATE: it succeeds only while the row is still queued, or running
/// under a lease that has expired. SQLite serializes writers, and PostgreSQL re-checks the WHERE
/// clause against the newest row version after a concurrent update (READ COMMITTED), so exactly one
/// process wins a row on either database. Each claim gets a fresh lease token; heartbeats and the
/// final write are conditional on it, so a process that lost its lease (it stalled past the lease
/// and another took over) cannot overwrite the newer run. Lease times come from
/// <see cref="TimeProvider"/>.
/// </remarks>
internal sealed class FitJobQueue(IDbContextFactory<PatchproofDbContext> contexts, TimeProvider time, IOptions<PatchproofOptions> options)
{
    private const int CandidatesPerClaim = 8;

    private FitJobSettings Settings => options.Value.Fits;

    private long NowUnixMs => TimeStamps.ToUnixMs(time.GetUtcNow());

    /// <summary>Takes the oldest job that is free, or returns null when there is none.</summary>
    public async Task<FitJobClaim?> TryClaimAsync(string owner, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        var now = NowUnixMs;
        var maxAttempts = Settings.MaxAttempts;
        await FailExhaustedAsync(db, now, cancellationToken);

        var candidates = await db.FitJobs
            .Where(j => j.State == FitState.Queued || (j.State == FitState.Running && j.LeaseExpiresAtUnixMs < now && j.Attempts < maxAttempts))
            .OrderBy(j => j.CreatedAtUnixMs)
            .Select(j => j.Id)
            .Take(CandidatesPerClaim)
            .ToListAsync(cancellationToken);

        foreach (var id in candidates)
        {
            var token = Guid.NewGuid();
            var expires = now + (long)Settings.LeaseDuration.TotalMilliseconds;
            var claimed = await db.FitJobs
                .Where(j => j.Id == id && (j.State == FitState.Queued || (j.State == FitState.Running && j.LeaseExpiresAtUnixMs < now && j.Attempts < maxAttempts)))
                .ExecuteUpdateAsync(
                    set => set
                        .SetProperty(j => j.State, FitState.Running)
                        .SetProperty(j => j.LeaseOwner, owner)
                        .SetProperty(j => j.LeaseToken, token)
                        .SetProperty(j => j.LeaseExpiresAtUnixMs, expires)
                        .SetProperty(j => j.StartedAtUnixMs, now)
                        .SetProperty(j => j.Attempts, j => j.Attempts + 1),
                    cancellationToken);
            if (claimed == 1)
            {
                var job = await db.FitJobs.AsNoTracking().SingleAsync(j => j.Id == id, cancellationToken);
                return new FitJobClaim(id, token, job.Attempts, job.CancelRequested);
            }
        }

        return null;
    }

    /// <summary>Renews the lease and saves progress; returns whether the claim still holds and whether a cancel was asked for.</summary>
    public async Task<FitJobHeartbeat> HeartbeatAsync(FitJobClaim claim, FitJobProgress? progress, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        var expires = NowUnixMs + (long)Settings.LeaseDuration.TotalMilliseconds;
        var mine = db.FitJobs.Where(j => j.Id == claim.FitId && j.LeaseToken == claim.LeaseToken && j.State == FitState.Running);
        var updated = progress is null
            ? await mine.ExecuteUpdateAsync(set => set.SetProperty(j => j.LeaseExpiresAtUnixMs, expires), cancellationToken)
            : await mine.ExecuteUpdateAsync(
                set => set
                    .SetProperty(j => j.LeaseExpiresAtUnixMs, expires)
                    .SetProperty(j => j.Progress, Math.Clamp(progress.Fraction, 0.0, 1.0))
                    .SetProperty(j => j.Stage, progress.Stage),
                cancellationToken);
        if (updated == 0)
        {
            return new FitJobHeartbeat(StillOwned: false, CancelRequested: true);
        }

        var cancelRequested = await db.FitJobs.Where(j => j.Id == claim.FitId).Select(j => j.CancelRequested).SingleAsync(cancellationToken);
        return new FitJobHeartbeat(StillOwned: true, cancelRequested);
    }

    /// <summary>Writes the final state of a claimed job; false when the claim was lost meanwhile.</summary>
    public async Task<bool> CompleteAsync(FitJobClaim claim, FitState finalState, string? resultJson, string? error, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        var now = NowUnixMs;
        var updated = await db.FitJobs
            .Where(j => j.Id == claim.FitId && j.LeaseToken == claim.LeaseToken && j.State == FitState.Running)
            .ExecuteUpdateAsync(
                set => set
                    .SetProperty(j => j.State, finalState)
                    .SetProperty(j => j.ResultJson, resultJson)
                    .SetProperty(j => j.Error, error)
                    .SetProperty(j => j.Progress, j => finalState == FitState.Succeeded ? 1.0 : j.Progress)
                    .SetProperty(j => j.FinishedAtUnixMs, now)
                    .SetProperty(j => j.LeaseOwner, (string?)null)
                    .SetProperty(j => j.LeaseToken, (Guid?)null)
                    .SetProperty(j => j.LeaseExpiresAtUnixMs, (long?)null),
                cancellationToken);
        return updated == 1;
    }

    /// <summary>Gives a claimed job back to the queue untouched (this process is stopping).</summary>
    public async Task ReleaseAsync(FitJobClaim claim, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        await db.FitJobs
            .Where(j => j.Id == claim.FitId && j.LeaseToken == claim.LeaseToken && j.State == FitState.Running)
            .ExecuteUpdateAsync(
                set => set
                    .SetProperty(j => j.State, FitState.Queued)
                    .SetProperty(j => j.LeaseOwner, (string?)null)
                    .SetProperty(j => j.LeaseToken, (Guid?)null)
                    .SetProperty(j => j.LeaseExpiresAtUnixMs, (long?)null)
                    .SetProperty(j => j.Attempts, j => j.Attempts - 1),
                cancellationToken);
    }

    /// <summary>Cancels a job: a queued one at once, a running one at its next heartbeat.</summary>
    public async Task<FitState?> RequestCancelAsync(Guid fitId, CancellationToken cancellationToken)
    {
        await using var db = await contexts.CreateDbContextAsync(cancellationToken);
        var now = NowUnixMs;
        await db.FitJobs
            .Where(j => j.Id == fitId && j.State == FitState.Queued)
            .ExecuteUpdateAsync(
                set => set
                    .SetProperty(j => j.State, FitState.Cancelled)
                    .SetProperty(j => j.CancelRequested, true)
                    .SetProperty(j => j.FinishedAtUnixMs, now),
                cancellationToken);
        await db.FitJobs
            .Where(j => j.Id == fitId && j.State == FitState.Running)
            .ExecuteUpdateAsync(set => set.SetProperty(j => j.CancelRequested, true), cancellationToken);
        var state = await db.FitJobs.Where(j => j.Id == fitId).Select(j => (FitState?)j.State).SingleOrDefaultAsync(cancellationToken);
        return state;
    }

    // A job whose lease ran out after its last allowed attempt is not retried again: each of those
    // attempts ended with its process gone, so another run would most likely end the same way.
    private async Task FailExhaustedAsync(PatchproofDbContext db, long now, CancellationToken cancellationToken)
    {
        var maxAttempts = Settings.MaxAttempts;
        var message = $"The fit was interrupted {maxAttempts} times (its server process stopped each time); it was not started again.";
        await db.FitJobs
            .Where(j => j.State == FitState.Running && j.LeaseExpiresAtUnixMs < now && j.Attempts >= maxAttempts)
            .ExecuteUpdateAsync(
                set => set
                    .SetProperty(j => j.State, FitState.Failed)
                    .SetProperty(j => j.Error, message)
                    .SetProperty(j => j.FinishedAtUnixMs, now)
                    .SetProperty(j => j.LeaseOwner, (string?)null)
                    .SetProperty(j => j.LeaseToken, (Guid?)null)
                    .SetProperty(j => j.LeaseExpiresAtUnixMs, (long?)null),
                cancellationToken);
    }
}

/// <summary>A job this process holds: its id, the token of this claim, and which attempt it is.</summary>
internal sealed record FitJobClaim(Guid FitId, Guid LeaseToken, int Attempt, bool CancelRequested);

/// <summary>The answer to a heartbeat.</summary>
internal sealed record FitJobHeartbeat(bool StillOwned, bool CancelRequested);
