using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Boards;
using Patchproof.Server.Data;

namespace Patchproof.Server.Apis;

/// <summary>One board: its summary. Its designs, captures and fits have their own groups.</summary>
internal static class BoardsApi
{
    public static IEndpointRouteBuilder MapBoardEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/boards/{boardId:guid}", GetBoardAsync)
            .WithTags("Boards").WithName("GetBoard").WithSummary("Reads one board with its latest design version and counts.");
        return routes;
    }

    internal static IQueryable<BoardResponse> QueryResponses(IQueryable<BoardRecord> boards) =>
        boards.AsNoTracking().Select(b => new BoardResponse(
            b.Id,
            b.BenchId,
            b.Code,
            b.Name,
            b.BuiltBy,
            b.Description,
            b.Designs.Max(d => (int?)d.Version),
            b.Captures.Count,
            b.Fits.Count,
            DateTimeOffset.FromUnixTimeMilliseconds(b.CreatedAtUnixMs)));

    internal static BoardResponse ToResponse(BoardRecord board, int? latestDesignVersion, int captureCount, int fitCount) =>
        new(board.Id, board.BenchId, board.Code, board.Name, board.BuiltBy, board.Description, latestDesignVersion, captureCount, fitCount,
            TimeStamps.FromUnixMs(board.CreatedAtUnixMs));

    private static async Task<Results<Ok<BoardResponse>, ProblemHttpResult>> GetBoardAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var board = await QueryResponses(db.Boards.Where(b => b.Id == boardId)).SingleOrDefaultAsync(cancellationToken);
        return board is null ? ApiProblems.NotFound("board", boardId) : TypedResults.Ok(board);
    }
}
