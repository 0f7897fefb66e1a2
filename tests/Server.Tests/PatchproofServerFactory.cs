using Microsoft.AspNetCore.Mvc.Testing;

namespace Patchproof.Server.Tests;

/// <summary>Hosts the real server in memory for API tests.</summary>
public sealed class PatchproofServerFactory : WebApplicationFactory<Program>;
