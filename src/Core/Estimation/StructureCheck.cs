namespace Patchproof.Core.Estimation;

/// <summary>Asks whether the board computes the design's equations at all: each derivative regressed on every state,
/// every product of two and a constant, pruned to the terms the data need, compared with the design's terms.</summary>
/// <remarks>
/// <para>Steps, per equation: (1) one Savitzky-Golay filter for all channels, as in <see cref="EquationErrorRegression"/>;
/// (2) least squares of the derivative on the library (the design's terms are always in it); (3) backward elimination:
/// while some term has |t| below <see cref="StructureCheckOptions.MinimumTValue"/> (t from the batch-means standard
/// error, which allows for correlated residuals), drop the least significant one and refit; (4) compare what is left with
/// the design. A term outside the design that survives with a contribution of at least
/// <see cref="StructureCheckOptions.MinimumRelativeSize"/> of the equation's smallest design term is reported as
/// unexpected (a miswire or a stray connection); a design term that is dropped, or keeps less than
/// <see cref="StructureCheckOptions.MissingFraction"/> of its nominal size, is reported as missing (an open
/// connection); one of the wrong sign as reversed. A term's contribution is |theta| times the RMS of its basis over
/// the record. The constant stands for integrator offsets, which the diagnosis weighs; it is never a finding.</para>
/// <para>Channels must be corrected for their offsets first: an offset d on a state inside a product makes linear
/// terms appear, (x - d_x)(y - d_y) = xy - d_y x - d_x y + d_x d_y.</para>
/// <para>Reference: S. L. Brunton, J. L. Proctor, J. N. Kutz, Discovering governing equations from data by sparse
/// identification of nonlinear dynamical systems, PNAS 113 (2016) 3932-3937 (the extended library and pruning).</para>
/// </remarks>
public static class StructureCheck
{
    /// <summary>Runs the check.</summary>
    /// <param name="channels">One array per state, mapped, signed and offset-corrected; equal lengths.</param>
    /// <param name="stateNames">The states' names, for term labels.</param>
    /// <param name="sampleInterval">h, positive, in the time unit of <paramref name="nominalCoefficients"/>.</param>
    /// <param name="designTerms">For each state, the design's terms of its equation (without the constant).</param>
    /// <param name="nominalCoefficients">For each equation, the nominal coefficient of each design term, same order.</param>
    /// <param name="options">Thresholds; defaults when null.</param>
    /// <param name="fitOptions">Filter, window and batch settings of the regression; defaults when null.</param>
    /// <returns>Every equation's pruned terms and the findings.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When counts disagree.</exception>
    public static StructureCheckResult Run(
        IReadOnlyList<double[]> channels,
        IReadOnlyList<string> stateNames,
        double sampleInterval,
        IReadOnlyList<IReadOnlyList<RegressionTerm>> designTerms,
        IReadOnlyList<IReadOnlyList<double>> nominalCoefficients,
        StructureCheckOptions? options = null,
        EquationErrorOptions? fitOptions = null)
    {
        ArgumentNullException.ThrowIfNull(stateNames);
        ArgumentNullException.ThrowIfNull(designTerms);
        ArgumentNullException.ThrowIfNull(nominalCoefficients);
        options ??= new StructureCheckOptions();
        fitOptions = (fitOptions ?? new EquationErrorOptions()) with { IncludeConstant = true };
        Preconditions.CheckArgumentRange(nameof(stateNames), stateNames.Count == channels.Count, "needs one name per channel");
        Preconditions.CheckArgumentRange(nameof(nominalCoefficients), nominalCoefficients.Count == designTerms.Count && nominalCoefficients.Select((row, j) => row.Count == designTerms[j].Count).All(ok => ok), "needs one nominal value per design term");

        var library = Library(stateNames);
        var prepared = EquationErrorRegression.Prepare(channels, sampleInterval, designTerms.Select(_ => (IReadOnlyList<RegressionTerm>)library).ToList(), fitOptions);
        var equations = new List<StructureEquation>(designTerms.Count);
        var findings = new List<StructureFinding>();
        for (var j = 0; j < designTerms.Count; j++)
        {
            var (equation, equationFindings) = CheckEquation(j, stateNames[j], library, designTerms[j], nominalCoefficients[j], prepared, sampleInterval, options, fitOptions);
            equations.Add(equation);
            findings.AddRange(equationFindings);
        }

        return new StructureCheckResult(true, null, prepared.HalfWidth, prepared.PolynomialOrder, equations, findings);
    }

    /// <summary>The result when the check cannot run, for example when a variable was not recorded.</summary>
    /// <param name="reason">Why, in plain words.</param>
    /// <returns>A result that says so.</returns>
    public static StructureCheckResult NotPerformed(string reason) => new(false, reason, 0, 0, [], []);

    private static List<RegressionTerm> Library(IReadOnlyList<string> names)
    {
        var terms = new List<RegressionTerm>();
        for (var a = 0; a < names.Count; a++)
        {
            terms.Add(new RegressionTerm(names[a], [a]));
        }

        for (var a = 0; a < names.Count; a++)
        {
            for (var b = a; b < names.Count; b++)
            {
                terms.Add(new RegressionTerm(a == b ? $"{names[a]}^2" : $"{names[a]}*{names[b]}", [a, b]));
            }
        }

        return terms;
    }

    private static string Key(RegressionTerm term) => string.Join(',', term.Factors.Order());

    private static (StructureEquation Equation, List<StructureFinding> Findings) CheckEquation(
        int j,
        string name,
        List<RegressionTerm> library,
        IReadOnlyList<RegressionTerm> design,
        IReadOnlyList<double> nominal,
        EquationErrorRegression.PreparedChannels prepared,
        double sampleInterval,
        StructureCheckOptions options,
        EquationErrorOptions fitOptions)
    {
        var designKeys = design.Select(Key).ToList();
        var candidates = library.Where(term => !designKeys.Contains(Key(term))).Concat(design).ToList();
        var active = candidates.ToList();
        var droppedAt = new Dictionary<string, double>(StringComparer.Ordinal);
        EquationFit fit;
        while (true)
        {
            fit = EquationErrorRegression.FitEquation(j, active, prepared, sampleInterval, fitOptions);
            var weakest = -1;
            var weakestT = double.PositiveInfinity;
            for (var k = 0; k < active.Count; k++)
            {
                var t = Math.Abs(fit.Coefficients[k] / fit.StandardErrors[k]);
                t = double.IsFinite(t) ? t : 0;
                if (t < weakestT)
                {
                    (weakest, weakestT) = (k, t);
                }
            }

            if (weakest < 0 || weakestT >= options.MinimumTValue)
            {
                break;
            }

            droppedAt[Key(active[weakest])] = weakestT;
            active.RemoveAt(weakest);
        }

        var reference = design.Select((term, d) => Math.Abs(nominal[d]) * Rms(term, prepared)).Where(size => size > 0).DefaultIfEmpty(double.NaN).Min();
        var terms = new List<StructureTermEstimate>(candidates.Count);
        var findings = new List<StructureFinding>();
        foreach (var term in candidates)
        {
            var key = Key(term);
            var d = designKeys.IndexOf(key);
            var k = active.FindIndex(a => Key(a) == key);
            var estimate = k >= 0 ? fit.Coefficients[k] : 0;
            var error = k >= 0 ? fit.StandardErrors[k] : double.NaN;
            var t = k >= 0 ? estimate / error : droppedAt[key];
            var size = Math.Abs(estimate) * Rms(term, prepared) / reference;
            double? nominalValue = d >= 0 ? nominal[d] : null;
            terms.Add(new StructureTermEstimate(term.Name, nominalValue, estimate, error, t, size, k >= 0));
            if (d < 0 && k >= 0 && size >= options.MinimumRelativeSize)
            {
                findings.Add(new StructureFinding(name, term.Name, StructureFindingKind.UnexpectedTerm, estimate, null, t, size,
                    $"{name}' has a term {term.Name} the design lacks ({100 * size:0.#} % of its smallest design term, t = {t:0.#}): look for a miswire or a stray connection into the {name} integrator."));
            }
            else if (d >= 0 && (k < 0 || Math.Abs(estimate) < options.MissingFraction * Math.Abs(nominal[d])))
            {
                findings.Add(new StructureFinding(name, term.Name, StructureFindingKind.MissingTerm, estimate, nominal[d], t, size,
                    $"{name}' lacks its design term {term.Name} (it computes {100 * estimate / nominal[d]:0.#} % of the nominal coefficient): look for an open connection or a missing input of the {name} integrator."));
            }
            else if (d >= 0 && Math.Sign(estimate) != Math.Sign(nominal[d]))
            {
                findings.Add(new StructureFinding(name, term.Name, StructureFindingKind.ReversedTerm, estimate, nominal[d], t, size,
                    $"{name}' computes its term {term.Name} with the wrong sign: look for an input taken from the wrong polarity (an inverter skipped or added)."));
            }
        }

        var constant = active.Count < fit.Terms.Count ? fit.Coefficients[active.Count] : 0;
        return (new StructureEquation(name, terms, constant, fit.RSquared), findings);
    }

    private static double Rms(RegressionTerm term, EquationErrorRegression.PreparedChannels prepared)
    {
        var sum = 0.0;
        foreach (var i in prepared.UsableSamples)
        {
            var value = term.Evaluate(prepared.Smoothed, i);
            sum += value * value;
        }

        return Math.Sqrt(sum / Math.Max(1, prepared.UsableSamples.Length));
    }
}

/// <summary>Thresholds of the structure check.</summary>
public sealed record StructureCheckOptions
{
    /// <summary>Terms with |t| below this are pruned. Default 5: with thousands of correlated samples a lower bar lets
    /// filter bias through (our choice, checked on the synthetic boards of the tests).</summary>
    public double MinimumTValue { get; init; } = 5;

    /// <summary>An extra term smaller than this fraction of the equation's smallest design term is not reported. Default 0.05.</summary>
    public double MinimumRelativeSize { get; init; } = 0.05;

    /// <summary>A design term keeping less than this fraction of its nominal coefficient counts as missing. Default 0.25.</summary>
    public double MissingFraction { get; init; } = 0.25;
}

/// <summary>What the structure check found.</summary>
/// <param name="Performed">False when the check could not run.</param>
/// <param name="NotPerformedReason">Why not, when it did not run.</param>
/// <param name="FilterHalfWidth">The Savitzky-Golay half-width used.</param>
/// <param name="FilterOrder">The Savitzky-Golay polynomial order used.</param>
/// <param name="Equations">Every equation's library terms after pruning.</param>
/// <param name="Findings">Unexpected, missing and reversed terms, in equation order.</param>
public sealed record StructureCheckResult(bool Performed, string? NotPerformedReason, int FilterHalfWidth, int FilterOrder, IReadOnlyList<StructureEquation> Equations, IReadOnlyList<StructureFinding> Findings)
{
    /// <summary>True when the check ran and the board computes the design's terms and no others.</summary>
    public bool Passed => Performed && Findings.Count == 0;

    /// <summary>The outcome in one sentence.</summary>
    public string Message => !Performed
        ? "Structure check not performed: " + NotPerformedReason
        : Findings.Count == 0
            ? "The board computes the design's terms and no others."
            : string.Join(" ", Findings.Select(finding => finding.Sentence));
}

/// <summary>One equation of the structure check.</summary>
/// <param name="Equation">The state whose derivative it is.</param>
/// <param name="Terms">Each library term (design terms last) with its estimate; pruned terms have estimate 0.</param>
/// <param name="Constant">The fitted constant (integrator offsets).</param>
/// <param name="RSquared">The fraction of the derivative's variance the kept terms explain.</param>
public sealed record StructureEquation(string Equation, IReadOnlyList<StructureTermEstimate> Terms, double Constant, double RSquared);

/// <summary>One library term in one equation.</summary>
/// <param name="Term">The term, for example <c>x*z</c>.</param>
/// <param name="Nominal">The design's coefficient, or null when the design lacks the term.</param>
/// <param name="Estimate">The coefficient after pruning (0 when pruned).</param>
/// <param name="StandardError">Its batch-means standard error (NaN when pruned).</param>
/// <param name="TValue">estimate / standard error; for a pruned term, its |t| when it was dropped.</param>
/// <param name="RelativeSize">Its contribution over the smallest design term's nominal contribution.</param>
/// <param name="Kept">Whether it survived the pruning.</param>
public sealed record StructureTermEstimate(string Term, double? Nominal, double Estimate, double StandardError, double TValue, double RelativeSize, bool Kept);

/// <summary>How a term disagrees with the design.</summary>
public enum StructureFindingKind
{
    /// <summary>A term the design lacks, large and significant.</summary>
    UnexpectedTerm,

    /// <summary>A design term the board does not compute.</summary>
    MissingTerm,

    /// <summary>A design term computed with the wrong sign.</summary>
    ReversedTerm,
}

/// <summary>One disagreement between the board and its design.</summary>
/// <param name="Equation">The state whose equation it is in.</param>
/// <param name="Term">The term.</param>
/// <param name="Kind">What kind of disagreement.</param>
/// <param name="Estimate">The fitted coefficient.</param>
/// <param name="Nominal">The design's coefficient, when it has the term.</param>
/// <param name="TValue">Its t-value.</param>
/// <param name="RelativeSize">Its contribution over the equation's smallest design term.</param>
/// <param name="Sentence">What it means and what to look at.</param>
public sealed record StructureFinding(string Equation, string Term, StructureFindingKind Kind, double Estimate, double? Nominal, double TValue, double RelativeSize, string Sentence);
