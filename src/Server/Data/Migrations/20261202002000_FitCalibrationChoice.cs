using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace Patchproof.Server.Data.Migrations
{
    /// <summary>A fit can be told not to use its bench's probe calibration; fits stored before keep using it.</summary>
    public partial class FitCalibrationChoice : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<bool>(
                name: "IgnoreBenchCalibration",
                table: "FitJobs",
                nullable: false,
                defaultValue: false);
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "IgnoreBenchCalibration",
                table: "FitJobs");
        }
    }
}
