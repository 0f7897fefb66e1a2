using System.Globalization;
using Patchproof.Core.Models;

namespace Patchproof.Cli.Verbs;

/// <summary>The trajectory CSV of <c>patchproof simulate</c>: <c># key: value</c> lines, a header <c>t,x,y,z</c>, then one row per output time.</summary>
/// <remarks>Numbers use the invariant culture and round-trip precision, so reading a file back gives the same doubles. Metadata values hold no commas.</remarks>
internal static class TrajectoryCsv
{
    public static string Format(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    public static void Write(TextWriter writer, SimulationRun run)
    {
        var model = run.Model;
        var solution = run.Solution;
        writer.WriteLine($"# model: {run.ModelLabel}");
        writer.WriteLine($"# parameters: {string.Join("; ", model.Parameters.Select(p => $"{p.Name}={Format(p.NominalValue)}"))}");
        writer.WriteLine($"# initial state: {string.Join("; ", model.StateNames.Select((name, i) => $"{name}={Format(run.InitialState[i])}"))}");
        writer.WriteLine($"# solver: Dormand-Prince 5(4) rtol={Format(run.Request.RelativeTolerance)} atol={Format(run.Request.AbsoluteTolerance)}");
        writer.WriteLine($"# outcome: {solution.Status}");
        writer.WriteLine("t," + string.Join(",", model.StateNames));
        var times = solution.Times;
        var line = new System.Text.StringBuilder();
        for (var i = 0; i < times.Length; i++)
        {
            line.Clear();
            line.Append(Format(times[i]));
            foreach (var value in solution.StateAt(i))
            {
                line.Append(',').Append(Format(value));
            }

            writer.WriteLine(line);
        }
    }
}
