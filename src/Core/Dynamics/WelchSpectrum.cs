using MathNet.Numerics.IntegralTransforms;

namespace Patchproof.Core.Dynamics;

/// <summary>Power spectral density by Welch's method: Hann-windowed segments, 50 % overlap, averaged periodograms.</summary>
/// <remarks>
/// <para>Formula: the signal is cut into K segments of L samples starting every L/2 samples; each
/// segment has its mean removed, is multiplied by the periodic Hann window
/// w_n = 0.5 - 0.5 cos(2 pi n / L), and transformed, X_k = sum_n w_n x_n e^{-2 pi i k n / L}. The
/// one-sided density is P_k = c_k |X_k|^2 dt / sum_n w_n^2, averaged over the segments, with
/// c_k = 1 at k = 0 and k = L/2 and c_k = 2 between. So sum_k P_k / (L dt) equals the mean of
/// sum_n (w_n x_n)^2 / sum_n w_n^2, the window-weighted variance (Parseval).</para>
/// <para>Segment length rule (default): the largest power of two not above N / 8, so that at least
/// 15 half-overlapping segments are averaged (variance about 1/15 of a single periodogram's), and
/// at least 256 samples (or N when the record is shorter). A caller who needs finer resolution
/// passes its own length.</para>
/// <para>References: 1. P. D. Welch, The use of fast Fourier transform for the estimation of power
/// spectra, IEEE Trans. Audio Electroacoust. 15 (1967) 70-73. 2. F. J. Harris, On the use of windows
/// for harmonic analysis with the discrete Fourier transform, Proc. IEEE 66 (1978) 51-83.</para>
/// </remarks>
public static class WelchSpectrum
{
    /// <summary>The default segment length for <paramref name="sampleCount"/> samples (see remarks).</summary>
    /// <param name="sampleCount">The record length N (at least 2).</param>
    public static int DefaultSegmentLength(int sampleCount)
    {
        Preconditions.CheckArgumentRange(nameof(sampleCount), sampleCount >= 2, "must be at least 2");
        var length = 256;
        while (length * 2 <= sampleCount / 8)
        {
            length *= 2;
        }

        return Math.Min(length, sampleCount - (sampleCount % 2));
    }

    /// <summary>Estimates the one-sided power spectral density of a uniformly sampled signal.</summary>
    /// <param name="signal">The samples (at least 2, finite).</param>
    /// <param name="sampleIntervalSeconds">The sample interval dt, positive.</param>
    /// <param name="segmentLength">Samples per segment, even, 2 .. N; 0 picks <see cref="DefaultSegmentLength"/>.</param>
    /// <param name="cancellation">Checked every 16 segments; default none.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the interval or the segment length is out of range.</exception>
    /// <exception cref="OperationCanceledException">When <paramref name="cancellation"/> is cancelled.</exception>
    public static PowerSpectrum Estimate(ReadOnlySpan<double> signal, double sampleIntervalSeconds, int segmentLength = 0, CancellationToken cancellation = default)
    {
        Preconditions.CheckArgumentRange(nameof(signal), signal.Length >= 2, "needs at least 2 samples");
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        var length = segmentLength == 0 ? DefaultSegmentLength(signal.Length) : segmentLength;
        Preconditions.CheckArgumentRange(nameof(segmentLength), length >= 2 && length <= signal.Length && length % 2 == 0, "must be even and between 2 and the number of samples");

        var window = new double[length];
        var windowPower = 0.0;
        for (var n = 0; n < length; n++)
        {
            window[n] = 0.5 - 0.5 * Math.Cos(2 * Math.PI * n / length);
            windowPower += window[n] * window[n];
        }

        var bins = length / 2 + 1;
        var density = new double[bins];
        var buffer = new double[length + 2];
        var hop = length / 2;
        var segments = 0;
        for (var start = 0; start + length <= signal.Length; start += hop)
        {
            if ((segments & 15) == 0)
            {
                cancellation.ThrowIfCancellationRequested();
            }

            var segment = signal.Slice(start, length);
            var mean = 0.0;
            for (var n = 0; n < length; n++)
            {
                mean += segment[n];
            }

            mean /= length;
            for (var n = 0; n < length; n++)
            {
                buffer[n] = (segment[n] - mean) * window[n];
            }

            buffer[length] = 0;
            buffer[length + 1] = 0;
            Fourier.ForwardReal(buffer, length, FourierOptions.NoScaling);
            for (var k = 0; k < bins; k++)
            {
                var re = buffer[2 * k];
                var im = buffer[2 * k + 1];
                density[k] += re * re + im * im;
            }

            segments++;
        }

        var scale = sampleIntervalSeconds / (windowPower * segments);
        var frequencies = new double[bins];
        var binWidth = 1.0 / (length * sampleIntervalSeconds);
        for (var k = 0; k < bins; k++)
        {
            var oneSided = k == 0 || k == length / 2 ? 1.0 : 2.0;
            density[k] *= oneSided * scale;
            frequencies[k] = k * binWidth;
        }

        return new PowerSpectrum(frequencies, density, binWidth, length, segments);
    }
}
