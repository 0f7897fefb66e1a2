using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class WelchSpectrumTests
{
    [Fact]
    public void Estimate_SineOnABinCentre_PeaksInThatBinAndKeepsItsPower_Parseval()
    {
        // Arrange: amplitude 2 V at bin 64 of a 1024-sample segment; its power is A^2/2 = 2 V^2
        // (Parseval's theorem; Welch 1967 for the estimator).
        const double dt = 1e-3;
        const int segment = 1024;
        var frequency = 64 / (segment * dt);
        var signal = Enumerable.Range(0, 16 * segment).Select(i => 2.0 * Math.Sin(2 * Math.PI * frequency * i * dt)).ToArray();

        // Act
        var spectrum = WelchSpectrum.Estimate(signal, dt, segment, TestContext.Current.CancellationToken);

        // Assert
        Assert.Equal(64, spectrum.PeakBin());
        Assert.Equal(frequency, spectrum.FrequenciesHertz[spectrum.PeakBin()], 9);
        Assert.Equal(2.0, spectrum.TotalPower(), 3);
        Assert.Equal(31, spectrum.SegmentCount);
    }

    [Fact]
    public void Estimate_SineBetweenBins_StillKeepsItsPower_Parseval()
    {
        const double dt = 1e-4;
        var signal = Enumerable.Range(0, 50_000).Select(i => 0.5 * Math.Sin(2 * Math.PI * 123.4 * i * dt + 0.3)).ToArray();

        var spectrum = WelchSpectrum.Estimate(signal, dt, cancellation: TestContext.Current.CancellationToken);

        // Parseval with the Hann window: the window-weighted variance equals A^2/2 to within the
        // leakage of the segment means (below 1e-3 here).
        Assert.Equal(0.125, spectrum.TotalPower(), 0.125 * 2e-3);
        Assert.InRange(spectrum.FrequenciesHertz[spectrum.PeakBin()], 123.4 - spectrum.BinWidthHertz, 123.4 + spectrum.BinWidthHertz);
    }

    [Fact]
    public void Estimate_WhiteNoise_HasTheFlatLevelTwoSigmaSquaredDt()
    {
        // Derived: a one-sided density of white noise of variance s^2 sampled at dt is 2 s^2 dt.
        var random = new Random(7);
        const double dt = 0.01;
        const double sigma = 0.3;
        var noise = Enumerable.Range(0, 200_000).Select(_ => sigma * Gaussian(random)).ToArray();

        var spectrum = WelchSpectrum.Estimate(noise, dt, 512, TestContext.Current.CancellationToken);

        var interior = spectrum.Density.Skip(5).Take(spectrum.Density.Length - 10).ToArray();
        Assert.Equal(2 * sigma * sigma * dt, interior.Average(), 2 * sigma * sigma * dt * 0.02);
        Assert.Equal(sigma * sigma, spectrum.TotalPower(), sigma * sigma * 0.02);
    }

    [Fact]
    public void DefaultSegmentLength_IsThePowerOfTwoNotAboveAnEighth()
    {
        Assert.Equal(8192, WelchSpectrum.DefaultSegmentLength(100_000));
        Assert.Equal(256, WelchSpectrum.DefaultSegmentLength(1000));
        Assert.Equal(100, WelchSpectrum.DefaultSegmentLength(100));
    }

    [Fact]
    public void Estimate_OddSegmentLength_IsRejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => WelchSpectrum.Estimate(new double[100], 1, 33, TestContext.Current.CancellationToken));
    }

    internal static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());

    [Fact]
    public void Estimate_CancelledToken_StopsWithOperationCanceled()
    {
        var signal = Enumerable.Range(0, 4096).Select(i => Math.Sin(0.1 * i)).ToArray();

        Assert.ThrowsAny<OperationCanceledException>(() => WelchSpectrum.Estimate(signal, 1e-3, 256, new CancellationToken(true)));
    }
}
