namespace Patchproof.Core.Simulation;

/// <summary>A continuous approximation of the solution over one interval [TMin, TMax].</summary>
/// <remarks>For integration backwards in time TMin is still the smaller end. Evaluating outside the
/// interval extrapolates the polynomial and loses accuracy.</remarks>
public interface IDenseOutput
{
    /// <summary>The smaller end of the interval, in the system's time unit.</summary>
    double TMin { get; }

    /// <summary>The larger end of the interval, in the system's time unit.</summary>
    double TMax { get; }

    /// <summary>Writes the approximate solution at <paramref name="time"/> into <paramref name="destination"/>.</summary>
    /// <param name="time">The time, normally in [TMin, TMax].</param>
    /// <param name="destination">Receives the state; its length picks how many leading components are written.</param>
    void Evaluate(double time, Span<double> destination);
}
