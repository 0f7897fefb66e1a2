using System.Text.Json;
using Patchproof.Contracts.Boards;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Designs;
using Patchproof.Contracts.Fits;

namespace Patchproof.Contracts.Reports;

/// <summary>Everything about one finished fit in one document: what was fitted, against what, and the engine's result.</summary>
/// <param name="Fit">The fit job as it ended.</param>
/// <param name="Board">The board.</param>
/// <param name="Design">The design version fitted.</param>
/// <param name="Captures">The captures fitted, with their checks.</param>
/// <param name="Result">The fit engine's result document (JSON).</param>
public sealed record FitReportResponse(
    FitResponse Fit,
    BoardResponse Board,
    DesignVersionSummary Design,
    IReadOnlyList<CaptureResponse> Captures,
    JsonElement Result);
