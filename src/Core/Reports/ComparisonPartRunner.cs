using System.Diagnostics;

namespace Patchproof.Core.Reports;

/// <summary>One part of the comparison: its name in words and its rough share of the work.</summary>
/// <param name="Name">What the part computes, as a person would say it (shown while the fit runs and in the timings).</param>
/// <param name="Weight">Its share of the work, relative to the other parts (from the part timings in docs/performance.md).</param>
internal sealed record ComparisonPart(string Name, double Weight);

/// <summary>Runs the parts of a comparison, some as tasks, keeps their timings, and tells the caller each finished part.</summary>
/// <remarks>
/// <para>Progress is reported on the thread that builds the comparison, never on a part's task: the board fit promises
/// its reports on the fitting thread. While it waits for one task it reports the others as they end, so the bar moves
/// whichever part finishes first. The fraction is the finished parts' weight over the total, so it never decreases.</para>
/// <para>Cancellation: every task gets the token (a part checks it at its own block granularity), and waiting throws
/// <see cref="OperationCanceledException"/> as soon as it is cancelled. <see cref="WaitForStarted"/> then lets the
/// started tasks wind down, so nothing keeps computing after the builder has returned.</para>
/// </remarks>
internal sealed class ComparisonPartRunner(IReadOnlyList<ComparisonPart> parts, IProgress<FitComparisonProgress>? progress, CancellationToken cancellation)
{
    private readonly Task?[] tasks = new Task?[parts.Count];
    private readonly bool[] finished = new bool[parts.Count];
    private readonly PartTiming?[] timings = new PartTiming?[parts.Count];
    private readonly double totalWeight = parts.Sum(part => part.Weight);
    private double finishedWeight;
    private int finishedCount;

    /// <summary>The token every part is given.</summary>
    public CancellationToken Cancellation => cancellation;

    /// <summary>The wall time of each finished part, in slot order.</summary>
    public IReadOnlyList<PartTiming> Timings => [.. timings.OfType<PartTiming>()];

    /// <summary>Starts part <paramref name="slot"/> on the thread pool.</summary>
    public Task<T> Start<T>(int slot, Func<T> work)
    {
        var task = Task.Run(() => Timed(slot, work), cancellation);
        tasks[slot] = task;
        return task;
    }

    /// <summary>Waits for <paramref name="task"/>, reporting every part that finishes meanwhile, and returns its value.</summary>
    /// <exception cref="OperationCanceledException">When the token is cancelled while waiting or the part stopped on it.</exception>
    public T Await<T>(Task<T> task)
    {
        while (!task.IsCompleted)
        {
            Task.WaitAny([.. tasks.OfType<Task>().Where(t => !t.IsCompleted)], cancellation);
            ReportFinished();
        }

        ReportFinished();
        return task.GetAwaiter().GetResult();
    }

    /// <summary>Runs part <paramref name="slot"/> on the calling thread and reports it (and any task that ended meanwhile).</summary>
    /// <exception cref="OperationCanceledException">When the token is cancelled before the part starts.</exception>
    public T Run<T>(int slot, Func<T> work)
    {
        cancellation.ThrowIfCancellationRequested();
        var value = Timed(slot, work);
        finished[slot] = true;
        Finish(slot);
        ReportFinished();
        return value;
    }

    /// <summary>Blocks until every started task has ended, whatever its outcome (after a cancellation).</summary>
    public void WaitForStarted()
    {
        foreach (var task in tasks.OfType<Task>())
        {
            // WaitAny returns when the task ends and, unlike Wait, does not rethrow its cancellation.
            Task.WaitAny(task);
        }
    }

    private T Timed<T>(int slot, Func<T> work)
    {
        var watch = Stopwatch.StartNew();
        var value = work();
        timings[slot] = new PartTiming(parts[slot].Name, watch.Elapsed.TotalSeconds);
        return value;
    }

    private void ReportFinished()
    {
        for (var slot = 0; slot < tasks.Length; slot++)
        {
            if (!finished[slot] && tasks[slot] is { IsCompletedSuccessfully: true })
            {
                finished[slot] = true;
                Finish(slot);
            }
        }
    }

    private void Finish(int slot)
    {
        finishedWeight += parts[slot].Weight;
        finishedCount++;
        progress?.Report(new FitComparisonProgress(Math.Min(1, finishedWeight / totalWeight), $"{parts[slot].Name} done ({finishedCount} of {parts.Count} parts)"));
    }
}
