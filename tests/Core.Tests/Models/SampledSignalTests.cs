using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Models;

public sealed class SampledSignalTests
{
    [Theory]
    [InlineData(-1.0, 1.0)]
    [InlineData(0.0, 1.0)]
    [InlineData(0.5, 2.0)]
    [InlineData(1.0, 3.0)]
    [InlineData(2.5, 0.0)]
    [InlineData(4.0, -3.0)]
    [InlineData(9.0, -3.0)]
    public void ValueAt_NonUniformSamples_InterpolatesAndHoldsTheEnds(double time, double expected)
    {
        var signal = new SampledSignal([0.0, 1.0, 4.0], [1.0, 3.0, -3.0]);

        Assert.Equal(expected, signal.ValueAt(time), 14);
    }

    [Fact]
    public void ValueAt_UniformSamples_MatchesTheLinearInterpolant()
    {
        var values = Enumerable.Range(0, 1001).Select(i => Math.Sin(i * 0.01)).ToArray();
        var signal = SampledSignal.Uniform(2.0, 0.01, values);
        var random = new Random(3);

        for (var trial = 0; trial < 1000; trial++)
        {
            var time = 2.0 + (random.NextDouble() * 10);
            var position = (time - 2.0) / 0.01;
            var lower = Math.Min((int)Math.Floor(position), 999);
            var fraction = position - lower;
            var expected = values[lower] + (fraction * (values[lower + 1] - values[lower]));
            Assert.Equal(expected, signal.ValueAt(time), 12);
        }
    }

    [Fact]
    public void Constructor_BadSamples_AreACallersMistake()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new SampledSignal([], []));
        Assert.Throws<ArgumentOutOfRangeException>(() => new SampledSignal([0.0, 1.0], [1.0]));
        Assert.Throws<ArgumentOutOfRangeException>(() => new SampledSignal([0.0, 0.0], [1.0, 2.0]));
        Assert.Throws<ArgumentOutOfRangeException>(() => new SampledSignal([0.0, double.NaN], [1.0, 2.0]));
        Assert.Throws<ArgumentOutOfRangeException>(() => SampledSignal.Uniform(0, 0, [1.0]));
    }
}
