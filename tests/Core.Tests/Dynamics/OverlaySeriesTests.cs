using Patchproof.Core.Dynamics;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class OverlaySeriesTests
{
    [Fact]
    public void Build_LorenzCapture_GivesEveryPlaneAndSeriesWithinBudget_AndRestartsFromTheCapture()
    {
        // Arrange: 50,000 samples (500 time units), nominal and a drifted design.
        var capture = TestTrajectories.Lorenz(50_000, 0.01, substeps: 2);
        OverlayDesign[] designs = [new("nominal design", [10, 28, 8.0 / 3]), new("fitted design", [10, 29, 8.0 / 3])];

        // Act: restarts every half Lyapunov time (0.5 / 0.9056, about 0.55).
        var overlays = OverlaySeries.Build(capture, 0.01, new LorenzSystem(), designs, 0.55, 1e-6, TestContext.Current.CancellationToken);

        // Assert
        Assert.Equal(["capture", "nominal design", "fitted design"], overlays.Select(o => o.Label));
        Assert.All(overlays, o => Assert.Equal(3, o.TimeSeries.Count));
        Assert.All(overlays, o => Assert.Equal(3, o.PhasePlanes.Count));
        Assert.All(overlays.SelectMany(o => o.TimeSeries.Concat(o.PhasePlanes.Select(p => p.Trace))), trace => Assert.InRange(trace.Count, 2, TraceDecimation.DefaultPointBudget + 2));
        var nominal = overlays[1];
        Assert.Equal(50_000 / 55 + 1, nominal.RestartTimes.Length);
        Assert.Equal(capture[0][0], nominal.TimeSeries[0].Y[0], 12);
        Assert.Equal(capture[0][^1], nominal.TimeSeries[0].Y[^1], 1e-2);
    }

    [Fact]
    public void Build_CancelledToken_StopsWithOperationCanceled()
    {
        var capture = TestTrajectories.Lorenz(2_000, 0.01, substeps: 2);
        OverlayDesign[] designs = [new("nominal", [.. LorenzSystem.ClassicParameters])];

        Assert.ThrowsAny<OperationCanceledException>(() => OverlaySeries.Build(capture, 0.01, new LorenzSystem(), designs, 0.55, 1e-6, new CancellationToken(true)));
    }
}
