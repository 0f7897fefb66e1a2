using Patchproof.Core.Captures;
using Patchproof.Core.Circuits.Boards;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Simulation.Synthesis;
using Patchproof.Core.Tests.Circuits;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Simulation.Synthesis;

public sealed class CaptureSynthesizerTests
{
    [Fact]
    public void Synthesize_SameSeed_GivesTheSameCapture_AndStepsOfTheWindow()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var system = BoardOdeSystem.Create(design);
        var trace = BoardSimulator.Simulate(system, system.ParameterVector(), system.InitialState(BuiltInTargets.Lorenz), 5e-3, 2e-3, 1e-6);
        var channel = new ScopeChannelSettings("CH1", "x", WindowSpanVolts: 20);
        var options = new CaptureSynthesisOptions([channel], 4e-3, 7, 100);

        var first = CaptureSynthesizer.Synthesize(trace, options).Capture;
        var second = CaptureSynthesizer.Synthesize(trace, options).Capture;

        Assert.Equal(first.Channels[0].Samples.ToArray(), second.Channels[0].Samples.ToArray());
        Assert.Equal(-100 * 1e-6, first.TimeBase.TimeAtSeconds(0), 15);
        foreach (var value in first.Channels[0].Samples.Span)
        {
            var code = (value + 10) / channel.StepVolts;
            Assert.Equal(Math.Round(code), code, 3);
        }
    }

    [Theory]
    [InlineData("qh-l3-wren.csv", 3)]
    [InlineData("qh-l4-plover.csv", 3)]
    [InlineData("qh-l5-tern.csv", 2)]
    [InlineData("qh-r1-gannet.csv", 3)]
    [InlineData("qh-d2-dunlin.csv", 2)]
    [InlineData("qh-l9-skua.csv", 3)]
    public void DemoCaptures_ReadBackThroughTheCaptureReader(string fileName, int channels)
    {
        var path = Path.Combine(ReferenceDataFiles.RepositoryRoot, "sample-captures", fileName);

        var result = CaptureReader.ReadFile(path);

        Assert.True(result.Success, string.Join("\n", result.Errors));
        Assert.Equal(channels, result.Value.Channels.Count);
        Assert.InRange(result.Value.SampleCount, 20000, 25000);
    }
}
