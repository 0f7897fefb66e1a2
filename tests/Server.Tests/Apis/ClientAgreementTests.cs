using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

/// <summary>The web app's own API client against the real server: every call of the main path is understood on both sides.</summary>
public sealed class ClientAgreementTests
{
    [Fact]
    public async Task MainPath_WithTheClientsApi_GeneratesChecksSavesUploadsFitsAndReadsTheReport()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });
        var client = new PatchproofApi(api.Client);
        var token = ApiTest.Token;

        var bench = (await client.CreateBenchAsync(new NewBench("Bench 9", null, null), token)).Value;
        var board = (await client.CreateBoardAsync(bench.Id, new NewBoard("QH-A1", "Avocet", null, null), token)).Value;
        var models = (await client.ListModelsAsync(token)).Value;
        var generated = await client.GenerateDesignAsync("damped-oscillator", token);
        Assert.True(generated.Succeeded, generated.Problem?.ToText());
        var notes = await client.CheckDesignAsync(generated.Value, token);
        Assert.True(notes.Succeeded, notes.Problem?.ToText());
        var saved = await client.SaveDesignAsync(board.Id, generated.Value, "generated", token);
        Assert.True(saved.Succeeded, saved.Problem?.ToText());
        var reloaded = await client.GetDesignAsync(board.Id, null, token);

        var design = Patchproof.Core.Circuits.Files.DesignFileReader.Read(generated.Value.Document!.Value.GetRawText()).Value;
        var csv = SyntheticBoardCaptures.Csv(design, new Dictionary<string, double>(), seed: 71, problemUnits: 12);
        var upload = await client.UploadCaptureAsync(board.Id, new UploadFile("avocet.csv", csv.Length, "text/csv", () => new MemoryStream(csv)), null, token);
        Assert.True(upload.Succeeded, upload.Problem?.ToText());
        var mapping = await client.CheckMappingAsync(upload.Value.Id, 1, [new ChannelMapping("CH1", "x", 1), new ChannelMapping("CH2", "y", 1)], token);
        Assert.True(mapping.Succeeded, mapping.Problem?.ToText());

        var started = await client.StartFitAsync(board.Id, 1, [upload.Value.Id], cancellationToken: token);
        Assert.True(started.Succeeded, started.Problem?.ToText());
        await api.WaitForFitAsync(started.Value.Id, ApiTest.IsFinal, TimeSpan.FromMinutes(3));
        var fit = (await client.GetFitAsync(started.Value.Id, token)).Value;
        var report = await client.GetReportAsync(started.Value.Id, token);

        Assert.Contains(models, m => m.Id == "lorenz" && m.CanGenerateDesign && m.Equations.Count == 3);
        Assert.Contains(models, m => m.Id == "chua" && !m.CanGenerateDesign);
        Assert.Equal(1, saved.Value.Version);
        Assert.Equal(generated.Value.Parts.Select(p => (p.Reference, p.Nominal)), reloaded.Value.Parts.Select(p => (p.Reference, p.Nominal)));
        Assert.Equal(["dx/dt = y", "dy/dt = -k*x - d*y"], reloaded.Value.Equations);
        Assert.True(fit.State == FitJobState.Succeeded, $"{fit.State}: {fit.Error}");
        Assert.True(report.Succeeded, report.Problem?.ToText());
        Assert.Contains(report.Value.Coefficients, c => c.Equation == "dy/dt" && c.Term == "x");
        Assert.Equal(2, report.Value.Offsets.Count);
        Assert.NotNull(report.Value.TimeScale);
    }
}
