using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>The equation-error start: per equation, weighted linear least squares of the smoothed derivative on that equation's basis terms plus a constant.</summary>
/// <remarks>
/// <para>Steps: (1) pick one Savitzky-Golay (m, p) for all channels: the selector's choice for each channel's first
/// derivative among windows up to <see cref="EquationErrorOptions.MaxWindowDuration"/> and orders of at least 3
/// (quadratic windows bias Lorenz-like coefficients by percents), taking the smallest half-width among them (the channel with the fastest content sets the window, so
/// no channel's peaks are flattened); (2) smooth (d = 0) and differentiate (d = 1) every channel with it; (3) drop
/// the first and last m samples (the shifted end windows are noisier) and every sample whose window touches an
/// excluded one; (4) per equation j, solve min sum_i (D_j(t_i) - sum_k theta_jk phi_jk(S(t_i)) - b_j)^2 by QR
/// (<see cref="LinearLeastSquares"/>), where S are the smoothed channels and D the derivatives; (5) covariance by
/// batch means over contiguous batches of <see cref="EquationErrorOptions.BatchDuration"/>.</para>
/// <para>Channels must already be mapped to states (with signs) and scaled to the model's units. All equations are
/// weighted equally within themselves (the derivative noise is nearly uniform in time), so no weights enter.</para>
/// <para>References:
/// 1. H. U. Voss, J. Timmer, J. Kurths, Nonlinear dynamical system identification from uncertain and indirect measurements, Int. J. Bifurcation Chaos 14 (2004) 1905-1933 (equation-error start, section 3).
/// 2. A. Savitzky, M. J. E. Golay, Anal. Chem. 36 (1964) 1627-1639.</para>
/// </remarks>
public static class EquationErrorRegression
{
    /// <summary>Fits every equation.</summary>
    /// <param name="channels">One uniformly sampled array per state, mapped and scaled; equal lengths, finite.</param>
    /// <param name="sampleInterval">h, positive, in the model's time unit.</param>
    /// <param name="equations">For each state j, the basis terms of dV_j/dt (without the constant).</param>
    /// <param name="options">Filter, noise floors, constant, batches and mask; defaults when null.</param>
    /// <returns>The filter used and one fit per equation.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When counts or lengths disagree, a term names a missing state, or the record is too short.</exception>
    public static EquationErrorResult Fit(IReadOnlyList<double[]> channels, double sampleInterval, IReadOnlyList<IReadOnlyList<RegressionTerm>> equations, EquationErrorOptions? options = null)
    {
        options ??= new EquationErrorOptions();
        var prepared = Prepare(channels, sampleInterval, equations, options);
        var fits = new List<EquationFit>(equations.Count);
        for (var j = 0; j < equations.Count; j++)
        {
            fits.Add(FitEquation(j, equations[j], prepared, sampleInterval, options));
        }

        return new EquationErrorResult(prepared.HalfWidth, prepared.PolynomialOrder, fits);
    }

    /// <summary>Smoothed channels, derivatives and usable samples, shared by the fit and the mapping search.</summary>
    internal sealed record PreparedChannels(int HalfWidth, int PolynomialOrder, double[][] Smoothed, double[][] Derivatives, int[] UsableSamples);

    internal static PreparedChannels Prepare(IReadOnlyList<double[]> channels, double sampleInterval, IReadOnlyList<IReadOnlyList<RegressionTerm>> equations, EquationErrorOptions options)
    {
        ArgumentNullException.ThrowIfNull(channels);
        ArgumentNullException.ThrowIfNull(equations);
        Preconditions.CheckArgumentRange(nameof(channels), channels.Count >= 1 && channels.All(c => c is not null && c.Length == channels[0].Length), "needs at least one channel, all of one length");
        Preconditions.CheckArgumentRange(nameof(equations), equations.Count == channels.Count, "needs one equation per channel (state)");
        Preconditions.CheckArgumentRange(nameof(equations), equations.All(terms => terms.All(term => term.Factors.All(f => f >= 0 && f < channels.Count))), "a term names a state that has no channel");
        Preconditions.CheckArgumentRange(nameof(sampleInterval), sampleInterval > 0 && double.IsFinite(sampleInterval), "must be positive and finite");
        var n = channels[0].Length;
        Preconditions.CheckArgumentRange(nameof(channels), n >= 64, "needs at least 64 samples");
        Preconditions.CheckArgumentRange(nameof(options), options.Excluded is null || options.Excluded.Count == n, "the mask needs one flag per sample");
        Preconditions.CheckArgumentRange(nameof(options), options.NoiseStandardDeviations is null || options.NoiseStandardDeviations.Count == channels.Count, "needs one noise floor per channel");

        int halfWidth, order;
        if (options.Filter is { } fixedFilter)
        {
            (halfWidth, order) = fixedFilter;
        }
        else
        {
            var widest = Math.Max(2, (int)Math.Floor(options.MaxWindowDuration / sampleInterval / 2));
            var selection = new SavitzkyGolaySelectionOptions { MaxHalfWidth = widest, MinPolynomialOrder = 3 };
            var choices = Enumerable.Range(0, channels.Count)
                .Select(c => SavitzkyGolaySelector.Choose(channels[c], sampleInterval, 1, options.NoiseStandardDeviations?[c] ?? double.NaN, selection))
                .ToList();
            var narrowest = choices.MinBy(choice => choice.HalfWidth)!;
            (halfWidth, order) = (narrowest.HalfWidth, narrowest.PolynomialOrder);
        }

        var smoother = new SavitzkyGolayFilter(halfWidth, order, 0);
        var differentiator = new SavitzkyGolayFilter(halfWidth, order, 1);
        var excluded = options.Excluded?.ToArray() ?? new bool[n];
        var smoothed = new double[channels.Count][];
        var derivatives = new double[channels.Count][];
        for (var c = 0; c < channels.Count; c++)
        {
            smoothed[c] = new double[n];
            derivatives[c] = new double[n];
            smoother.ApplyMasked(channels[c], excluded, sampleInterval, smoothed[c]);
            differentiator.ApplyMasked(channels[c], excluded, sampleInterval, derivatives[c]);
        }

        var usable = new List<int>(n);
        for (var i = halfWidth; i < n - halfWidth; i++)
        {
            var ok = true;
            for (var c = 0; c < channels.Count && ok; c++)
            {
                ok = double.IsFinite(smoothed[c][i]) && double.IsFinite(derivatives[c][i]);
            }

            if (ok)
            {
                usable.Add(i);
            }
        }

        return new PreparedChannels(halfWidth, order, smoothed, derivatives, usable.ToArray());
    }

    internal static EquationFit FitEquation(int equation, IReadOnlyList<RegressionTerm> terms, PreparedChannels prepared, double sampleInterval, EquationErrorOptions options)
    {
        var allTerms = options.IncludeConstant ? terms.Append(new RegressionTerm("1", [])).ToList() : terms.ToList();
        var rows = prepared.UsableSamples.Length;
        Preconditions.CheckArgumentRange("channels", rows > allTerms.Count + 2, "too few usable samples for the number of terms");
        var design = Matrix<double>.Build.Dense(rows, allTerms.Count);
        var response = Vector<double>.Build.Dense(rows);
        for (var r = 0; r < rows; r++)
        {
            var i = prepared.UsableSamples[r];
            response[r] = prepared.Derivatives[equation][i];
            for (var k = 0; k < allTerms.Count; k++)
            {
                design[r, k] = allTerms[k].Evaluate(prepared.Smoothed, i);
            }
        }

        var fit = LinearLeastSquares.Fit(design, response);
        var mean = response.Sum() / rows;
        var total = 0.0;
        for (var r = 0; r < rows; r++)
        {
            total += (response[r] - mean) * (response[r] - mean);
        }

        var batchLength = Math.Max(1, Math.Min((int)Math.Round(options.BatchDuration / sampleInterval), rows / 20));
        var sandwich = fit.Status == LinearLeastSquaresStatus.FullRank
            ? BatchMeansCovariance.Compute(design, fit.Residuals, null, batchLength)
            : fit.Covariance;
        return new EquationFit(equation, allTerms, fit, sandwich, total > 0 ? 1 - fit.WeightedResidualSumOfSquares / total : double.NaN, rows);
    }
}
