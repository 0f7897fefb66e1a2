using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class LobeStatisticsTests
{
    [Fact]
    public void Analyze_SquareWaveWithNoise_CountsEachSwitchOnceAndTheResidenceTimes()
    {
        // Derived: a +-1 square wave of period 2 s (1 s per lobe) sampled at 1 ms.
        var random = new Random(4);
        var values = TestTrajectories.Times(10_000, 0.001)
            .Select(t => (Math.Floor(t) % 2 == 0 ? 1.0 : -1.0) + 0.05 * WelchSpectrumTests.Gaussian(random))
            .ToArray();

        var statistics = LobeSwitching.Analyze(values, 0.001);

        Assert.Equal(9, statistics.SwitchCount);
        Assert.True(statistics.IsTwoLobed);
        Assert.Equal(8, statistics.PositiveResidenceSeconds.Length + statistics.NegativeResidenceSeconds.Length);
        Assert.All(statistics.PositiveResidenceSeconds.Concat(statistics.NegativeResidenceSeconds), seconds => Assert.Equal(1.0, seconds, 0.01));
        Assert.Equal(0.5, statistics.PositiveFraction, 0.01);
    }

    [Fact]
    public void Analyze_LorenzX_IsTwoLobedAndSymmetric()
    {
        // Derived: the Lorenz system is symmetric under (x, y) -> (-x, -y), so both lobes hold
        // half the time over a long record.
        var x = TestTrajectories.Lorenz(100_000, 0.01)[0];

        var statistics = LobeSwitching.Analyze(x, 0.01);

        Assert.True(statistics.IsTwoLobed);
        Assert.InRange(statistics.PositiveFraction, 0.4, 0.6);
        Assert.True(statistics.SwitchCount > 300);
        Assert.InRange(statistics.MeanResidenceSeconds(), 0.7, 5);
    }

    [Fact]
    public void Analyze_OneLobeOnly_IsNotTwoLobed()
    {
        var values = TestTrajectories.Times(1000, 0.01).Select(t => 2 + Math.Sin(t)).ToArray();

        Assert.False(LobeSwitching.Analyze(values, 0.01).IsTwoLobed);
    }
}
