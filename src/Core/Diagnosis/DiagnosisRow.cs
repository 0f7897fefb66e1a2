namespace Patchproof.Core.Diagnosis;

/// <summary>What kind of measured quantity a diagnosis row holds.</summary>
public enum DiagnosisRowKind
{
    /// <summary>ln(estimated coefficient / nominal coefficient) of one design term, dimensionless.</summary>
    LogCoefficient,

    /// <summary>An equation's constant term expressed as an equivalent input voltage, in volts.</summary>
    OffsetVolts,
}

/// <summary>One quantity the estimator measured and the diagnosis must explain by parts.</summary>
/// <param name="Id">A stable identifier, for example <c>dy/dt:x</c>.</param>
/// <param name="Label">What a person reads, for example "y integrator, input from x".</param>
/// <param name="Kind">Log-coefficient (dimensionless) or offset (volts).</param>
/// <param name="Value">The measured deviation: ln(theta_hat/theta_nom), or the offset in volts.</param>
public sealed record DiagnosisRow(string Id, string Label, DiagnosisRowKind Kind, double Value);
