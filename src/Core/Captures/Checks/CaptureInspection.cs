namespace Patchproof.Core.Captures.Checks;

/// <summary>Runs the standard capture checks, plus any model-aware ones, and returns their findings in order.</summary>
/// <remarks>The standard list: time base, DC level, vertical resolution, clipping, noise floor, samples per dominant period, record length, AC coupling (acts only with expectations).</remarks>
public static class CaptureInspection
{
    /// <summary>The standard checks in the order they run.</summary>
    public static IReadOnlyList<ICaptureCheck> StandardChecks { get; } =
    [
        new TimeBaseCheck(),
        new DcLevelCheck(),
        new ResolutionCheck(),
        new ClippingCheck(),
        new NoiseFloorCheck(),
        new DominantPeriodCheck(),
        new AcCouplingCheck(),
    ];

    /// <summary>Runs the standard checks and then <paramref name="extraChecks"/>.</summary>
    /// <param name="capture">The capture.</param>
    /// <param name="context">Model expectations, or null for none.</param>
    /// <param name="extraChecks">More checks, for example model-aware ones; null for none.</param>
    public static IReadOnlyList<CaptureCheckResult> Run(Capture capture, CaptureCheckContext? context = null, IEnumerable<ICaptureCheck>? extraChecks = null)
    {
        ArgumentNullException.ThrowIfNull(capture);
        var ctx = context ?? CaptureCheckContext.WithoutModel;
        var results = new List<CaptureCheckResult>();
        foreach (var check in StandardChecks.Concat(extraChecks ?? []))
        {
            results.AddRange(check.Run(capture, ctx));
        }

        return results;
    }
}
