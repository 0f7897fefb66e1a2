using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class RosensteinLyapunovTests
{
    // Sprott, Common Chaotic Systems (1998/2004): Lorenz (10, 28, 8/3) lambda_1 = 0.9056.
    private const double SprottLorenzLargest = 0.9056;

    [Fact]
    public void EstimateFromSeries_LorenzX_TenThousandSamples_IsWithinTenPercentOfSprott()
    {
        // Arrange: 10^4 samples of x at dt = 0.01 (tolerance 10 %: common practice, CHECKS.md).
        var x = TestTrajectories.Lorenz(10_000, 0.01)[0];

        // Act
        var result = RosensteinLyapunov.EstimateFromSeries(x, 0.01);

        // Assert
        Assert.Equal(EstimateStatus.Estimated, result.Status);
        Assert.InRange(result.LargestExponentPerSecond, 0.9 * SprottLorenzLargest, 1.1 * SprottLorenzLargest);
        Assert.NotNull(result.Fit);
        Assert.NotNull(result.Embedding);
        Assert.Equal(3, result.Embedding.Dimension);
        Assert.Equal(result.DivergenceTimesSeconds.Length, result.MeanLogDivergence.Length);
        Assert.Equal(result.LargestExponentPerSecond, result.Fit.Slope);
    }

    [Fact]
    public void EstimateFromSeries_Lorenz16_45_92_4_IsWithinTenPercentOfWolf()
    {
        // Wolf et al. (1985), as restated by Sprott (lorenzle.htm): 2.16 bits/s = 1.50 per unit;
        // Rosenstein et al. (1993) Table 1 used the same system (from memory). Tolerance 10 %.
        var x = TestTrajectories.Lorenz(10_000, 0.01, sigma: 16, rho: 45.92, beta: 4)[0];

        var result = RosensteinLyapunov.EstimateFromSeries(x, 0.01);

        Assert.InRange(result.LargestExponentPerSecond, 0.9 * 1.50, 1.1 * 1.50);
    }

    [Fact]
    public void EstimateFromSeries_ShortRecord_SaysTooShort()
    {
        var result = RosensteinLyapunov.EstimateFromSeries(new double[50], 0.01);

        Assert.Equal(EstimateStatus.TooShort, result.Status);
        Assert.True(double.IsNaN(result.LargestExponentPerSecond));
    }

    [Fact]
    public void Estimate_PeriodicOrbit_GivesNoPositiveExponent()
    {
        // Derived: nearby points on a limit cycle do not separate exponentially.
        var times = TestTrajectories.Times(8000, 0.01);
        var x = times.Select(t => Math.Sin(2 * Math.PI * t)).ToArray();
        var y = times.Select(t => Math.Cos(2 * Math.PI * t)).ToArray();

        var result = RosensteinLyapunov.EstimateFromChannels([x, y], 0.01);

        Assert.True(result.Status != EstimateStatus.Estimated || Math.Abs(result.LargestExponentPerSecond) < 0.05, $"got {result.LargestExponentPerSecond}");
    }

    [Fact]
    public void EstimateFromSeries_CancelledToken_StopsWithOperationCanceled()
    {
        var x = TestTrajectories.Lorenz(10_000, 0.01)[0];

        Assert.ThrowsAny<OperationCanceledException>(() => RosensteinLyapunov.EstimateFromSeries(x, 0.01, new RosensteinOptions { Cancellation = new CancellationToken(true) }));
    }

    [Fact]
    public void Estimate_CancelledToken_StopsInTheNeighbourSearch()
    {
        var lorenz = TestTrajectories.Lorenz(10_000, 0.01);
        var options = new RosensteinOptions { TemporalExclusionSamples = 50, Cancellation = new CancellationToken(true) };

        Assert.ThrowsAny<OperationCanceledException>(() => RosensteinLyapunov.Estimate(PointCloud.FromChannels(lorenz), 0.01, options));
    }
}
