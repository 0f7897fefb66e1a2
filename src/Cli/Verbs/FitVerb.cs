using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Reports;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof fit --design D CAPTURE... [--map CH1=x,CH2=-y] [--calibration FILE] [--json OUT]</c>: which part drifted, and how sure.</summary>
internal static class FitVerb
{
    /// <summary>Exit code when the fit ran but warnings make its findings unsafe.</summary>
    public const int FittedWithWarnings = 3;

    public static Command Create(CliConsole console)
    {
        var design = new Option<string>("--design") { Description = "The board's design file (docs/circuits.md).", Required = true };
        var files = new Argument<string[]>("captures") { Description = "The capture: one CSV with every channel, or one CSV per channel.", Arity = ArgumentArity.OneOrMore };
        var map = new Option<string?>("--map") { Description = "Which channel records which variable, with sign: CH1=x,CH2=-y,CH3=z. Default: the channels in order." };
        var probeTolerance = new Option<double>("--probe-tolerance") { Description = "Probe gain tolerance in percent when no calibration is given.", DefaultValueFactory = _ => 2.0 };
        var calibration = new Option<string?>("--calibration") { Description = "A probe calibration file from calibrate (docs/probe-calibration.md): its gains replace the probe tolerance for the channels it names." };
        var json = new Option<string?>("--json") { Description = "Also write the versioned JSON report (docs/fit-report.md) to this file." };
        var command = new Command("fit", "Fit the board's design to a capture: effective coefficients, offsets and time constants, and the part that drifted.");
        command.Options.Add(design);
        command.Arguments.Add(files);
        command.Options.Add(map);
        command.Options.Add(probeTolerance);
        command.Options.Add(calibration);
        command.Options.Add(json);
        command.SetAction(parse => Run(console, parse.GetValue(design)!, parse.GetValue(files) ?? [], parse.GetValue(map), parse.GetValue(probeTolerance), parse.GetValue(calibration), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string designPath, string[] files, string? map, double probeTolerancePercent, string? calibrationPath, string? jsonPath)
    {
        var designResult = DesignFileReader.ReadFile(designPath);
        if (!designResult.TryGetValue(out var design))
        {
            return Fail(console, designResult.Errors);
        }

        var captureResult = CaptureReader.ReadFiles(files);
        if (!captureResult.TryGetValue(out var capture))
        {
            return Fail(console, captureResult.Errors);
        }

        IReadOnlyList<ChannelAssignment> mapping = [];
        if (map is not null)
        {
            var mapResult = ChannelAssignment.ParseList(map);
            if (!mapResult.TryGetValue(out var parsed))
            {
                return Fail(console, mapResult.Errors);
            }

            mapping = parsed;
        }

        if (probeTolerancePercent is <= 0 or > 50)
        {
            console.Error.WriteLine("--probe-tolerance: expected a percentage above 0 and at most 50.");
            return PatchproofCommandLine.BadInput;
        }

        ProbeCalibration? calibration = null;
        if (calibrationPath is not null)
        {
            var calibrationResult = ProbeCalibrationFile.ReadFile(calibrationPath);
            if (!calibrationResult.TryGetValue(out calibration))
            {
                return Fail(console, calibrationResult.Errors);
            }

            foreach (var warning in calibrationResult.Warnings)
            {
                console.Error.WriteLine(warning.ToString());
            }

            if (!capture.Channels.Any(channel => calibration.Find(channel.Name) is not null))
            {
                console.Error.WriteLine($"{calibrationPath}:0:0: the calibration names {string.Join(", ", calibration.Channels.Select(c => c.Channel))}, none of the capture's channels ({string.Join(", ", capture.Channels.Select(c => c.Name))})");
                return PatchproofCommandLine.BadInput;
            }
        }

        var options = new BoardFitOptions { Mapping = mapping, ProbeGainTolerance = probeTolerancePercent / 100, Calibration = calibration };
        var fitResult = BoardFitter.Fit(design, capture, options, TimeProvider.System);
        if (!fitResult.TryGetValue(out var report))
        {
            return Fail(console, fitResult.Errors);
        }

        Print(console.Output, report);
        if (jsonPath is not null)
        {
            File.WriteAllText(jsonPath, FitReportJson.Write(report));
            console.Output.WriteLine($"Report written to {jsonPath}.");
        }

        return report.FindingsAreSafe ? PatchproofCommandLine.Success : FittedWithWarnings;
    }

    private static void Print(TextWriter output, FitReport report)
    {
        var invariant = CultureInfo.InvariantCulture;
        output.WriteLine($"{report.Board} \"{report.Title}\": {report.Diagnosis.Summary}");
        foreach (var finding in report.Diagnosis.Findings)
        {
            output.WriteLine($"  finding: {finding.Sentence}");
        }

        if (report.Diagnosis.RunnerUp is { } runnerUp)
        {
            output.WriteLine(string.Create(invariant, $"  runner-up: {runnerUp.Describe()} (probability {runnerUp.Probability:0.00})"));
        }

        foreach (var note in report.Diagnosis.Notes)
        {
            output.WriteLine($"  note: {note}");
        }

        foreach (var warning in report.Warnings)
        {
            output.WriteLine($"  warning: {warning}");
        }

        output.WriteLine();
        output.WriteLine("Coefficients (machine units; problem units in brackets):");
        foreach (var c in report.Coefficients)
        {
            var hidden = c.TouchesHiddenState ? "  (touches an unrecorded variable: rests on part priors)" : "";
            output.WriteLine(string.Create(invariant, $"  {c.Equation}' {c.Term,-6} nominal {c.Nominal,12:G6} {c.Unit,-7} estimate {c.Estimate,12:G6} ± {c.StandardError:G3}  ({c.DeviationPercent:+0.00;-0.00} %)  [{c.ProblemNominal:G5} -> {c.ProblemEstimate:G5}]{hidden}"));
        }

        foreach (var offset in report.Offsets)
        {
            output.WriteLine(string.Create(invariant, $"  {offset.Equation} integrator offset {offset.VoltsPerSecond:G4} V/s, equivalent input offset {offset.EquivalentInputMillivolts:+0.00;-0.00} mV"));
        }

        foreach (var channel in report.Channels)
        {
            output.WriteLine(string.Create(invariant, $"  {channel.Channel} = {(channel.Sign < 0 ? "-" : "")}{channel.Variable}: offset {1000 * channel.OffsetVolts:+0.0;-0.0} mV, residual {1000 * channel.ResidualRmsVolts:0.0} mV rms, gain {Math.Abs(channel.Gain):0.0000} from {channel.GainSource}"));
        }

        foreach (var timeConstant in report.TimeConstants)
        {
            output.WriteLine(string.Create(invariant, $"  {timeConstant.Integrator} integrator time constant {1000 * timeConstant.EffectiveSeconds:0.000} ms per unit (design {1000 * timeConstant.NominalSeconds:0.000} ms)"));
        }

        output.WriteLine("Structure: " + report.StructureCheck.Message);
        var q = report.Quality;
        output.WriteLine(string.Create(invariant, $"Fit: {q.Method}, {q.Segments} segments of {1000 * q.SegmentSeconds:0.###} ms, {q.Iterations} iterations ({q.ExitReason}), {q.ElapsedSeconds:0.0} s."));
        if (q.HiddenVariables.Count > 0)
        {
            output.WriteLine("Unrecorded variables: " + string.Join(", ", q.HiddenVariables) + ".");
        }

        if (report.Comparison is { } comparison)
        {
            FitComparisonSummary.Print(output, comparison);
        }
    }

    private static int Fail(CliConsole console, IReadOnlyList<Patchproof.Core.SourceDiagnostic> errors)
    {
        foreach (var error in errors)
        {
            console.Error.WriteLine(error.ToString());
        }

        return PatchproofCommandLine.BadInput;
    }
}
