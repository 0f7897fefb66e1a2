using Patchproof.Core.Captures;
using Patchproof.Server.Storage;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Storage;

public sealed class CaptureSamplesFileTests
{
    [Fact]
    public void WriteThenRead_ReaderOutput_GivesTheSameTimeBaseAndSamples()
    {
        using var csv = new MemoryStream(CaptureFiles.TwoChannelScopeExport(777));
        var capture = CaptureReader.Read(csv, "capture.csv").Value;
        var path = Path.Combine(Path.GetTempPath(), $"patchproof-samples-{Guid.NewGuid():N}.samples");
        try
        {
            CaptureSamplesFile.Write(path, capture);
            var read = CaptureSamplesFile.Read(path, "capture.csv");

            Assert.Equal(capture.TimeBase, read.TimeBase);
            Assert.Equal(capture.Channels.Select(c => (c.Name, c.Unit, c.SourceColumn)), read.Channels.Select(c => (c.Name, c.Unit, c.SourceColumn)));
            for (var i = 0; i < capture.Channels.Count; i++)
            {
                Assert.True(capture.Channels[i].Samples.Span.SequenceEqual(read.Channels[i].Samples.Span));
            }
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void WriteThenRead_ExplicitTimes_KeepsEveryTime()
    {
        double[] times = [0.0, 0.001, 0.0025, 0.004];
        var capture = new Capture(new ExplicitTimeBase(times), [new CaptureChannel("x", "V", new float[] { 1f, -2f, 3.5f, 0f }, null, 2)], []);
        var path = Path.Combine(Path.GetTempPath(), $"patchproof-samples-{Guid.NewGuid():N}.samples");
        try
        {
            CaptureSamplesFile.Write(path, capture);
            var read = CaptureSamplesFile.Read(path, null);

            var explicitTimes = Assert.IsType<ExplicitTimeBase>(read.TimeBase);
            Assert.Equal(times, explicitTimes.TimesSeconds.ToArray());
            Assert.Equal([1f, -2f, 3.5f, 0f], read.Channels[0].Samples.ToArray());
        }
        finally
        {
            File.Delete(path);
        }
    }
}
