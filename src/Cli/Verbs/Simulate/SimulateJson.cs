using System.Text.Encodings.Web;
using System.Text.Json;
using Patchproof.Core;

namespace Patchproof.Cli.Verbs;

/// <summary>The JSON summary of <c>patchproof simulate --json</c>, format <c>patchproof.simulate</c> version 1 (docs/models.md).</summary>
internal static class SimulateJson
{
    public const string FormatName = "patchproof.simulate";

    public const int FormatVersion = 1;

    private static readonly JsonWriterOptions WriterOptions = new() { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    // JSON has no NaN or infinity; a non-finite value is written as null.
    private static void WriteNumberOrNull(Utf8JsonWriter w, string name, double value)
    {
        if (double.IsFinite(value))
        {
            w.WriteNumber(name, value);
        }
        else
        {
            w.WriteNull(name);
        }
    }

    public static void Write(TextWriter output, SimulationRun run)
    {
        var solution = run.Solution;
        var model = run.Model;
        using var buffer = new MemoryStream();
        using (var w = new Utf8JsonWriter(buffer, WriterOptions))
        {
            w.WriteStartObject();
            w.WriteString("format", FormatName);
            w.WriteNumber("version", FormatVersion);
            w.WriteString("coreVersion", CoreAssembly.Version);
            w.WriteString("model", run.ModelLabel);
            w.WriteStartObject("parameters");
            foreach (var parameter in model.Parameters)
            {
                w.WriteNumber(parameter.Name, parameter.NominalValue);
            }

            w.WriteEndObject();
            w.WriteStartObject("initialState");
            for (var i = 0; i < model.States.Count; i++)
            {
                w.WriteNumber(model.States[i].Name, run.InitialState[i]);
            }

            w.WriteEndObject();
            w.WriteStartObject("solver");
            w.WriteString("method", "Dormand-Prince 5(4)");
            w.WriteNumber("relativeTolerance", run.Request.RelativeTolerance);
            w.WriteNumber("absoluteTolerance", run.Request.AbsoluteTolerance);
            w.WriteNumber("startTime", 0);
            w.WriteNumber("endTime", run.Request.EndTime);
            w.WriteNumber("outputInterval", run.Interval);
            w.WriteEndObject();
            w.WriteStartObject("outcome");
            w.WriteString("status", solution.Status.ToString());
            w.WriteBoolean("reachedEndTime", solution.IsSuccess);
            w.WriteString("message", solution.Message);
            if (run.Explanation is not null)
            {
                w.WriteString("explanation", run.Explanation);
            }

            WriteNumberOrNull(w, "finalTime", solution.FinalTime);
            w.WriteEndObject();
            w.WriteStartObject("statistics");
            w.WriteNumber("acceptedSteps", solution.Statistics.AcceptedSteps);
            w.WriteNumber("rejectedSteps", solution.Statistics.RejectedSteps);
            w.WriteNumber("functionEvaluations", solution.Statistics.FunctionEvaluations);
            w.WriteNumber("rows", solution.Count);
            w.WriteEndObject();
            w.WriteStartObject("finalState");
            var final = solution.FinalState;
            for (var i = 0; i < model.States.Count; i++)
            {
                WriteNumberOrNull(w, model.States[i].Name, final[i]);
            }

            w.WriteEndObject();
            if (run.Request.OutputPath is not null)
            {
                w.WriteString("trajectoryFile", run.Request.OutputPath);
            }

            w.WriteEndObject();
        }

        output.WriteLine(System.Text.Encoding.UTF8.GetString(buffer.ToArray()));
    }
}
