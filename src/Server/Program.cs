using Patchproof.Server.Apis;
using Patchproof.Server.Extensions;

var builder = WebApplication.CreateBuilder(args);
builder.AddPatchproofServices();

var app = builder.Build();
app.UsePatchproofPipeline();
app.MapHealthEndpoints();
app.MapClientFallback();
app.Run();

/// <summary>The server's entry point; public so integration tests can host it.</summary>
public partial class Program;
