namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>Recovers a hidden state from an observed equation in which it appears in exactly one linear term.</summary>
/// <remarks>
/// If state h enters observed equation j only through a term theta_h·V_h, then
/// V_h = (dV_j/dt - Σ other terms - b_j) / theta_h, with dV_j/dt from a Savitzky-Golay derivative of the channel.
/// For Lorenz with x observed, x' = sigma (y - x) gives y = x + x'/sigma. The result is noisy (a derivative) but has
/// no transient, so it is a good start for multiple shooting where synchronization is slow.
/// </remarks>
public static class HiddenStateInversion
{
    /// <summary>Tries to recover every hidden state; returns null when some hidden state has no suitable equation.</summary>
    /// <param name="field">The vector field (volts, seconds).</param>
    /// <param name="parameters">The field's parameters (nominal values).</param>
    /// <param name="observed">Observed states and their samples (offset and gain removed).</param>
    /// <param name="intervalSeconds">The sample interval; positive.</param>
    /// <param name="halfWidth">Half-width of the Savitzky-Golay derivative window, in samples.</param>
    /// <returns>The full state per sample, or null.</returns>
    public static IReadOnlyList<double[]>? TryRecover(PolynomialVectorField field, IReadOnlyList<double> parameters, IReadOnlyDictionary<int, IReadOnlyList<double>> observed, double intervalSeconds, int halfWidth = 10)
    {
        var n = field.StateCount;
        var count = observed.Values.First().Count;
        var states = Enumerable.Range(0, count).Select(_ => new double[n]).ToArray();
        foreach (var (index, samples) in observed)
        {
            for (var i = 0; i < count; i++)
            {
                states[i][index] = samples[i];
            }
        }

        var known = observed.Keys.ToHashSet();
        var filter = new SavitzkyGolayFilter(halfWidth, 3, 1);
        var progress = true;
        while (known.Count < n && progress)
        {
            progress = false;
            for (var h = 0; h < n; h++)
            {
                if (known.Contains(h))
                {
                    continue;
                }

                var source = FindEquation(field, h, known);
                if (source is not { } found)
                {
                    continue;
                }

                var derivative = new double[count];
                filter.Apply(observed[found.Equation].ToArray(), intervalSeconds, derivative);
                var offsetSlot = field.OffsetEquations.ToList().IndexOf(found.Equation);
                for (var i = 0; i < count; i++)
                {
                    var rest = offsetSlot >= 0 ? parameters[field.TermCount + offsetSlot] : 0;
                    for (var t = 0; t < field.TermCount; t++)
                    {
                        if (t != found.Term && field.Terms[t].Equation == found.Equation)
                        {
                            rest += parameters[t] * field.Basis(t, states[i]);
                        }
                    }

                    states[i][h] = (derivative[i] - rest) / parameters[found.Term];
                }

                known.Add(h);
                progress = true;
            }
        }

        return known.Count == n ? states : null;
    }

    private static (int Equation, int Term)? FindEquation(PolynomialVectorField field, int hidden, HashSet<int> known)
    {
        foreach (var equation in known.Where(observedEquation => observedEquation < field.StateCount))
        {
            var touching = Enumerable.Range(0, field.TermCount).Where(t => field.Terms[t].Equation == equation && field.Terms[t].Factors.Contains(hidden)).ToList();
            if (touching.Count == 1 && field.Terms[touching[0]].Factors is [var only] && only == hidden
                && Enumerable.Range(0, field.TermCount).Where(t => field.Terms[t].Equation == equation && t != touching[0]).All(t => field.Terms[t].Factors.All(known.Contains)))
            {
                return (equation, touching[0]);
            }
        }

        return null;
    }
}
