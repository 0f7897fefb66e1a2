using System.Collections.Immutable;

namespace Patchproof.Core.Simulation;

/// <summary>The coefficients of an explicit embedded Runge-Kutta method with a continuous extension.</summary>
/// <remarks>
/// <para>For s stages K_i = f(t + c_i h, y + h Σ_{j&lt;i} a_ij K_j), the solution is y1 = y + h Σ b_i K_i
/// (order <see cref="Order"/>), the local error estimate is h Σ e_i K_i with e = b - b̂ (b̂ of order
/// <see cref="ErrorEstimatorOrder"/>), and the dense output is
/// y(t + θh) = y + h Σ_i K_i Σ_{j=1..q} P_ij θ^j.</para>
/// <para>Shape invariants checked by the constructor: <see cref="A"/> has s rows, row i holding the i
/// entries a_i0 .. a_i(i-1) (row 0 is empty); <see cref="B"/>, <see cref="C"/>, <see cref="E"/> have s
/// entries; <see cref="P"/> has s rows of equal length q ≥ 1; both orders are positive.</para>
/// <para>References: 1. SciML DiffEqBase <c>tableaus.jl</c> (the shape checks);
/// 2. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.1-II.6.</para>
/// </remarks>
public sealed record ButcherTableau
{
    /// <summary>Creates a tableau after checking its shape.</summary>
    /// <param name="a">The strictly lower triangle of A, row by row.</param>
    /// <param name="b">The weights of the propagated solution.</param>
    /// <param name="c">The nodes.</param>
    /// <param name="e">The error weights b - b̂.</param>
    /// <param name="p">The dense-output coefficients, s rows of q powers θ^1..θ^q.</param>
    /// <param name="order">The order of the propagated solution.</param>
    /// <param name="errorEstimatorOrder">The order of the embedded solution.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the shapes do not agree or an order is not positive.</exception>
    public ButcherTableau(
        ImmutableArray<ImmutableArray<double>> a,
        ImmutableArray<double> b,
        ImmutableArray<double> c,
        ImmutableArray<double> e,
        ImmutableArray<ImmutableArray<double>> p,
        int order,
        int errorEstimatorOrder)
    {
        Preconditions.CheckArgumentRange(nameof(b), !b.IsDefaultOrEmpty, "must hold at least one weight");
        var stages = b.Length;
        Preconditions.CheckArgumentRange(nameof(a), !a.IsDefault && a.Length == stages, $"must have {stages} rows");
        for (var i = 0; i < stages; i++)
        {
            Preconditions.CheckArgumentRange(nameof(a), !a[i].IsDefault && a[i].Length == i, $"row {i} must have {i} entries");
        }

        Preconditions.CheckArgumentRange(nameof(c), !c.IsDefault && c.Length == stages, $"must have {stages} entries");
        Preconditions.CheckArgumentRange(nameof(e), !e.IsDefault && e.Length == stages, $"must have {stages} entries");
        Preconditions.CheckArgumentRange(nameof(p), !p.IsDefault && p.Length == stages, $"must have {stages} rows");
        var powers = p[0].IsDefault ? 0 : p[0].Length;
        Preconditions.CheckArgumentRange(nameof(p), powers >= 1 && p.All(row => !row.IsDefault && row.Length == powers), "rows must have the same positive length");
        Preconditions.CheckArgumentRange(nameof(order), order > 0, "must be positive");
        Preconditions.CheckArgumentRange(nameof(errorEstimatorOrder), errorEstimatorOrder > 0, "must be positive");
        A = a;
        B = b;
        C = c;
        E = e;
        P = p;
        Order = order;
        ErrorEstimatorOrder = errorEstimatorOrder;
    }

    /// <summary>The strictly lower triangle of the Runge-Kutta matrix: row i holds a_i0 .. a_i(i-1).</summary>
    public ImmutableArray<ImmutableArray<double>> A { get; }

    /// <summary>The weights b of the propagated solution.</summary>
    public ImmutableArray<double> B { get; }

    /// <summary>The nodes c.</summary>
    public ImmutableArray<double> C { get; }

    /// <summary>The error weights e = b - b̂ (the local error estimate is h Σ e_i K_i).</summary>
    public ImmutableArray<double> E { get; }

    /// <summary>The dense-output coefficients: row i, column j - 1 multiplies θ^j for stage i.</summary>
    public ImmutableArray<ImmutableArray<double>> P { get; }

    /// <summary>The order of the propagated solution.</summary>
    public int Order { get; }

    /// <summary>The order of the embedded solution used for the error estimate.</summary>
    public int ErrorEstimatorOrder { get; }

    /// <summary>The number of stages s.</summary>
    public int StageCount => B.Length;

    /// <summary>Whether the last stage is evaluated at the new solution (first same as last), so it can be reused as the next step's first stage.</summary>
    public bool IsFirstSameAsLast
    {
        get
        {
            var last = StageCount - 1;
            if (last < 1 || C[last] != 1.0 || B[last] != 0.0)
            {
                return false;
            }

            for (var j = 0; j < last; j++)
            {
                if (A[last][j] != B[j])
                {
                    return false;
                }
            }

            return true;
        }
    }
}
