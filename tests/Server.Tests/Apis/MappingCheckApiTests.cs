using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Captures;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public sealed class MappingCheckApiTests
{
    private static async Task<(ApiTest Api, Guid CaptureId)> DunlinAsync()
    {
        var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-M1");
        await api.CreateDesignAsync(board.Id, SyntheticBoardCaptures.DesignText("qh-d2-dunlin.json"));
        using var upload = await api.UploadAsync(board.Id, SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 51, problemUnits: 12), "dunlin.csv");
        var capture = (await upload.Content.ReadFromJsonAsync<CaptureResponse>(ApiTest.Token))!;
        return (api, capture.Id);
    }

    private static async Task<HttpResponseMessage> CheckAsync(ApiTest api, Guid captureId, params ChannelMappingEntry[] mapping) =>
        await api.Client.PostAsJsonAsync($"/api/captures/{captureId}/mapping-check", new MappingCheckRequest(1, mapping), ApiTest.Token);

    [Fact]
    public async Task MappingCheck_TheRightMapping_Agrees()
    {
        var (api, capture) = await DunlinAsync();
        await using var owned = api;

        using var response = await CheckAsync(api, capture, new("CH1", "x", 1), new("CH2", "y", 1));
        var check = (await response.Content.ReadFromJsonAsync<MappingCheckResponse>(ApiTest.Token))!;

        Assert.True(check.AgreesWithGiven, check.Message);
    }

    [Fact]
    public async Task MappingCheck_SwappedChannels_SuggestsTheRightOnes()
    {
        var (api, capture) = await DunlinAsync();
        await using var owned = api;

        using var response = await CheckAsync(api, capture, new("CH1", "y", 1), new("CH2", "x", 1));
        var check = (await response.Content.ReadFromJsonAsync<MappingCheckResponse>(ApiTest.Token))!;

        Assert.False(check.AgreesWithGiven, check.Message);
        Assert.Equal([("CH1", "x"), ("CH2", "y")], check.Suggested.OrderBy(s => s.Channel).Select(s => (s.Channel, s.Variable)));
    }

    [Fact]
    public async Task MappingCheck_BadInput_NamesTheFieldAndUnknownCaptureIsNotFound()
    {
        var (api, capture) = await DunlinAsync();
        await using var owned = api;

        using var badChannel = await CheckAsync(api, capture, new("CH9", "x", 1), new("CH2", "y", 1));
        using var badSign = await CheckAsync(api, capture, new("CH1", "x", 2), new("CH2", "y", 1));
        using var tooFew = await CheckAsync(api, capture, new ChannelMappingEntry("CH1", "x", 1));
        using var unknown = await CheckAsync(api, Guid.NewGuid(), new("CH1", "x", 1), new("CH2", "y", 1));
        using var noDesign = await api.Client.PostAsJsonAsync($"/api/captures/{capture}/mapping-check", new MappingCheckRequest(7, [new("CH1", "x", 1), new("CH2", "y", 1)]), ApiTest.Token);

        Assert.True((await ApiTest.ReadProblemAsync(badChannel, HttpStatusCode.BadRequest)).GetProperty("errors").TryGetProperty("mapping[0].channel", out _));
        Assert.True((await ApiTest.ReadProblemAsync(badSign, HttpStatusCode.BadRequest)).GetProperty("errors").TryGetProperty("mapping[0].sign", out _));
        Assert.True((await ApiTest.ReadProblemAsync(tooFew, HttpStatusCode.BadRequest)).GetProperty("errors").TryGetProperty("mapping", out _));
        await ApiTest.ReadProblemAsync(unknown, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(noDesign, HttpStatusCode.NotFound);
    }
}
