using System.Collections.Immutable;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Simulation;

public sealed class ButcherTableauTests
{
    [Fact]
    public void Constructor_RowOfWrongLength_Throws()
    {
        ImmutableArray<ImmutableArray<double>> a = [[], [0.5, 0.5]];
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            new ButcherTableau(a, [0.5, 0.5], [0, 0.5], [0, 0], [[1], [0]], 2, 1));
    }

    [Fact]
    public void Constructor_DenseRowsOfUnequalLength_Throws()
    {
        ImmutableArray<ImmutableArray<double>> a = [[], [0.5]];
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            new ButcherTableau(a, [0, 1], [0, 0.5], [0, 0], [[1, 0], [0]], 2, 1));
    }

    [Fact]
    public void IsFirstSameAsLast_MidpointRule_IsFalse()
    {
        ImmutableArray<ImmutableArray<double>> a = [[], [0.5]];
        var midpoint = new ButcherTableau(a, [0, 1], [0, 0.5], [1, -1], [[1], [0]], 2, 1);
        Assert.False(midpoint.IsFirstSameAsLast);
        Assert.Equal(2, midpoint.StageCount);
    }
}
