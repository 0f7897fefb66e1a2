using Microsoft.Extensions.Options;
using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Server.Fits;
using Patchproof.Server.Reports;
using Patchproof.Server.Storage;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Fits;

public sealed class BoardFitJobExecutorCalibrationTests : IDisposable
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));
    private readonly string folder = Directory.CreateTempSubdirectory("patchproof-calibration-executor-tests").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public async Task Execute_BenchWithACalibration_UsesTheNewestOneAndSaysSo()
    {
        var store = new ProbeCalibrationStore(Options.Create(new PatchproofOptions { DataFolder = folder }), Clock);
        var bench = Guid.NewGuid();
        store.Save(bench, ProbeCalibrationFile.Write(Calibration(1.03)));
        Clock.Advance(TimeSpan.FromMinutes(5));
        store.Save(bench, ProbeCalibrationFile.Write(Calibration(1.004)));
        var input = Input(SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 41, problemUnits: 6)) with { BenchId = bench };

        var outcome = await new BoardFitJobExecutor(Clock, store).ExecuteAsync(input, new Progress<FitJobProgress>(), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Error);
        var document = FitResultJson.TryRead(outcome.Result!.Value);
        Assert.NotNull(document);
        Assert.Contains(document.Notes, n => n.StartsWith("Probe gains from the bench's newest probe calibration (uploaded 2026-12-01 12:05 UTC", StringComparison.Ordinal));
        Assert.Equal(1.004, store.Newest(bench)!.Value.Calibration.Find("CH2")!.Gain);
        var ch2 = Assert.Single(document.Channels!, c => c.Channel == "CH2");
        Assert.True(ch2.IsCalibrated);
        Assert.Equal(1.004, ch2.Gain, 12);
        Assert.StartsWith("calibration against CH1", ch2.GainSource, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Execute_ToldToIgnoreTheBenchCalibration_KeepsEveryChannelAtTheProbeToleranceAndSaysSo()
    {
        var store = new ProbeCalibrationStore(Options.Create(new PatchproofOptions { DataFolder = folder }), Clock);
        var bench = Guid.NewGuid();
        store.Save(bench, ProbeCalibrationFile.Write(Calibration(1.03)));
        var input = Input(SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 41, problemUnits: 6)) with { BenchId = bench, IgnoreBenchCalibration = true };

        var outcome = await new BoardFitJobExecutor(Clock, store).ExecuteAsync(input, new Progress<FitJobProgress>(), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Error);
        var document = FitResultJson.TryRead(outcome.Result!.Value);
        Assert.NotNull(document);
        Assert.DoesNotContain(document.Notes, n => n.StartsWith("Probe gains from the bench's newest probe calibration", StringComparison.Ordinal));
        Assert.Contains(document.Notes, n => n.Contains("was not used, as asked", StringComparison.Ordinal));
        Assert.NotEmpty(document.Channels!);
        Assert.All(document.Channels!, c =>
        {
            Assert.False(c.IsCalibrated);
            Assert.Equal(1, c.Gain);
            Assert.StartsWith("probe tolerance", c.GainSource, StringComparison.Ordinal);
        });
    }

    [Fact]
    public async Task Execute_BenchWithAnAbsoluteCalibration_DividesByTheAbsoluteGainsAndSaysSo()
    {
        var store = new ProbeCalibrationStore(Options.Create(new PatchproofOptions { DataFolder = folder }), Clock);
        var bench = Guid.NewGuid();
        var absolute = Calibration(1.004) with { Absolute = new KnownAmplitudeReference(10, 0.001, 6.1, -4.1, 0.003, 24_000, 1.02, 0.00107) };
        store.Save(bench, ProbeCalibrationFile.Write(absolute));
        var input = Input(SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 41, problemUnits: 6)) with { BenchId = bench };

        var outcome = await new BoardFitJobExecutor(Clock, store).ExecuteAsync(input, new Progress<FitJobProgress>(), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Error);
        var document = FitResultJson.TryRead(outcome.Result!.Value);
        Assert.NotNull(document);
        Assert.Contains(document.Notes, n => n.EndsWith("absolute gains, against a known amplitude of 10 V.", StringComparison.Ordinal));
        Assert.Equal(1.02, Assert.Single(document.Channels!, c => c.Channel == "CH1").Gain, 12);
        var ch2 = Assert.Single(document.Channels!, c => c.Channel == "CH2");
        Assert.Equal(1.004 * 1.02, ch2.Gain, 12);
        Assert.StartsWith("absolute calibration against a 10 V step on CH1", ch2.GainSource, StringComparison.Ordinal);
    }

    [Fact]
    public void Newest_BenchWithoutCalibrations_IsNull()
    {
        var store = new ProbeCalibrationStore(Options.Create(new PatchproofOptions { DataFolder = folder }), Clock);

        Assert.Null(store.Newest(Guid.NewGuid()));
    }

    private static ProbeCalibration Calibration(double gain) => new(
        "CH1",
        [new ChannelCalibration("CH1", 1, 0, 0, 0, 1, 0, 0.01, 0.04), new ChannelCalibration("CH2", gain, 5e-5, 0, 1e-4, 0.99998, 0.012, 0.013, 0.04)],
        20_000,
        0.2,
        ["calibration.csv"],
        Clock.GetUtcNow(),
        "x output");

    private FitJobInput Input(byte[] capture)
    {
        var path = Path.Combine(folder, "capture.csv");
        File.WriteAllBytes(path, capture);
        return new FitJobInput(Guid.NewGuid(), Guid.NewGuid(), 1, SyntheticBoardCaptures.DesignText("qh-d2-dunlin.json"), [new FitJobCapture(Guid.NewGuid(), "capture.csv", path, path + ".samples")], 1);
    }
}
