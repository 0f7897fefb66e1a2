using Patchproof.Core.Estimation;

namespace Patchproof.Core.Tests.Estimation;

public sealed class SavitzkyGolaySelectorTests
{
    private const int Margin = 100;
    private readonly ITestOutputHelper output = TestContext.Current.TestOutputHelper!;

    [Fact]
    public void Choose_QuantizedNoisySines_PicksNearTheBestWindowAgainstTheKnownDerivative()
    {
        // Invented test signal with a known derivative: two sines, 0.5 % noise, 8-bit quantization over a 40-unit window.
        const double h = 0.002;
        var n = 10_001;
        var random = new Random(7);
        var clean = new double[n];
        var derivative = new double[n];
        for (var i = 0; i < n; i++)
        {
            var t = i * h;
            clean[i] = 8 * Math.Sin(2 * Math.PI * 1.3 * t) + 3 * Math.Sin(2 * Math.PI * 3.1 * t + 1);
            derivative[i] = 8 * 2 * Math.PI * 1.3 * Math.Cos(2 * Math.PI * 1.3 * t) + 3 * 2 * Math.PI * 3.1 * Math.Cos(2 * Math.PI * 3.1 * t + 1);
        }

        var sd = Math.Sqrt(clean.Average(v => v * v));
        var samples = clean.Select(v => Math.Round((v + 0.005 * sd * SyntheticLorenz.Gaussian(random)) / (40.0 / 256)) * (40.0 / 256)).ToArray();

        CheckChoice(samples, derivative, h, "sines");
    }

    [Fact]
    public void Choose_QuantizedNoisyLorenzChannel_PicksNearTheBestWindowAgainstTheKnownDerivative()
    {
        // BENCHMARKS.md section 3 capture (s = 10.5, r = 27.3, b = 2.6, 0.5 % noise, quantum 40/256); exact derivative from the equations.
        var (states, derivatives) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 11);

        for (var c = 0; c < 3; c++)
        {
            CheckChoice(capture[c], derivatives[c], SyntheticLorenz.SampleInterval, "xyz"[c].ToString());
        }
    }

    [Fact]
    public void EstimateNoiseStandardDeviation_WhiteNoiseOnSmoothSignal_RecoversSigmaWithin10Percent()
    {
        // Derived: the periodogram of white noise has mean sigma^2 sum w^2 on every bin.
        var random = new Random(3);
        var samples = Enumerable.Range(0, 8192).Select(i => 5 * Math.Sin(0.01 * i) + 0.2 * SyntheticLorenz.Gaussian(random)).ToArray();

        var sigma = SavitzkyGolaySelector.EstimateNoiseStandardDeviation(samples);

        Assert.InRange(sigma, 0.18, 0.22);
    }

    private void CheckChoice(double[] samples, double[] derivative, double h, string label)
    {
        var choice = SavitzkyGolaySelector.Choose(samples, h, derivativeOrder: 1);
        var chosenError = ActualRmsError(choice.ToFilter(), samples, derivative, h);

        var best = double.PositiveInfinity;
        (int M, int P) bestFilter = (0, 0);
        foreach (var p in new[] { 2, 4, 6 })
        {
            for (var m = (p + 2) / 2; m <= Margin; m++)
            {
                var error = ActualRmsError(new SavitzkyGolayFilter(m, p, 1), samples, derivative, h);
                if (error < best)
                {
                    (best, bestFilter) = (error, (m, p));
                }
            }
        }

        output.WriteLine($"{label}: chose m={choice.HalfWidth} p={choice.PolynomialOrder} (sigma {choice.NoiseStandardDeviation:G3}), predicted {choice.PredictedRmsError:G3}, actual {chosenError:G3}; best m={bestFilter.M} p={bestFilter.P} actual {best:G3}");
        Assert.True(chosenError <= 1.25 * best, $"{label}: chosen error {chosenError:G3} vs best {best:G3}");
        Assert.InRange(choice.PredictedRmsError / chosenError, 0.5, 2.0);
    }

    private static double ActualRmsError(SavitzkyGolayFilter filter, double[] samples, double[] derivative, double h)
    {
        var filtered = new double[samples.Length];
        filter.Apply(samples, h, filtered);
        var sum = 0.0;
        for (var i = Margin; i < samples.Length - Margin; i++)
        {
            sum += (filtered[i] - derivative[i]) * (filtered[i] - derivative[i]);
        }

        return Math.Sqrt(sum / (samples.Length - 2 * Margin));
    }
}
