using System.Net;
using System.Net.Http.Json;
using System.Security.Cryptography;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Captures;
using Patchproof.Server.Storage;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class CapturesApiTests(ServerDatabase database)
{
    [Fact]
    public async Task Upload_ScopeExport_IsStoredUnderItsHashWithChecksInTheAnswer()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();
        var bytes = CaptureFiles.TwoChannelScopeExport(2000);

        using var response = await api.UploadAsync(board.Id, bytes, "../../etc/bench 7.csv");
        var capture = await response.Content.ReadFromJsonAsync<CaptureResponse>(ApiTest.Token);
        var store = api.Service<CaptureStore>();

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        Assert.Equal($"/api/captures/{capture!.Id}", response.Headers.Location?.OriginalString);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(bytes)), capture.Sha256);
        Assert.Equal("bench 7.csv", capture.FileName);
        Assert.Equal(2000, capture.RowCount);
        Assert.Equal(["CH1", "CH2"], capture.Channels.Select(c => c.Name));
        Assert.Equal(1e-4, capture.SampleIntervalSeconds!.Value, 12);
        Assert.NotEmpty(capture.Checks);
        Assert.Equal(bytes, await File.ReadAllBytesAsync(store.CsvPathOf(capture.Sha256), ApiTest.Token));
        Assert.True(File.Exists(store.SamplesPathOf(capture.Sha256)));
    }

    [Fact]
    public async Task ListGetAndDownload_AfterUpload_GiveTheCaptureAndItsBytes()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();
        var bytes = CaptureFiles.TwoChannelScopeExport(500);
        var capture = await api.UploadCaptureAsync(board.Id, bytes);

        var listed = await api.Client.GetFromJsonAsync<List<CaptureResponse>>($"/api/boards/{board.Id}/captures", ApiTest.Token);
        var read = await api.Client.GetFromJsonAsync<CaptureResponse>($"/api/captures/{capture.Id}", ApiTest.Token);
        var downloaded = await api.Client.GetByteArrayAsync($"/api/captures/{capture.Id}/file", ApiTest.Token);

        Assert.Equal(capture.Id, Assert.Single(listed!).Id);
        Assert.Equal(capture.Sha256, read!.Sha256);
        Assert.Equal(capture.Checks.Count, read.Checks.Count);
        Assert.Equal(bytes, downloaded);
    }

    [Fact]
    public async Task Upload_SameBytesTwice_KeepsTwoCapturesAndOneFile()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();
        var bytes = CaptureFiles.TwoChannelScopeExport(300);

        var first = await api.UploadCaptureAsync(board.Id, bytes);
        var second = await api.UploadCaptureAsync(board.Id, bytes);

        Assert.NotEqual(first.Id, second.Id);
        Assert.Equal(first.Sha256, second.Sha256);
        Assert.Equal(2, api.Service<CaptureStore>().CountStoredFiles());
    }

    [Fact]
    public async Task Upload_MalformedCsv_AnswersLineAndColumnAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var response = await api.UploadAsync(board.Id, CaptureFiles.WithBadField(200, dataRow: 40, badField: "1.2.3"));

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.Equal(43, problem.GetProperty("line").GetInt32());
        Assert.Equal(15, problem.GetProperty("column").GetInt32()); // the second field: after "3.900000E-003,"
        Assert.Equal("capture.csv", problem.GetProperty("file").GetString());
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_ImagePart_AnswersUnsupportedMediaTypeAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var response = await api.UploadAsync(board.Id, CaptureFiles.TwoChannelScopeExport(10), "scope.png", "image/png");

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnsupportedMediaType);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_BinaryContent_AnswersUnsupportedMediaTypeAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();
        byte[] png = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 0x0D, 0x49, 0x48, 0x44, 0x52];

        using var response = await api.UploadAsync(board.Id, png, "capture.csv", "application/octet-stream");

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnsupportedMediaType);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_NotMultipart_AnswersUnsupportedMediaType()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var content = new ByteArrayContent(CaptureFiles.TwoChannelScopeExport(10));
        content.Headers.ContentType = new System.Net.Http.Headers.MediaTypeHeaderValue("text/csv");
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/captures", content, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnsupportedMediaType);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_NoFilePart_AnswersBadRequest()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var form = new MultipartFormDataContent { { new StringContent("hello"), "note" } };
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/captures", form, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.BadRequest);
    }

    [Fact]
    public async Task Upload_LargerThanTheLimit_AnswersPayloadTooLargeAndStoresNothing()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { MaxUploadBytes = 4096 });
        var board = await api.CreateBoardAsync();

        using var response = await api.UploadAsync(board.Id, CaptureFiles.TwoChannelScopeExport(2000));

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.RequestEntityTooLarge);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_MoreRowsThanTheLimit_AnswersPayloadTooLargeAndStoresNothing()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { MaxRows = 100 });
        var board = await api.CreateBoardAsync();

        using var response = await api.UploadAsync(board.Id, CaptureFiles.TwoChannelScopeExport(101));

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.RequestEntityTooLarge);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task Upload_UnknownBoard_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.UploadAsync(Guid.NewGuid(), CaptureFiles.TwoChannelScopeExport(10));

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
        await AssertNothingStoredAsync(api);
    }

    [Fact]
    public async Task GetCapture_Unknown_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);
        var id = Guid.NewGuid();

        using var capture = await api.Client.GetAsync($"/api/captures/{id}", ApiTest.Token);
        using var file = await api.Client.GetAsync($"/api/captures/{id}/file", ApiTest.Token);
        using var list = await api.Client.GetAsync($"/api/boards/{id}/captures", ApiTest.Token);

        await ApiTest.ReadProblemAsync(capture, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(file, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(list, HttpStatusCode.NotFound);
    }

    private static async Task AssertNothingStoredAsync(ApiTest api)
    {
        Assert.Equal(0, await api.WithDbAsync(db => db.Captures.CountAsync(ApiTest.Token)));
        Assert.Equal(0, api.Service<CaptureStore>().CountStoredFiles());
        var temp = Path.Combine(api.Data.DataFolder, "tmp");
        Assert.True(!Directory.Exists(temp) || !Directory.EnumerateFiles(temp).Any(), "an upload left a temporary file behind");
    }

    public sealed class OnSqlite() : CapturesApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : CapturesApiTests(ServerDatabase.Postgres);
}
