namespace Patchproof.Core.Simulation;

/// <summary>How much work a solve took.</summary>
/// <param name="FunctionEvaluations">Evaluations of the right-hand side f, including those for event location.</param>
/// <param name="JacobianEvaluations">Evaluations of the state and parameter Jacobian pair (sensitivities only).</param>
/// <param name="AcceptedSteps">Steps accepted by the error control (all steps for a fixed-step method).</param>
/// <param name="RejectedSteps">Steps rejected and retried with a smaller step.</param>
public sealed record SolverStatistics(long FunctionEvaluations, long JacobianEvaluations, long AcceptedSteps, long RejectedSteps);
