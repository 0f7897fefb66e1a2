using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>Builds the reference problems the tests share.</summary>
internal static class Problems
{
    public static OdeProblem Lorenz(double endTime) =>
        new(new LorenzSystem(), [1.0, 1.0, 1.0], 0.0, endTime, [.. LorenzSystem.ClassicParameters]);

    public static OdeProblem Arenstorf() =>
        new(new ArenstorfSystem(), [0.994, 0.0, 0.0, ArenstorfSystem.InitialY2Velocity], 0.0, ArenstorfSystem.Period, [ArenstorfSystem.Mu]);

    public static OdeProblem Scalar(IOdeSystem system, double initial, double startTime, double endTime) =>
        new(system, [initial], startTime, endTime, []);
}
