using System.Collections.Immutable;
using System.CommandLine;
using System.Globalization;
using Patchproof.Core.Captures;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Boards;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Simulation;
using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof design simulate FILE --t-end 50ms --out capture.csv [--faults R3=+10%,...] [--channels CH1=x,...] [--seed 1] ...</c>: a synthetic capture of a board;
/// with <c>--square-wave 10V@-4V</c>, a calibration capture of every probe on a reference square wave instead.</summary>
internal static class DesignSimulateVerb
{
    public static Command Create(CliConsole console)
    {
        var file = new Argument<string>("file") { Description = "The design file (JSON, docs/circuits.md)." };
        var options = new SimulateOptions();
        var command = new Command("simulate", "Simulate a board in volts and seconds, with faults, and write what a scope would record: noise, 8-bit steps, probe offsets, an arbitrary trigger time.");
        command.Arguments.Add(file);
        foreach (var option in options.All)
        {
            command.Options.Add(option);
        }

        command.SetAction(parse => Run(console, parse.GetValue(file)!, options.Read(parse)));
        return command;
    }

    private static int Run(CliConsole console, string path, SimulateSettings settings)
    {
        var design = DesignVerb.ReadDesign(console, path);
        if (design is null)
        {
            return PatchproofCommandLine.BadInput;
        }

        if (!BoardFaults.TryParse(settings.Faults, design, out var faults, out var faultError))
        {
            console.Error.WriteLine($"--faults: {faultError}");
            return PatchproofCommandLine.BadInput;
        }

        if (!ValueNotation.TryParse(settings.Duration, Quantity.Time, out var duration, out var durationError) || !(duration > 0))
        {
            console.Error.WriteLine($"--t-end: {durationError ?? "must be positive"}");
            return PatchproofCommandLine.BadInput;
        }

        var settle = 30 * design.TimeScaleSeconds;
        if (settings.Settle is not null && (!ValueNotation.TryParse(settings.Settle, Quantity.Time, out settle, out var settleError) || settle < 0))
        {
            console.Error.WriteLine($"--settle: {settleError ?? "must be at least 0"}");
            return PatchproofCommandLine.BadInput;
        }

        if (!ValueNotation.TryParse(settings.Noise, Quantity.Voltage, out var noise, out var noiseError) || noise < 0)
        {
            console.Error.WriteLine($"--noise: {noiseError ?? "must be at least 0"}");
            return PatchproofCommandLine.BadInput;
        }

        if (settings.Samples < 100 || settings.Samples > 2_000_000)
        {
            console.Error.WriteLine("--samples: must be between 100 and 2000000.");
            return PatchproofCommandLine.BadInput;
        }

        if (!CaptureCsvStyle.TryFind(settings.Style, out var style))
        {
            console.Error.WriteLine($"--style {settings.Style}: use comma, semicolon, semicolon-decimal-comma, units-row or tab.");
            return PatchproofCommandLine.BadInput;
        }

        var channelPairs = settings.Channels is null
            ? design.Variables.Select((variable, index) => ($"CH{index + 1}", variable.Name)).ToList()
            : DesignVerb.TryPairs(settings.Channels, out var pairs) ? pairs : null;
        if (channelPairs is null || channelPairs.Count == 0 || channelPairs.Any(pair => design.FindVariable(pair.Item2.TrimStart('-', '+')) is null))
        {
            console.Error.WriteLine($"--channels {settings.Channels}: expected CHANNEL=VARIABLE or CHANNEL=-VARIABLE with variables of the design ({string.Join(", ", design.Variables.Select(variable => variable.Name))}).");
            return PatchproofCommandLine.BadInput;
        }

        if (!TryProbeGains(settings.ProbeGains, channelPairs.Select(pair => pair.Item1).ToList(), out var probeGains, out var gainError))
        {
            console.Error.WriteLine($"--probe-gains {settings.ProbeGains}: {gainError}");
            return PatchproofCommandLine.BadInput;
        }

        if (!DesignVerb.TryPairs(settings.Windows, out var windowPairs))
        {
            console.Error.WriteLine($"--window {settings.Windows}: expected CHANNEL=SPAN or CHANNEL=SPAN@CENTER, for example CH3=10V@5V.");
            return PatchproofCommandLine.BadInput;
        }

        var random = new Random(settings.Seed);
        var deviations = ImmutableDictionary.CreateBuilder<string, double>(StringComparer.Ordinal);
        foreach (var part in design.Parts)
        {
            // Healthy spread: each part a Gaussian draw within its tolerance band (sd = spread * tol / 3).
            var draw = Gaussian(random) * settings.PartSpread * part.Tolerance / 3;
            if (settings.PartSpread > 0)
            {
                deviations[part.Id] = draw;
            }
        }

        foreach (var (id, deviation) in faults.PartDeviations)
        {
            deviations[id] = deviation;
        }

        var interval = duration / settings.Samples;
        var square = settings.SquareWave is not null;
        BoardTrace trace;
        if (square)
        {
            if (!TrySquareWave(settings, out var peakToPeak, out var low, out var period, out var edge, out var squareError))
            {
                console.Error.WriteLine(squareError);
                return PatchproofCommandLine.BadInput;
            }

            trace = SquareWaveSource.Create(peakToPeak, low, period, edge, interval, settings.Samples, random.NextDouble() * period);
        }
        else
        {
            DesignTargets.TryFind(design.Model?.Name, out var target);
            var system = BoardOdeSystem.Create(design, faults.NonIdealities);
            trace = BoardSimulator.Simulate(system, system.ParameterVector(deviations.ToImmutable()), system.InitialState(target), settle, interval * (settings.Samples - 1), interval);
        }

        if (trace.Status is not (SolveStatus.Succeeded or SolveStatus.StoppedByEvent))
        {
            console.Error.WriteLine($"{path}: the board simulation stopped early: {trace.Message}");
            return PatchproofCommandLine.BadInput;
        }

        var channels = ImmutableArray.CreateBuilder<ScopeChannelSettings>();
        foreach (var (name, probed) in channelPairs)
        {
            // On a square wave every probe sits on the source: the channel's variable only names it.
            var sign = !square && probed.StartsWith('-') ? -1 : 1;
            var variable = square ? SquareWaveSource.StateName : probed.TrimStart('-', '+');
            var volts = trace.Volts[trace.StateNames.IndexOf(variable)];
            var (span, center) = AutoWindow(volts.Select(value => sign * value));
            var window = windowPairs.FirstOrDefault(pair => string.Equals(pair.Key, name, StringComparison.OrdinalIgnoreCase));
            if (window.Key is not null)
            {
                var parts = window.Value.Split('@');
                if (!ValueNotation.TryParse(parts[0], Quantity.Voltage, out span, out var spanError) || !(span > 0)
                    || (parts.Length > 1 && !ValueNotation.TryParse(parts[1], Quantity.Voltage, out center, out spanError)))
                {
                    console.Error.WriteLine($"--window {window.Key}={window.Value}: {spanError ?? "the span must be positive"}");
                    return PatchproofCommandLine.BadInput;
                }
            }

            var offset = settings.ProbeOffsets == "none" ? 0 : Math.Round(Gaussian(random) * 0.010, 4);
            channels.Add(new ScopeChannelSettings(name, variable, sign, probeGains.GetValueOrDefault(name, 1), offset, center, span));
        }

        var trigger = settings.TriggerFraction is { } fraction
            ? (int)Math.Round(Math.Clamp(fraction, 0, 1) * (trace.SampleCount - 1))
            : (int)Math.Round((0.1 + (0.3 * random.NextDouble())) * (trace.SampleCount - 1));
        var metadata = new List<MetadataEntry>
        {
            new("Board", design.Board.Length > 0 ? design.Board : Path.GetFileNameWithoutExtension(path), null, null, null, 0),
            new("Record length", settings.Samples.ToString(CultureInfo.InvariantCulture), null, null, null, 0),
            new("Sample interval", interval.ToString("G6", CultureInfo.InvariantCulture), "s", null, null, 0),
        };
        foreach (var channel in channels)
        {
            metadata.Add(new($"{channel.Name} V/div", (channel.WindowSpanVolts / 8).ToString("G4", CultureInfo.InvariantCulture), "V", null, null, 0));
            metadata.Add(new($"{channel.Name} position", channel.WindowCenterVolts.ToString("G4", CultureInfo.InvariantCulture), "V", null, null, 0));
        }

        var synthetic = CaptureSynthesizer.Synthesize(trace, new CaptureSynthesisOptions(channels.ToImmutable(), noise, settings.Seed * 7919 + 1, trigger), metadata);
        try
        {
            var directory = Path.GetDirectoryName(Path.GetFullPath(settings.Output));
            if (directory is not null)
            {
                Directory.CreateDirectory(directory);
            }

            using var writer = new StreamWriter(settings.Output, false, new System.Text.UTF8Encoding(false)) { NewLine = "\n" };
            CaptureCsvWriter.Write(synthetic.Capture, writer, style);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            console.Error.WriteLine($"{settings.Output}: cannot write: {exception.Message}");
            return PatchproofCommandLine.BadInput;
        }

        console.Output.WriteLine($"Wrote {settings.Output}: {trace.SampleCount} samples at {ValueNotation.Format(interval, Quantity.Time)}, channels {string.Join(", ", channels.Select(channel => $"{channel.Name}={(channel.ProbeSign < 0 ? "-" : string.Empty)}{channel.Variable}"))}.");
        var warnings = 0;
        for (var c = 0; c < channels.Count; c++)
        {
            if (synthetic.ClippedSamples[c] > 0)
            {
                console.Error.WriteLine($"{settings.Output}: {channels[c].Name} sits at the end of its scope window in {synthetic.ClippedSamples[c]} samples (clipped) (warning)");
                warnings++;
            }
        }

        return warnings == 0 ? PatchproofCommandLine.Success : DesignVerb.DoneWithWarnings;
    }

    /// <summary>Reads --square-wave PEAK-TO-PEAK@LOW, --square-period and --edge-time.</summary>
    private static bool TrySquareWave(SimulateSettings settings, out double peakToPeak, out double low, out double period, out double edge, out string error)
    {
        (peakToPeak, low, period, edge, error) = (0, 0, 0, 0, string.Empty);
        var parts = settings.SquareWave!.Split('@');
        string? message = null;
        if (parts.Length > 2 || !ValueNotation.TryParse(parts[0], Quantity.Voltage, out peakToPeak, out message) || !(peakToPeak > 0)
            || (parts.Length == 2 && !ValueNotation.TryParse(parts[1], Quantity.Voltage, out low, out message)))
        {
            error = $"--square-wave {settings.SquareWave}: {message ?? "the peak-to-peak amplitude must be positive"}; expected PEAK-TO-PEAK or PEAK-TO-PEAK@LOW-LEVEL, for example 10V@-4V.";
            return false;
        }

        if (parts.Length == 1)
        {
            low = -peakToPeak / 2;
        }

        if (!ValueNotation.TryParse(settings.SquarePeriod, Quantity.Time, out period, out message) || !(period > 0))
        {
            error = $"--square-period {settings.SquarePeriod}: {message ?? "must be positive"}.";
            return false;
        }

        if (!ValueNotation.TryParse(settings.EdgeTime, Quantity.Time, out edge, out message) || edge < 0 || edge >= period / 4)
        {
            error = $"--edge-time {settings.EdgeTime}: {message ?? "must be at least 0 and well below a quarter of the period"}.";
            return false;
        }

        return true;
    }

    /// <summary>Reads CH1=+1.5%,CH2=-0.8% into gains (1.015, 0.992) of the named channels.</summary>
    private static bool TryProbeGains(string? text, IReadOnlyList<string> channelNames, out Dictionary<string, double> gains, out string error)
    {
        gains = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        error = string.Empty;
        if (!DesignVerb.TryPairs(text, out var pairs))
        {
            error = "expected CHANNEL=PERCENT, for example CH1=+1.5%,CH2=-0.8%.";
            return false;
        }

        foreach (var (name, value) in pairs)
        {
            if (!channelNames.Contains(name, StringComparer.OrdinalIgnoreCase))
            {
                error = $"no channel '{name}' is recorded (channels: {string.Join(", ", channelNames)}).";
                return false;
            }

            if (!ValueNotation.TryParse(value, Quantity.Fraction, out var fraction, out var message) || !(Math.Abs(fraction) < 0.5))
            {
                error = $"'{value}' for {name}: {message ?? "expected a deviation between -50 % and +50 %, for example +1.5%"}.";
                return false;
            }

            gains[name] = 1 + fraction;
        }

        return true;
    }

    private static (double Span, double Center) AutoWindow(IEnumerable<double> volts)
    {
        var low = double.PositiveInfinity;
        var high = double.NegativeInfinity;
        foreach (var value in volts)
        {
            low = Math.Min(low, value);
            high = Math.Max(high, value);
        }

        // A scope set up by hand: a 1-2-2.5-5 volts-per-division over 8 divisions with 15 % margin, centred on a half volt.
        var center = Math.Round((low + high) / 2 * 2) / 2;
        var needed = Math.Max(2 * Math.Max(high - center, center - low) * 1.15 / 8, 0.01);
        var decade = Math.Pow(10, Math.Floor(Math.Log10(needed)));
        var perDivision = new[] { 1.0, 2, 2.5, 5, 10 }.Select(step => step * decade).First(step => step >= needed * (1 - 1e-12));
        return (8 * perDivision, center + 0.0);
    }

    private static double Gaussian(Random random)
    {
        var u1 = 1.0 - random.NextDouble();
        var u2 = random.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    private sealed record SimulateSettings(string? Faults, string Duration, string? Settle, int Samples, string? Channels, string Noise, int Seed, string? Windows, string ProbeOffsets, string? ProbeGains, double? TriggerFraction, double PartSpread, string Style, string Output, string? SquareWave, string SquarePeriod, string EdgeTime);

    private sealed class SimulateOptions
    {
        private readonly Option<string?> faults = new("--faults") { Description = "Faults, as R3=+10%,C3=-15%,M1=-4%,M1.offset=20mV,x.offset=1mV,x.bias=80nA,dc-gain=1e5,clip=hard." };
        private readonly Option<string> duration = new("--t-end") { Description = "The recorded span, for example 50ms.", Required = true };
        private readonly Option<string?> settle = new("--settle") { Description = "Board time before recording starts (default 30 problem time units)." };
        private readonly Option<int> samples = new("--samples") { Description = "Samples per channel (default 25000).", DefaultValueFactory = _ => 25000 };
        private readonly Option<string?> channels = new("--channels") { Description = "Channels as CH1=x,CH2=-y (default every variable, CH1, CH2, ...)." };
        private readonly Option<string> noise = new("--noise") { Description = "Noise standard deviation before quantization (default 4mV).", DefaultValueFactory = _ => "4 mV" };
        private readonly Option<int> seed = new("--seed") { Description = "Random seed: the same seed writes the same file (default 1).", DefaultValueFactory = _ => 1 };
        private readonly Option<string?> windows = new("--window") { Description = "Scope windows as CH3=10V@5V (span, optional centre); default fitted to each trace." };
        private readonly Option<string> probeOffsets = new("--probe-offsets") { Description = "auto (random, about 10 mV, from the seed) or none.", DefaultValueFactory = _ => "auto" };
        private readonly Option<string?> probeGains = new("--probe-gains") { Description = "Probe gain errors as CH1=+1.5%,CH2=-0.8% (default none: every probe exact)." };
        private readonly Option<double?> trigger = new("--trigger") { Description = "Where capture time 0 falls, as a fraction of the record (default random between 0.1 and 0.4)." };
        private readonly Option<double> partSpread = new("--part-spread") { Description = "Healthy spread of every part: a Gaussian with sd = SPREAD * tolerance / 3 (default 0: nominal).", DefaultValueFactory = _ => 0.0 };
        private readonly Option<string> style = new("--style") { Description = "CSV dialect: comma, semicolon, semicolon-decimal-comma, units-row, tab.", DefaultValueFactory = _ => "comma" };
        private readonly Option<string> output = new("--out") { Description = "The capture file to write.", Required = true };
        private readonly Option<string?> squareWave = new("--square-wave") { Description = "Record a reference square wave on every channel instead of the board, as PEAK-TO-PEAK[@LOW-LEVEL] (10V@-4V; default low level -PEAK-TO-PEAK/2): a calibration capture for calibrate --known-amplitude. Faults and part spread are then ignored." };
        private readonly Option<string> squarePeriod = new("--square-period") { Description = "The square wave's period (default 1ms).", DefaultValueFactory = _ => "1 ms" };
        private readonly Option<string> edgeTime = new("--edge-time") { Description = "The square wave's RC edge time constant (default 2us).", DefaultValueFactory = _ => "2 us" };

        public IEnumerable<Option> All => [faults, duration, settle, samples, channels, noise, seed, windows, probeOffsets, probeGains, trigger, partSpread, style, output, squareWave, squarePeriod, edgeTime];

        public SimulateSettings Read(ParseResult parse) => new(
            parse.GetValue(faults),
            parse.GetValue(duration)!,
            parse.GetValue(settle),
            parse.GetValue(samples),
            parse.GetValue(channels),
            parse.GetValue(noise)!,
            parse.GetValue(seed),
            parse.GetValue(windows),
            parse.GetValue(probeOffsets)!,
            parse.GetValue(probeGains),
            parse.GetValue(trigger),
            parse.GetValue(partSpread),
            parse.GetValue(style)!,
            parse.GetValue(output)!,
            parse.GetValue(squareWave),
            parse.GetValue(squarePeriod)!,
            parse.GetValue(edgeTime)!);
    }
}
