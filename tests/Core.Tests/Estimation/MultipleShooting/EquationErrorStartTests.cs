using Patchproof.Core.Estimation;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Core.Tests.Estimation.MultipleShooting;

public sealed class EquationErrorStartTests
{
    // Lorenz: x' = s y - s x, y' = r x - y - x z, z' = x y - b z, each equation with an offset.
    private static readonly PolynomialVectorField Lorenz = new(
        ["x", "y", "z"],
        [new(0, [1], "y"), new(0, [0], "x"), new(1, [0], "x"), new(1, [1], "y"), new(1, [0, 2], "x*z"), new(2, [0, 1], "x*y"), new(2, [2], "z")],
        [true, true, true]);

    [Fact]
    public void TryEstimate_LorenzCaptureWithChannelOffsets_RecoversTheResolvableOffsetsAndTheCoefficients()
    {
        // BENCHMARKS.md section 3 capture (true s = 10.5, r = 27.3, b = 2.6; 0.5 % noise; 8-bit steps of 40/256), with
        // channel offsets of 0.3, -0.2 and 0.5 added. z' sees x y, so d_x and d_y show as its x and y terms; d_z trades
        // exactly against y's x coefficient and z's offset (x (z - d_z) = x z - d_z x, -b (z - d_z) = -b z + b d_z), so
        // it stays at zero and the identity r + d_z, b d_z must appear instead.
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 31);
        double[] offsets = [0.3, -0.2, 0.5];
        var shifted = capture.Select((channel, j) => channel.Select(v => v + offsets[j]).ToArray()).ToList();

        var start = EquationErrorStart.TryEstimate(Lorenz, shifted, SyntheticLorenz.SampleInterval, new EquationErrorOptions())!;

        Assert.NotNull(start);
        Assert.InRange(start.StateOffsets[0], 0.3 - 0.01, 0.3 + 0.01);
        Assert.InRange(start.StateOffsets[1], -0.2 - 0.01, -0.2 + 0.01);
        Assert.Equal(0, start.StateOffsets[2], 1e-9);
        var p = start.Parameters;
        Assert.InRange(p[0] / SyntheticLorenz.Sigma, 0.999, 1.001);
        Assert.InRange(-p[1] / SyntheticLorenz.Sigma, 0.999, 1.001);
        Assert.InRange(p[2] / (SyntheticLorenz.Rho + 0.5), 0.998, 1.002);
        Assert.InRange(p[3], -1.01, -0.99);
        Assert.InRange(p[4], -1.002, -0.998);
        Assert.InRange(p[5], 0.998, 1.002);
        Assert.InRange(-p[6] / SyntheticLorenz.Beta, 0.999, 1.001);
        // Offsets: x' and y' none; z' carries b d_z = 1.3.
        Assert.InRange(p[7], -0.05, 0.05);
        Assert.InRange(p[8], -0.1, 0.1);
        Assert.InRange(p[9], 1.3 - 0.05, 1.3 + 0.05);
    }

    [Fact]
    public void TryEstimate_TooFewSamples_GivesNull()
    {
        var (states, _) = SyntheticLorenz.Clean(samples: 50);

        Assert.Null(EquationErrorStart.TryEstimate(Lorenz, states, SyntheticLorenz.SampleInterval, new EquationErrorOptions()));
    }
}
