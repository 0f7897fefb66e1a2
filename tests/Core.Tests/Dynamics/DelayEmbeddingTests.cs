using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class DelayEmbeddingTests
{
    [Fact]
    public void Embed_PlacesDelayedCoordinatesInOrder()
    {
        var cloud = DelayEmbedding.Embed([0.0, 1, 2, 3, 4, 5, 6], dimension: 3, delay: 2);

        Assert.Equal(3, cloud.Count);
        Assert.Equal([1.0, 3, 5], cloud.PointAt(1).ToArray());
    }

    [Fact]
    public void Choose_LorenzX_NeedsThreeDimensions_KennelEtAl1992()
    {
        // Kennel, Brown and Abarbanel (1992) find the false neighbours of the Lorenz x series vanish
        // at dimension 3 (from memory); a 3-D flow cannot need fewer than 3 (Takens 1981).
        var x = TestTrajectories.Lorenz(10_000, 0.01)[0];

        var choice = DelayEmbedding.Choose(x, maximumLag: 100, temporalExclusion: 100, TestContext.Current.CancellationToken);

        Assert.Equal(3, choice.Dimension);
        Assert.Equal(DelayRule.FirstMinimumOfMutualInformation, choice.DelayRule);
        Assert.True(choice.MutualInformationBits[choice.Delay] < choice.MutualInformationBits[choice.Delay - 1]);
        Assert.True(choice.FalseNeighbourFractions[1] > DelayEmbedding.FalseNeighbourThreshold);
    }

    [Fact]
    public void MutualInformationBits_IndependentNoise_IsNearZero_AndLagZeroIsTheEntropy()
    {
        // Derived: independent samples share no information; I(0) is the histogram entropy,
        // at most log2(16) = 4 bits.
        var random = new Random(3);
        var noise = Enumerable.Range(0, 100_000).Select(_ => random.NextDouble()).ToArray();

        Assert.InRange(DelayEmbedding.MutualInformationBits(noise, 1), 0, 0.01);
        Assert.Equal(4.0, DelayEmbedding.MutualInformationBits(noise, 0), 0.01);
    }

    [Fact]
    public void AutocorrelationOneOverELag_ExponentialDecay_IsTheDecayTime()
    {
        // An AR(1) series with coefficient a has autocorrelation a^k, below 1/e from k > -1/ln a (derived).
        var random = new Random(5);
        const double a = 0.98;
        var series = new double[200_000];
        for (var i = 1; i < series.Length; i++)
        {
            series[i] = a * series[i - 1] + WelchSpectrumTests.Gaussian(random);
        }

        var lag = DelayEmbedding.AutocorrelationOneOverELag(series, 500);

        Assert.InRange(lag, 47, 53);
    }
}
