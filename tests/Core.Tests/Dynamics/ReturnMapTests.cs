using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class ReturnMapTests
{
    [Fact]
    public void OfMaxima_LorenzZ_IsSingleHumpedWithSlopesSteeperThanOne_Lorenz1963()
    {
        // Shape: Lorenz (1963) Fig. 4: single-humped, steeper than 1 everywhere. Numbers (CHECKS.md,
        // computed with SciPy DOP853 1e-10 over 5000 time units): z_max in [30.4, 46.9], apex
        // 38.55 -> 46.89 (+- 0.3), branch slopes +1.51 / -1.52 (+- 0.15), fixed point 39.84.
        // Here 2000 time units sampled at 0.01.
        var z = TestTrajectories.Lorenz(200_000, 0.01)[2];

        var map = ReturnMaps.OfMaxima(z, 0.01);

        Assert.True(map.PairCount > 2500, $"{map.PairCount} pairs");
        var shape = map.Shape;
        Assert.NotNull(shape);
        Assert.True(shape.IsExpandingSingleHump);
        Assert.Equal(30.4, shape.MinimumValue, 0.3);
        Assert.Equal(46.89, shape.MaximumValue, 0.3);
        Assert.Equal(38.55, shape.ApexInput, 0.3);
        Assert.Equal(46.89, shape.ApexOutput, 0.3);
        Assert.Equal(1.51, shape.LeftSlope, 0.15);
        Assert.Equal(-1.52, shape.RightSlope, 0.15);
        Assert.Equal(39.84, shape.FixedPoint, 0.3);
        Assert.True(shape.MinimumAbsoluteLocalSlope > 1);
    }

    [Fact]
    public void OfMaxima_SampledSine_RefinesEachMaximumToTheTrueValue()
    {
        // Derived: a parabola through three samples of a sine near its crest errs by O(h^4).
        const double dt = 0.01;
        var values = TestTrajectories.Times(1000, dt).Select(t => 3 * Math.Sin(2 * Math.PI * 0.77 * t + 0.1)).ToArray();

        var map = ReturnMaps.OfMaxima(values, dt);

        Assert.Equal(8, map.MaximaValues.Length);
        Assert.All(map.MaximaValues, value => Assert.Equal(3.0, value, 1e-3));
        Assert.Equal((0.25 - 0.1 / (2 * Math.PI)) / 0.77, map.MaximaTimesSeconds[0], 1e-4);
    }

    [Fact]
    public void OfMaxima_NoisySine_FindsOneMaximumPerPeriod()
    {
        var random = new Random(2);
        var values = TestTrajectories.Times(10_000, 0.001).Select(t => Math.Sin(2 * Math.PI * t) + 0.02 * WelchSpectrumTests.Gaussian(random)).ToArray();

        var map = ReturnMaps.OfMaxima(values, 0.001);

        Assert.Equal(10, map.MaximaValues.Length);
    }
}
