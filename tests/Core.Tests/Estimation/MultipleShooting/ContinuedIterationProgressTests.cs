using Patchproof.Core.Estimation;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Core.Tests.Estimation.MultipleShooting;

public sealed class ContinuedIterationProgressTests
{
    [Fact]
    public void Report_RestartAfterTwelveOfSixty_CountsOnFromTwelveAgainstTheSharedCap()
    {
        // A restart after 12 of 60 iterations runs with the 48 left and counts from 0 itself.
        var seen = new List<LevenbergMarquardtIteration>();
        var continued = new ContinuedIterationProgress(new Recorder(seen), done: 12, cap: 60);

        for (var i = 0; i < 3; i++)
        {
            continued.Report(new LevenbergMarquardtIteration(i, 48, 2.5 - i));
        }

        Assert.Equal([12, 13, 14], seen.Select(s => s.Iteration));
        Assert.All(seen, s => Assert.Equal(60, s.MaxIterations));
        Assert.Equal([2.5, 1.5, 0.5], seen.Select(s => s.Cost));
    }

    private sealed class Recorder(List<LevenbergMarquardtIteration> seen) : IProgress<LevenbergMarquardtIteration>
    {
        public void Report(LevenbergMarquardtIteration value) => seen.Add(value);
    }
}
