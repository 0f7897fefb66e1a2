namespace Patchproof.Core.Circuits;

/// <summary>One problem variable as it appears on the board: its amplitude scale and sign.</summary>
/// <remarks>
/// The integrator output for variable x is V = Sign * ScaleVoltsPerUnit * x (volts), with x in
/// problem units. A sign of -1 means the integrator produces -x (common when that saves an inverter).
/// </remarks>
/// <param name="Name">The variable's name in the model, for example <c>x</c>.</param>
/// <param name="ScaleVoltsPerUnit">Volts per problem unit s, positive.</param>
/// <param name="Sign">+1 or -1.</param>
public sealed record DesignVariable(string Name, double ScaleVoltsPerUnit, int Sign = 1)
{
    /// <summary>Volts per problem unit including the sign: Sign * ScaleVoltsPerUnit.</summary>
    public double SignedScale => Sign * ScaleVoltsPerUnit;

    /// <summary>The machine voltage for a problem value: V = sign * s * x.</summary>
    /// <param name="problemValue">x in problem units.</param>
    /// <returns>Volts.</returns>
    public double ToVolts(double problemValue) => SignedScale * problemValue;

    /// <summary>The problem value for a machine voltage: x = V / (sign * s).</summary>
    /// <param name="volts">V in volts.</param>
    /// <returns>x in problem units.</returns>
    public double FromVolts(double volts) => volts / SignedScale;
}
