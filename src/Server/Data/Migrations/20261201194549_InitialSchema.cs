using System;
using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace Patchproof.Server.Data.Migrations
{
    /// <summary>The first schema: benches, boards, design versions, captures and fit jobs.</summary>
    /// <remarks>Provider-neutral: no column types are named, so SQLite and PostgreSQL each map the CLR types themselves.</remarks>
    public partial class InitialSchema : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateTable(
                name: "Benches",
                columns: table => new
                {
                    Id = table.Column<Guid>(nullable: false),
                    Name = table.Column<string>(nullable: false),
                    Institution = table.Column<string>(nullable: true),
                    Description = table.Column<string>(nullable: true),
                    CreatedAtUnixMs = table.Column<long>(nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Benches", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "Boards",
                columns: table => new
                {
                    Id = table.Column<Guid>(nullable: false),
                    BenchId = table.Column<Guid>(nullable: false),
                    Code = table.Column<string>(nullable: false),
                    Name = table.Column<string>(nullable: false),
                    BuiltBy = table.Column<string>(nullable: true),
                    Description = table.Column<string>(nullable: true),
                    CreatedAtUnixMs = table.Column<long>(nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Boards", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Boards_Benches_BenchId",
                        column: x => x.BenchId,
                        principalTable: "Benches",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Captures",
                columns: table => new
                {
                    Id = table.Column<Guid>(nullable: false),
                    BoardId = table.Column<Guid>(nullable: false),
                    FileName = table.Column<string>(nullable: false),
                    Sha256 = table.Column<string>(nullable: false),
                    SizeBytes = table.Column<long>(nullable: false),
                    RowCount = table.Column<long>(nullable: false),
                    ChannelsJson = table.Column<string>(nullable: false),
                    SampleIntervalSeconds = table.Column<double>(nullable: true),
                    DurationSeconds = table.Column<double>(nullable: false),
                    ChecksJson = table.Column<string>(nullable: false),
                    UploadedAtUnixMs = table.Column<long>(nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Captures", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Captures_Boards_BoardId",
                        column: x => x.BoardId,
                        principalTable: "Boards",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "DesignVersions",
                columns: table => new
                {
                    Id = table.Column<Guid>(nullable: false),
                    BoardId = table.Column<Guid>(nullable: false),
                    Version = table.Column<int>(nullable: false),
                    Note = table.Column<string>(nullable: true),
                    Document = table.Column<string>(nullable: false),
                    CreatedAtUnixMs = table.Column<long>(nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_DesignVersions", x => x.Id);
                    table.ForeignKey(
                        name: "FK_DesignVersions_Boards_BoardId",
                        column: x => x.BoardId,
                        principalTable: "Boards",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "FitJobs",
                columns: table => new
                {
                    Id = table.Column<Guid>(nullable: false),
                    BoardId = table.Column<Guid>(nullable: false),
                    DesignVersionId = table.Column<Guid>(nullable: false),
                    State = table.Column<string>(nullable: false),
                    CancelRequested = table.Column<bool>(nullable: false),
                    Progress = table.Column<double>(nullable: false),
                    Stage = table.Column<string>(nullable: true),
                    Attempts = table.Column<int>(nullable: false),
                    LeaseOwner = table.Column<string>(nullable: true),
                    LeaseToken = table.Column<Guid>(nullable: true),
                    LeaseExpiresAtUnixMs = table.Column<long>(nullable: true),
                    CreatedAtUnixMs = table.Column<long>(nullable: false),
                    StartedAtUnixMs = table.Column<long>(nullable: true),
                    FinishedAtUnixMs = table.Column<long>(nullable: true),
                    ResultJson = table.Column<string>(nullable: true),
                    Error = table.Column<string>(nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_FitJobs", x => x.Id);
                    table.ForeignKey(
                        name: "FK_FitJobs_Boards_BoardId",
                        column: x => x.BoardId,
                        principalTable: "Boards",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_FitJobs_DesignVersions_DesignVersionId",
                        column: x => x.DesignVersionId,
                        principalTable: "DesignVersions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "FitJobCaptures",
                columns: table => new
                {
                    FitJobId = table.Column<Guid>(nullable: false),
                    CaptureId = table.Column<Guid>(nullable: false),
                    Position = table.Column<int>(nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_FitJobCaptures", x => new { x.FitJobId, x.CaptureId });
                    table.ForeignKey(
                        name: "FK_FitJobCaptures_Captures_CaptureId",
                        column: x => x.CaptureId,
                        principalTable: "Captures",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_FitJobCaptures_FitJobs_FitJobId",
                        column: x => x.FitJobId,
                        principalTable: "FitJobs",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateIndex(
                name: "IX_Benches_Name",
                table: "Benches",
                column: "Name",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Boards_BenchId_Code",
                table: "Boards",
                columns: new[] { "BenchId", "Code" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Captures_BoardId",
                table: "Captures",
                column: "BoardId");

            migrationBuilder.CreateIndex(
                name: "IX_Captures_Sha256",
                table: "Captures",
                column: "Sha256");

            migrationBuilder.CreateIndex(
                name: "IX_DesignVersions_BoardId_Version",
                table: "DesignVersions",
                columns: new[] { "BoardId", "Version" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_FitJobCaptures_CaptureId",
                table: "FitJobCaptures",
                column: "CaptureId");

            migrationBuilder.CreateIndex(
                name: "IX_FitJobs_BoardId",
                table: "FitJobs",
                column: "BoardId");

            migrationBuilder.CreateIndex(
                name: "IX_FitJobs_DesignVersionId",
                table: "FitJobs",
                column: "DesignVersionId");

            migrationBuilder.CreateIndex(
                name: "IX_FitJobs_State_CreatedAtUnixMs",
                table: "FitJobs",
                columns: new[] { "State", "CreatedAtUnixMs" });
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropTable(
                name: "FitJobCaptures");

            migrationBuilder.DropTable(
                name: "Captures");

            migrationBuilder.DropTable(
                name: "FitJobs");

            migrationBuilder.DropTable(
                name: "DesignVersions");

            migrationBuilder.DropTable(
                name: "Boards");

            migrationBuilder.DropTable(
                name: "Benches");
        }
    }
}
