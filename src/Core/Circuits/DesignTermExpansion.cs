using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>Expands each integrator input through the blocks it passes into coefficient-times-basis terms.</summary>
/// <remarks>
/// Rules (machine units): a variable node contributes +V; a summer -R_f * sum u_k / R_k, adding
/// (R_f, +1), (R_k, -1) and a sign flip; a multiplier kappa * X * Y, adding (M, +1) and multiplying
/// the bases; a reference +V_ref, adding (VR, +1) and the sign of V_ref; a function block g(V).
/// The integrator adds (R, -1), (C, -1) and a sign flip. Paths landing on the same basis of the
/// same equation are merged into one term.
/// </remarks>
internal static class DesignTermExpansion
{
    public static ImmutableArray<DesignTerm> Expand(BoardDesign design)
    {
        var problems = DesignValidator.Validate(design);
        if (problems.Count > 0)
        {
            throw new ArgumentException("The design has problems: " + string.Join("; ", problems.Take(5)), nameof(design));
        }

        var terms = ImmutableArray.CreateBuilder<DesignTerm>();
        foreach (var integrator in design.Integrators)
        {
            var byBasis = new Dictionary<string, (TermBasis Basis, List<PartPath> Paths)>(StringComparer.Ordinal);
            var order = new List<string>();
            foreach (var input in integrator.Inputs)
            {
                foreach (var partial in ExpandNode(design, input.From))
                {
                    var factors = new Dictionary<string, int>(partial.Factors, StringComparer.Ordinal);
                    Add(factors, input.ResistorId, -1);
                    Add(factors, integrator.CapacitorId, -1);
                    var path = new PartPath(-partial.Sign, [.. factors.Where(pair => pair.Value != 0).Select(pair => new PartFactor(pair.Key, pair.Value))]);
                    if (!byBasis.TryGetValue(partial.Basis.Key, out var entry))
                    {
                        entry = (partial.Basis, []);
                        byBasis[partial.Basis.Key] = entry;
                        order.Add(partial.Basis.Key);
                    }

                    entry.Paths.Add(path);
                }
            }

            foreach (var key in order)
            {
                var (basis, paths) = byBasis[key];
                var term = new DesignTerm(integrator.Variable, basis, [.. paths], 0);
                terms.Add(term with { NominalCoefficient = term.Coefficient(design.NominalOf) });
            }
        }

        return terms.ToImmutable();
    }

    private static void Add(Dictionary<string, int> factors, string partId, int exponent) =>
        factors[partId] = factors.GetValueOrDefault(partId) + exponent;

    private static List<Partial> ExpandNode(BoardDesign design, string node)
    {
        if (node == BoardDesign.GroundNode)
        {
            return [];
        }

        if (design.FindVariable(node) is not null)
        {
            return [new Partial(TermBasis.Product(node), 1, ImmutableDictionary<string, int>.Empty)];
        }

        switch (design.FindBlock(node))
        {
            case SummerBlock summer:
                var summed = new List<Partial>();
                foreach (var input in summer.Inputs)
                {
                    foreach (var partial in ExpandNode(design, input.From))
                    {
                        var factors = new Dictionary<string, int>(partial.Factors, StringComparer.Ordinal);
                        Add(factors, summer.FeedbackResistorId, 1);
                        Add(factors, input.ResistorId, -1);
                        summed.Add(new Partial(partial.Basis, -partial.Sign, factors.ToImmutableDictionary(StringComparer.Ordinal)));
                    }
                }

                return summed;
            case MultiplierBlock multiplier:
                var products = new List<Partial>();
                foreach (var left in ExpandNode(design, multiplier.X))
                {
                    foreach (var right in ExpandNode(design, multiplier.Y))
                    {
                        var factors = new Dictionary<string, int>(left.Factors, StringComparer.Ordinal);
                        foreach (var (id, exponent) in right.Factors)
                        {
                            Add(factors, id, exponent);
                        }

                        Add(factors, multiplier.PartId, 1);
                        products.Add(new Partial(left.Basis.Times(right.Basis), left.Sign * right.Sign, factors.ToImmutableDictionary(StringComparer.Ordinal)));
                    }
                }

                return products;
            case ReferenceBlock reference:
                var sign = Math.Sign(design.NominalOf(reference.PartId));
                return [new Partial(TermBasis.One, sign, ImmutableDictionary<string, int>.Empty.Add(reference.PartId, 1))];
            case FunctionBlock function:
                return [new Partial(TermBasis.OfFunction(function.Output, function.Input), 1, ImmutableDictionary<string, int>.Empty)];
            default:
                throw new ArgumentException($"node '{node}' is not driven by any block", nameof(design));
        }
    }

    private sealed record Partial(TermBasis Basis, int Sign, ImmutableDictionary<string, int> Factors);
}
