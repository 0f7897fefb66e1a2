using System.Globalization;
using System.Text.Json;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Simulation;

/// <summary>Reads tests/ReferenceData/ode-reference.json (values and provenance listed in the file and CHECKS.md).</summary>
internal static class OdeReference
{
    private static readonly JsonElement Root = JsonDocument.Parse(File.ReadAllText(ReferenceDataFiles.PathOf("ode-reference.json"))).RootElement;

    /// <summary>The Lorenz (10, 28, 8/3) reference trajectory from (1, 1, 1): rows of (t, x, y, z), a 40-digit Taylor integration.</summary>
    public static IReadOnlyList<(double Time, double[] State)> LorenzTrajectory() =>
        Root.GetProperty("lorenz63").GetProperty("reference_trajectory").GetProperty("rows").EnumerateArray()
            .Select(row => (row.GetProperty("t").GetDouble(), new[] { Number(row, "x"), Number(row, "y"), Number(row, "z") }))
            .ToList();

    public static double[] LorenzAt(double time) => LorenzTrajectory().Single(row => row.Time == time).State;

    public static JsonElement VanDerPol(string key) => Root.GetProperty("van_der_pol").GetProperty(key);

    public static double ExactSolution(string keyPrefix, string property)
    {
        var problems = Root.GetProperty("exact_solution_problems");
        var entry = problems.EnumerateObject().Single(item => item.Name.StartsWith(keyPrefix, StringComparison.Ordinal)).Value;
        return Number(entry, property);
    }

    private static double Number(JsonElement element, string property) =>
        element.GetProperty(property).ValueKind == JsonValueKind.String
            ? double.Parse(element.GetProperty(property).GetString()!, CultureInfo.InvariantCulture)
            : element.GetProperty(property).GetDouble();
}
