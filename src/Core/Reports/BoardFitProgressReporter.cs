using Patchproof.Core.Estimation;

namespace Patchproof.Core.Reports;

/// <summary>Turns the stages of a board fit, the shooting iterations and the comparison's parts into one progress bar that never steps back.</summary>
/// <remarks>
/// <para>The bar: capture checks from 0, starting values from 0.05, multiple shooting from 0.10 (iterations counted
/// against the cap) to 0.85, the structure and mapping checks at 0.86, the part diagnosis at 0.88, the comparison's
/// parts from 0.90 to 0.99 (weighted by their usual cost), done at 1. Without the comparison the shooting runs to 0.95
/// and the checks and diagnosis follow at 0.96 and 0.98.</para>
/// <para>Monotone: every report carries the largest fraction reached so far, so a source that counts again from 0
/// (a solver restarted after a stall) holds the bar where it was instead of moving it back.</para>
/// <para>Each stage report first checks the cancellation token, so a cancelled fit stops at the next stage.</para>
/// </remarks>
internal sealed class BoardFitProgressReporter
{
    /// <summary>Where multiple shooting starts on the bar.</summary>
    public const double ShootingStart = 0.10;

    /// <summary>Where the comparison starts on the bar.</summary>
    public const double ComparisonStart = 0.90;

    /// <summary>Where the comparison ends on the bar (the last part done; "done" is 1).</summary>
    public const double ComparisonEnd = 0.99;

    private const string ComparisonStage = "comparing the capture with the designs";

    private readonly IProgress<BoardFitProgress>? outer;
    private readonly CancellationToken cancellation;
    private double reached;

    /// <summary>A reporter for one fit.</summary>
    /// <param name="outer">Where the reports go; null for none.</param>
    /// <param name="cancellation">Checked at each stage.</param>
    /// <param name="compares">Whether the fit ends with the comparison (it then keeps 0.90 to 0.99 of the bar).</param>
    public BoardFitProgressReporter(IProgress<BoardFitProgress>? outer, CancellationToken cancellation, bool compares)
    {
        this.outer = outer;
        this.cancellation = cancellation;
        ShootingEnd = compares ? 0.85 : 0.95;
        Iterations = outer is null ? null : new IterationReporter(this);
        Comparison = outer is null ? null : new ComparisonReporter(this);
    }

    /// <summary>Where multiple shooting ends on the bar.</summary>
    public double ShootingEnd { get; }

    /// <summary>Where the structure and mapping checks start.</summary>
    public double Checks => ShootingEnd + 0.01;

    /// <summary>Where the part diagnosis starts.</summary>
    public double Diagnosis => ShootingEnd + 0.03;

    /// <summary>Takes the solver's iteration reports; null when nobody listens.</summary>
    public IProgress<LevenbergMarquardtIteration>? Iterations { get; }

    /// <summary>Takes the comparison's part reports; null when nobody listens.</summary>
    public IProgress<FitComparisonProgress>? Comparison { get; }

    /// <summary>Reports the start of a stage, after checking the token.</summary>
    /// <exception cref="OperationCanceledException">When the fit was cancelled.</exception>
    public void Stage(double fraction, string stage)
    {
        cancellation.ThrowIfCancellationRequested();
        Send(fraction, stage);
    }

    /// <summary>Reports the comparison's start.</summary>
    /// <exception cref="OperationCanceledException">When the fit was cancelled.</exception>
    public void ComparisonStarts() => Stage(ComparisonStart, ComparisonStage);

    private void Send(double fraction, string stage)
    {
        reached = Math.Max(reached, Math.Clamp(fraction, 0, 1));
        outer?.Report(new BoardFitProgress(reached, stage));
    }

    private sealed class IterationReporter(BoardFitProgressReporter owner) : IProgress<LevenbergMarquardtIteration>
    {
        public void Report(LevenbergMarquardtIteration value) =>
            owner.Send(
                ShootingStart + ((owner.ShootingEnd - ShootingStart) * value.Iteration / Math.Max(1, value.MaxIterations)),
                $"multiple shooting, iteration {value.Iteration + 1} of at most {value.MaxIterations}");
    }

    private sealed class ComparisonReporter(BoardFitProgressReporter owner) : IProgress<FitComparisonProgress>
    {
        public void Report(FitComparisonProgress value) =>
            owner.Send(ComparisonStart + ((ComparisonEnd - ComparisonStart) * value.Fraction), $"{ComparisonStage}: {value.Stage}");
    }
}
