using System.Text.Json;
using System.Text.Json.Serialization;
using Patchproof.Client.Models;

namespace Patchproof.Client.Services;

/// <summary>Reads the fit engine's result document (the <c>result</c> of a report) into the report page's sections.</summary>
/// <remarks>
/// The document is camel-case JSON: <c>summary</c>, <c>findings</c>, <c>coefficients</c>, <c>offsets</c>,
/// <c>timeScale</c>, <c>invariants</c>, <c>structureCheck</c>, <c>plots</c>, <c>warnings</c>, <c>notes</c> and <c>channels</c> (see docs/web-app.md). A section the
/// document lacks comes back empty, so a report of an older engine still opens; a document that is not an object
/// comes back as a problem.
/// </remarks>
public static class ReportDocumentReader
{
    private static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        // An uncertainty the capture cannot give arrives as "NaN" or "Infinity".
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.CamelCase) },
    };

    /// <summary>The sections of one result document.</summary>
    /// <param name="Summary">The diagnosis in one sentence.</param>
    /// <param name="Findings">Most probable first.</param>
    /// <param name="Coefficients">The estimated coefficients.</param>
    /// <param name="Offsets">The integrators' offsets.</param>
    /// <param name="TimeScale">The time scale, or null.</param>
    /// <param name="Invariants">The invariants.</param>
    /// <param name="StructureCheck">The structure check, or null.</param>
    /// <param name="Plots">The comparison plots.</param>
    public sealed record Sections(
        string Summary,
        IReadOnlyList<FindingView> Findings,
        IReadOnlyList<CoefficientView> Coefficients,
        IReadOnlyList<OffsetView> Offsets,
        TimeScaleView? TimeScale,
        IReadOnlyList<InvariantView> Invariants,
        StructureCheckView? StructureCheck,
        ComparisonPlots Plots)
    {
        /// <summary>Why the findings may be unsafe (the fit did not converge, the capture clipped...); empty when they are safe.</summary>
        public IReadOnlyList<string> Warnings { get; init; } = [];

        /// <summary>Further remarks of the diagnosis and the server.</summary>
        public IReadOnlyList<string> Notes { get; init; } = [];

        /// <summary>The gain the fit assumed for each channel and where it came from.</summary>
        public IReadOnlyList<ChannelGainView> Channels { get; init; } = [];

        /// <summary>Which channel the fit read as which variable, for example "CH2 = -y"; empty when the document does not say.</summary>
        public IReadOnlyList<string> Mapping { get; init; } = [];
    }

    private sealed record Document(
        string? Summary,
        List<FindingView>? Findings,
        List<CoefficientView>? Coefficients,
        List<OffsetView>? Offsets,
        TimeScaleView? TimeScale,
        List<InvariantView>? Invariants,
        StructureCheckView? StructureCheck,
        PlotsDocument? Plots,
        List<string>? Warnings,
        List<string>? Notes,
        List<ChannelGainView>? Channels = null,
        FittedDocument? Fitted = null);

    private sealed record FittedDocument(List<string>? Mapping);

    private sealed record PlotsDocument(
        List<OverlayPlot>? PhasePlanes,
        List<OverlayPlot>? TimeSeries,
        OverlayPlot? ReturnMap,
        List<DensityDifferencePlot>? DensityDifferences,
        List<OverlayPlot>? Spectra);

    /// <summary>Reads a result document.</summary>
    /// <param name="result">The <c>result</c> element of a report.</param>
    /// <returns>The sections, or the reason the document could not be read.</returns>
    public static ApiResult<Sections> Read(JsonElement result)
    {
        if (result.ValueKind != JsonValueKind.Object)
        {
            return ApiResult<Sections>.Fail(0, "The report's result is not a JSON object", $"It is {result.ValueKind}.");
        }

        Document? document;
        try
        {
            document = result.Deserialize<Document>(Options);
        }
        catch (JsonException ex)
        {
            return ApiResult<Sections>.Fail(0, "The report's result could not be read", $"{ex.Path}: {ex.Message}");
        }

        if (document is null)
        {
            return ApiResult<Sections>.Fail(0, "The report's result is empty");
        }

        var plots = document.Plots is { } p
            ? new ComparisonPlots(p.PhasePlanes ?? [], p.TimeSeries ?? [], p.ReturnMap, p.DensityDifferences ?? [], p.Spectra ?? [])
            : ComparisonPlots.Empty;
        return ApiResult<Sections>.Ok(new Sections(
            document.Summary ?? "",
            document.Findings ?? [],
            document.Coefficients ?? [],
            document.Offsets ?? [],
            document.TimeScale,
            document.Invariants ?? [],
            document.StructureCheck,
            plots)
        {
            Warnings = document.Warnings ?? [],
            Notes = document.Notes ?? [],
            Channels = document.Channels ?? [],
            Mapping = document.Fitted?.Mapping ?? [],
        });
    }
}
