using System.Net;
using System.Net.Http.Json;
using System.Text;
using Patchproof.Contracts.Benches;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class ProbeCalibrationsApiTests(ServerDatabase database)
{
    [Fact]
    public async Task Upload_TwoCalibrations_StoresBothAndReadsBackTheNewest()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 9");

        using var first = await PostAsync(api, bench.Id, ProbeCalibrationFile.Write(Calibration("first")));
        api.Host.Time.Advance(TimeSpan.FromMinutes(1));
        using var second = await PostAsync(api, bench.Id, ProbeCalibrationFile.Write(Calibration("second")));
        var newest = await api.Client.GetStringAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Created, first.StatusCode);
        Assert.Equal(HttpStatusCode.Created, second.StatusCode);
        var summary = await second.Content.ReadFromJsonAsync<ProbeCalibrationSummary>(ApiTest.Token);
        Assert.Equal(["CH1", "CH2"], summary!.Channels);
        Assert.Equal(api.Host.Time.GetUtcNow(), summary.UploadedAt);
        Assert.Equal("second", ProbeCalibrationFile.Read(newest).Value.Note);
    }

    [Fact]
    public async Task Upload_MissingGain_AnswersUnprocessableWithLineAndColumn()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 10");
        var text = "{\n  \"format\": \"patchproof-probe-calibration\",\n  \"version\": 1,\n  \"referenceChannel\": \"CH1\",\n  \"channels\": [\n    { \"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0 },\n    { \"channel\": \"CH2\", \"gainSd\": 0 }\n  ]\n}\n";

        using var response = await PostAsync(api, bench.Id, text);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.Equal(7, problem.GetProperty("line").GetInt32());
        Assert.Equal(5, problem.GetProperty("column").GetInt32());
    }

    [Fact]
    public async Task Upload_UnknownBench_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await PostAsync(api, Guid.NewGuid(), ProbeCalibrationFile.Write(Calibration("x")));

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task Newest_BenchWithoutCalibration_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 11");

        using var response = await api.Client.GetAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    private static async Task<HttpResponseMessage> PostAsync(ApiTest api, Guid benchId, string document)
    {
        using var content = new StringContent(document, Encoding.UTF8, "application/json");
        return await api.Client.PostAsync($"/api/benches/{benchId}/probe-calibrations", content, ApiTest.Token);
    }

    private static ProbeCalibration Calibration(string note) => new(
        "CH1",
        [new ChannelCalibration("CH1", 1, 0, 0, 0, 1, 0, 0.01, 0.04), new ChannelCalibration("CH2", 1.01, 5e-5, 0, 1e-4, 0.99998, 0.012, 0.013, 0.04)],
        20_000,
        0.2,
        ["calibration.csv"],
        new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero),
        note);

    public sealed class OnSqlite() : ProbeCalibrationsApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : ProbeCalibrationsApiTests(ServerDatabase.Postgres);
}
