namespace Patchproof.Core.Estimation;

/// <summary>An in-place radix-2 fast Fourier transform on separate real and imaginary arrays, single-threaded.</summary>
/// <remarks>X_k = sum_j x_j exp(-2 pi i j k / N), no scaling; N must be a power of two. Iterative Cooley-Tukey with
/// bit-reversed input order. References: 1. J. W. Cooley, J. W. Tukey, Math. Comp. 19 (1965) 297-301.</remarks>
internal static class RadixTwoFourier
{
    /// <summary>Transforms (real, imaginary) in place; both of the same power-of-two length.</summary>
    public static void Forward(Span<double> real, Span<double> imaginary)
    {
        var n = real.Length;
        for (int i = 1, j = 0; i < n; i++)
        {
            var bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1)
            {
                j ^= bit;
            }

            j ^= bit;
            if (i < j)
            {
                (real[i], real[j]) = (real[j], real[i]);
                (imaginary[i], imaginary[j]) = (imaginary[j], imaginary[i]);
            }
        }

        for (var length = 2; length <= n; length <<= 1)
        {
            var angle = -2 * Math.PI / length;
            var stepReal = Math.Cos(angle);
            var stepImaginary = Math.Sin(angle);
            var halfLength = length >> 1;
            for (var start = 0; start < n; start += length)
            {
                double twiddleReal = 1, twiddleImaginary = 0;
                for (var k = 0; k < halfLength; k++)
                {
                    var a = start + k;
                    var b = a + halfLength;
                    var productReal = real[b] * twiddleReal - imaginary[b] * twiddleImaginary;
                    var productImaginary = real[b] * twiddleImaginary + imaginary[b] * twiddleReal;
                    real[b] = real[a] - productReal;
                    imaginary[b] = imaginary[a] - productImaginary;
                    real[a] += productReal;
                    imaginary[a] += productImaginary;
                    var nextReal = twiddleReal * stepReal - twiddleImaginary * stepImaginary;
                    twiddleImaginary = twiddleReal * stepImaginary + twiddleImaginary * stepReal;
                    twiddleReal = nextReal;
                }
            }
        }
    }
}
