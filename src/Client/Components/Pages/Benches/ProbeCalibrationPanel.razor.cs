using System.Globalization;
using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Forms;
using Patchproof.Client.Models;
using Patchproof.Client.Services;

namespace Patchproof.Client.Components.Pages.Benches;

/// <summary>What the probe calibration panel shows above its upload form.</summary>
public enum ProbeCalibrationPanelState
{
    /// <summary>The calibrations are on their way.</summary>
    Loading,

    /// <summary>The server could not list them.</summary>
    Failed,

    /// <summary>The bench has none.</summary>
    Empty,

    /// <summary>The newest one is shown.</summary>
    Loaded,
}

/// <summary>A bench's probe calibration: the newest one with its gains, uncertainty and check, and the form that makes a new one from a calibration capture.</summary>
public sealed partial class ProbeCalibrationPanel
{
    // A calibration capture is a few seconds of signal; the server refuses more than this too.
    private const long MaxFileBytes = 64L << 20;

    private ApiResult<IReadOnlyList<ProbeCalibrationView>>? calibrations;
    private ApiProblem? loadProblem;
    private IBrowserFile? chosen;
    private string? note;
    private string? knownAmplitude;
    private string? amplitudeAccuracy;
    private bool uploading;
    private ApiProblem? uploadProblem;
    private ProbeCalibrationView? stored;

    /// <summary>The bench whose probe calibration this is.</summary>
    [Parameter, EditorRequired]
    public Guid BenchId { get; set; }

    [Inject]
    private IPatchproofApi Api { get; set; } = default!;

    /// <summary>What the panel shows now.</summary>
    public ProbeCalibrationPanelState State => calibrations switch
    {
        null => ProbeCalibrationPanelState.Loading,
        { Succeeded: false } => ProbeCalibrationPanelState.Failed,
        { Value.Count: 0 } => ProbeCalibrationPanelState.Empty,
        _ => ProbeCalibrationPanelState.Loaded,
    };

    private ProbeCalibrationView? Newest => calibrations is { Succeeded: true, Value.Count: > 0 } list ? list.Value[0] : null;

    private int EarlierCount => calibrations is { Succeeded: true } list ? Math.Max(0, list.Value.Count - 1) : 0;

    /// <inheritdoc />
    protected override async Task OnParametersSetAsync()
    {
        calibrations = null;
        calibrations = await Api.ListProbeCalibrationsAsync(BenchId);
        loadProblem = calibrations.Problem;
    }

    private void OnFileChosen(InputFileChangeEventArgs e)
    {
        chosen = e.File;
        uploadProblem = null;
        stored = null;
    }

    private async Task CalibrateAsync()
    {
        if (chosen is not { } file)
        {
            return;
        }

        uploading = true;
        uploadProblem = null;
        stored = null;
        var result = await Api.CalibrateProbesAsync(BenchId, new UploadFile(file.Name, file.Size, file.ContentType, () => file.OpenReadStream(MaxFileBytes)), new CalibrationCaptureDetails(note, knownAmplitude, amplitudeAccuracy));
        uploading = false;
        if (!result.Succeeded)
        {
            uploadProblem = result.Problem;
            return;
        }

        stored = result.Value;
        chosen = null;
        // The new calibration is the newest: put it in front rather than asking the server again.
        var earlier = calibrations is { Succeeded: true } list ? list.Value : [];
        calibrations = ApiResult<IReadOnlyList<ProbeCalibrationView>>.Ok([result.Value, .. earlier]);
    }

    private static string Stamp(DateTimeOffset time) =>
        time.ToUniversalTime().ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC";

    private static string Number(double value, string format) =>
        double.IsFinite(value) ? value.ToString(format, CultureInfo.InvariantCulture) : "—";

    private static string Percent(double value, string format) => Number(value, format);

    private static string CheckClass(bool? passed) => passed switch
    {
        true => "check-passed",
        false => "check-failed",
        null => "check-unknown",
    };

    private static string ChannelCheckText(bool? passed) => passed switch
    {
        true => "passed",
        false => "failed",
        null => "not recorded",
    };

    private static string CheckText(ProbeCalibrationView calibration) => calibration.PassesOneSignalCheck switch
    {
        true => $"Check passed: every channel followed {calibration.ReferenceChannel}, so the probes saw one signal.",
        false => $"Check failed: {string.Join(", ", calibration.Channels.Where(c => c.FollowsReference == false).Select(c => c.Channel))} did not follow {calibration.ReferenceChannel}. Record the calibration again with every probe on one node.",
        null => "The one-signal check is not recorded in this calibration's file.",
    };
}
