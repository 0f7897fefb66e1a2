using System.Collections.Immutable;
using System.Globalization;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Core.Circuits.Checking;

/// <summary>Checks that a design realizes its model: every term present, with the right sign and a value within the rounding of standard parts.</summary>
/// <remarks>
/// <para>Each design term is de-scaled to problem units (c = theta * tau * prod(sign_i s_i) /
/// (sign_j s_j)) and matched to the model term of the same equation and basis. Reported: model terms
/// the board lacks, board terms the model lacks, wrong signs, values off by more than the rounding
/// allowance (see <see cref="RealizedTerm"/>), parts that serve nothing, and variables whose typical
/// peak (model's typical range times scale) exceeds the output limit.</para>
/// <para>The parameters the parts imply are the realized coefficient divided by the term's fixed
/// factor, averaged over the terms carrying the parameter (sigma appears in two Lorenz terms).</para>
/// </remarks>
public static class DesignCheck
{
    /// <summary>The allowance for a part bought without a series: 0.5 %.</summary>
    public const double UnlistedPartAllowance = 0.005;

    /// <summary>Checks a design against a model.</summary>
    /// <param name="design">A valid design (see <see cref="DesignValidator"/>).</param>
    /// <param name="target">The model, or null to report the coefficients only.</param>
    /// <returns>The report.</returns>
    public static DesignCheckReport Check(BoardDesign design, TargetSystem? target)
    {
        ArgumentNullException.ThrowIfNull(design);
        var designTerms = design.Terms();
        var overrides = design.Model?.Parameters ?? ImmutableDictionary<string, double>.Empty;
        var findings = new List<DesignFinding>();
        var realized = new List<RealizedTerm>();
        var matched = new HashSet<TargetTerm>();

        foreach (var term in designTerms)
        {
            var problem = design.ToProblemCoefficient(term);
            var allowance = term.Paths.Max(path => path.Factors.Sum(factor => AllowanceOf(design.FindPart(factor.PartId))));
            var expectedTerms = target?.TermsOf(term.Variable).Where(candidate => candidate.Basis.Equals(term.Basis)).ToList() ?? [];
            double? expected = expectedTerms.Count == 0 ? null : expectedTerms.Sum(candidate => candidate.Coefficient(name => target!.ParameterValue(name, overrides)));
            matched.UnionWith(expectedTerms);
            var row = new RealizedTerm(term, term.Variable, term.Basis, problem, expected, allowance);
            realized.Add(row);
            if (target is null)
            {
                continue;
            }

            if (expected is null)
            {
                findings.Add(new(DesignFindingKind.ExtraTerm, row.Label, $"{row.Label}: the board computes {Number(problem)} * {term.Basis.Key}, which the model '{target.Name}' does not have", true));
            }
            else if (Math.Sign(expected.Value) != Math.Sign(problem))
            {
                findings.Add(new(DesignFindingKind.WrongSign, row.Label, $"{row.Label}: the board computes {Number(problem)}, the model {Number(expected.Value)}: the sign is wrong (an inverter missing or extra on this path?)", true));
            }
            else if (Math.Abs(row.RelativeError!.Value) > allowance + 1e-9)
            {
                findings.Add(new(DesignFindingKind.WrongValue, row.Label, $"{row.Label}: the board computes {Number(problem)}, the model {Number(expected.Value)} ({Percent(row.RelativeError.Value)}, more than the {Percent(allowance)} rounding of its parts allows)", true));
            }
        }

        if (target is not null)
        {
            foreach (var missing in target.Terms.Where(term => !matched.Contains(term)))
            {
                var value = missing.Coefficient(name => target.ParameterValue(name, overrides));
                var row = new RealizedTerm(null, missing.Variable, missing.Basis, 0, value, 0);
                realized.Add(row);
                findings.Add(new(DesignFindingKind.MissingTerm, row.Label, $"{row.Label}: the model has {Number(value)} * {missing.Basis.Key}, and no input of the {missing.Variable} integrator computes it", true));
            }

            foreach (var name in target.Variables.Where(name => design.FindVariable(name) is null))
            {
                findings.Add(new(DesignFindingKind.VariableMismatch, name, $"the model's variable '{name}' has no integrator on the board", true));
            }

            foreach (var variable in design.Variables.Where(variable => !target.Variables.Contains(variable.Name)))
            {
                findings.Add(new(DesignFindingKind.VariableMismatch, variable.Name, $"the board's variable '{variable.Name}' is not a variable of the model '{target.Name}'", true));
            }

            for (var i = 0; i < target.Variables.Length; i++)
            {
                if (design.FindVariable(target.Variables[i]) is not { } variable)
                {
                    continue;
                }

                var peak = target.TypicalRanges[i] * variable.ScaleVoltsPerUnit;
                if (peak > design.OutputLimitVolts)
                {
                    findings.Add(new(DesignFindingKind.Range, variable.Name, $"{variable.Name} typically reaches about {Number(peak)} V at {Number(variable.ScaleVoltsPerUnit)} V per unit, beyond the {Number(design.OutputLimitVolts)} V output limit: it will clip", false));
                }
                else if (peak < 0.2 * design.MachineUnitVolts)
                {
                    findings.Add(new(DesignFindingKind.Range, variable.Name, $"{variable.Name} typically stays below {Number(peak)} V, a fifth of the {Number(design.MachineUnitVolts)} V machine unit: offsets and noise weigh more than they need to", false));
                }
            }
        }
        else if (design.Model is { } reference)
        {
            findings.Add(new(DesignFindingKind.UnknownModel, reference.Name, $"the model '{reference.Name}' is not known; only the coefficients are shown", false));
        }

        var used = designTerms.SelectMany(term => term.PartIds).ToHashSet(StringComparer.Ordinal);
        foreach (var part in design.Parts.Where(part => !used.Contains(part.Id)))
        {
            findings.Add(new(DesignFindingKind.UnusedPart, part.Id, $"{part.Id} ({part.NominalText}) serves no term", false));
        }

        return new DesignCheckReport(
            design,
            target?.Name,
            [.. realized],
            target is null ? [] : ImpliedParameters(target, overrides, realized),
            [.. findings.OrderByDescending(finding => finding.IsError)]);
    }

    private static ImmutableArray<ImpliedParameter> ImpliedParameters(TargetSystem target, IReadOnlyDictionary<string, double> overrides, List<RealizedTerm> realized)
    {
        var result = ImmutableArray.CreateBuilder<ImpliedParameter>();
        foreach (var (name, _) in target.Parameters)
        {
            var perTerm = new List<KeyValuePair<string, double>>();
            foreach (var term in target.Terms.Where(term => term.Parameter == name))
            {
                var row = realized.FirstOrDefault(candidate => candidate.Term is not null && candidate.Variable == term.Variable && candidate.Basis.Equals(term.Basis));
                if (row is not null && target.TermsOf(term.Variable).Count(other => other.Basis.Equals(term.Basis)) == 1)
                {
                    perTerm.Add(new(row.Label, row.RealizedProblemCoefficient / term.Factor));
                }
            }

            if (perTerm.Count > 0)
            {
                result.Add(new ImpliedParameter(name, perTerm.Average(pair => pair.Value), target.ParameterValue(name, overrides), [.. perTerm]));
            }
        }

        return result.ToImmutable();
    }

    private static double AllowanceOf(Part? part) => part?.Series?.HalfStep ?? UnlistedPartAllowance;

    private static string Number(double value) => value.ToString("G4", CultureInfo.InvariantCulture);

    private static string Percent(double value) => (value * 100).ToString("+0.0#;-0.0#", CultureInfo.InvariantCulture) + " %";
}
