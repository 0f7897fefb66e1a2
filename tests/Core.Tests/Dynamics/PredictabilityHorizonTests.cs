using Patchproof.Core.Dynamics;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class PredictabilityHorizonTests
{
    [Fact]
    public void Measure_ExactModelWithSmallNoise_LastsAboutLnBandOverNoiseLyapunovTimes()
    {
        // Derived from the definition of lambda_1 (Sprott's 0.9056 for Lorenz): an initial error
        // d_0 grows like d_0 e^(lambda_1 t), so the band 0.25 is left after about
        // ln(0.25 / d_0) Lyapunov times, 7.8 for d_0 = 1e-4 standard deviations. Finite-time
        // exponents scatter, hence the wide range.
        var reference = Noisy(TestTrajectories.Lorenz(10_000, 0.01), 1e-4);

        var result = PredictabilityHorizon.Measure(new LorenzSystem(), LorenzSystem.ClassicParameters, reference, 0.01, 1e-3, 0.9056, new PredictabilityOptions { Restarts = 10 });

        Assert.Equal(10, result.Horizons.Length);
        Assert.InRange(result.MeanHorizonLyapunovTimes, 4, 12);
        Assert.Equal(result.MeanHorizon * 1e-3, result.MeanHorizonSeconds, 12);
        Assert.True(result.CensoredCount < 10);
    }

    [Fact]
    public void Measure_DriftedCoefficient_ShortensTheHorizon()
    {
        var reference = Noisy(TestTrajectories.Lorenz(10_000, 0.01), 1e-4);
        var options = new PredictabilityOptions { Restarts = 10 };

        var exact = PredictabilityHorizon.Measure(new LorenzSystem(), LorenzSystem.ClassicParameters, reference, 0.01, 1, 0.9056, options);
        var drifted = PredictabilityHorizon.Measure(new LorenzSystem(), [10, 28 * 1.05, 8.0 / 3], reference, 0.01, 1, 0.9056, options);

        Assert.True(drifted.MeanHorizon < 0.7 * exact.MeanHorizon, $"drifted {drifted.MeanHorizon}, exact {exact.MeanHorizon}");
    }

    [Fact]
    public void Measure_CancelledToken_StopsWithOperationCanceled()
    {
        var reference = TestTrajectories.Lorenz(10_000, 0.01);
        var options = new PredictabilityOptions { Restarts = 10, Cancellation = new CancellationToken(true) };

        Assert.ThrowsAny<OperationCanceledException>(() => PredictabilityHorizon.Measure(new LorenzSystem(), LorenzSystem.ClassicParameters, reference, 0.01, 1e-3, 0.9056, options));
    }

    private static double[][] Noisy(double[][] channels, double relative)
    {
        var random = new Random(9);
        return channels.Select(channel =>
        {
            var deviation = Math.Sqrt(channel.Select(v => v * v).Average() - Math.Pow(channel.Average(), 2));
            return channel.Select(v => v + relative * deviation * WelchSpectrumTests.Gaussian(random)).ToArray();
        }).ToArray();
    }
}
