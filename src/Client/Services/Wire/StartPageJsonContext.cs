using System.Text.Json;
using System.Text.Json.Serialization;
using Patchproof.Client.Components.Pages.Home;
using Patchproof.Client.Models;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Services.Wire;

/// <summary>Compile-time JSON metadata for the answers the start page waits for, the bench it records and the snapshot the server hands it.</summary>
/// <remarks>
/// The WebAssembly runtime interprets .NET code, so the reflection-based serializer's first use of a type (reading its
/// constructors and properties, building its converters) costs noticeably on the first page load. Types listed here
/// skip that; every other type still goes through reflection (see <see cref="PatchproofApi"/>).
/// </remarks>
[JsonSourceGenerationOptions(JsonSerializerDefaults.Web)]
[JsonSerializable(typeof(HealthResponse))]
[JsonSerializable(typeof(List<BenchWire>))]
[JsonSerializable(typeof(BenchWire))]
[JsonSerializable(typeof(NewBench))]
[JsonSerializable(typeof(StartPageSnapshot))]
internal sealed partial class StartPageJsonContext : JsonSerializerContext;
