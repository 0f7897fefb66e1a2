namespace Patchproof.EndToEnd.Tests.Infrastructure;

/// <summary>One server and one browser for all browser tests: starting Chromium is the slow part.</summary>
[CollectionDefinition(Name)]
public sealed class EndToEndCollection : ICollectionFixture<LiveServer>, ICollectionFixture<Browser>
{
    public const string Name = "live server and browser";
}
