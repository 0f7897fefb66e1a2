using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class OccupancyDensityTests
{
    [Fact]
    public void Compare_SameAttractorIndependentStretches_IsCloseAndDifferentParametersAreFar()
    {
        // Arrange: two stretches of one Lorenz orbit, and a Lorenz orbit with rho = 35 (a board
        // whose coefficient drifted by 25 %).
        var first = TestTrajectories.Lorenz(100_000, 0.01, substeps: 2);
        var second = TestTrajectories.Lorenz(100_000, 0.01, transient: 2000, substeps: 2);
        var drifted = TestTrajectories.Lorenz(100_000, 0.01, rho: 35, substeps: 2);

        // Act
        var same = OccupancyDensities.Compare(first, second);
        var different = OccupancyDensities.Compare(first, drifted);

        // Assert: three planes each (x-y, x-z, y-z).
        Assert.Equal(3, same.Count);
        Assert.Equal((0, 2), (same[1].XChannel, same[1].YChannel));
        Assert.All(same, plane => Assert.InRange(plane.HellingerDistance, 0, 0.1));
        Assert.All(different, plane => Assert.InRange(plane.HellingerDistance, 0.15, 1));
        Assert.All(same.Zip(different), pair => Assert.True(pair.Second.HellingerDistance > 2.5 * pair.First.HellingerDistance));
    }

    [Fact]
    public void Histogram_SumsToOne_AndHellingerOfIdenticalIsZeroOfDisjointIsOne()
    {
        // Derived from the definition H = sqrt(1 - sum sqrt(p q)).
        double[] left = [0.1, 0.2, 0.3];
        double[] right = [5.1, 5.2, 5.3];

        var a = OccupancyDensities.Histogram(left, left, 0, 6, 0, 6, 16, 0);
        var b = OccupancyDensities.Histogram(right, right, 0, 6, 0, 6, 16, 0);

        Assert.Equal(1.0, a.Probabilities.Sum(), 12);
        Assert.Equal(0.0, OccupancyDensities.Hellinger(a.Probabilities, a.Probabilities), 12);
        Assert.Equal(1.0, OccupancyDensities.Hellinger(a.Probabilities, b.Probabilities), 12);
    }

    [Fact]
    public void Compare_DifferentChannelCounts_IsRejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => OccupancyDensities.Compare([new double[3], new double[3]], [new double[3]]));
    }
}
