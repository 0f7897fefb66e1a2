using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Design;

namespace Patchproof.Server.Data;

/// <summary>Lets the EF Core tools build the model without starting the server (used to write migrations).</summary>
internal sealed class DesignTimeDbContextFactory : IDesignTimeDbContextFactory<PatchproofDbContext>
{
    public PatchproofDbContext CreateDbContext(string[] args)
    {
        var options = new DbContextOptionsBuilder<PatchproofDbContext>();
        DatabaseProvider.Configure(options, Environment.GetEnvironmentVariable("PATCHPROOF_DESIGN_POSTGRES"), Path.Combine(Path.GetTempPath(), "patchproof-design"));
        return new PatchproofDbContext(options.Options);
    }
}
