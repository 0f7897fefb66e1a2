using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Captures;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Estimation;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Apis;

/// <summary>The channel-mapping check: the core's search over every assignment and sign, against the person's mapping.</summary>
internal static class MappingCheckApi
{
    // A mapping is "clearly better" when its equation-error misfit is under half the given one's (a rule of our own, not a published threshold).
    private const double ClearlyBetterRatio = 0.5;

    public static IEndpointRouteBuilder MapMappingCheckEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapPost("/api/captures/{captureId:guid}/mapping-check", CheckAsync)
            .WithTags("Captures").WithName("CheckChannelMapping")
            .WithSummary("Says whether another channel-to-variable assignment (with signs) fits the design's equations clearly better than the one given; needs one channel per variable.");
        return routes;
    }

    private static async Task<Results<Ok<MappingCheckResponse>, ProblemHttpResult, ValidationProblem>> CheckAsync(
        Guid captureId, MappingCheckRequest request, PatchproofDbContext db, CaptureStore store, CancellationToken cancellationToken)
    {
        var capture = await db.Captures.AsNoTracking().SingleOrDefaultAsync(c => c.Id == captureId, cancellationToken);
        if (capture is null)
        {
            return ApiProblems.NotFound("capture", captureId);
        }

        var designRecord = await db.DesignVersions.AsNoTracking().SingleOrDefaultAsync(d => d.BoardId == capture.BoardId && d.Version == request.DesignVersion, cancellationToken);
        if (designRecord is null)
        {
            return ApiProblems.NotFound("design version of this capture's board", request.DesignVersion);
        }

        var design = DesignFileReader.Read(designRecord.Document, $"design version {designRecord.Version}");
        if (!design.TryGetValue(out var board))
        {
            return LocatedProblems.Unreadable("The stored design cannot be read", $"design version {designRecord.Version}", design.Errors);
        }

        var samplesPath = store.SamplesPathOf(capture.Sha256);
        if (!File.Exists(samplesPath))
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status410Gone, title: "Capture samples gone", detail: "The capture's parsed samples are no longer stored.");
        }

        var samples = await Task.Run(() => CaptureSamplesFile.Read(samplesPath, capture.FileName), cancellationToken);
        var variables = board.Variables.Select(v => v.Name).ToList();
        var mapping = request.Mapping ?? [];
        // The fit's own rules for each entry (channel, variable, sign, nothing mapped twice); the check adds that every variable is recorded.
        var errors = FitMappingRules.Check(mapping, variables, [(capture.FileName, samples.Channels.Select(c => c.Name).ToList())]);
        if (errors.Count == 0 && mapping.Count != variables.Count)
        {
            errors["mapping"] = [$"The check needs each of the design's {variables.Count} variables ({string.Join(", ", variables)}) on a channel of its own."];
        }

        if (errors.Count > 0)
        {
            return ApiProblems.Invalid(errors);
        }

        if (samples.TimeBase is not Patchproof.Core.Captures.UniformTimeBase timeBase)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status422UnprocessableEntity, title: "Capture not evenly sampled", detail: "The mapping check needs evenly spaced samples.");
        }

        // Channels in the given mapping's order, so state j is read from mapping[j]'s channel under the given mapping.
        var ordered = variables.Select(v => mapping.Single(m => m.Variable == v)).ToList();
        var channels = ordered.Select(m => samples.FindChannel(m.Channel)!.Samples.ToArray().Select(x => (double)x).ToArray()).ToList();
        var terms = board.Terms().Where(t => !t.Basis.IsConstant).ToList();
        var equations = variables.Select(v => (IReadOnlyList<RegressionTerm>)terms.Where(t => t.Variable == v)
            .Select(t => new RegressionTerm(t.Basis.ToString(), t.Basis.Variables.Select(variables.IndexOf).ToList())).ToList()).ToList();
        var nominal = variables.Select(v => (IReadOnlyList<double>)terms.Where(t => t.Variable == v).Select(t => t.NominalCoefficient).ToList()).ToList();
        var ranked = await Task.Run(() => ChannelMappingSearch.Rank(channels, timeBase.IntervalSeconds, equations, nominal), cancellationToken);

        // Under the given mapping (reordered above) state j reads channel j with the given sign.
        var given = ranked.FirstOrDefault(m => m.ChannelOfState.Select((c, j) => c == j && m.SignOfState[j] == ordered[j].Sign).All(ok => ok));
        var best = ranked[0];
        var suggested = variables.Select((v, j) => new ChannelMappingEntry(ordered[best.ChannelOfState[j]].Channel, v, best.SignOfState[j])).ToList();
        // Signs change no misfit (the free coefficients flip instead); the design's nominal signs tell them apart.
        var clearlyBetter = given is not null && given != best
            && (best.Misfit < ClearlyBetterRatio * given.Misfit || (best.Misfit <= 1.01 * given.Misfit && best.SignDisagreements < given.SignDisagreements));
        if (given is null || !clearlyBetter)
        {
            return TypedResults.Ok(new MappingCheckResponse(true, mapping.ToList(), "No other assignment of channels and signs fits the design's equations clearly better than this one."));
        }

        return TypedResults.Ok(new MappingCheckResponse(false, suggested,
            $"Another assignment fits the design's equations clearly better ({string.Join(", ", suggested.Select(s => $"{s.Channel} = {(s.Sign < 0 ? "-" : "")}{s.Variable}"))}): its unexplained share of the derivatives is {best.Misfit:P1} against {given.Misfit:P1}, with {best.SignDisagreements} coefficient signs against the design's instead of {given.SignDisagreements}."));
    }
}
