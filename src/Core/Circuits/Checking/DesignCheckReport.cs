using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Checking;

/// <summary>What a design realizes and what is wrong with it.</summary>
/// <param name="Design">The design checked.</param>
/// <param name="ModelName">The model it was checked against, or null when none was known.</param>
/// <param name="Terms">Every design term and every model term, matched up.</param>
/// <param name="ImpliedParameters">The model parameters the parts imply, by name (mean over the terms that carry each).</param>
/// <param name="Findings">What is wrong or worth a note, errors first.</param>
public sealed record DesignCheckReport(
    BoardDesign Design,
    string? ModelName,
    ImmutableArray<RealizedTerm> Terms,
    ImmutableArray<ImpliedParameter> ImpliedParameters,
    ImmutableArray<DesignFinding> Findings)
{
    /// <summary>True when every model term is realized with the right sign and value and no extra term exists.</summary>
    public bool RealizesModel => ModelName is not null && !Findings.Any(finding => finding.IsError);
}

/// <summary>One model parameter as the parts imply it.</summary>
/// <param name="Name">The parameter's name, for example <c>rho</c>.</param>
/// <param name="Value">The implied value (mean over the terms carrying it).</param>
/// <param name="Intended">The value the model asks for.</param>
/// <param name="PerTerm">The value each carrying term implies, labelled like <see cref="RealizedTerm.Label"/>.</param>
public sealed record ImpliedParameter(string Name, double Value, double Intended, ImmutableArray<KeyValuePair<string, double>> PerTerm)
{
    /// <summary>Value / Intended - 1.</summary>
    public double RelativeError => (Value / Intended) - 1;
}
