using Microsoft.AspNetCore.Components.WebAssembly.Hosting;
using Patchproof.Client.Services;

var builder = WebAssemblyHostBuilder.CreateDefault(args);
// The root components (the router and the head outlet) come from the server's page document.
builder.Services.AddScoped(_ => new HttpClient { BaseAddress = new Uri(builder.HostEnvironment.BaseAddress) });
builder.Services.AddScoped<IPatchproofApi, PatchproofApi>();
await builder.Build().RunAsync();
