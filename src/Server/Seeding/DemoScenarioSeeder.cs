using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Server.Captures;
using Patchproof.Server.Data;
using Patchproof.Server.Designs;

namespace Patchproof.Server.Seeding;

/// <summary>Loads the demo bench and boards, and any demo designs and captures found on disk; running it again adds nothing twice.</summary>
/// <remarks>
/// Demo files are looked up in the demo folder (<c>Patchproof:Demo:Folder</c>, or the first
/// <c>sample-captures</c> folder above the app): a file belongs to a board when its name starts
/// with the board's code or it lies in a folder named after the code. <c>*.json</c> files are
/// design documents (stored as version 1 when the board has no design yet), <c>*.csv</c> files are
/// captures (stored unless the board already has a capture with the same bytes).
/// </remarks>
internal sealed partial class DemoScenarioSeeder(
    PatchproofDbContext db,
    IDesignDocumentValidator designValidator,
    TimeProvider time,
    IOptions<PatchproofOptions> options,
    ILogger<DemoScenarioSeeder> logger,
    CaptureIngest? ingest = null)
{
    public async Task SeedAsync(CancellationToken cancellationToken)
    {
        var bench = await EnsureBenchAsync(cancellationToken);
        var folder = FindDemoFolder();
        foreach (var demo in DemoScenario.Boards)
        {
            var board = await EnsureBoardAsync(bench.Id, demo, cancellationToken);
            if (folder is not null)
            {
                await SeedFilesAsync(board, FilesOf(folder, demo.Code), cancellationToken);
            }
        }
    }

    private async Task<BenchRecord> EnsureBenchAsync(CancellationToken cancellationToken)
    {
        var bench = await db.Benches.SingleOrDefaultAsync(b => b.Name == DemoScenario.BenchName, cancellationToken);
        if (bench is not null)
        {
            return bench;
        }

        bench = new BenchRecord
        {
            Id = Guid.NewGuid(),
            Name = DemoScenario.BenchName,
            Institution = DemoScenario.Institution,
            Description = DemoScenario.BenchDescription,
            CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
        };
        db.Benches.Add(bench);
        if (await TrySaveAsync(cancellationToken))
        {
            return bench;
        }

        // Another server process seeded it at the same moment.
        return await db.Benches.SingleAsync(b => b.Name == DemoScenario.BenchName, cancellationToken);
    }

    private async Task<BoardRecord> EnsureBoardAsync(Guid benchId, DemoBoard demo, CancellationToken cancellationToken)
    {
        var board = await db.Boards.SingleOrDefaultAsync(b => b.BenchId == benchId && b.Code == demo.Code, cancellationToken);
        if (board is not null)
        {
            return board;
        }

        board = new BoardRecord
        {
            Id = Guid.NewGuid(),
            BenchId = benchId,
            Code = demo.Code,
            Name = demo.Name,
            BuiltBy = demo.BuiltBy,
            Description = demo.Description,
            CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
        };
        db.Boards.Add(board);
        return await TrySaveAsync(cancellationToken)
            ? board
            : await db.Boards.SingleAsync(b => b.BenchId == benchId && b.Code == demo.Code, cancellationToken);
    }

    private async Task SeedFilesAsync(BoardRecord board, IReadOnlyList<string> files, CancellationToken cancellationToken)
    {
        var design = files.FirstOrDefault(f => f.EndsWith(".json", StringComparison.OrdinalIgnoreCase));
        if (design is not null && !await db.DesignVersions.AnyAsync(d => d.BoardId == board.Id, cancellationToken))
        {
            var document = await File.ReadAllTextAsync(design, cancellationToken);
            var errors = designValidator.Validate(document);
            if (errors.Count > 0)
            {
                LogDemoFileSkipped(logger, design, errors[0].ToString());
            }
            else
            {
                db.DesignVersions.Add(new DesignVersionRecord
                {
                    Id = Guid.NewGuid(),
                    BoardId = board.Id,
                    Version = 1,
                    Note = "Demo design",
                    Document = document,
                    CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
                });
                await TrySaveAsync(cancellationToken);
            }
        }

        if (ingest is null)
        {
            return;
        }

        foreach (var capture in files.Where(f => f.EndsWith(".csv", StringComparison.OrdinalIgnoreCase)))
        {
            var sha = await Sha256OfAsync(capture, cancellationToken);
            if (await db.Captures.AnyAsync(c => c.BoardId == board.Id && c.Sha256 == sha, cancellationToken))
            {
                continue;
            }

            await using var stream = File.OpenRead(capture);
            var outcome = await ingest.IngestFileAsync(board.Id, Path.GetFileName(capture), stream, cancellationToken);
            if (outcome.Capture is null)
            {
                LogDemoFileSkipped(logger, capture, "the capture reader did not accept it");
            }
        }
    }

    private async Task<bool> TrySaveAsync(CancellationToken cancellationToken)
    {
        try
        {
            await db.SaveChangesAsync(cancellationToken);
            return true;
        }
        catch (DbUpdateException)
        {
            db.ChangeTracker.Clear();
            return false;
        }
    }

    private string? FindDemoFolder()
    {
        if (options.Value.Demo.Folder is { } configured)
        {
            var path = Path.GetFullPath(configured, AppContext.BaseDirectory);
            return Directory.Exists(path) ? path : null;
        }

        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            var candidate = Path.Combine(dir.FullName, "sample-captures");
            if (Directory.Exists(candidate))
            {
                return candidate;
            }
        }

        return null;
    }

    private static IReadOnlyList<string> FilesOf(string folder, string code) =>
        Directory.EnumerateFiles(folder, "*", SearchOption.AllDirectories)
            .Where(f => Path.GetFileName(f).StartsWith(code, StringComparison.OrdinalIgnoreCase)
                || Path.GetRelativePath(folder, f).Split(Path.DirectorySeparatorChar).SkipLast(1).Any(part => part.Equals(code, StringComparison.OrdinalIgnoreCase)))
            .Order(StringComparer.Ordinal)
            .ToList();

    private static async Task<string> Sha256OfAsync(string path, CancellationToken cancellationToken)
    {
        await using var stream = File.OpenRead(path);
        return Convert.ToHexStringLower(await System.Security.Cryptography.SHA256.HashDataAsync(stream, cancellationToken));
    }

    [LoggerMessage(Level = LogLevel.Warning, Message = "Demo file {Path} was not loaded: {Reason}")]
    private static partial void LogDemoFileSkipped(ILogger logger, string path, string reason);
}
