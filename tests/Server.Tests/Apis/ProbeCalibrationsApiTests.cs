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

    [Fact]
    public async Task CalibrateFromCapture_ProbesOnOneNode_StoresTheGainsAndListsThemNewestFirst()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 12");

        // Known by construction: CH2 reads 1.018 times what CH1 reads.
        using var response = await PostCaptureAsync(api, bench.Id, CalibrationCaptureFiles.Csv([1.0, 1.018], seed: 3), "wren-cal.csv", "x output");
        var listed = await api.Client.GetFromJsonAsync<List<ProbeCalibrationSummary>>($"/api/benches/{bench.Id}/probe-calibrations", ApiTest.Token);
        var newest = await api.Client.GetStringAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var summary = (await response.Content.ReadFromJsonAsync<ProbeCalibrationSummary>(ApiTest.Token))!;
        Assert.Equal("CH1", summary.ReferenceChannel);
        Assert.Equal("x output", summary.Note);
        Assert.Equal(["wren-cal.csv"], summary.SourceFiles);
        var ch2 = Assert.Single(summary.ChannelDetails, c => c.Channel == "CH2");
        Assert.InRange(ch2.Gain, 1.018 - (3 * ch2.GainSd), 1.018 + (3 * ch2.GainSd));
        Assert.True(ch2.FollowsReference);
        Assert.True(Assert.Single(summary.ChannelDetails, c => c.Channel == "CH1").IsReference);
        Assert.Equal(ch2.Gain, Assert.Single(listed!).ChannelDetails.Single(c => c.Channel == "CH2").Gain);
        Assert.Equal(ch2.Gain, ProbeCalibrationFile.Read(newest).Value.Find("CH2")!.Gain);
    }

    [Fact]
    public async Task CalibrateFromCapture_UnreadableCsv_AnswersWithFileLineAndColumnAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 13");
        var csv = Encoding.ASCII.GetBytes("time_s,CH1,CH2\n0,1,1\n1e-5,1,x\n2e-5,1,1\n");

        using var response = await PostCaptureAsync(api, bench.Id, csv, "broken-cal.csv", null);
        var listed = await api.Client.GetFromJsonAsync<List<ProbeCalibrationSummary>>($"/api/benches/{bench.Id}/probe-calibrations", ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.Equal("broken-cal.csv", problem.GetProperty("file").GetString());
        Assert.Equal(3, problem.GetProperty("line").GetInt32());
        Assert.True(problem.GetProperty("column").GetInt32() > 0);
        Assert.Empty(listed!);
    }

    [Fact]
    public async Task CalibrateFromCapture_ProbesOnDifferentNodes_RefusesWithTheCheckAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 14");

        using var response = await PostCaptureAsync(api, bench.Id, CalibrationCaptureFiles.Csv([1.0, 1.0], seed: 5, secondChannelOnAnotherNode: true), "two-nodes.csv", null);
        using var newest = await api.Client.GetAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.Equal("NotOneSignal", problem.GetProperty("calibrationStatus").GetString());
        Assert.Contains("CH2 does not follow CH1", problem.GetProperty("errors")[0].GetString(), StringComparison.Ordinal);
        Assert.Contains("Nothing was stored", problem.GetProperty("detail").GetString(), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.NotFound, newest.StatusCode);
    }

    [Fact]
    public async Task Upload_AbsoluteCalibration_StoresItAsUploadedAndReturnsTheKnownAmplitude()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 16");
        var absolute = Calibration("square wave") with { Absolute = new KnownAmplitudeReference(10, 0.001, 6.1, -4.1, 0.003, 24_000, 1.02, 0.00107) };
        var document = ProbeCalibrationFile.Write(absolute);

        using var response = await PostAsync(api, bench.Id, document);
        var listed = await api.Client.GetFromJsonAsync<List<ProbeCalibrationSummary>>($"/api/benches/{bench.Id}/probe-calibrations", ApiTest.Token);
        var newest = await api.Client.GetStringAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var summary = (await response.Content.ReadFromJsonAsync<ProbeCalibrationSummary>(ApiTest.Token))!;
        Assert.Equal(new ProbeCalibrationKnownAmplitudeSummary(10, 0.001, 6.1, -4.1, 1.02, 0.00107), summary.KnownAmplitude);
        Assert.Equal(summary.KnownAmplitude, Assert.Single(listed!).KnownAmplitude);
        Assert.Equal(document, newest);
        Assert.Equal(absolute.Absolute, ProbeCalibrationFile.Read(newest).Value.Absolute);
    }

    [Fact]
    public async Task Upload_RelativeCalibration_ReturnsNoKnownAmplitude()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 17");

        using var response = await PostAsync(api, bench.Id, ProbeCalibrationFile.Write(Calibration("relative")));

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        Assert.Null((await response.Content.ReadFromJsonAsync<ProbeCalibrationSummary>(ApiTest.Token))!.KnownAmplitude);
    }

    [Fact]
    public async Task CalibrateFromCapture_SquareWaveOfKnownAmplitude_StoresAbsoluteGains()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 18");
        // The demo's square-wave capture was recorded with CH1 1.2 % high (sample-captures/regenerate.sh).
        var csv = await File.ReadAllBytesAsync(Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "sample-captures", "qh-r1-gannet-square-wave-probe-calibration.csv"), ApiTest.Token);

        using var response = await PostCaptureAsync(api, bench.Id, csv, "square.csv", null, "?knownAmplitude=10V&amplitudeAccuracy=0.1%25");
        var newest = await api.Client.GetStringAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var known = (await response.Content.ReadFromJsonAsync<ProbeCalibrationSummary>(ApiTest.Token))!.KnownAmplitude;
        Assert.NotNull(known);
        Assert.Equal(10, known.AmplitudeVolts);
        Assert.Equal(0.001, known.AmplitudeRelativeSd, 12);
        Assert.InRange(known.ReferenceGain, 1.012 - (3 * known.ReferenceGainSd), 1.012 + (3 * known.ReferenceGainSd));
        Assert.True(ProbeCalibrationFile.Read(newest).Value.IsAbsolute);
    }

    [Fact]
    public async Task CalibrateFromCapture_KnownAmplitudeWithoutItsAccuracy_AnswersBadRequestNamingTheFieldAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 19");

        using var response = await PostCaptureAsync(api, bench.Id, CalibrationCaptureFiles.Csv([1.0, 1.0], seed: 6), "cal.csv", null, "?knownAmplitude=10V");
        using var newest = await api.Client.GetAsync($"/api/benches/{bench.Id}/probe-calibrations/newest", ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.BadRequest);
        Assert.Contains("0.1%", problem.GetProperty("errors").GetProperty("amplitudeAccuracy")[0].GetString(), StringComparison.Ordinal);
        Assert.Equal(HttpStatusCode.NotFound, newest.StatusCode);
    }

    [Fact]
    public async Task List_BenchWithoutCalibration_IsEmpty()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync("Bench 15");

        var listed = await api.Client.GetFromJsonAsync<List<ProbeCalibrationSummary>>($"/api/benches/{bench.Id}/probe-calibrations", ApiTest.Token);

        Assert.Empty(listed!);
    }

    private static async Task<HttpResponseMessage> PostCaptureAsync(ApiTest api, Guid benchId, byte[] csv, string fileName, string? note, string? query = null)
    {
        using var file = new ByteArrayContent(csv);
        file.Headers.ContentType = new System.Net.Http.Headers.MediaTypeHeaderValue("text/csv");
        using var form = new MultipartFormDataContent { { file, "file", fileName } };
        query ??= note is null ? "" : "?note=" + Uri.EscapeDataString(note);
        return await api.Client.PostAsync($"/api/benches/{benchId}/probe-calibrations/from-capture{query}", form, ApiTest.Token);
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
