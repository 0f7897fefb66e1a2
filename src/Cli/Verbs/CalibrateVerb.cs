using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Calibration;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof calibrate CAPTURE... [--reference CH1] [--note TEXT] [--known-amplitude 10V --amplitude-accuracy 0.1%] [--json OUT]</c>: each
/// channel's gain and offset against a reference, from a capture with every probe on one node; with a square wave of known amplitude, absolute gains.</summary>
internal static class CalibrateVerb
{
    /// <summary>Exit code when the capture was read but the probes did not see one usable signal; nothing is written.</summary>
    public const int NotUsable = 3;

    public static Command Create(CliConsole console)
    {
        var files = new Argument<string[]>("captures") { Description = "The calibration capture (every probe on one node): one CSV with every channel, or one CSV per channel.", Arity = ArgumentArity.OneOrMore };
        var reference = new Option<string?>("--reference") { Description = "The channel the others are measured against. Default: the first channel." };
        var note = new Option<string?>("--note") { Description = "Free text kept in the file, for example which node the probes sat on." };
        var json = new Option<string?>("--json") { Description = "Write the calibration file (docs/probe-calibration.md) here, for fit --calibration." };
        var amplitude = new Option<string?>("--known-amplitude") { Description = "The capture is a square wave of this known peak-to-peak amplitude (high level minus low level), for example 10V: the reference channel's absolute gain is measured too. Needs --amplitude-accuracy." };
        var accuracy = new Option<string?>("--amplitude-accuracy") { Description = "The known amplitude's relative accuracy, one standard deviation, for example 0.1% or 0.001 (a worst-case ± limit L counts as L/√3)." };
        var command = new Command("calibrate", "Measure each channel's gain and offset against a reference from a capture with every probe on one node; with a square wave of known amplitude, the absolute gains.");
        command.Arguments.Add(files);
        command.Options.Add(reference);
        command.Options.Add(note);
        command.Options.Add(amplitude);
        command.Options.Add(accuracy);
        command.Options.Add(json);
        command.SetAction(parse => Run(console, parse.GetValue(files) ?? [], parse.GetValue(reference), parse.GetValue(note), parse.GetValue(amplitude), parse.GetValue(accuracy), parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string[] files, string? reference, string? note, string? amplitudeText, string? accuracyText, string? jsonPath)
    {
        var known = KnownAmplitudeNotation.Read(amplitudeText, accuracyText, "--known-amplitude", "--amplitude-accuracy");
        if (!known.IsValid)
        {
            console.Error.WriteLine(known.Error);
            return PatchproofCommandLine.BadInput;
        }

        var captureResult = CaptureReader.ReadFiles(files);
        if (!captureResult.TryGetValue(out var capture))
        {
            foreach (var error in captureResult.Errors)
            {
                console.Error.WriteLine(error.ToString());
            }

            return PatchproofCommandLine.BadInput;
        }

        var options = new ProbeCalibrationOptions { ReferenceChannel = reference, Note = note ?? "", KnownAmplitudeVolts = known.AmplitudeVolts, KnownAmplitudeRelativeSd = known.RelativeSd };
        var result = ProbeCalibrator.Calibrate(capture, files, options, TimeProvider.System);
        var invariant = CultureInfo.InvariantCulture;
        if (result.Calibration is { } calibration)
        {
            console.Output.WriteLine($"Probe calibration against {calibration.ReferenceChannel}, {calibration.SampleCount} samples:");
            foreach (var channel in calibration.Channels)
            {
                console.Output.WriteLine(channel.Channel == calibration.ReferenceChannel
                    ? $"  {channel.Channel}  gain 1 (reference)"
                    : string.Create(invariant, $"  {channel.Channel}  gain {channel.Gain:0.00000} ± {channel.GainSd:0.00000} ({100 * (channel.Gain - 1):+0.000;-0.000} %), offset {1000 * channel.OffsetVolts:+0.0;-0.0} ± {1000 * channel.OffsetSdVolts:0.0} mV, residual {1000 * channel.ResidualRmsVolts:0.0} mV rms (expected {1000 * channel.ExpectedResidualRmsVolts:0.0}), correlation {channel.Correlation:0.000000}"));
            }

            if (calibration.Absolute is { } absolute)
            {
                console.Output.WriteLine(string.Create(invariant, $"Absolute gains against the {absolute.KnownAmplitudeVolts:0.####} V step (accuracy ± {100 * absolute.KnownAmplitudeRelativeSd:0.###} %), levels {absolute.LowLevelVolts:0.0000} V and {absolute.HighLevelVolts:0.0000} V on {calibration.ReferenceChannel}:"));
                foreach (var channel in calibration.Channels)
                {
                    var gain = calibration.AbsoluteGainOf(channel);
                    var sd = gain * Math.Sqrt((channel.LogGainSd * channel.LogGainSd) + (absolute.ReferenceLogGainSd * absolute.ReferenceLogGainSd));
                    console.Output.WriteLine(string.Create(invariant, $"  {channel.Channel}  absolute gain {gain:0.00000} ± {sd:0.00000} ({100 * (gain - 1):+0.000;-0.000} %)"));
                }
            }
        }

        foreach (var finding in result.Findings)
        {
            console.Output.WriteLine($"  {(result.IsUsable ? "note" : "problem")}: {finding}");
        }

        if (!result.IsUsable)
        {
            console.Output.WriteLine("The calibration is not usable" + (jsonPath is null ? "." : $"; {jsonPath} was not written."));
            return NotUsable;
        }

        if (jsonPath is not null)
        {
            File.WriteAllText(jsonPath, ProbeCalibrationFile.Write(result.Calibration!));
            console.Output.WriteLine($"Calibration written to {jsonPath}; use it with fit --calibration {jsonPath}.");
        }

        return PatchproofCommandLine.Success;
    }
}
