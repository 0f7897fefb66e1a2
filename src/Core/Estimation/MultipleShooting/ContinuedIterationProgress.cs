namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>Passes a restarted solver's iteration reports on as iterations of the whole loop: counted on from the
/// iterations already done, against the shared cap, so the count never starts again from 0.</summary>
/// <param name="outer">Where the reports go.</param>
/// <param name="done">Iterations the earlier runs used.</param>
/// <param name="cap">The cap the runs share.</param>
internal sealed class ContinuedIterationProgress(IProgress<LevenbergMarquardtIteration> outer, int done, int cap) : IProgress<LevenbergMarquardtIteration>
{
    /// <inheritdoc />
    public void Report(LevenbergMarquardtIteration value) => outer.Report(value with { Iteration = done + value.Iteration, MaxIterations = cap });
}
