using System.Globalization;
using Patchproof.Client.Models;

namespace Patchproof.Client.Components.Pages.Fits;

/// <summary>A fit's state in words, the same on every screen.</summary>
public static class FitStateText
{
    /// <summary>"waiting to start", "running, 40 %", "finished", "failed", "cancelled".</summary>
    public static string Of(FitJob fit) => fit.State switch
    {
        FitJobState.Queued => fit.CancelRequested ? "cancelling" : "waiting to start",
        FitJobState.Running => fit.CancelRequested
            ? "cancelling"
            : string.Create(CultureInfo.InvariantCulture, $"running, {fit.Progress * 100:0} %"),
        FitJobState.Succeeded => "finished",
        FitJobState.Failed => "failed",
        FitJobState.Cancelled => "cancelled",
        _ => fit.State.ToString(),
    };
}
