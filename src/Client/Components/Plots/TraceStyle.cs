using Patchproof.Client.Models;

namespace Patchproof.Client.Components.Plots;

/// <summary>How each kind of trace looks on every plot: colour, dash and the legend's words, so colour is never the only cue.</summary>
/// <param name="Colour">An Okabe-Ito colour.</param>
/// <param name="Dash">Plotly's dash name: "solid", "dash" or "dot".</param>
/// <param name="WidthPixels">Line width.</param>
/// <param name="Legend">What the legend says.</param>
public sealed record TraceStyle(string Colour, string Dash, double WidthPixels, string Legend)
{
    /// <summary>The style of a role.</summary>
    public static TraceStyle For(TraceRole role) => role switch
    {
        TraceRole.Capture => new(OkabeIto.Black, "solid", 1.0, "capture (measured on the board)"),
        TraceRole.Nominal => new(OkabeIto.Orange, "dash", 1.4, "nominal design (simulated)"),
        TraceRole.Fitted => new(OkabeIto.Blue, "solid", 1.4, "fitted values (simulated)"),
        _ => throw new ArgumentOutOfRangeException(nameof(role), role, "Unknown trace role."),
    };
}
