using Patchproof.Client.Models;

namespace Patchproof.Client.Components.Pages.Fits;

/// <summary>Holds a fit's shown progress at the largest value seen for that fit, so the bar never steps back between polls.</summary>
/// <remarks>The server's progress already never decreases; this guards the display against an older answer arriving late or
/// a fit picked up again after a server restart. A different fit starts from its own value.</remarks>
public sealed class FitProgressClamp
{
    private Guid fitId;
    private double largest;

    /// <summary>The fit as it should be shown: its progress raised to the largest seen for it so far.</summary>
    /// <param name="fit">The fit as the server answered.</param>
    public FitJob Apply(FitJob fit)
    {
        ArgumentNullException.ThrowIfNull(fit);
        if (fit.Id != fitId)
        {
            fitId = fit.Id;
            largest = 0;
        }

        largest = Math.Max(largest, fit.Progress);
        return fit.Progress < largest ? fit with { Progress = largest } : fit;
    }
}
