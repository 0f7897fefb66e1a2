using System.Text.Json;
using Patchproof.Contracts.Captures;

namespace Patchproof.Server.Fits;

/// <summary>The stored form of a fit's channel mapping (the <c>MappingJson</c> column of a fit job).</summary>
internal static class FitMappingJson
{
    /// <summary>The mapping as stored; channel names trimmed.</summary>
    public static string Write(IReadOnlyList<ChannelMappingEntry> mapping) =>
        JsonSerializer.Serialize(mapping.Select(m => new ChannelMappingEntry(m.Channel.Trim(), m.Variable, m.Sign)).ToList(), JsonSerializerOptions.Web);

    /// <summary>The stored mapping, or null for a fit started without one.</summary>
    public static IReadOnlyList<ChannelMappingEntry>? Read(string? json) =>
        json is null ? null : JsonSerializer.Deserialize<List<ChannelMappingEntry>>(json, JsonSerializerOptions.Web);
}
