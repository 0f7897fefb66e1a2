using Microsoft.EntityFrameworkCore;

namespace Patchproof.Server.Data;

/// <summary>The server's database: benches, boards, designs, captures and fit jobs.</summary>
/// <remarks>
/// The model uses only types that SQLite and PostgreSQL both map without provider-specific
/// configuration (Guid keys, text, 64-bit integers, doubles, booleans), so one set of migrations
/// serves both. Lengths are checked by the API, not by column types, for the same reason.
/// </remarks>
internal sealed class PatchproofDbContext(DbContextOptions<PatchproofDbContext> options) : DbContext(options)
{
    public DbSet<BenchRecord> Benches => Set<BenchRecord>();
    public DbSet<BoardRecord> Boards => Set<BoardRecord>();
    public DbSet<DesignVersionRecord> DesignVersions => Set<DesignVersionRecord>();
    public DbSet<CaptureRecord> Captures => Set<CaptureRecord>();
    public DbSet<FitJobRecord> FitJobs => Set<FitJobRecord>();
    public DbSet<FitJobCaptureRecord> FitJobCaptures => Set<FitJobCaptureRecord>();

    protected override void OnModelCreating(ModelBuilder modelBuilder)
    {
        modelBuilder.Entity<BenchRecord>(bench =>
        {
            bench.ToTable("Benches");
            bench.HasIndex(b => b.Name).IsUnique();
        });

        modelBuilder.Entity<BoardRecord>(board =>
        {
            board.ToTable("Boards");
            board.HasOne(b => b.Bench).WithMany(b => b.Boards).HasForeignKey(b => b.BenchId).OnDelete(DeleteBehavior.Restrict);
            board.HasIndex(b => new { b.BenchId, b.Code }).IsUnique();
        });

        modelBuilder.Entity<DesignVersionRecord>(design =>
        {
            design.ToTable("DesignVersions");
            design.HasOne(d => d.Board).WithMany(b => b.Designs).HasForeignKey(d => d.BoardId).OnDelete(DeleteBehavior.Restrict);
            design.HasIndex(d => new { d.BoardId, d.Version }).IsUnique();
        });

        modelBuilder.Entity<CaptureRecord>(capture =>
        {
            capture.ToTable("Captures");
            capture.HasOne(c => c.Board).WithMany(b => b.Captures).HasForeignKey(c => c.BoardId).OnDelete(DeleteBehavior.Restrict);
            capture.HasIndex(c => c.BoardId);
            capture.HasIndex(c => c.Sha256);
        });

        modelBuilder.Entity<FitJobRecord>(fit =>
        {
            fit.ToTable("FitJobs");
            fit.HasOne(f => f.Board).WithMany(b => b.Fits).HasForeignKey(f => f.BoardId).OnDelete(DeleteBehavior.Restrict);
            fit.HasOne(f => f.DesignVersion).WithMany().HasForeignKey(f => f.DesignVersionId).OnDelete(DeleteBehavior.Restrict);
            fit.Property(f => f.State).HasConversion<string>();
            fit.HasIndex(f => new { f.State, f.CreatedAtUnixMs });
            fit.HasIndex(f => f.BoardId);
        });

        modelBuilder.Entity<FitJobCaptureRecord>(link =>
        {
            link.ToTable("FitJobCaptures");
            link.HasKey(l => new { l.FitJobId, l.CaptureId });
            link.HasOne<FitJobRecord>().WithMany(f => f.Captures).HasForeignKey(l => l.FitJobId).OnDelete(DeleteBehavior.Cascade);
            link.HasOne(l => l.Capture).WithMany().HasForeignKey(l => l.CaptureId).OnDelete(DeleteBehavior.Restrict);
        });
    }
}
