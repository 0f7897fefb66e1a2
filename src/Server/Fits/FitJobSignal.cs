namespace Patchproof.Server.Fits;

/// <summary>Wakes this process's idle workers when a fit is queued here; jobs queued by other processes are found by polling.</summary>
internal sealed class FitJobSignal : IDisposable
{
    private readonly SemaphoreSlim pending = new(0);

    public void Notify()
    {
        if (pending.CurrentCount == 0)
        {
            pending.Release();
        }
    }

    public async Task WaitAsync(TimeSpan timeout, CancellationToken cancellationToken) =>
        await pending.WaitAsync(timeout, cancellationToken);

    public void Dispose() => pending.Dispose();
}
