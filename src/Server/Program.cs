using Patchproof.Server.Extensions;

var builder = WebApplication.CreateBuilder(args);
builder.AddPatchproofServices();
builder.AddPatchproofPersistence();
builder.AddPatchproofCaptures();
builder.AddPatchproofFitJobs();
builder.AddPatchproofPageRendering();

var app = builder.Build();
app.UsePatchproofPipeline();
app.MapPatchproofApi();
app.MapClientPages();
app.Run();

/// <summary>The server's entry point; public so integration tests can host it.</summary>
public partial class Program;
