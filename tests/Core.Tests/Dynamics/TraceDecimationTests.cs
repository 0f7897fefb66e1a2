using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class TraceDecimationTests
{
    private static readonly double[] Time = TestTrajectories.Times(1_000_000, 1e-5);

    [Fact]
    public void MinMaxPerColumn_MillionSamples_StaysWithinTheBudgetAndKeepsASpike()
    {
        // Arrange: noise-free sine with a single-sample spike.
        var values = Time.Select(t => Math.Sin(2 * Math.PI * 3 * t)).ToArray();
        values[654_321] = 5;

        // Act
        var trace = TraceDecimation.MinMaxPerColumn(Time, values);

        // Assert
        Assert.InRange(trace.Count, 19_000, TraceDecimation.DefaultPointBudget + 2);
        Assert.Contains(654_321, trace.SourceIndices);
        Assert.Equal(0, trace.SourceIndices[0]);
        Assert.Equal(Time.Length - 1, trace.SourceIndices[^1]);
        Assert.True(trace.SourceIndices.Zip(trace.SourceIndices.Skip(1)).All(pair => pair.First < pair.Second));
        Assert.Equal(values.Min(), trace.Y.Min());
    }

    [Fact]
    public void LargestTriangleThreeBuckets_KeepsExactlyTheBudgetAndThePeaks()
    {
        var values = Time.Select(t => Math.Sin(2 * Math.PI * 2 * t)).ToArray();

        var trace = TraceDecimation.LargestTriangleThreeBuckets(Time, values, 2000);

        Assert.Equal(2000, trace.Count);
        Assert.Equal(1.0, trace.Y.Max(), 5);
        Assert.Equal(-1.0, trace.Y.Min(), 5);
    }

    [Fact]
    public void AlongCurve_Circle_KeepsEvenlySpacedPointsWithinBudget()
    {
        // A circle traversed at a varying speed: the kept points must be evenly spaced in angle.
        var angle = Time.Select(t => 2 * Math.PI * 10 * (t + 0.3 * t * t)).ToArray();
        var x = angle.Select(Math.Cos).ToArray();
        var y = angle.Select(Math.Sin).ToArray();

        var trace = TraceDecimation.AlongCurve(x, y, 5000);

        Assert.InRange(trace.Count, 4900, 5000);
        var gaps = trace.X.Zip(trace.Y).Zip(trace.X.Skip(1).Zip(trace.Y.Skip(1)))
            .Select(pair => Math.Sqrt(Math.Pow(pair.First.First - pair.Second.First, 2) + Math.Pow(pair.First.Second - pair.Second.Second, 2)))
            .Take(trace.Count - 2)
            .ToArray();
        Assert.True(gaps.Max() < 1.2 * gaps.Average(), $"largest gap {gaps.Max()} against mean {gaps.Average()}");
    }

    [Fact]
    public void MinMaxPerColumn_ShortTrace_IsReturnedWhole()
    {
        var trace = TraceDecimation.MinMaxPerColumn([0.0, 1, 2], [5.0, 6, 7]);

        Assert.Equal([5.0, 6, 7], trace.Y);
    }
}
