using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof simulate --model NAME|--file F [--set p=v] [--x0 a,b,c] --t-end T [--every DT] [--rtol R] [--atol A] [--out F.csv] [--json]</c>.</summary>
/// <remarks>
/// Exit codes: 0 simulated to t-end; 1 the solver stopped early (budget, step too small, non-finite
/// state; the trajectory up to there is still written); 2 bad input.
/// </remarks>
internal static class SimulateVerb
{
    /// <summary>Exit code when the solver stopped before the end time.</summary>
    public const int StoppedEarly = 1;

    public static Command Create(CliConsole console)
    {
        var model = new Option<string?>("--model") { Description = "A built-in model: " + string.Join(", ", ModelCatalog.All.Select(m => m.Name)) + "." };
        var file = new Option<string?>("--file") { Description = "A model file in the equation language (docs/models.md)." };
        var set = new Option<string[]>("--set") { Description = "Override a parameter's nominal value, as NAME=VALUE (sigma=10.5); repeat per parameter." };
        var x0 = new Option<string?>("--x0") { Description = "The initial state, comma-separated in state order (1,1,1); default: the model's own." };
        var tEnd = new Option<string?>("--t-end") { Description = "The end time, in the model's time unit (the start is 0)." };
        var every = new Option<string?>("--every") { Description = "The output interval; default: t-end/1000." };
        var rtol = new Option<string?>("--rtol") { Description = "Relative tolerance of the Dormand-Prince solver (default 1e-8)." };
        var atol = new Option<string?>("--atol") { Description = "Absolute tolerance of the Dormand-Prince solver (default 1e-10)." };
        var output = new Option<string?>("--out") { Description = "Write the trajectory CSV to this file (default: standard output, unless --json)." };
        var json = new Option<bool>("--json") { Description = "Print a JSON summary (format patchproof.simulate, version 1) instead of the readable one." };
        var command = new Command("simulate", "Simulate a built-in or written model with the Dormand-Prince 5(4) solver and write its trajectory as CSV.");
        foreach (var option in new Option[] { model, file, set, x0, tEnd, every, rtol, atol, output, json })
        {
            command.Options.Add(option);
        }

        command.SetAction(parse => Run(console, new SimulateArguments(
            parse.GetValue(model),
            parse.GetValue(file),
            parse.GetValue(set) ?? [],
            parse.GetValue(x0),
            parse.GetValue(tEnd),
            parse.GetValue(every),
            parse.GetValue(rtol),
            parse.GetValue(atol),
            parse.GetValue(output),
            parse.GetValue(json))));
        return command;
    }

    private static int Fail(CliConsole console, string message)
    {
        console.Error.WriteLine(message);
        return PatchproofCommandLine.BadInput;
    }

    private static int Run(CliConsole console, SimulateArguments arguments)
    {
        // Numbers are read here rather than by the parser so that a bad one exits 2 with a message.
        if (arguments.EndTime is null || !TryParseNumber(arguments.EndTime, out var endTime) || endTime <= 0)
        {
            return Fail(console, "--t-end: expected a finite time above 0, for example --t-end 50.");
        }

        double? every = null;
        if (arguments.Every is not null)
        {
            if (!TryParseNumber(arguments.Every, out var value) || value <= 0)
            {
                return Fail(console, "--every: expected a finite interval above 0.");
            }

            every = value;
        }

        var relative = 1e-8;
        var absolute = 1e-10;
        if ((arguments.RelativeTolerance is not null && (!TryParseNumber(arguments.RelativeTolerance, out relative) || relative <= 0))
            || (arguments.AbsoluteTolerance is not null && (!TryParseNumber(arguments.AbsoluteTolerance, out absolute) || absolute <= 0)))
        {
            return Fail(console, "--rtol and --atol: expected finite tolerances above 0, for example --rtol 1e-9.");
        }

        return Run(console, new SimulateRequest(
            arguments.ModelName, arguments.FilePath, arguments.Settings, arguments.InitialState, endTime, every, relative, absolute, arguments.OutputPath, arguments.Json));
    }

    private static int Run(CliConsole console, SimulateRequest request)
    {
        if ((request.ModelName is null) == (request.FilePath is null))
        {
            return Fail(console, "give exactly one of --model NAME or --file F.");
        }

        if (!double.IsFinite(request.EndTime) || request.EndTime <= 0)
        {
            return Fail(console, "--t-end: expected a finite time above 0.");
        }

        var interval = request.Every ?? (request.EndTime / 1000);
        if (!double.IsFinite(interval) || interval <= 0 || request.EndTime / interval > 10_000_000)
        {
            return Fail(console, "--every: expected a finite interval above 0 that gives at most 10 million rows.");
        }

        if (!(request.RelativeTolerance > 0 && double.IsFinite(request.RelativeTolerance)) || !(request.AbsoluteTolerance > 0 && double.IsFinite(request.AbsoluteTolerance)))
        {
            return Fail(console, "--rtol and --atol: expected finite tolerances above 0.");
        }

        if (!TryLoadModel(console, request, out var equationModel, out var modelLabel, out var defaultInitialState))
        {
            return PatchproofCommandLine.BadInput;
        }

        if (equationModel.InputNames.Count > 0)
        {
            return Fail(console, $"the model reads the recorded input(s) {string.Join(", ", equationModel.InputNames)}; simulate does not bind inputs yet.");
        }

        foreach (var item in request.Settings)
        {
            var at = item.IndexOf('=', StringComparison.Ordinal);
            var name = at > 0 ? item[..at].Trim() : string.Empty;
            if (at <= 0 || !TryParseNumber(item[(at + 1)..], out var value))
            {
                return Fail(console, $"--set {item}: expected NAME=VALUE with a finite number, for example sigma=10.5.");
            }

            if (equationModel.IndexOfParameter(name) < 0)
            {
                return Fail(console, $"--set {item}: the model has no parameter '{name}'; its parameters are {Describe(equationModel.ParameterNames)}.");
            }

            equationModel = equationModel.WithNominalValue(name, value);
        }

        var initialState = defaultInitialState;
        if (request.InitialState is not null)
        {
            var parts = request.InitialState.Split(',');
            var values = new double[parts.Length];
            for (var i = 0; i < parts.Length; i++)
            {
                if (!TryParseNumber(parts[i], out values[i]))
                {
                    return Fail(console, $"--x0 {request.InitialState}: '{parts[i].Trim()}' is not a finite number.");
                }
            }

            if (values.Length != equationModel.States.Count)
            {
                return Fail(console, $"--x0 {request.InitialState}: the model has {equationModel.States.Count} states ({Describe(equationModel.StateNames)}), {values.Length} values were given.");
            }

            initialState = values;
        }

        var system = equationModel.Compile();
        var problem = new OdeProblem(system, [.. initialState], 0, request.EndTime, [.. equationModel.NominalParameters()]);
        var method = new DormandPrince45
        {
            RelativeTolerance = request.RelativeTolerance,
            AbsoluteTolerance = request.AbsoluteTolerance,
            SampleInterval = interval,
        };
        var solution = OdeSolver.Solve(problem, method);
        var explanation = solution.Status == SolveStatus.NonFiniteState
            ? system.ExplainNonFinite(solution.FinalTime, solution.FinalState, [.. equationModel.NominalParameters()])
            : null;
        var run = new SimulationRun(modelLabel, equationModel, initialState, request, interval, solution, explanation);

        if (request.OutputPath is not null)
        {
            try
            {
                using var writer = new StreamWriter(request.OutputPath, false, new System.Text.UTF8Encoding(false), 1 << 16);
                TrajectoryCsv.Write(writer, run);
            }
            catch (Exception error) when (error is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
            {
                return Fail(console, $"--out {request.OutputPath}: cannot write the file ({error.Message}).");
            }
        }
        else if (!request.Json)
        {
            TrajectoryCsv.Write(console.Output, run);
        }

        if (request.Json)
        {
            SimulateJson.Write(console.Output, run);
        }
        else if (request.OutputPath is not null)
        {
            SimulateText.Write(console.Output, run);
        }

        if (!solution.IsSuccess)
        {
            console.Error.WriteLine($"the solver stopped early: {solution.Message}{(explanation is null ? string.Empty : "; " + explanation)}");
            return StoppedEarly;
        }

        return PatchproofCommandLine.Success;
    }

    private static bool TryLoadModel(CliConsole console, SimulateRequest request, out EquationModel model, out string label, out double[] initialState)
    {
        model = null!;
        label = string.Empty;
        initialState = [];
        if (request.ModelName is not null)
        {
            var builtIn = ModelCatalog.Find(request.ModelName);
            if (builtIn is null)
            {
                Fail(console, $"--model {request.ModelName}: no built-in model of that name; the models are {string.Join(", ", ModelCatalog.All.Select(m => m.Name))}.");
                return false;
            }

            model = builtIn.Parse();
            label = builtIn.Name;
            initialState = [.. builtIn.DefaultInitialState];
            return true;
        }

        string text;
        try
        {
            text = File.ReadAllText(request.FilePath!);
        }
        catch (Exception error) when (error is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            Fail(console, $"--file {request.FilePath}: cannot read the file ({error.Message}).");
            return false;
        }

        var result = ModelParser.Parse(text, request.FilePath);
        foreach (var warning in result.Warnings)
        {
            console.Error.WriteLine(warning.ToString());
        }

        if (!result.TryGetValue(out var parsed))
        {
            foreach (var error in result.Errors)
            {
                console.Error.WriteLine(error.ToString());
            }

            return false;
        }

        model = parsed;
        label = request.FilePath!;
        initialState = parsed.DefaultInitialState();
        return true;
    }

    private static string Describe(IReadOnlyList<string> names) => names.Count == 0 ? "none" : string.Join(", ", names);

    private static bool TryParseNumber(string text, out double value) =>
        double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value);
}
