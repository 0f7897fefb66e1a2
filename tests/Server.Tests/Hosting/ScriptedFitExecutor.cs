using System.Collections.Concurrent;
using System.Text.Json;
using Patchproof.Server.Fits;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>A fit engine for tests of the job machinery: it fits nothing, and does what the test tells it.</summary>
/// <remarks>
/// Its result document says which attempt produced it, so a test can tell runs apart. Runs are
/// counted per fit across every server that shares one instance, which is how the tests prove a
/// job ran exactly once.
/// </remarks>
internal sealed class ScriptedFitExecutor : IFitJobExecutor
{
    private readonly ConcurrentDictionary<Guid, int> runs = new();
    private readonly ConcurrentDictionary<Guid, TaskCompletionSource> started = new();
    private readonly ConcurrentDictionary<Guid, FitJobInput> inputs = new();

    /// <summary>What each run does.</summary>
    public FitScript Script { get; set; } = FitScript.Succeed;

    /// <summary>Released by a test to let blocked runs finish.</summary>
    public TaskCompletionSource Release { get; } = new(TaskCreationOptions.RunContinuationsAsynchronously);

    public int RunsOf(Guid fitId) => runs.GetValueOrDefault(fitId);

    /// <summary>What the engine was handed for the fit's latest run, or null when it has not run.</summary>
    public FitJobInput? InputOf(Guid fitId) => inputs.GetValueOrDefault(fitId);

    public IReadOnlyDictionary<Guid, int> Runs => runs;

    public Task StartedAsync(Guid fitId) => started.GetOrAdd(fitId, _ => new(TaskCreationOptions.RunContinuationsAsynchronously)).Task;

    public async Task<FitJobOutcome> ExecuteAsync(FitJobInput input, IProgress<FitJobProgress> progress, CancellationToken cancellationToken)
    {
        runs.AddOrUpdate(input.FitId, 1, (_, n) => n + 1);
        inputs[input.FitId] = input;
        started.GetOrAdd(input.FitId, _ => new(TaskCreationOptions.RunContinuationsAsynchronously)).TrySetResult();
        var result = JsonSerializer.SerializeToElement(new { fitId = input.FitId, attempt = input.Attempt, captures = input.Captures.Count, designVersion = input.DesignVersion });
        switch (Script)
        {
            case FitScript.Succeed:
                progress.Report(new FitJobProgress(0.5, "halfway"));
                return FitJobOutcome.Succeeded(result);
            case FitScript.Fail:
                return FitJobOutcome.Failed("The scripted engine was told to fail.");
            case FitScript.Throw:
                throw new InvalidOperationException("scripted failure with internal detail at Secret.Method()");
            case FitScript.BlockUntilReleased:
                progress.Report(new FitJobProgress(0.25, "waiting for the test"));
                await Release.Task.WaitAsync(cancellationToken);
                return FitJobOutcome.Succeeded(result);
            case FitScript.BlockIgnoringCancellation:
                progress.Report(new FitJobProgress(0.25, "stuck"));
                await Release.Task;
                return FitJobOutcome.Succeeded(result);
            default:
                throw new InvalidOperationException(Script.ToString());
        }
    }
}

/// <summary>What a scripted run does.</summary>
internal enum FitScript
{
    Succeed,
    Fail,
    Throw,
    BlockUntilReleased,
    BlockIgnoringCancellation,
}
