using System.Numerics;
using MathNet.Numerics.IntegralTransforms;

namespace Patchproof.Core.Captures.Checks;

/// <summary>Finds a channel's dominant frequency: the highest peak of its power spectrum above the lowest bins.</summary>
/// <remarks>
/// On the first M samples (M the largest power of two up to 2^20 and the record length): remove the
/// least-squares line (so a slow ramp does not dominate), apply a Hann window, take the FFT (MathNet), and pick
/// the bin k in [2, M/2] of largest |X_k|^2; f = k / (M dt). The frequency resolution is 1 / (M dt).
/// References:
/// 1. F. J. Harris, "On the use of windows for harmonic analysis with the discrete Fourier transform", Proc. IEEE 66 (1978).
/// </remarks>
internal static class DominantFrequency
{
    public const int MaxLength = 1 << 20;

    /// <summary>The dominant frequency in hertz, or null when the record is too short (under 16 samples) or flat.</summary>
    public static double? Find(ReadOnlySpan<float> x, double intervalSeconds)
    {
        if (x.Length < 16 || !(intervalSeconds > 0))
        {
            return null;
        }

        var m = 1 << (int)Math.Floor(Math.Log2(Math.Min(x.Length, MaxLength)));
        double sx = 0, sxx = 0, sy = 0, sxy = 0;
        for (var i = 0; i < m; i++)
        {
            sx += i;
            sxx += (double)i * i;
            sy += x[i];
            sxy += i * (double)x[i];
        }

        var slope = ((m * sxy) - (sx * sy)) / ((m * sxx) - (sx * sx));
        var intercept = (sy - (slope * sx)) / m;
        var data = new Complex[m];
        for (var i = 0; i < m; i++)
        {
            var window = 0.5 - (0.5 * Math.Cos(2 * Math.PI * i / (m - 1)));
            data[i] = new Complex((x[i] - (intercept + (slope * i))) * window, 0);
        }

        Fourier.Forward(data, FourierOptions.Matlab);
        var best = -1;
        var bestPower = 0.0;
        for (var k = 2; k <= m / 2; k++)
        {
            var p = (data[k].Real * data[k].Real) + (data[k].Imaginary * data[k].Imaginary);
            if (p > bestPower)
            {
                bestPower = p;
                best = k;
            }
        }

        return best < 0 || bestPower == 0 ? null : best / (m * intervalSeconds);
    }
}
