using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>Finds how the capture's channels map to the model's states by trying every assignment and every sign with the equation-error fit.</summary>
/// <remarks>
/// <para>All channels are smoothed and differentiated once (<see cref="EquationErrorRegression"/>'s filter choice).
/// Under a mapping, a term's column is a product of channels times a sign, and an equation's response is a channel's
/// derivative times a sign, so every candidate fit is assembled from one Gram matrix of the distinct channel
/// products: sum_i M_u M_v and sum_i M_u D_c over the usable samples. Each candidate is then a small normal-equation
/// solve (Cholesky), which is accurate enough to rank candidates whose misfits differ by orders of magnitude; the
/// chosen mapping is refitted properly by QR in <see cref="EquationErrorRegression.Fit"/>.</para>
/// <para>Cost: n! 2^n candidates for n states (48 for three), each O(q^3) with q terms per equation, after one pass over
/// the samples. Symmetric systems give exact ties (Lorenz is unchanged by x, y -&gt; -x, -y); tied readings are
/// equivalent for estimation.</para>
/// </remarks>
public static class ChannelMappingSearch
{
    /// <summary>Every mapping, best (lowest misfit) first.</summary>
    /// <param name="channels">The capture's channels, one per state (scaled to the model's units), equal lengths.</param>
    /// <param name="sampleInterval">h, positive, in the model's time unit.</param>
    /// <param name="equations">For each state, the design's terms of its equation (constant added as in <paramref name="options"/>).</param>
    /// <param name="nominalCoefficients">For each equation, the design's nominal coefficient of each term (same order, constant excluded), or null; used to tell channel signs apart.</param>
    /// <param name="options">Filter and mask options; defaults when null.</param>
    /// <returns>All n! 2^n mappings ordered by misfit; exact ties (sign flips the free coefficients absorb) ordered by fewest sign disagreements.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When counts disagree or there are more than 6 states.</exception>
    public static IReadOnlyList<ChannelMapping> Rank(IReadOnlyList<double[]> channels, double sampleInterval, IReadOnlyList<IReadOnlyList<RegressionTerm>> equations, IReadOnlyList<IReadOnlyList<double>>? nominalCoefficients = null, EquationErrorOptions? options = null)
    {
        options ??= new EquationErrorOptions();
        Preconditions.CheckArgumentRange(nameof(channels), channels is not null && channels.Count is >= 1 and <= 6, "needs between 1 and 6 channels");
        var prepared = EquationErrorRegression.Prepare(channels!, sampleInterval, equations, options);
        Preconditions.CheckArgumentRange(nameof(nominalCoefficients), nominalCoefficients is null || (nominalCoefficients.Count == equations.Count && nominalCoefficients.Select((row, j) => row.Count == equations[j].Count).All(ok => ok)), "needs one nominal value per term of every equation");
        var count = channels!.Count;
        var permutations = Permutations(count).ToList();

        // Distinct channel products (sorted channel multisets) over every term under every permutation.
        var keys = new Dictionary<string, int>(StringComparer.Ordinal);
        var products = new List<int[]>();
        int KeyOf(IEnumerable<int> channelIndices)
        {
            var sorted = channelIndices.OrderBy(c => c).ToArray();
            var key = string.Join(',', sorted);
            if (!keys.TryGetValue(key, out var index))
            {
                index = products.Count;
                keys.Add(key, index);
                products.Add(sorted);
            }

            return index;
        }

        var constantKey = KeyOf([]);
        foreach (var permutation in permutations)
        {
            foreach (var term in equations.SelectMany(terms => terms))
            {
                KeyOf(term.Factors.Select(f => permutation[f]));
            }
        }

        var usable = prepared.UsableSamples;
        var columns = products.Count;
        var gram = new double[columns, columns];
        var cross = new double[columns, count];
        var derivativeSquares = new double[count];
        var derivativeSums = new double[count];
        var values = new double[columns];
        foreach (var i in usable)
        {
            for (var u = 0; u < columns; u++)
            {
                var product = 1.0;
                foreach (var channel in products[u])
                {
                    product *= prepared.Smoothed[channel][i];
                }

                values[u] = product;
            }

            for (var u = 0; u < columns; u++)
            {
                for (var v = u; v < columns; v++)
                {
                    gram[u, v] += values[u] * values[v];
                }

                for (var c = 0; c < count; c++)
                {
                    cross[u, c] += values[u] * prepared.Derivatives[c][i];
                }
            }

            for (var c = 0; c < count; c++)
            {
                derivativeSquares[c] += prepared.Derivatives[c][i] * prepared.Derivatives[c][i];
                derivativeSums[c] += prepared.Derivatives[c][i];
            }
        }

        var mappings = new List<ChannelMapping>(permutations.Count << count);
        foreach (var permutation in permutations)
        {
            for (var signBits = 0; signBits < 1 << count; signBits++)
            {
                var signs = Enumerable.Range(0, count).Select(k => (signBits >> k & 1) == 1 ? -1 : 1).ToArray();
                var misfit = 0.0;
                var disagreements = 0;
                for (var j = 0; j < count; j++)
                {
                    var terms = equations[j];
                    var size = terms.Count + (options.IncludeConstant ? 1 : 0);
                    var termKeys = new int[size];
                    var termSigns = new double[size];
                    for (var k = 0; k < terms.Count; k++)
                    {
                        termKeys[k] = keys[string.Join(',', terms[k].Factors.Select(f => permutation[f]).OrderBy(c => c))];
                        termSigns[k] = terms[k].Factors.Aggregate(1.0, (sign, f) => sign * signs[f]);
                    }

                    if (options.IncludeConstant)
                    {
                        termKeys[^1] = constantKey;
                        termSigns[^1] = 1;
                    }

                    var channel = permutation[j];
                    var normal = Matrix<double>.Build.Dense(size, size, (a, b) => termSigns[a] * termSigns[b] * gram[Math.Min(termKeys[a], termKeys[b]), Math.Max(termKeys[a], termKeys[b])]);
                    var right = Vector<double>.Build.Dense(size, a => termSigns[a] * signs[j] * cross[termKeys[a], channel]);
                    var total = derivativeSquares[channel] - derivativeSums[channel] * derivativeSums[channel] / usable.Length;
                    double unexplained;
                    try
                    {
                        var solution = normal.Cholesky().Solve(right);
                        unexplained = (derivativeSquares[channel] - solution.DotProduct(right)) / total;
                        for (var k = 0; nominalCoefficients is not null && k < terms.Count; k++)
                        {
                            disagreements += nominalCoefficients[j][k] * solution[k] < 0 ? 1 : 0;
                        }
                    }
                    catch (ArgumentException)
                    {
                        unexplained = 1.0;
                    }

                    misfit += Math.Clamp(unexplained, 0.0, 1.0) / count;
                }

                mappings.Add(new ChannelMapping(permutation, signs, misfit, disagreements));
            }
        }

        // Sign flips give the same misfit up to rounding; within such a tie the nominal signs decide.
        mappings.Sort((a, b) => a.Misfit.CompareTo(b.Misfit));
        var ordered = new List<ChannelMapping>(mappings.Count);
        for (var start = 0; start < mappings.Count;)
        {
            var end = start + 1;
            while (end < mappings.Count && mappings[end].Misfit - mappings[start].Misfit <= 1e-9 * Math.Max(mappings[start].Misfit, 1e-12))
            {
                end++;
            }

            ordered.AddRange(mappings.GetRange(start, end - start).OrderBy(m => m.SignDisagreements));
            start = end;
        }

        return ordered;
    }

    private static IEnumerable<int[]> Permutations(int count)
    {
        var current = Enumerable.Range(0, count).ToArray();
        return Recurse(0);

        IEnumerable<int[]> Recurse(int position)
        {
            if (position == count)
            {
                yield return (int[])current.Clone();
                yield break;
            }

            for (var i = position; i < count; i++)
            {
                (current[position], current[i]) = (current[i], current[position]);
                foreach (var permutation in Recurse(position + 1))
                {
                    yield return permutation;
                }

                (current[position], current[i]) = (current[i], current[position]);
            }
        }
    }
}
