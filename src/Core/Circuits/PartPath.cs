using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>One part on a term's signal path and the power it enters the coefficient with.</summary>
/// <remarks>An input resistor into an integrator is (R, -1), the integrator's capacitor (C, -1), a
/// multiplier on the path (M, +1), an inverter's feedback (Rf, +1) and its input (Rin, -1), a
/// reference (VR, +1). The value raised to the power is the part's magnitude |value|.</remarks>
/// <param name="PartId">The part's id.</param>
/// <param name="Exponent">The power, usually +1 or -1.</param>
public sealed record PartFactor(string PartId, int Exponent);

/// <summary>How one signal path's coefficient follows from its parts: theta = Sign * Constant * prod |value_i|^exponent_i.</summary>
/// <remarks>
/// <para>The diagnosis works in log-deviations u_i = ln(value_i / nominal_i): along one path,
/// ln(theta / theta_nominal) = sum_i exponent_i * u_i exactly. The sign of a reference voltage is
/// carried in <see cref="Sign"/>, its magnitude in the factor.</para>
/// <para>Units: the coefficient is in machine units (volts and seconds), 1/s for a linear term,
/// V/s for a constant, 1/(V s) for a product of two voltages.</para>
/// </remarks>
/// <param name="Sign">+1 or -1: the sign of the path's coefficient.</param>
/// <param name="Factors">The parts on the path, each once, with its exponent.</param>
/// <param name="Constant">A positive constant without a part (1 unless stated).</param>
public sealed record PartPath(int Sign, ImmutableArray<PartFactor> Factors, double Constant = 1.0)
{
    /// <summary>The path's coefficient for given part values.</summary>
    /// <param name="valueOf">The value of each part by id, in its unit.</param>
    /// <returns>theta of this path.</returns>
    public double Coefficient(Func<string, double> valueOf)
    {
        ArgumentNullException.ThrowIfNull(valueOf);
        var product = Sign * Constant;
        foreach (var factor in Factors)
        {
            product *= Math.Pow(Math.Abs(valueOf(factor.PartId)), factor.Exponent);
        }

        return product;
    }

    /// <summary>The exponent of a part on this path, 0 when the part is not on it.</summary>
    /// <param name="partId">The part's id.</param>
    /// <returns>The exponent.</returns>
    public int ExponentOf(string partId)
    {
        foreach (var factor in Factors)
        {
            if (factor.PartId == partId)
            {
                return factor.Exponent;
            }
        }

        return 0;
    }

    /// <summary>Readable form, for example <c>-1 * R5^-1 * C2^-1</c>.</summary>
    /// <returns>The text.</returns>
    public override string ToString() =>
        (Sign < 0 ? "-" : "+") + (Constant == 1 ? "1" : Constant.ToString("G6", System.Globalization.CultureInfo.InvariantCulture))
        + string.Concat(Factors.Select(factor => $" * {factor.PartId}^{factor.Exponent}"));
}

/// <summary>One term of one integrator's equation in machine units: dV_j/dt contains theta * phi(V).</summary>
/// <remarks>
/// <para>theta is the sum of its paths' coefficients (usually one path). Units: 1/s for a linear
/// term, V/s for a constant, 1/(V s) for a product of two voltages.</para>
/// <para>For the diagnosis, <see cref="LogSensitivity"/> gives d ln theta / d ln value for a part:
/// the exponents of the paths weighted by their share of theta; with one path it is the exponent.</para>
/// </remarks>
/// <param name="Variable">The integrator's variable (the equation).</param>
/// <param name="Basis">phi, in machine voltages.</param>
/// <param name="Paths">The signal paths that land on this term.</param>
/// <param name="NominalCoefficient">theta at nominal part values.</param>
public sealed record DesignTerm(string Variable, TermBasis Basis, ImmutableArray<PartPath> Paths, double NominalCoefficient)
{
    /// <summary>The unit of the coefficient, for example <c>1/s</c>.</summary>
    public string CoefficientUnit => Basis.Degree switch
    {
        0 => "V/s",
        1 => "1/s",
        2 => "1/(V s)",
        var degree => $"1/(V^{degree - 1} s)",
    };

    /// <summary>theta for given part values.</summary>
    /// <param name="valueOf">The value of each part by id.</param>
    /// <returns>The coefficient in machine units.</returns>
    public double Coefficient(Func<string, double> valueOf) => Paths.Sum(path => path.Coefficient(valueOf));

    /// <summary>Every part on any of the term's paths.</summary>
    public IEnumerable<string> PartIds => Paths.SelectMany(path => path.Factors).Select(factor => factor.PartId).Distinct();

    /// <summary>d ln theta / d ln |value| of one part at nominal values.</summary>
    /// <param name="partId">The part's id.</param>
    /// <param name="nominalOf">The nominal value of each part by id.</param>
    /// <returns>The log-sensitivity; the exponent when only one path lands here, 0 when the part is not on any path.</returns>
    public double LogSensitivity(string partId, Func<string, double> nominalOf)
    {
        if (Paths.Length == 1)
        {
            return Paths[0].ExponentOf(partId);
        }

        var total = Coefficient(nominalOf);
        return Paths.Sum(path => path.ExponentOf(partId) * path.Coefficient(nominalOf)) / total;
    }
}
