using Patchproof.Server.Rendering;

namespace Patchproof.Server.Tests.Rendering;

public sealed class LoopbackApiAddressTests
{
    [Theory]
    [InlineData("http://127.0.0.1:41234", "http://127.0.0.1:41234/")]
    [InlineData("http://0.0.0.0:5000", "http://127.0.0.1:5000/")]
    [InlineData("http://[::]:5000", "http://[::1]:5000/")]
    [InlineData("http://+:8080", "http://localhost:8080/")]
    [InlineData("http://*:8080", "http://localhost:8080/")]
    [InlineData("http://lab-server.local:5000", "http://lab-server.local:5000/")]
    public void FromListeningAddresses_OneAddress_IsReachedFromTheServerItself(string listening, string expected) =>
        Assert.Equal(new Uri(expected), LoopbackApiAddress.FromListeningAddresses([listening]));

    [Fact]
    public void FromListeningAddresses_PlainHttpBesideHttps_IsPreferred() =>
        Assert.Equal(new Uri("http://127.0.0.1:5000/"), LoopbackApiAddress.FromListeningAddresses(["https://0.0.0.0:5001", "http://0.0.0.0:5000"]));

    [Fact]
    public void FromListeningAddresses_None_IsNone() => Assert.Null(LoopbackApiAddress.FromListeningAddresses([]));
}
