namespace Patchproof.Core.Simulation;

/// <summary>Why a solve stopped.</summary>
public enum SolveStatus
{
    /// <summary>The end time was reached.</summary>
    Succeeded,

    /// <summary>A terminal event occurred before the end time.</summary>
    StoppedByEvent,

    /// <summary>The step size fell below the resolution of the time variable.</summary>
    StepSizeTooSmall,

    /// <summary>The step budget (<see cref="OdeMethod.MaxSteps"/>) was used up.</summary>
    MaxStepsExceeded,

    /// <summary>The evaluation budget (<see cref="OdeMethod.MaxEvaluations"/>) was used up.</summary>
    MaxEvaluationsExceeded,

    /// <summary>A step produced a NaN or infinite state or derivative (a blow-up or an undefined right-hand side).</summary>
    NonFiniteState,
}
