using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Boards;
using Patchproof.Server.Data;

namespace Patchproof.Server.Apis;

/// <summary>Benches (or classes) and the boards that belong to them.</summary>
internal static class BenchesApi
{
    public static IEndpointRouteBuilder MapBenchEndpoints(this IEndpointRouteBuilder routes)
    {
        var benches = routes.MapGroup("/api/benches").WithTags("Benches");
        benches.MapGet("/", ListBenchesAsync).WithName("ListBenches").WithSummary("Lists the benches and classes.");
        benches.MapPost("/", CreateBenchAsync).WithName("CreateBench").WithSummary("Records a new bench or class.");
        benches.MapGet("/{benchId:guid}", GetBenchAsync).WithName("GetBench").WithSummary("Reads one bench.");
        benches.MapGet("/{benchId:guid}/boards", ListBoardsAsync).WithName("ListBoards").WithSummary("Lists the boards of a bench.");
        benches.MapPost("/{benchId:guid}/boards", CreateBoardAsync).WithName("CreateBoard").WithSummary("Records a new board on a bench.");
        return routes;
    }

    private static async Task<Ok<List<BenchResponse>>> ListBenchesAsync(PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var rows = await db.Benches.AsNoTracking()
            .OrderBy(b => b.Name)
            .Select(b => new { Bench = b, BoardCount = b.Boards.Count })
            .ToListAsync(cancellationToken);
        return TypedResults.Ok(rows.Select(r => ToResponse(r.Bench, r.BoardCount)).ToList());
    }

    private static async Task<Results<Ok<BenchResponse>, ProblemHttpResult>> GetBenchAsync(Guid benchId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var row = await db.Benches.AsNoTracking()
            .Where(b => b.Id == benchId)
            .Select(b => new { Bench = b, BoardCount = b.Boards.Count })
            .SingleOrDefaultAsync(cancellationToken);
        return row is null ? ApiProblems.NotFound("bench", benchId) : TypedResults.Ok(ToResponse(row.Bench, row.BoardCount));
    }

    private static async Task<Results<Created<BenchResponse>, ValidationProblem, ProblemHttpResult>> CreateBenchAsync(
        CreateBenchRequest request, PatchproofDbContext db, TimeProvider time, CancellationToken cancellationToken)
    {
        var checks = new FieldChecks()
            .Required("name", request.Name, 200)
            .Optional("institution", request.Institution, 200)
            .Optional("description", request.Description, 2000);
        if (checks.HasErrors)
        {
            return ApiProblems.Invalid(checks.Errors);
        }

        var name = request.Name.Trim();
        if (await db.Benches.AnyAsync(b => b.Name == name, cancellationToken))
        {
            return ApiProblems.Conflict("Bench exists", $"A bench named '{name}' is already recorded.");
        }

        var bench = new BenchRecord
        {
            Id = Guid.NewGuid(),
            Name = name,
            Institution = request.Institution?.Trim(),
            Description = request.Description,
            CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
        };
        db.Benches.Add(bench);
        try
        {
            await db.SaveChangesAsync(cancellationToken);
        }
        catch (DbUpdateException)
        {
            return ApiProblems.Conflict("Bench exists", $"A bench named '{name}' is already recorded.");
        }

        return TypedResults.Created($"/api/benches/{bench.Id}", ToResponse(bench, 0));
    }

    private static async Task<Results<Ok<List<BoardResponse>>, ProblemHttpResult>> ListBoardsAsync(Guid benchId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        var boards = await BoardsApi.QueryResponses(db.Boards.Where(b => b.BenchId == benchId)).ToListAsync(cancellationToken);
        return TypedResults.Ok(boards.OrderBy(b => b.Code, StringComparer.Ordinal).ToList());
    }

    private static async Task<Results<Created<BoardResponse>, ValidationProblem, ProblemHttpResult>> CreateBoardAsync(
        Guid benchId, CreateBoardRequest request, PatchproofDbContext db, TimeProvider time, CancellationToken cancellationToken)
    {
        var checks = new FieldChecks()
            .Required("code", request.Code, 40)
            .Required("name", request.Name, 200)
            .Optional("builtBy", request.BuiltBy, 200)
            .Optional("description", request.Description, 2000);
        if (checks.HasErrors)
        {
            return ApiProblems.Invalid(checks.Errors);
        }

        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        var code = request.Code.Trim();
        if (await db.Boards.AnyAsync(b => b.BenchId == benchId && b.Code == code, cancellationToken))
        {
            return ApiProblems.Conflict("Board exists", $"This bench already has a board labelled '{code}'.");
        }

        var board = new BoardRecord
        {
            Id = Guid.NewGuid(),
            BenchId = benchId,
            Code = code,
            Name = request.Name.Trim(),
            BuiltBy = request.BuiltBy?.Trim(),
            Description = request.Description,
            CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
        };
        db.Boards.Add(board);
        try
        {
            await db.SaveChangesAsync(cancellationToken);
        }
        catch (DbUpdateException)
        {
            return ApiProblems.Conflict("Board exists", $"This bench already has a board labelled '{code}'.");
        }

        return TypedResults.Created($"/api/boards/{board.Id}", BoardsApi.ToResponse(board, null, 0, 0));
    }

    private static BenchResponse ToResponse(BenchRecord bench, int boardCount) =>
        new(bench.Id, bench.Name, bench.Institution, bench.Description, boardCount, TimeStamps.FromUnixMs(bench.CreatedAtUnixMs));
}
