namespace Patchproof.Core.Simulation;

/// <summary>The dense output of a zero-length solution: the same state at every time.</summary>
public sealed class ConstantDenseOutput : IDenseOutput
{
    private readonly double[] state;

    /// <summary>Creates the constant output.</summary>
    /// <param name="time">The single time, in the system's time unit.</param>
    /// <param name="state">The state to return (copied).</param>
    public ConstantDenseOutput(double time, ReadOnlySpan<double> state)
    {
        TMin = time;
        TMax = time;
        this.state = state.ToArray();
    }

    /// <inheritdoc />
    public double TMin { get; }

    /// <inheritdoc />
    public double TMax { get; }

    /// <inheritdoc />
    public void Evaluate(double time, Span<double> destination) => state.AsSpan(0, destination.Length).CopyTo(destination);
}
