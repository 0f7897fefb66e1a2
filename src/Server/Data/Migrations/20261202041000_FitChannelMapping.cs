using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace Patchproof.Server.Data.Migrations
{
    /// <summary>A fit keeps the channel mapping it was started with; fits stored before have none and keep the file order.</summary>
    public partial class FitChannelMapping : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<string>(
                name: "MappingJson",
                table: "FitJobs",
                nullable: true);
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "MappingJson",
                table: "FitJobs");
        }
    }
}
