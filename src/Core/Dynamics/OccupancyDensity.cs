namespace Patchproof.Core.Dynamics;

/// <summary>A 2-D histogram of one phase plane on a stated grid, smoothed and normalized to sum 1.</summary>
/// <remarks>Cell (ix, iy) covers [XMinimum + ix w, XMinimum + (ix+1) w) by the analogous y interval,
/// w = (XMaximum - XMinimum) / Bins; <see cref="Probabilities"/> holds the fraction of samples per
/// cell (after smoothing) at <c>iy * Bins + ix</c>. Bounds are in the channels' units.</remarks>
/// <param name="XMinimum">Left edge of the grid.</param>
/// <param name="XMaximum">Right edge of the grid.</param>
/// <param name="YMinimum">Bottom edge of the grid.</param>
/// <param name="YMaximum">Top edge of the grid.</param>
/// <param name="Bins">Cells per axis.</param>
/// <param name="Probabilities">Fraction of samples per cell, row-major by y, summing to 1.</param>
public sealed record OccupancyGrid(double XMinimum, double XMaximum, double YMinimum, double YMaximum, int Bins, double[] Probabilities);

/// <summary>The occupancy of one phase plane in the capture and in the simulation, on a common grid, and their distance.</summary>
/// <param name="XChannel">Index of the horizontal channel.</param>
/// <param name="YChannel">Index of the vertical channel.</param>
/// <param name="Capture">The capture's occupancy.</param>
/// <param name="Simulation">The simulation's occupancy on the same grid.</param>
/// <param name="HellingerDistance">H in [0, 1]: 0 for identical occupancy, 1 for disjoint.</param>
public sealed record PhasePlaneOccupancy(int XChannel, int YChannel, OccupancyGrid Capture, OccupancyGrid Simulation, double HellingerDistance);

/// <summary>Occupancy densities of every phase plane, capture against simulation, and the Hellinger distance between them.</summary>
/// <remarks>
/// <para>Grid: for each pair of channels (i &lt; j) one grid of 64 by 64 cells spans the union of
/// the capture's and the simulation's ranges widened by 5 % on each side, so both histograms share
/// their cells. Each histogram is smoothed with a separable Gaussian kernel of standard deviation
/// one cell (truncated at 3 cells) and normalized to sum 1.</para>
/// <para>Distance: the Hellinger distance H(p, q) = sqrt(1 - sum_k sqrt(p_k q_k)). It suits a
/// chaotic comparison because it needs no time alignment (only where the orbit spends its time),
/// it is a true metric bounded in [0, 1] so values compare across boards and planes, it stays finite
/// when one histogram has empty cells where the other has mass (Kullback-Leibler does not), and it
/// weighs relative differences in sparse cells less than a squared difference of densities would.
/// Smoothing removes most of the dependence on the cell size and on the finite number of samples
/// (measured: two stretches of 10^5 samples of one Lorenz (10, 28, 8/3) orbit give H of 0.03 to
/// 0.06 per plane, while rho = 35 against rho = 28 gives 0.18 to 0.39 and rho = 29.4, a 5 % drift,
/// gives 0.05 to 0.12; at 2 x 10^4 samples the floor rises to about 0.15, so H is read against the
/// floor for the record's length). The samples of each histogram need not be equal in number.</para>
/// <para>References: 1. E. Hellinger, Neue Begründung der Theorie quadratischer Formen von
/// unendlichvielen Veränderlichen, J. reine angew. Math. 136 (1909) 210-271. 2. L. Le Cam, G. L.
/// Yang, Asymptotics in Statistics, Springer (2000), ch. 3 (properties of the Hellinger distance).</para>
/// </remarks>
public static class OccupancyDensities
{
    /// <summary>Default cells per axis.</summary>
    public const int DefaultBins = 64;

    /// <summary>Default smoothing: the Gaussian kernel's standard deviation in cells.</summary>
    public const double DefaultSmoothingCells = 1.0;

    /// <summary>Compares every phase plane (each pair of channels) of a capture and a simulation.</summary>
    /// <param name="capture">The capture's channels (at least 2, equally long).</param>
    /// <param name="simulation">The simulation's channels, same count and order (length may differ from the capture's).</param>
    /// <param name="bins">Cells per axis, 4 .. 1024.</param>
    /// <param name="smoothingCells">Kernel standard deviation in cells, 0 (none) .. 10.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the channel counts differ or an argument is out of range.</exception>
    public static IReadOnlyList<PhasePlaneOccupancy> Compare(IReadOnlyList<double[]> capture, IReadOnlyList<double[]> simulation, int bins = DefaultBins, double smoothingCells = DefaultSmoothingCells)
    {
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(simulation);
        Preconditions.CheckArgumentRange(nameof(simulation), capture.Count == simulation.Count && capture.Count >= 2, "must have as many channels as the capture, at least 2");
        Preconditions.CheckArgumentRange(nameof(bins), bins >= 4 && bins <= 1024, "must be between 4 and 1024");
        Preconditions.CheckArgumentRange(nameof(smoothingCells), smoothingCells >= 0 && smoothingCells <= 10, "must be between 0 and 10");
        var planes = new List<PhasePlaneOccupancy>();
        for (var i = 0; i < capture.Count; i++)
        {
            for (var j = i + 1; j < capture.Count; j++)
            {
                var (xMin, xMax) = CommonRange(capture[i], simulation[i]);
                var (yMin, yMax) = CommonRange(capture[j], simulation[j]);
                var captured = Histogram(capture[i], capture[j], xMin, xMax, yMin, yMax, bins, smoothingCells);
                var simulated = Histogram(simulation[i], simulation[j], xMin, xMax, yMin, yMax, bins, smoothingCells);
                planes.Add(new PhasePlaneOccupancy(i, j, captured, simulated, Hellinger(captured.Probabilities, simulated.Probabilities)));
            }
        }

        return planes;
    }

    /// <summary>The occupancy of one plane on a given grid.</summary>
    /// <param name="x">Horizontal channel.</param>
    /// <param name="y">Vertical channel, same length.</param>
    /// <param name="xMinimum">Left edge.</param>
    /// <param name="xMaximum">Right edge, above the left.</param>
    /// <param name="yMinimum">Bottom edge.</param>
    /// <param name="yMaximum">Top edge, above the bottom.</param>
    /// <param name="bins">Cells per axis, 4 .. 1024.</param>
    /// <param name="smoothingCells">Kernel standard deviation in cells (0 for none).</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths differ or the bounds are empty.</exception>
    public static OccupancyGrid Histogram(ReadOnlySpan<double> x, ReadOnlySpan<double> y, double xMinimum, double xMaximum, double yMinimum, double yMaximum, int bins = DefaultBins, double smoothingCells = DefaultSmoothingCells)
    {
        Preconditions.CheckArgumentRange(nameof(y), x.Length == y.Length, "must have as many samples as x");
        Preconditions.CheckArgumentRange(nameof(xMaximum), xMaximum > xMinimum && yMaximum > yMinimum, "each grid must have positive extent");
        Preconditions.CheckArgumentRange(nameof(bins), bins >= 4 && bins <= 1024, "must be between 4 and 1024");
        var counts = new double[bins * bins];
        var scaleX = bins / (xMaximum - xMinimum);
        var scaleY = bins / (yMaximum - yMinimum);
        for (var k = 0; k < x.Length; k++)
        {
            var ix = (int)Math.Floor((x[k] - xMinimum) * scaleX);
            var iy = (int)Math.Floor((y[k] - yMinimum) * scaleY);
            if (ix >= 0 && ix < bins && iy >= 0 && iy < bins)
            {
                counts[iy * bins + ix]++;
            }
        }

        if (smoothingCells > 0)
        {
            Smooth(counts, bins, smoothingCells);
        }

        var sum = counts.Sum();
        if (sum > 0)
        {
            for (var k = 0; k < counts.Length; k++)
            {
                counts[k] /= sum;
            }
        }

        return new OccupancyGrid(xMinimum, xMaximum, yMinimum, yMaximum, bins, counts);
    }

    /// <summary>The Hellinger distance sqrt(1 - sum sqrt(p q)) between two probability vectors of equal length.</summary>
    /// <param name="p">Probabilities summing to 1.</param>
    /// <param name="q">Probabilities summing to 1, same length.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths differ.</exception>
    public static double Hellinger(ReadOnlySpan<double> p, ReadOnlySpan<double> q)
    {
        Preconditions.CheckArgumentRange(nameof(q), p.Length == q.Length, "must have as many cells as p");
        var affinity = 0.0;
        for (var k = 0; k < p.Length; k++)
        {
            affinity += Math.Sqrt(p[k] * q[k]);
        }

        return Math.Sqrt(Math.Max(0, 1 - affinity));
    }

    private static (double Minimum, double Maximum) CommonRange(double[] a, double[] b)
    {
        var min = Math.Min(a.Min(), b.Min());
        var max = Math.Max(a.Max(), b.Max());
        var margin = max > min ? 0.05 * (max - min) : 1;
        return (min - margin, max + margin);
    }

    private static void Smooth(double[] grid, int bins, double sigma)
    {
        var radius = (int)Math.Ceiling(3 * sigma);
        var kernel = new double[2 * radius + 1];
        for (var k = -radius; k <= radius; k++)
        {
            kernel[k + radius] = Math.Exp(-0.5 * k * k / (sigma * sigma));
        }

        var scratch = new double[grid.Length];
        for (var iy = 0; iy < bins; iy++)
        {
            for (var ix = 0; ix < bins; ix++)
            {
                var sum = 0.0;
                for (var k = -radius; k <= radius; k++)
                {
                    var jx = ix + k;
                    if (jx >= 0 && jx < bins)
                    {
                        sum += kernel[k + radius] * grid[iy * bins + jx];
                    }
                }

                scratch[iy * bins + ix] = sum;
            }
        }

        for (var iy = 0; iy < bins; iy++)
        {
            for (var ix = 0; ix < bins; ix++)
            {
                var sum = 0.0;
                for (var k = -radius; k <= radius; k++)
                {
                    var jy = iy + k;
                    if (jy >= 0 && jy < bins)
                    {
                        sum += kernel[k + radius] * scratch[jy * bins + ix];
                    }
                }

                grid[iy * bins + ix] = sum;
            }
        }
    }
}
