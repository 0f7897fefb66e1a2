using Patchproof.Server.Apis;

namespace Patchproof.Server.Extensions;

/// <summary>Maps every API group.</summary>
internal static class EndpointMapping
{
    public static WebApplication MapPatchproofApi(this WebApplication app)
    {
        app.MapHealthEndpoints();
        app.MapBenchEndpoints();
        app.MapProbeCalibrationEndpoints();
        app.MapBoardEndpoints();
        app.MapDesignEndpoints();
        app.MapCaptureEndpoints();
        app.MapFitEndpoints();
        app.MapReportEndpoints();
        app.MapReportExportEndpoints();
        app.MapModelEndpoints();
        app.MapDesignSheetEndpoints();
        app.MapMappingCheckEndpoints();
        return app;
    }
}
