namespace Patchproof.Core.Simulation;

/// <summary>The options of one integration method; pass a derived record to <see cref="OdeSolver.Solve"/>.</summary>
/// <remarks>The known methods are <see cref="DormandPrince45"/> (adaptive, the default choice) and
/// <see cref="RungeKutta4"/> (fixed step, for comparison). A misspelt option fails to compile.</remarks>
public abstract record OdeMethod
{
    /// <summary>The most steps (accepted plus rejected) one solve may attempt; default 1,000,000.</summary>
    /// <remarks>A budget, not a target: integration stops with <see cref="SolveStatus.MaxStepsExceeded"/>
    /// when it is used up, so a runaway problem cannot hang the caller.</remarks>
    public int MaxSteps { get; init; } = 1_000_000;

    /// <summary>The most right-hand-side evaluations one solve may use; default 10,000,000.</summary>
    /// <remarks>Integration stops with <see cref="SolveStatus.MaxEvaluationsExceeded"/> before a step
    /// that would exceed it.</remarks>
    public long MaxEvaluations { get; init; } = 10_000_000;

    /// <summary>Whether the state at every step is kept in <see cref="OdeSolution.Times"/> and
    /// <see cref="OdeSolution.StateAt"/>; default true. Ignored when sample times are given.</summary>
    public bool KeepSteps { get; init; } = true;

    /// <summary>Checks the common options; throws for a caller's mistake.</summary>
    internal virtual void Validate()
    {
        Preconditions.CheckArgumentRange(nameof(MaxSteps), MaxSteps > 0, "must be positive");
        Preconditions.CheckArgumentRange(nameof(MaxEvaluations), MaxEvaluations > 0, "must be positive");
    }
}
