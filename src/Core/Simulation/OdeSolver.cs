using System.Globalization;

namespace Patchproof.Core.Simulation;

/// <summary>The front door: solves an <see cref="OdeProblem"/> with a chosen method and returns an <see cref="OdeSolution"/>.</summary>
/// <remarks>
/// <para><c>OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-8 })</c> covers the
/// common case. Bad arguments (a negative tolerance, a non-finite initial state, a vector of the wrong
/// length) throw <see cref="ArgumentOutOfRangeException"/>; everything that happens during integration
/// (budgets, non-finite states, events) is reported in <see cref="OdeSolution.Status"/>.</para>
/// <para>For step-by-step control or streaming, use <see cref="DormandPrince45Stepper"/>.</para>
/// </remarks>
public static class OdeSolver
{
    /// <summary>Solves <paramref name="problem"/> with <paramref name="method"/>.</summary>
    /// <param name="problem">The initial value problem.</param>
    /// <param name="method">The method and its options: <see cref="DormandPrince45"/> or <see cref="RungeKutta4"/>.</param>
    /// <returns>The solution, whatever the outcome.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When an option or the problem is invalid.</exception>
    /// <exception cref="ArgumentNullException">When an argument is null.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="DormandPrince45.Cancellation"/> is cancelled during the solve.</exception>
    public static OdeSolution Solve(OdeProblem problem, OdeMethod method)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(method);
        return method switch
        {
            DormandPrince45 options => DormandPrince45Run.Solve(problem, options),
            RungeKutta4 options => RungeKutta4Run.Solve(problem, options),
            _ => throw new ArgumentOutOfRangeException(nameof(method), method.GetType().Name, "is not a known integration method"),
        };
    }

    /// <summary>The sentence that goes with a status.</summary>
    internal static string Describe(SolveStatus status, double time, OdeMethod method) => status switch
    {
        SolveStatus.Succeeded => Format($"reached the end time t = {time}"),
        SolveStatus.StoppedByEvent => Format($"stopped by a terminal event at t = {time}"),
        SolveStatus.StepSizeTooSmall => Format($"step size too small at t = {time}: the solution may be singular there or the tolerances too tight"),
        SolveStatus.MaxStepsExceeded => Format($"step budget of {method.MaxSteps} steps used up at t = {time}"),
        SolveStatus.MaxEvaluationsExceeded => Format($"evaluation budget of {method.MaxEvaluations} evaluations used up at t = {time}"),
        SolveStatus.NonFiniteState => Format($"non-finite state at t = {time}: the next step produced NaN or infinity (blow-up or undefined right-hand side)"),
        _ => status.ToString(),
    };

    private static string Format(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
