using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Cli.Verbs;

/// <summary>The arguments of <c>patchproof simulate</c> as typed.</summary>
internal sealed record SimulateArguments(
    string? ModelName,
    string? FilePath,
    string[] Settings,
    string? InitialState,
    string? EndTime,
    string? Every,
    string? RelativeTolerance,
    string? AbsoluteTolerance,
    string? OutputPath,
    bool Json);

/// <summary>What <c>patchproof simulate</c> was asked for, numbers read.</summary>
internal sealed record SimulateRequest(
    string? ModelName,
    string? FilePath,
    string[] Settings,
    string? InitialState,
    double EndTime,
    double? Every,
    double RelativeTolerance,
    double AbsoluteTolerance,
    string? OutputPath,
    bool Json);

/// <summary>One finished simulation: the model as simulated, its settings and the solution.</summary>
internal sealed record SimulationRun(
    string ModelLabel,
    EquationModel Model,
    double[] InitialState,
    SimulateRequest Request,
    double Interval,
    OdeSolution Solution,
    string? Explanation);
