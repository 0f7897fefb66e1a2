using System.Collections.Immutable;
using Patchproof.Core.Captures;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Estimation.MultipleShooting;
using Patchproof.Core.Simulation;
using Patchproof.Core.Simulation.Synthesis;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Reports;

/// <summary>A capture of a board whose parts may deviate from its design: simulated in volts and seconds from the
/// design's own term algebra, with noise of 0.5 % of each channel's SD and 8-bit quantization over a scope window.</summary>
internal static class SyntheticBoardCapture
{
    public static BoardDesign LoadDesign(string file) =>
        DesignFileReader.ReadFile(Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", file)).Value;

    public static Capture Simulate(BoardDesign asBuilt, int seed, double problemUnits = 20, double[]? channelOffsetsVolts = null, int[]? recorded = null, double[]? probeGains = null)
    {
        var (run, dt, count) = Trace(asBuilt, problemUnits);
        var random = new Random(seed);
        var channels = new List<CaptureChannel>();
        foreach (var j in recorded ?? Enumerable.Range(0, asBuilt.Variables.Count()).ToArray())
        {
            var clean = Enumerable.Range(0, count).Select(i => ((probeGains?[j] ?? 1) * run.StateAt(i)[j]) + (channelOffsetsVolts?[j] ?? 0)).ToArray();
            var mean = clean.Average();
            var sd = Math.Sqrt(clean.Sum(v => (v - mean) * (v - mean)) / count);
            var window = 1.1 * clean.Max(Math.Abs);
            var step = 2 * window / 256;
            var samples = clean.Select(v => (float)(Math.Round((v + 0.005 * sd * GaussianNoise.Next(random)) / step) * step)).ToArray();
            channels.Add(new CaptureChannel($"CH{j + 1}", "V", samples, "synthetic.csv", j + 2));
        }

        return new Capture(new UniformTimeBase(0, dt, count), channels, []);
    }

    /// <summary>A calibration capture of the same board: every channel on one node (state <paramref name="node"/>) through its probe
    /// gain, all channels at one volts/div (one 8-bit window), noise of 0.5 % of the node's SD.</summary>
    public static Capture SimulateCalibration(BoardDesign asBuilt, int seed, double[] probeGains, int node = 0, double problemUnits = 5)
    {
        var (run, dt, count) = Trace(asBuilt, problemUnits);
        var random = new Random(seed);
        var clean = Enumerable.Range(0, count).Select(i => run.StateAt(i)[node]).ToArray();
        var mean = clean.Average();
        var sd = Math.Sqrt(clean.Sum(v => (v - mean) * (v - mean)) / count);
        var window = 1.15 * clean.Max(Math.Abs) * probeGains.Max();
        var step = 2 * window / 256;
        var channels = probeGains.Select((gain, c) => new CaptureChannel($"CH{c + 1}", "V",
            clean.Select(v => (float)(Math.Round(((gain * v) + (0.005 * sd * GaussianNoise.Next(random))) / step) * step)).ToArray(), "calibration.csv", c + 2)).ToList();
        return new Capture(new UniformTimeBase(0, dt, count), channels, []);
    }

    /// <summary>An absolute calibration capture: every channel on a square wave of <paramref name="peakToPeakVolts"/> (RC edges of
    /// 2 µs, period 1 ms, 25 000 samples over 20 ms) through its probe gain, one 8-bit window of ±8 V, noise of
    /// <paramref name="noiseVolts"/>.</summary>
    public static Capture SimulateSquareWaveCalibration(int seed, double[] probeGains, double peakToPeakVolts = 10, double noiseVolts = 0.02)
    {
        var trace = SquareWaveSource.Create(peakToPeakVolts, -0.4 * peakToPeakVolts, 1e-3, 2e-6, 8e-7, 25_000, phaseSeconds: 3.1e-4);
        var channels = probeGains.Select((gain, c) => new ScopeChannelSettings($"CH{c + 1}", SquareWaveSource.StateName, 1, gain, 0.01 * (c - 1), 0, 16)).ToImmutableArray();
        return CaptureSynthesizer.Synthesize(trace, new CaptureSynthesisOptions(channels, noiseVolts, seed, 0)).Capture;
    }

    private static (OdeSolution Run, double IntervalSeconds, int Count) Trace(BoardDesign asBuilt, double problemUnits)
    {
        var variables = asBuilt.Variables.Select(v => v.Name).ToList();
        var terms = asBuilt.Terms();
        var field = new PolynomialVectorField(
            variables,
            terms.Select(t => new PolynomialTerm(variables.IndexOf(t.Variable), t.Basis.Variables.Select(v => variables.IndexOf(v)).ToList(), t.Basis.ToString())).ToList(),
            variables.Select(_ => false).ToList());
        var parameters = terms.Select(t => t.NominalCoefficient).ToImmutableArray();
        var tau = asBuilt.TimeScaleSeconds;
        var start = asBuilt.Variables.Select(v => v.ToVolts(1.0)).ToImmutableArray();
        var transient = OdeSolver.Solve(new OdeProblem(field, start, 0, 10 * tau, parameters), new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10 });
        var dt = tau / 500;
        var count = (int)Math.Round(problemUnits * 500) + 1;
        var times = Enumerable.Range(0, count).Select(i => 10 * tau + i * dt).ToImmutableArray();
        var run = OdeSolver.Solve(new OdeProblem(field, [.. transient.FinalState.ToArray()], 10 * tau, times[^1], parameters),
            new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10, SampleTimes = times });
        return (run, dt, count);
    }

}
