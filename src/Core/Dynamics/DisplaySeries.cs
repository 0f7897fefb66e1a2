namespace Patchproof.Core.Dynamics;

/// <summary>A trace ready for a plot: abscissae and ordinates of equal length, already decimated.</summary>
/// <remarks>
/// <para>For a time series <see cref="X"/> holds times (seconds for a capture, problem time units
/// for a model) and <see cref="Y"/> one channel; for a phase plane both hold channels. Indices into
/// the source are kept so a caller can look up other channels at the same samples.</para>
/// </remarks>
/// <param name="X">Abscissae, in the source's units.</param>
/// <param name="Y">Ordinates, in the source's units.</param>
/// <param name="SourceIndices">The index in the source of each kept point, increasing.</param>
public sealed record DisplaySeries(double[] X, double[] Y, int[] SourceIndices)
{
    /// <summary>The number of points in the trace.</summary>
    public int Count => X.Length;
}
