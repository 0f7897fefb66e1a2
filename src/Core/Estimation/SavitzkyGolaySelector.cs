namespace Patchproof.Core.Estimation;

/// <summary>Options of the automatic Savitzky-Golay choice.</summary>
/// <remarks>Defaults: half-widths 2..100 (capped at a quarter of the record), orders 2..6, a signal bin counts when its
/// power exceeds 20 times the noise floor (a false alarm on a noise-only bin has probability e^-20).</remarks>
public sealed record SavitzkyGolaySelectionOptions
{
    /// <summary>The smallest half-width tried, at least 1. Default 2.</summary>
    public int MinHalfWidth { get; init; } = 2;

    /// <summary>The largest half-width tried. Default 100.</summary>
    public int MaxHalfWidth { get; init; } = 100;

    /// <summary>The lowest polynomial order tried (raised to d when smaller). Default 2.</summary>
    public int MinPolynomialOrder { get; init; } = 2;

    /// <summary>The highest polynomial order tried. Default 6.</summary>
    public int MaxPolynomialOrder { get; init; } = 6;

    /// <summary>How many times the noise floor a spectral bin must exceed to count as signal. Default 20.</summary>
    public double SignalThreshold { get; init; } = 20;
}

/// <summary>Chooses a Savitzky-Golay window and order for a record from its noise floor and its spectrum, by minimising the predicted mean-square error of the smoothed value or derivative.</summary>
/// <remarks>
/// <para>Rule. For a filter with centre coefficients c_i (per sample^d) and transfer function
/// H(omega) = h^-d sum_i c_i e^(i omega i h), the mean-square error of the filtered d-th derivative of signal plus white
/// noise of variance sigma^2 is
/// MSE = sigma^2 sum_i c_i^2 / h^(2d) + integral |H(omega) - (i omega)^d|^2 S(omega) d omega,
/// noise through the filter plus the distortion of the signal's spectrum S. The first term falls with the window, the
/// second grows with it; the minimum over (m, p) is taken. This is the exact form of the usual rule "noise variance
/// through the filter + bias from the neglected Taylor term": it uses the whole signal spectrum instead of one
/// higher-derivative estimate, so it stays right when the window spans a good part of a period, where the leading
/// Taylor term no longer dominates.</para>
/// <para>Estimates. The record is detrended, Hann-windowed, zero-padded to a power of two and transformed; the periodogram P_k has expectation
/// sigma^2 sum w^2 on noise-only bins. sigma is the caller's (noise floor and quantization step / sqrt(12) from the
/// capture checks) or, when not given, median(P_k over the upper half of the band) / ln 2 / sum w^2 (the median of an
/// exponential variable is ln 2 times its mean). The signal spectrum is (P_k - noise)+ up to the last bin above
/// <see cref="SavitzkyGolaySelectionOptions.SignalThreshold"/> times the noise; beyond, it is taken as zero.
/// Bins are merged into at most 256 bands for speed.</para>
/// <para>References:
/// 1. R. W. Schafer, What is a Savitzky-Golay filter?, IEEE Signal Processing Magazine 28(4) (2011) 111-117 (frequency response).
/// 2. P. Welch, The use of fast Fourier transform for the estimation of power spectra, IEEE Trans. Audio Electroacoust. 15 (1967) 70-73 (windowed periodogram).</para>
/// </remarks>
public static class SavitzkyGolaySelector
{
    private const int MaxBands = 256;

    /// <summary>Chooses (m, p) for the d-th derivative of <paramref name="samples"/>.</summary>
    /// <param name="samples">A uniformly sampled record, at least 64 samples, finite.</param>
    /// <param name="sampleInterval">h, positive, in the time unit of the derivative.</param>
    /// <param name="derivativeOrder">d, 0 to 4.</param>
    /// <param name="noiseStandardDeviation">The white noise floor sigma in the record's unit, or NaN to estimate it from the spectrum.</param>
    /// <param name="options">Search ranges; defaults when null.</param>
    /// <returns>The chosen window and order with the predicted error budget.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When the record is too short or not finite, or an argument is out of range.</exception>
    public static SavitzkyGolayChoice Choose(ReadOnlySpan<double> samples, double sampleInterval, int derivativeOrder, double noiseStandardDeviation = double.NaN, SavitzkyGolaySelectionOptions? options = null)
    {
        options ??= new SavitzkyGolaySelectionOptions();
        var n = samples.Length;
        Preconditions.CheckArgumentRange(nameof(samples), n >= 64, "needs at least 64 samples");
        Preconditions.CheckArgumentRange(nameof(sampleInterval), sampleInterval > 0 && double.IsFinite(sampleInterval), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(derivativeOrder), derivativeOrder is >= 0 and <= 4, "must lie between 0 and 4");
        Preconditions.CheckArgumentRange(nameof(noiseStandardDeviation), double.IsNaN(noiseStandardDeviation) || (noiseStandardDeviation >= 0 && double.IsFinite(noiseStandardDeviation)), "must be NaN (estimate) or non-negative");
        Preconditions.CheckArgumentRange(nameof(options), options.MinHalfWidth >= 1 && options.MaxHalfWidth >= options.MinHalfWidth && options.MaxPolynomialOrder >= Math.Max(options.MinPolynomialOrder, derivativeOrder), "needs a non-empty range of half-widths and orders");

        var spectrum = Periodogram(samples, out var windowEnergy);
        var padded = 2 * (spectrum.Length - 1);
        var half = padded / 2;
        var sigma = double.IsNaN(noiseStandardDeviation) ? EstimateNoise(spectrum, half, windowEnergy) : noiseStandardDeviation;
        var noiseLevel = sigma * sigma * windowEnergy;
        var cutoff = 0;
        for (var k = 1; k <= half; k++)
        {
            if (spectrum[k] > options.SignalThreshold * noiseLevel)
            {
                cutoff = k;
            }
        }

        // Signal power per band (mean square of the signal carried by the band) and the band's RMS angular frequency.
        var bandCount = Math.Max(1, Math.Min(MaxBands, cutoff));
        var bandPower = new double[bandCount];
        var bandOmega = new double[bandCount];
        var omegaStep = 2 * Math.PI / (padded * sampleInterval);
        for (var k = 1; k <= cutoff; k++)
        {
            var band = (int)((long)(k - 1) * bandCount / cutoff);
            var power = Math.Max(0, spectrum[k] - noiseLevel) * (k == half ? 1 : 2) / (padded * windowEnergy);
            bandPower[band] += power;
            bandOmega[band] += power * (k * omegaStep) * (k * omegaStep);
        }

        for (var b = 0; b < bandCount; b++)
        {
            bandOmega[b] = bandPower[b] > 0 ? Math.Sqrt(bandOmega[b] / bandPower[b]) : 0;
        }

        var maxHalfWidth = Math.Min(options.MaxHalfWidth, (n - 1) / 4);
        var cosine = new double[bandCount * (maxHalfWidth + 1)];
        var sine = new double[bandCount * (maxHalfWidth + 1)];
        for (var b = 0; b < bandCount; b++)
        {
            for (var i = 0; i <= maxHalfWidth; i++)
            {
                cosine[b * (maxHalfWidth + 1) + i] = Math.Cos(bandOmega[b] * i * sampleInterval);
                sine[b * (maxHalfWidth + 1) + i] = Math.Sin(bandOmega[b] * i * sampleInterval);
            }
        }

        var d = derivativeOrder;
        var timeScale = Math.Pow(sampleInterval, -d);
        var targetSign = (d / 2) % 2 == 0 ? 1.0 : -1.0;
        SavitzkyGolayChoice? best = null;
        for (var p = Math.Max(options.MinPolynomialOrder, d); p <= options.MaxPolynomialOrder; p++)
        {
            // Orders p - 1 and p give the same centre filter when p - d is odd; skip the duplicate.
            if ((p - d) % 2 == 1 && p > Math.Max(options.MinPolynomialOrder, d))
            {
                continue;
            }

            for (var m = Math.Max(options.MinHalfWidth, (p + 2) / 2); m <= maxHalfWidth; m++)
            {
                var c = SavitzkyGolayFilter.ComputeCoefficients(m, p, d);
                var gain = 0.0;
                foreach (var value in c)
                {
                    gain += value * value;
                }

                var noiseMeanSquare = sigma * sigma * gain * timeScale * timeScale;
                var biasMeanSquare = 0.0;
                for (var b = 0; b < bandCount; b++)
                {
                    var row = b * (maxHalfWidth + 1);
                    var response = d % 2 == 0 ? c[m] : 0.0;
                    for (var i = 1; i <= m; i++)
                    {
                        // Symmetric (even d) or antisymmetric (odd d) coefficients: H is real or imaginary.
                        response += d % 2 == 0 ? (c[m + i] + c[m - i]) * cosine[row + i] : (c[m + i] - c[m - i]) * sine[row + i];
                    }

                    var error = response * timeScale - targetSign * Math.Pow(bandOmega[b], d);
                    biasMeanSquare += error * error * bandPower[b];
                }

                var total = Math.Sqrt(noiseMeanSquare + biasMeanSquare);
                if (best is null || total < best.PredictedRmsError)
                {
                    best = new SavitzkyGolayChoice(m, p, d, sigma, Math.Sqrt(noiseMeanSquare), Math.Sqrt(biasMeanSquare), total, cutoff * omegaStep / (2 * Math.PI));
                }
            }
        }

        return best!;
    }

    /// <summary>Estimates the white noise floor sigma of a record from the upper half of its periodogram.</summary>
    /// <param name="samples">A uniformly sampled record, at least 64 samples.</param>
    /// <returns>sigma in the record's unit.</returns>
    public static double EstimateNoiseStandardDeviation(ReadOnlySpan<double> samples)
    {
        Preconditions.CheckArgumentRange(nameof(samples), samples.Length >= 64, "needs at least 64 samples");
        var spectrum = Periodogram(samples, out var windowEnergy);
        return EstimateNoise(spectrum, spectrum.Length - 1, windowEnergy);
    }

    private static double EstimateNoise(double[] spectrum, int half, double windowEnergy)
    {
        var upper = spectrum.AsSpan(half / 2, half - half / 2).ToArray();
        Array.Sort(upper);
        var median = upper[upper.Length / 2];
        return Math.Sqrt(median / Math.Log(2) / windowEnergy);
    }

    /// <summary>|X_k|^2 of the detrended, Hann-windowed record for k = 0..n/2, and sum w_i^2.</summary>
    private static double[] Periodogram(ReadOnlySpan<double> samples, out double windowEnergy)
    {
        var n = samples.Length;
        double meanIndex = (n - 1) / 2.0, mean = 0, slope = 0, spread = 0;
        for (var i = 0; i < n; i++)
        {
            if (!double.IsFinite(samples[i]))
            {
                Preconditions.CheckArgumentRange(nameof(samples), false, $"sample {i} is not a finite number");
            }

            mean += samples[i];
        }

        mean /= n;
        for (var i = 0; i < n; i++)
        {
            slope += (i - meanIndex) * (samples[i] - mean);
            spread += (i - meanIndex) * (i - meanIndex);
        }

        slope /= spread;
        // Zero-padded to a power of two: bin k then sits at k / (N h) with N the padded length.
        var length = (int)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)n);
        var real = new double[length];
        var imaginary = new double[length];
        windowEnergy = 0;
        for (var i = 0; i < n; i++)
        {
            var w = 0.5 * (1 - Math.Cos(2 * Math.PI * i / (n - 1)));
            windowEnergy += w * w;
            real[i] = w * (samples[i] - mean - slope * (i - meanIndex));
        }

        RadixTwoFourier.Forward(real, imaginary);
        var spectrum = new double[length / 2 + 1];
        for (var k = 0; k < spectrum.Length; k++)
        {
            spectrum[k] = real[k] * real[k] + imaginary[k] * imaginary[k];
        }

        return spectrum;
    }
}
