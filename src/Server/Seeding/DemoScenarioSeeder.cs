using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Server.Captures;
using Patchproof.Server.Data;
using Patchproof.Server.Designs;

namespace Patchproof.Server.Seeding;

/// <summary>Loads the demo bench and boards, and any demo designs and captures found on disk; running it again adds nothing twice.</summary>
/// <remarks>
/// Design files (<c>*.json</c>) come from <c>Patchproof:Demo:DesignsFolder</c> (default: the first
/// <c>designs</c> folder above the app), captures (<c>*.csv</c>) from
/// <c>Patchproof:Demo:CapturesFolder</c> (default: the first <c>sample-captures</c> folder). A file
/// belongs to a board when its name starts with the board's code (any case) or it lies in a folder
/// named after the code. A design is stored as version 1 when the board has none yet; a capture is
/// stored unless the board already has one with the same bytes. Files ending in <c>-probe-calibration.csv</c> are
/// probe calibration captures and are left out.
/// </remarks>
internal sealed partial class DemoScenarioSeeder(
    PatchproofDbContext db,
    IDesignDocumentValidator designValidator,
    TimeProvider time,
    IOptions<PatchproofOptions> options,
    ILogger<DemoScenarioSeeder> logger,
    CaptureIngest ingest)
{
    /// <summary>How a demo probe calibration capture's file name ends; such files are not seeded as board captures.</summary>
    public const string ProbeCalibrationSuffix = "-probe-calibration.csv";

    /// <summary>Seeds the bench, its boards and the files found, skipping what is there already.</summary>
    /// <param name="cancellationToken">Stops the seeding.</param>
    /// <returns>A task that completes when the seeding is done.</returns>
    public async Task SeedAsync(CancellationToken cancellationToken)
    {
        var bench = await EnsureBenchAsync(cancellationToken);
        var designs = FindFolder(options.Value.Demo.DesignsFolder, "designs");
        var captures = FindFolder(options.Value.Demo.CapturesFolder, "sample-captures");
        foreach (var demo in DemoScenario.Boards)
        {
            var board = await EnsureBoardAsync(bench.Id, demo, cancellationToken);
            await SeedDesignAsync(board, FilesOf(designs, demo.Code, ".json"), cancellationToken);
            // A probe calibration capture (every probe on one node) is not a recording of the board: it stays a file to
            // upload on the bench page, since a bench calibration would apply to every board of the demo bench.
            var boardCaptures = FilesOf(captures, demo.Code, ".csv")
                .Where(file => !Path.GetFileName(file).EndsWith(ProbeCalibrationSuffix, StringComparison.OrdinalIgnoreCase))
                .ToList();
            await SeedCapturesAsync(board, boardCaptures, cancellationToken);
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

    private async Task SeedDesignAsync(BoardRecord board, IReadOnlyList<string> files, CancellationToken cancellationToken)
    {
        var design = files.FirstOrDefault();
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
    }

    private async Task SeedCapturesAsync(BoardRecord board, IReadOnlyList<string> files, CancellationToken cancellationToken)
    {
        foreach (var capture in files)
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

    private static string? FindFolder(string? configured, string defaultName)
    {
        if (configured is not null)
        {
            var path = Path.GetFullPath(configured, AppContext.BaseDirectory);
            return Directory.Exists(path) ? path : null;
        }

        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            var candidate = Path.Combine(dir.FullName, defaultName);
            if (Directory.Exists(candidate))
            {
                return candidate;
            }
        }

        return null;
    }

    private static IReadOnlyList<string> FilesOf(string? folder, string code, string extension) => folder is null ? [] :
        Directory.EnumerateFiles(folder, "*" + extension, SearchOption.AllDirectories)
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
