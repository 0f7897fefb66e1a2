using Patchproof.Client.Components.Pages.Fits;
using Patchproof.Client.Models;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Fits;

public sealed class FitProgressClampTests
{
    [Fact]
    public void Apply_LowerProgressOfTheSameFit_KeepsTheLargestSeen()
    {
        var clamp = new FitProgressClamp();

        var shown = new[] { 0.2, 0.5, 0.3, 0.7 }.Select(p => clamp.Apply(DemoData.FitJob(FitJobState.Running, p)).Progress).ToList();

        Assert.Equal([0.2, 0.5, 0.5, 0.7], shown);
    }

    [Fact]
    public void Apply_AnotherFit_StartsFromItsOwnProgress()
    {
        var clamp = new FitProgressClamp();
        clamp.Apply(DemoData.FitJob(FitJobState.Running, 0.9));

        var other = clamp.Apply(DemoData.FitJob(FitJobState.Running, 0.1) with { Id = Guid.NewGuid() });

        Assert.Equal(0.1, other.Progress);
    }
}
