using SimdVector = System.Numerics.Vector;
using SimdVectorOfDouble = System.Numerics.Vector<double>;

namespace Patchproof.Core.Estimation;

/// <summary>A Savitzky-Golay smoothing and differentiating filter: a least-squares polynomial fitted over a sliding window, evaluated (or differentiated) at each sample.</summary>
/// <remarks>
/// <para>For half-width m, polynomial order p and derivative order d, the window holds 2m + 1 samples at offsets
/// i = -m..m. With u = i / m and A_ij = u_i^j (j = 0..p), the least-squares polynomial coefficients are
/// a = R^-1 Q' y (A = Q R, never the normal equations), and the d-th derivative at offset t is
/// sum_j a_j j!/(j-d)! (t/m)^(j-d) / m^d per sample^d; divide by h^d for the time unit. The coefficient rows for
/// every t in -m..m are precomputed: t = 0 (centre) in the interior, shifted windows at the two ends, so every output
/// sample comes from a full window and the record keeps its length. Coefficients follow the published data-order
/// convention (first coefficient multiplies the earliest sample).</para>
/// <para>Exactness: a filter of order p returns the exact value or derivative of any polynomial of degree at most p,
/// at the centre and at the ends alike. White noise of variance sigma^2 comes out with variance
/// sigma^2 <see cref="NoiseGain"/> / h^(2d) in the interior.</para>
/// <para>Invariants: m &gt;= 1, 0 &lt;= d &lt;= p &lt;= 2m. The filter is immutable and safe to share across threads;
/// <see cref="Apply"/> allocates nothing.</para>
/// <para>References:
/// 1. A. Savitzky, M. J. E. Golay, Smoothing and differentiation of data by simplified least squares procedures, Anal. Chem. 36 (1964) 1627-1639.
/// 2. J. Steinier, Y. Termonia, J. Deltour, Comments on smoothing and differentiation of data by simplified least square procedure, Anal. Chem. 44 (1972) 1906-1909.
/// 3. R. W. Schafer, What is a Savitzky-Golay filter?, IEEE Signal Processing Magazine 28(4) (2011) 111-117.</para>
/// </remarks>
public sealed class SavitzkyGolayFilter
{
    private readonly double[] table;

    /// <summary>Builds the filter and its coefficient rows.</summary>
    /// <param name="halfWidth">m, at least 1; the window has 2m + 1 samples.</param>
    /// <param name="polynomialOrder">p, from <paramref name="derivativeOrder"/> to 2m.</param>
    /// <param name="derivativeOrder">d, 0 for smoothing, 1 for the first derivative, and so on; at most p.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the orders do not satisfy 0 &lt;= d &lt;= p &lt;= 2m.</exception>
    public SavitzkyGolayFilter(int halfWidth, int polynomialOrder, int derivativeOrder = 0)
    {
        Preconditions.CheckArgumentRange(nameof(halfWidth), halfWidth >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(polynomialOrder), polynomialOrder >= 0 && polynomialOrder <= 2 * halfWidth, "must lie between 0 and 2 * halfWidth");
        Preconditions.CheckArgumentRange(nameof(derivativeOrder), derivativeOrder >= 0 && derivativeOrder <= polynomialOrder, "must lie between 0 and polynomialOrder");
        HalfWidth = halfWidth;
        PolynomialOrder = polynomialOrder;
        DerivativeOrder = derivativeOrder;
        table = BuildTable(halfWidth, polynomialOrder, derivativeOrder, -halfWidth, halfWidth);
        var centre = Coefficients;
        var gain = 0.0;
        foreach (var value in centre)
        {
            gain += value * value;
        }

        NoiseGain = gain;
    }

    /// <summary>The half-width m.</summary>
    public int HalfWidth { get; }

    /// <summary>The polynomial order p.</summary>
    public int PolynomialOrder { get; }

    /// <summary>The derivative order d.</summary>
    public int DerivativeOrder { get; }

    /// <summary>The window length 2m + 1.</summary>
    public int WindowLength => 2 * HalfWidth + 1;

    /// <summary>The sum of squares of the centre coefficients: white noise of variance sigma^2 leaves with sigma^2 * NoiseGain / h^(2d).</summary>
    public double NoiseGain { get; }

    /// <summary>The centre coefficients (2m + 1, data order), per sample^d: divide the filtered value by h^d.</summary>
    public ReadOnlySpan<double> Coefficients => CoefficientsAt(0);

    /// <summary>The coefficients that evaluate at <paramref name="offset"/> samples from the window's centre (used at the record's ends).</summary>
    /// <param name="offset">t in -m..m; negative near the start of a record, positive near its end.</param>
    /// <returns>2m + 1 coefficients in data order, per sample^d.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When |offset| exceeds m.</exception>
    public ReadOnlySpan<double> CoefficientsAt(int offset)
    {
        Preconditions.CheckArgumentRange(nameof(offset), Math.Abs(offset) <= HalfWidth, "must lie within the half-width");
        return table.AsSpan((offset + HalfWidth) * WindowLength, WindowLength);
    }

    /// <summary>Computes coefficients for any (m, p, d) and evaluation offset without building a filter.</summary>
    /// <param name="halfWidth">m, at least 1.</param>
    /// <param name="polynomialOrder">p, from d to 2m.</param>
    /// <param name="derivativeOrder">d, from 0 to p.</param>
    /// <param name="offset">t in -m..m (0 for the centre).</param>
    /// <returns>2m + 1 coefficients in data order, per sample^d.</returns>
    public static double[] ComputeCoefficients(int halfWidth, int polynomialOrder, int derivativeOrder, int offset = 0)
    {
        Preconditions.CheckArgumentRange(nameof(halfWidth), halfWidth >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(polynomialOrder), polynomialOrder >= 0 && polynomialOrder <= 2 * halfWidth, "must lie between 0 and 2 * halfWidth");
        Preconditions.CheckArgumentRange(nameof(derivativeOrder), derivativeOrder >= 0 && derivativeOrder <= polynomialOrder, "must lie between 0 and polynomialOrder");
        Preconditions.CheckArgumentRange(nameof(offset), Math.Abs(offset) <= halfWidth, "must lie within the half-width");
        return BuildTable(halfWidth, polynomialOrder, derivativeOrder, offset, offset);
    }

    /// <summary>Filters a uniformly sampled record, keeping its length (shifted windows at both ends).</summary>
    /// <param name="samples">The record, at least 2m + 1 samples.</param>
    /// <param name="sampleInterval">h, positive, in the time unit wanted for the derivative (seconds for a capture).</param>
    /// <param name="destination">Receives the smoothed value or derivative (per time unit^d); same length as <paramref name="samples"/>; must not overlap it.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the record is shorter than the window, the lengths differ, or h is not positive.</exception>
    public void Apply(ReadOnlySpan<double> samples, double sampleInterval, Span<double> destination)
    {
        CheckApply(samples.Length, destination.Length, sampleInterval);
        var scale = Math.Pow(sampleInterval, -DerivativeOrder);
        var n = samples.Length;
        var m = HalfWidth;
        var width = WindowLength;
        var centre = Coefficients;
        for (var k = 0; k < m; k++)
        {
            destination[k] = scale * Dot(table.AsSpan(k * width, width), samples[..width]);
            destination[n - m + k] = scale * Dot(table.AsSpan((m + 1 + k) * width, width), samples[(n - width)..]);
        }

        for (var k = m; k < n - m; k++)
        {
            destination[k] = scale * Dot(centre, samples.Slice(k - m, width));
        }
    }

    /// <summary>Filters like <see cref="Apply"/>, but writes NaN wherever the window used for a sample touches an excluded sample (a clipped stretch, a glitch).</summary>
    /// <param name="samples">The record, at least 2m + 1 samples.</param>
    /// <param name="excluded">True for each sample that must not be used; same length.</param>
    /// <param name="sampleInterval">h, positive.</param>
    /// <param name="destination">Receives the result or NaN; same length; must not overlap <paramref name="samples"/>.</param>
    /// <returns>The number of output samples set to NaN.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When lengths differ, the record is shorter than the window, or h is not positive.</exception>
    public int ApplyMasked(ReadOnlySpan<double> samples, ReadOnlySpan<bool> excluded, double sampleInterval, Span<double> destination)
    {
        Preconditions.CheckArgumentRange(nameof(excluded), excluded.Length == samples.Length, "must have one flag per sample");
        Apply(samples, sampleInterval, destination);
        var n = samples.Length;
        var width = WindowLength;
        var excludedInWindow = 0;
        for (var i = 0; i < width; i++)
        {
            excludedInWindow += excluded[i] ? 1 : 0;
        }

        var masked = 0;
        var windowStart = 0;
        for (var k = 0; k < n; k++)
        {
            var start = Math.Clamp(k - HalfWidth, 0, n - width);
            while (windowStart < start)
            {
                excludedInWindow -= excluded[windowStart] ? 1 : 0;
                excludedInWindow += excluded[windowStart + width] ? 1 : 0;
                windowStart++;
            }

            if (excludedInWindow > 0)
            {
                destination[k] = double.NaN;
                masked++;
            }
        }

        return masked;
    }

    private void CheckApply(int length, int destinationLength, double sampleInterval)
    {
        Preconditions.CheckArgumentRange("samples", length >= WindowLength, $"needs at least {WindowLength} samples for this window");
        Preconditions.CheckArgumentRange("destination", destinationLength == length, "must have the same length as the samples");
        Preconditions.CheckArgumentRange(nameof(sampleInterval), sampleInterval > 0 && double.IsFinite(sampleInterval), "must be positive and finite");
    }

    private static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        var sum = SimdVectorOfDouble.Zero;
        var i = 0;
        if (SimdVector.IsHardwareAccelerated)
        {
            for (; i <= a.Length - SimdVectorOfDouble.Count; i += SimdVectorOfDouble.Count)
            {
                sum += new SimdVectorOfDouble(a.Slice(i)) * new SimdVectorOfDouble(b.Slice(i));
            }
        }

        var total = SimdVector.Sum(sum);
        for (; i < a.Length; i++)
        {
            total += a[i] * b[i];
        }

        return total;
    }

    /// <summary>Rows of coefficients for offsets first..last, each of length 2m + 1.</summary>
    private static double[] BuildTable(int halfWidth, int order, int derivative, int firstOffset, int lastOffset)
    {
        var width = 2 * halfWidth + 1;
        var columns = order + 1;
        var design = new double[width * columns];
        for (var j = 0; j < columns; j++)
        {
            for (var i = 0; i < width; i++)
            {
                design[j * width + i] = Math.Pow((i - halfWidth) / (double)halfWidth, j);
            }
        }

        // c = Q R^-T v for the evaluation vector v (the d-th derivative of the monomials at the offset), so c'y = v' R^-1 Q'y.
        var qr = new HouseholderQr(design, width, columns);
        var rows = lastOffset - firstOffset + 1;
        var result = new double[rows * width];
        var solved = new double[columns];
        var perSample = Math.Pow(halfWidth, -derivative);
        for (var row = 0; row < rows; row++)
        {
            var u = (firstOffset + row) / (double)halfWidth;
            for (var j = 0; j < columns; j++)
            {
                var evaluation = j < derivative ? 0.0 : FallingFactorial(j, derivative) * Math.Pow(u, j - derivative);
                var sum = evaluation;
                for (var k = 0; k < j; k++)
                {
                    sum -= qr.UpperAt(k, j) * solved[k];
                }

                solved[j] = sum / qr.UpperAt(j, j);
            }

            var coefficients = result.AsSpan(row * width, width);
            coefficients.Clear();
            solved.CopyTo(coefficients);
            qr.Apply(coefficients);
            for (var i = 0; i < width; i++)
            {
                coefficients[i] *= perSample;
            }
        }

        return result;
    }

    private static double FallingFactorial(int n, int k)
    {
        var product = 1.0;
        for (var i = 0; i < k; i++)
        {
            product *= n - i;
        }

        return product;
    }
}
