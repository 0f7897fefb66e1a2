using Patchproof.Core.Estimation;

namespace Patchproof.Core.Tests.Estimation;

public sealed class ChannelMappingSearchTests
{
    [Fact]
    public void Rank_ShuffledAndInvertedLorenzChannels_FindsTheTrueReadingFirst()
    {
        // BENCHMARKS.md section 3 capture; probes wired as CH1 = z, CH2 = -x, CH3 = y.
        var (states, _) = SyntheticLorenz.Clean(samples: 4001);
        var capture = SyntheticLorenz.Capture(states, seed: 5);
        double[][] channels = [capture[2], capture[0].Select(v => -v).ToArray(), capture[1]];

        // Nominal Lorenz (10, 28, 8/3) signs in the order of the terms: dx: y, x; dy: x, x*z, y; dz: x*y, z.
        double[][] nominal = [[10, -10], [28, -1, -1], [1, -8.0 / 3]];

        var ranked = ChannelMappingSearch.Rank(channels, SyntheticLorenz.SampleInterval, EquationErrorRegressionTests.LorenzTerms, nominal);

        // Lorenz is unchanged by (x, y) -> (-x, -y), so x = -CH2, y = CH3 and x = CH2, y = -CH3 tie.
        var best = ranked[0];
        Assert.Equal(0, best.SignDisagreements);
        Assert.Equal(0, ranked[1].SignDisagreements);
        Assert.True(ranked[2].SignDisagreements > 0);
        Assert.Equal([1, 2, 0], best.ChannelOfState);
        Assert.Equal(1, best.SignOfState[2]);
        Assert.Equal(-best.SignOfState[0], best.SignOfState[1]);
        Assert.Equal(ranked[0].Misfit, ranked[1].Misfit, 1e-9);
        var firstOtherAssignment = ranked.First(m => !m.ChannelOfState.SequenceEqual(best.ChannelOfState));
        Assert.True(firstOtherAssignment.Misfit > 20 * best.Misfit, $"best other assignment misfit {firstOtherAssignment.Misfit} vs best {best.Misfit}");
        Assert.Equal(48, ranked.Count);
        Assert.Equal("x=-CH2, y=CH3, z=CH1", (best.SignOfState[0] < 0 ? best : ranked[1]).Describe(["x", "y", "z"]));
    }
}
