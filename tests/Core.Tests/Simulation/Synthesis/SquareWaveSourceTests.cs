using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Core.Tests.Simulation.Synthesis;

public sealed class SquareWaveSourceTests
{
    [Fact]
    public void Create_EdgesFollowTheFirstOrderStepResponse()
    {
        // A one-pole RC low-pass answers a step with 1 - exp(-t/τ) (any circuits text); the edge at 0.5 ms falls inside a sample interval.
        var trace = SquareWaveSource.Create(10, -4, 1e-3, 2e-6, 3e-7, 4_000);

        var volts = trace.Volts[0];
        Assert.Equal(-4, volts[0], 12);
        Assert.Equal(-4, volts[1666], 12);
        for (var k = 1667; k < 1700; k++)
        {
            var t = (k * 3e-7) - 5e-4;
            Assert.Equal(-4 + (10 * (1 - Math.Exp(-t / 2e-6))), volts[k], 9);
        }

        Assert.Equal(6, volts[3300], 6);
        Assert.Equal(-4, volts[3999], 6);
    }
}
