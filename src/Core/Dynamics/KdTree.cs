namespace Patchproof.Core.Dynamics;

/// <summary>A static k-d tree over the first points of a <see cref="PointCloud"/>, for nearest-neighbour and fixed-radius searches.</summary>
/// <remarks>
/// <para>Balanced by median splits on the coordinate of widest spread; the tree is implicit in a
/// permutation of the point indices (node [lo, hi) keeps its splitting point at the middle), so
/// building allocates three arrays and searching allocates nothing. Leaves of up to 8 points are
/// scanned directly. Distances are Euclidean.</para>
/// <para>References: 1. J. L. Bentley, Multidimensional binary search trees used for associative
/// searching, Commun. ACM 18 (1975) 509-517. 2. J. H. Friedman, J. L. Bentley, R. A. Finkel, An
/// algorithm for finding best matches in logarithmic expected time, ACM TOMS 3 (1977) 209-226.</para>
/// </remarks>
internal sealed class KdTree
{
    private const int LeafSize = 8;
    private const int StackCapacity = 128;

    private readonly int dimension;
    private readonly int count;
    private readonly int[] order;
    private readonly double[] packed;
    private readonly byte[] splitDimension;

    /// <summary>Builds the tree over points 0 .. <paramref name="count"/> - 1 of <paramref name="cloud"/>.</summary>
    public KdTree(PointCloud cloud, int count)
    {
        Preconditions.CheckArgumentRange(nameof(count), count >= 1 && count <= cloud.Count, "must be between 1 and the number of points");
        Preconditions.CheckArgumentRange(nameof(cloud), cloud.Dimension <= 255, "dimension above 255 is not supported");
        dimension = cloud.Dimension;
        this.count = count;
        order = new int[count];
        for (var i = 0; i < count; i++)
        {
            order[i] = i;
        }

        splitDimension = new byte[count];
        Build(cloud.Coordinates, 0, count);
        packed = new double[count * dimension];
        for (var p = 0; p < count; p++)
        {
            Array.Copy(cloud.Coordinates, order[p] * dimension, packed, p * dimension, dimension);
        }
    }

    /// <summary>The number of points in the tree.</summary>
    public int Count => count;

    /// <summary>Finds the nearest point to <paramref name="query"/> whose index differs from <paramref name="queryIndex"/> by more than <paramref name="exclusion"/>.</summary>
    /// <returns>The neighbour's index and squared distance, or index -1 when every point is excluded.</returns>
    public (int Index, double SquaredDistance) Nearest(ReadOnlySpan<double> query, int queryIndex, int exclusion)
    {
        Span<int> stackLo = stackalloc int[StackCapacity];
        Span<int> stackHi = stackalloc int[StackCapacity];
        Span<double> stackBound = stackalloc double[StackCapacity];
        var top = 0;
        stackLo[0] = 0;
        stackHi[0] = count;
        stackBound[0] = 0;
        top = 1;
        var best = double.PositiveInfinity;
        var bestIndex = -1;
        while (top > 0)
        {
            top--;
            var lo = stackLo[top];
            var hi = stackHi[top];
            if (stackBound[top] >= best)
            {
                continue;
            }

            while (hi - lo > LeafSize)
            {
                var mid = (lo + hi) >> 1;
                var axis = splitDimension[mid];
                var diff = query[axis] - packed[mid * dimension + axis];
                Consider(query, queryIndex, exclusion, mid, ref best, ref bestIndex);
                var far2 = diff * diff;
                if (diff < 0)
                {
                    if (far2 < best)
                    {
                        stackLo[top] = mid + 1;
                        stackHi[top] = hi;
                        stackBound[top] = far2;
                        top++;
                    }

                    hi = mid;
                }
                else
                {
                    if (far2 < best)
                    {
                        stackLo[top] = lo;
                        stackHi[top] = mid;
                        stackBound[top] = far2;
                        top++;
                    }

                    lo = mid + 1;
                }
            }

            for (var p = lo; p < hi; p++)
            {
                Consider(query, queryIndex, exclusion, p, ref best, ref bestIndex);
            }
        }

        return (bestIndex, best);
    }

    /// <summary>Adds every point within the largest histogram radius of the query (and outside the temporal exclusion) to a logarithmic histogram of distances.</summary>
    /// <param name="query">The query point.</param>
    /// <param name="queryIndex">The query's index, for the exclusion.</param>
    /// <param name="exclusion">Points with an index difference of at most this are skipped.</param>
    /// <param name="logMinimumRadius">ln of the first radius r_0.</param>
    /// <param name="inverseLogStep">1 / ln(r_{k+1} / r_k).</param>
    /// <param name="histogram">Bin k counts pairs with r_{k-1} &lt;= d &lt; r_k (bin 0: d &lt; r_0); its length is the number of radii.</param>
    public void AccumulateWithin(ReadOnlySpan<double> query, int queryIndex, int exclusion, double logMinimumRadius, double inverseLogStep, Span<long> histogram)
    {
        var bins = histogram.Length;
        var radius = Math.Exp(logMinimumRadius + (bins - 1) / inverseLogStep);
        var radius2 = radius * radius;
        Span<int> stackLo = stackalloc int[StackCapacity];
        Span<int> stackHi = stackalloc int[StackCapacity];
        var top = 1;
        stackLo[0] = 0;
        stackHi[0] = count;
        while (top > 0)
        {
            top--;
            var lo = stackLo[top];
            var hi = stackHi[top];
            while (hi - lo > LeafSize)
            {
                var mid = (lo + hi) >> 1;
                var axis = splitDimension[mid];
                var diff = query[axis] - packed[mid * dimension + axis];
                CountIfWithin(query, queryIndex, exclusion, mid, radius2, logMinimumRadius, inverseLogStep, histogram);
                if (diff * diff < radius2)
                {
                    stackLo[top] = diff < 0 ? mid + 1 : lo;
                    stackHi[top] = diff < 0 ? hi : mid;
                    top++;
                }

                if (diff < 0)
                {
                    hi = mid;
                }
                else
                {
                    lo = mid + 1;
                }
            }

            for (var p = lo; p < hi; p++)
            {
                CountIfWithin(query, queryIndex, exclusion, p, radius2, logMinimumRadius, inverseLogStep, histogram);
            }
        }
    }

    private void CountIfWithin(ReadOnlySpan<double> query, int queryIndex, int exclusion, int position, double radius2, double logMinimumRadius, double inverseLogStep, Span<long> histogram)
    {
        if (Math.Abs(order[position] - queryIndex) <= exclusion)
        {
            return;
        }

        var d2 = SquaredDistance(query, position);
        if (d2 >= radius2)
        {
            return;
        }

        // Bin k is the first radius above d: k = floor((ln d - ln r0) / step) + 1.
        var k = d2 <= 0 ? 0 : (int)Math.Floor((0.5 * Math.Log(d2) - logMinimumRadius) * inverseLogStep) + 1;
        histogram[Math.Clamp(k, 0, histogram.Length - 1)]++;
    }

    private void Consider(ReadOnlySpan<double> query, int queryIndex, int exclusion, int position, ref double best, ref int bestIndex)
    {
        var index = order[position];
        if (Math.Abs(index - queryIndex) <= exclusion)
        {
            return;
        }

        var d2 = SquaredDistance(query, position);
        if (d2 < best)
        {
            best = d2;
            bestIndex = index;
        }
    }

    private double SquaredDistance(ReadOnlySpan<double> query, int position)
    {
        var offset = position * dimension;
        var sum = 0.0;
        for (var c = 0; c < dimension; c++)
        {
            var d = query[c] - packed[offset + c];
            sum += d * d;
        }

        return sum;
    }

    private void Build(double[] coordinates, int lo, int hi)
    {
        // Iterative over the larger half to bound recursion depth by log2(count).
        while (hi - lo > LeafSize)
        {
            var axis = WidestAxis(coordinates, lo, hi);
            var mid = (lo + hi) >> 1;
            Select(coordinates, axis, lo, hi - 1, mid);
            splitDimension[mid] = (byte)axis;
            Build(coordinates, lo, mid);
            lo = mid + 1;
        }
    }

    private int WidestAxis(double[] coordinates, int lo, int hi)
    {
        var bestAxis = 0;
        var bestSpread = -1.0;
        for (var c = 0; c < dimension; c++)
        {
            var min = double.PositiveInfinity;
            var max = double.NegativeInfinity;
            for (var p = lo; p < hi; p++)
            {
                var v = coordinates[order[p] * dimension + c];
                min = Math.Min(min, v);
                max = Math.Max(max, v);
            }

            if (max - min > bestSpread)
            {
                bestSpread = max - min;
                bestAxis = c;
            }
        }

        return bestAxis;
    }

    private void Select(double[] coordinates, int axis, int left, int right, int k)
    {
        // Hoare-style quickselect on order[left..right] by coordinate 'axis', middle-of-three pivot.
        while (right > left)
        {
            var pivot = Key(coordinates, axis, (left + right) >> 1);
            var a = Key(coordinates, axis, left);
            var b = Key(coordinates, axis, right);
            pivot = Math.Max(Math.Min(a, b), Math.Min(Math.Max(a, b), pivot));
            var i = left;
            var j = right;
            while (i <= j)
            {
                while (Key(coordinates, axis, i) < pivot)
                {
                    i++;
                }

                while (Key(coordinates, axis, j) > pivot)
                {
                    j--;
                }

                if (i <= j)
                {
                    (order[i], order[j]) = (order[j], order[i]);
                    i++;
                    j--;
                }
            }

            if (k <= j)
            {
                right = j;
            }
            else if (k >= i)
            {
                left = i;
            }
            else
            {
                return;
            }
        }
    }

    private double Key(double[] coordinates, int axis, int position) => coordinates[order[position] * dimension + axis];
}
