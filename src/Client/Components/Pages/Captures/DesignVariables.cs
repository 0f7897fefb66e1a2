using System.Text.RegularExpressions;
using Patchproof.Client.Models;

namespace Patchproof.Client.Components.Pages.Captures;

/// <summary>The state variables of a design, read from the left-hand sides of its equations ("dx/dt = ..." gives x).</summary>
public static partial class DesignVariables
{
    /// <summary>The variables in equation order, each once.</summary>
    public static IReadOnlyList<string> Of(DesignSheet design) =>
        design.Equations.Select(e => LeftHandSide().Match(e)).Where(m => m.Success).Select(m => m.Groups["name"].Value).Distinct().ToList();

    [GeneratedRegex(@"^\s*d(?<name>[A-Za-z_][A-Za-z0-9_]*)\s*/\s*dt\s*=")]
    private static partial Regex LeftHandSide();
}
