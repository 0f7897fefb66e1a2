namespace Patchproof.Core.Dynamics;

/// <summary>A set of points in R^d stored row-major: a multichannel state trajectory or a delay embedding.</summary>
/// <remarks>
/// <para>Point i occupies <c>Coordinates[i * Dimension] .. Coordinates[i * Dimension + Dimension - 1]</c>.
/// Points are in time order, one sample interval apart, so index differences are time differences
/// (the temporal exclusions of Rosenstein's and Grassberger-Procaccia's methods rely on this).</para>
/// <para>Coordinates are in the units of the channels (volts for a capture, problem units for a model).</para>
/// </remarks>
public sealed record PointCloud
{
    /// <summary>Creates a point set over a row-major coordinate array.</summary>
    /// <param name="coordinates">Row-major coordinates, length <paramref name="count"/> times <paramref name="dimension"/>.</param>
    /// <param name="dimension">The number of coordinates per point (at least 1).</param>
    /// <param name="count">The number of points (at least 1).</param>
    /// <exception cref="ArgumentOutOfRangeException">When the sizes do not agree.</exception>
    public PointCloud(double[] coordinates, int dimension, int count)
    {
        ArgumentNullException.ThrowIfNull(coordinates);
        Preconditions.CheckArgumentRange(nameof(dimension), dimension >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(count), count >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(coordinates), coordinates.Length >= (long)dimension * count, "holds fewer than count times dimension values");
        Coordinates = coordinates;
        Dimension = dimension;
        Count = count;
    }

    /// <summary>The row-major coordinates.</summary>
    public double[] Coordinates { get; }

    /// <summary>The number of coordinates per point.</summary>
    public int Dimension { get; }

    /// <summary>The number of points.</summary>
    public int Count { get; }

    /// <summary>The coordinates of point <paramref name="index"/>.</summary>
    /// <param name="index">A point index in [0, <see cref="Count"/>).</param>
    public ReadOnlySpan<double> PointAt(int index) => Coordinates.AsSpan(index * Dimension, Dimension);

    /// <summary>Stacks equally long channels into points: point i is (channel 0 [i], channel 1 [i], ...).</summary>
    /// <param name="channels">One or more channels of equal length.</param>
    /// <exception cref="ArgumentOutOfRangeException">When there is no channel or the lengths differ.</exception>
    public static PointCloud FromChannels(IReadOnlyList<double[]> channels)
    {
        ArgumentNullException.ThrowIfNull(channels);
        Preconditions.CheckArgumentRange(nameof(channels), channels.Count >= 1, "needs at least one channel");
        var count = channels[0].Length;
        Preconditions.CheckArgumentRange(nameof(channels), channels.All(channel => channel.Length == count), "channels differ in length");
        var dimension = channels.Count;
        var coordinates = new double[dimension * count];
        for (var c = 0; c < dimension; c++)
        {
            var channel = channels[c];
            for (var i = 0; i < count; i++)
            {
                coordinates[i * dimension + c] = channel[i];
            }
        }

        return new PointCloud(coordinates, dimension, count);
    }

    /// <summary>The diameter of the bounding box: the Euclidean length of its diagonal.</summary>
    public double BoundingBoxDiagonal()
    {
        var sum = 0.0;
        for (var c = 0; c < Dimension; c++)
        {
            var min = double.PositiveInfinity;
            var max = double.NegativeInfinity;
            for (var i = 0; i < Count; i++)
            {
                var v = Coordinates[i * Dimension + c];
                min = Math.Min(min, v);
                max = Math.Max(max, v);
            }

            sum += (max - min) * (max - min);
        }

        return Math.Sqrt(sum);
    }
}
