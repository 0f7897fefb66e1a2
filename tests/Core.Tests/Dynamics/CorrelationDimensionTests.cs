using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class CorrelationDimensionTests
{
    [Fact]
    public void EstimateFromChannels_LorenzXyz_IsTwoPointZeroFive_GrassbergerProcaccia1983()
    {
        // Grassberger and Procaccia (1983): Lorenz D_2 = 2.05 +- 0.01; tolerance for an estimator
        // on N >= 10^4 samples: +- 0.1 (CHECKS.md).
        var lorenz = TestTrajectories.Lorenz(10_000, 0.01);

        var result = CorrelationDimension.EstimateFromChannels(lorenz, 0.01);

        Assert.Equal(EstimateStatus.Estimated, result.Status);
        Assert.InRange(result.Dimension, 1.95, 2.15);
        Assert.NotNull(result.Fit);
        Assert.Equal(13, result.Fit.PointCount);
        Assert.True(result.TheilerWindowSamples > 0);
    }

    [Fact]
    public void Estimate_LorenzXEmbedding_IsTwoPointZeroFive_GrassbergerProcaccia1983()
    {
        var x = TestTrajectories.Lorenz(10_000, 0.01)[0];
        var cloud = DelayEmbedding.Embed(x, 3, 17);

        var result = CorrelationDimension.Estimate(cloud, new CorrelationDimensionOptions { TheilerWindowSamples = 100 });

        Assert.InRange(result.Dimension, 1.95, 2.15);
    }

    [Fact]
    public void Estimate_HenonAttractor_IsOnePointTwoTwo_Sprott()
    {
        // Sprott (Common Chaotic Systems): Henon D_2 = 1.220 +- 0.036; GP via other sources
        // 1.21-1.25; test tolerance 1.22 +- 0.05 (CHECKS.md).
        var map = new HenonMap();
        var state = new[] { 0.1, 0.1 };
        var next = new double[2];
        for (var i = 0; i < 1000; i++)
        {
            map.Apply(state, next);
            (state, next) = (next, state);
        }

        var coordinates = new double[2 * 20_000];
        for (var i = 0; i < 20_000; i++)
        {
            coordinates[2 * i] = state[0];
            coordinates[2 * i + 1] = state[1];
            map.Apply(state, next);
            (state, next) = (next, state);
        }

        var result = CorrelationDimension.Estimate(new PointCloud(coordinates, 2, 20_000), new CorrelationDimensionOptions { TheilerWindowSamples = 1 });

        Assert.InRange(result.Dimension, 1.17, 1.27);
    }

    [Fact]
    public void Estimate_UniformSquare_IsTwo()
    {
        // Derived: points filling a square have correlation dimension 2 (below the edge scale).
        var random = new Random(11);
        var coordinates = Enumerable.Range(0, 2 * 20_000).Select(_ => random.NextDouble()).ToArray();

        var result = CorrelationDimension.Estimate(new PointCloud(coordinates, 2, 20_000));

        Assert.InRange(result.Dimension, 1.9, 2.05);
    }

    [Fact]
    public void EstimateFromChannels_CancelledToken_StopsWithOperationCanceled()
    {
        var lorenz = TestTrajectories.Lorenz(10_000, 0.01);

        Assert.ThrowsAny<OperationCanceledException>(() => CorrelationDimension.EstimateFromChannels(lorenz, 0.01, new CorrelationDimensionOptions { Cancellation = new CancellationToken(true) }));
    }
}
