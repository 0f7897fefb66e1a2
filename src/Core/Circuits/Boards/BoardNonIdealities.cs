using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Boards;

/// <summary>The ways a simulated board departs from its ideal equations, other than part values (which are the system's parameters).</summary>
/// <remarks>
/// <para>Integrator j with inputs u_k through R_k, capacitor C, input offset voltage V_os, bias
/// current I_b and open-loop DC gain A:
/// dV/dt = (1/C) * [ sum_k (V_os - u_k) / R_k + I_b ] - (V / (A C)) * sum_k 1/R_k.
/// With the input grounded this gives the classic drift V_os/(R C) + I_b/C (standard derivation);
/// the last term is the leak of finite DC gain, which makes the integrator a lossy one with time
/// constant A R C.</para>
/// <para>A multiplier's output is kappa * X * Y + offset; kappa's error is a part deviation of the
/// multiplier part. Units: volts, amperes, dimensionless gain.</para>
/// <para>The default is the ideal board with smooth clipping at the design's output limit.</para>
/// </remarks>
public sealed record BoardNonIdealities
{
    /// <summary>The ideal board: no clipping, no offsets, infinite gain.</summary>
    public static BoardNonIdealities Ideal { get; } = new() { Clipping = OutputClipping.None };

    /// <summary>How outputs clip at <see cref="BoardDesign.OutputLimitVolts"/>; default smooth.</summary>
    public OutputClipping Clipping { get; init; } = OutputClipping.Smooth;

    /// <summary>The width of the smooth knee below the limit, volts; default 0.1 V.</summary>
    public double ClipKneeVolts { get; init; } = 0.1;

    /// <summary>Output offsets of multipliers by part id, volts.</summary>
    public ImmutableDictionary<string, double> MultiplierOutputOffsetsVolts { get; init; } = ImmutableDictionary<string, double>.Empty;

    /// <summary>Input offset voltages of integrators by variable name, volts.</summary>
    public ImmutableDictionary<string, double> IntegratorInputOffsetsVolts { get; init; } = ImmutableDictionary<string, double>.Empty;

    /// <summary>Input bias currents of integrators by variable name, amperes (positive charges the output upward).</summary>
    public ImmutableDictionary<string, double> IntegratorBiasCurrentsAmperes { get; init; } = ImmutableDictionary<string, double>.Empty;

    /// <summary>The op-amps' open-loop DC gain A (positive infinity for none); typical parts have 1e5 to 1e6 (common practice).</summary>
    public double IntegratorDcGain { get; init; } = double.PositiveInfinity;
}
