namespace Patchproof.Cli.Verbs;

/// <summary>The readable summary of <c>patchproof simulate</c> when the trajectory went to a file.</summary>
internal static class SimulateText
{
    public static void Write(TextWriter output, SimulationRun run)
    {
        var solution = run.Solution;
        var model = run.Model;
        var final = solution.FinalState.ToArray();
        output.WriteLine($"model {run.ModelLabel}: {model.States.Count} states, {model.Parameters.Count} parameters");
        output.WriteLine($"outcome: {solution.Message}");
        output.WriteLine($"steps: {solution.Statistics.AcceptedSteps} accepted, {solution.Statistics.RejectedSteps} rejected, {solution.Statistics.FunctionEvaluations} evaluations");
        output.WriteLine("final state: " + string.Join(", ", model.StateNames.Select((name, i) => $"{name} = {TrajectoryCsv.Format(final[i])}")) + $" at t = {TrajectoryCsv.Format(solution.FinalTime)}");
        if (run.Explanation is not null)
        {
            output.WriteLine("cause: " + run.Explanation);
        }

        output.WriteLine($"trajectory: {solution.Count} rows in {run.Request.OutputPath}");
    }
}
