using System.Collections.Immutable;
using Microsoft.AspNetCore.Http.HttpResults;
using Patchproof.Contracts.Designs;
using Patchproof.Contracts.Models;
using Patchproof.Core.Circuits.Building;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Models;
using Patchproof.Server.Designs;

namespace Patchproof.Server.Apis;

/// <summary>The core's built-in models, and designs proposed from them.</summary>
internal static class ModelsApi
{
    public static IEndpointRouteBuilder MapModelEndpoints(this IEndpointRouteBuilder routes)
    {
        var models = routes.MapGroup("/api/models").WithTags("Models");
        models.MapGet("/", List).WithName("ListModels").WithSummary("Lists the built-in models, with their equations and whether a design can be generated from them.");
        models.MapPost("/{modelId}/design", Generate).WithName("GenerateDesign")
            .WithSummary("Proposes a board for a built-in model (parts rounded to E24 resistors and E12 capacitors, 1 ms per problem time unit unless ?timeScaleSeconds= says otherwise); nothing is stored.");
        return routes;
    }

    private static Ok<List<BuiltInModelResponse>> List()
    {
        var realizable = DesignTargets.Names().ToHashSet(StringComparer.Ordinal);
        return TypedResults.Ok(ModelCatalog.All.Select(m => new BuiltInModelResponse(
            m.Name, m.Title, m.Description, DesignSheets.EquationsOf(m.Name), m.Source, realizable.Contains(m.Name))).ToList());
    }

    private static Results<Ok<DesignSheetDocument>, ProblemHttpResult, ValidationProblem> Generate(string modelId, double? timeScaleSeconds, string? board, string? title)
    {
        if (ModelCatalog.Find(modelId) is null)
        {
            return ApiProblems.NotFound("model", modelId);
        }

        if (!DesignTargets.TryFind(modelId, out var target))
        {
            var refusals = ModelTargets.FromCatalog(modelId)?.Refusals ?? [];
            return TypedResults.Problem(statusCode: StatusCodes.Status422UnprocessableEntity, title: "No design can be generated for this model",
                detail: $"The board's blocks cannot realize {string.Join("; ", refusals)}. Designs can be generated for {string.Join(", ", DesignTargets.Names())}; write a design file for '{modelId}' by hand (docs/circuits.md).");
        }

        if (timeScaleSeconds is { } tau && !(tau > 0 && tau < 1e3))
        {
            return ApiProblems.Invalid("timeScaleSeconds", "The time scale must be a positive number of seconds below 1000.");
        }

        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions
        {
            TimeScaleSeconds = timeScaleSeconds ?? 1e-3,
            Board = board ?? string.Empty,
            Title = title ?? string.Empty,
            Ranges = ImmutableDictionary<string, double>.Empty,
        });
        var document = DesignFileWriter.Write(proposal.Design);
        return TypedResults.Ok(DesignSheets.ToSheet(DesignFileReader.Read(document).Value, document));
    }
}
