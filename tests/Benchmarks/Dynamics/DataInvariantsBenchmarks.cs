using BenchmarkDotNet.Attributes;
using Patchproof.Core.Dynamics;

namespace Patchproof.Benchmarks.Dynamics;

/// <summary>Every data-side invariant on a 100,000-sample, 3-channel Lorenz capture (target: under 3 s in total).</summary>
/// <remarks>Runs in process (no generated project to build, which times out on a loaded 2-core machine).</remarks>
[MemoryDiagnoser]
[InProcess]
[WarmupCount(1)]
[IterationCount(5)]
public class DataInvariantsBenchmarks
{
    private const double Dt = 0.01;
    private double[][] capture = [];
    private double[][] simulation = [];
    private double[] time = [];

    [GlobalSetup]
    public void Setup()
    {
        capture = LorenzCapture.Generate(100_000);
        simulation = LorenzCapture.Generate(100_000, transient: 1000);
        time = Enumerable.Range(0, 100_000).Select(i => i * Dt).ToArray();
    }

    [Benchmark]
    public int Decimation()
    {
        var points = 0;
        foreach (var channel in capture)
        {
            points += TraceDecimation.MinMaxPerColumn(time, channel).Count;
            points += TraceDecimation.LargestTriangleThreeBuckets(time, channel).Count;
        }

        points += TraceDecimation.AlongCurve(capture[0], capture[1]).Count;
        points += TraceDecimation.AlongCurve(capture[0], capture[2]).Count;
        points += TraceDecimation.AlongCurve(capture[1], capture[2]).Count;
        return points;
    }

    [Benchmark]
    public double WelchSpectra() => capture.Sum(channel => WelchSpectrum.Estimate(channel, Dt).TotalPower());

    [Benchmark]
    public double RosensteinFromSeries() => RosensteinLyapunov.EstimateFromSeries(capture[0], Dt).LargestExponentPerSecond;

    [Benchmark]
    public double RosensteinFromChannels() => RosensteinLyapunov.EstimateFromChannels(capture, Dt).LargestExponentPerSecond;

    [Benchmark]
    public double CorrelationDimensionFromChannels() => CorrelationDimension.EstimateFromChannels(capture, Dt).Dimension;

    [Benchmark]
    public int ReturnMapAndLobes() => ReturnMaps.OfMaxima(capture[2], Dt).PairCount + LobeSwitching.Analyze(capture[0], Dt).SwitchCount;

    [Benchmark]
    public double OccupancyDensities() => Patchproof.Core.Dynamics.OccupancyDensities.Compare(capture, simulation).Sum(plane => plane.HellingerDistance);
}

/// <summary>The Hénon map's exponents by the QR method over 10^5 iterations.</summary>
[MemoryDiagnoser]
[InProcess]
[WarmupCount(1)]
[IterationCount(5)]
public class HenonSpectrumBenchmarks
{
    [Benchmark]
    public double HenonQr100k() => MapLyapunovSpectrum.Compute(new HenonMap(), [0.1, 0.1], 100_000).Exponents[0];
}
