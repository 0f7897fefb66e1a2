using System.Globalization;
using Patchproof.Core.Reports;

namespace Patchproof.Cli.Verbs;

/// <summary>The few lines of the fit verb's readable output that summarize the comparison of capture and designs.</summary>
internal static class FitComparisonSummary
{
    public static void Print(TextWriter output, FitComparison comparison)
    {
        var invariant = CultureInfo.InvariantCulture;
        output.WriteLine();
        if (!comparison.Computed)
        {
            output.WriteLine($"Comparison with the designs: not made ({comparison.Reason}).");
            return;
        }

        output.WriteLine(string.Create(invariant, $"Comparison with the designs (capture / fitted / nominal), {comparison.ElapsedSeconds:0.0} s:"));
        if (comparison.ModelLyapunov is { } model && comparison.CaptureLyapunov is { } data)
        {
            output.WriteLine(string.Create(invariant, $"  largest Lyapunov exponent: {Value(data.LargestPerSecond, data.Computed)} / {Value(model.Fitted.LargestPerSecond, model.Fitted.Computed)} / {Value(model.Nominal.LargestPerSecond, model.Nominal.Computed)} 1/s (per problem time unit {Value(data.LargestPerProblemUnit, data.Computed)} / {Value(model.Fitted.LargestPerProblemUnit, model.Fitted.Computed)} / {Value(model.Nominal.LargestPerProblemUnit, model.Nominal.Computed)})"));
        }

        if (comparison.Horizon is { } horizon)
        {
            output.WriteLine(string.Create(invariant, $"  predictability horizon: fitted {1000 * horizon.Fitted.MeanSeconds:0.###} ms ({horizon.Fitted.MeanLyapunovTimes:0.0} Lyapunov times), nominal {1000 * horizon.Nominal.MeanSeconds:0.###} ms ({horizon.Nominal.MeanLyapunovTimes:0.0})"));
        }

        if (comparison.CorrelationDimension is { } dimension)
        {
            output.WriteLine(string.Create(invariant, $"  correlation dimension: {Value(dimension.Capture.Dimension, dimension.Capture.Computed)} / {Value(dimension.Fitted.Dimension, dimension.Fitted.Computed)}"));
        }

        if (comparison.Occupancy is { Computed: true } occupancy)
        {
            var planes = string.Join(", ", occupancy.Planes.Select(plane => string.Create(invariant, $"{plane.YVariable}-{plane.XVariable} {plane.FittedDistance:0.000} / {plane.NominalDistance:0.000}")));
            output.WriteLine($"  occupancy, Hellinger distance to the capture (fitted / nominal): {planes}");
        }

        if (comparison.Reason.Length > 0)
        {
            output.WriteLine($"  not compared: {comparison.Reason}");
        }
    }

    private static string Value(double value, bool computed) =>
        computed && double.IsFinite(value) ? value.ToString("G4", CultureInfo.InvariantCulture) : "-";
}
