using Bunit;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Home;
using Patchproof.Client.Services;
using Patchproof.Contracts.Health;
using HomePage = Patchproof.Client.Components.Pages.Home.Home;

namespace Patchproof.Client.Tests.Components.Pages.Home;

public sealed class HomeTests : BunitContext
{
    [Fact]
    public void Render_WhileServerHasNotAnswered_ShowsPending()
    {
        var api = new FakeApi(new TaskCompletionSource<HealthResponse>().Task);
        Services.AddSingleton<IPatchproofApi>(api);

        var cut = Render<HomePage>();

        Assert.Contains("Asking the server", cut.Find(".server-state").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_ServerAnswers_ShowsReadyWithVersion()
    {
        Services.AddSingleton<IPatchproofApi>(new FakeApi(Task.FromResult(new HealthResponse("ok", "9.8.7"))));

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Contains("Server ready · core 9.8.7", cut.Find(".ok").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_ServerUnreachable_ShowsTheReasonAsAlert()
    {
        Services.AddSingleton<IPatchproofApi>(new FakeApi(Task.FromException<HealthResponse>(new HttpRequestException("connection refused"))));

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() =>
        {
            var alert = cut.Find("[role=alert]");
            Assert.Contains("connection refused", alert.TextContent, StringComparison.Ordinal);
        });
    }

    private sealed class FakeApi(Task<HealthResponse> health) : IPatchproofApi
    {
        public Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default) => health;
    }
}
